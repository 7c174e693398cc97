// Test support: the gate bodies of OpenQASM 2.0's standard header qelib1.inc, as user gates named ref_*.
//
// Source: Cross, Bishop, Smolin, Gambetta 2017, arXiv:1707.03429 (the header listed there), plus the
// gates added in later versions of the header (u, p, sx, sxdg, cp, crx, cry, csx, cu, rxx, rzz).
// Written from memory, not re-read: the tests compare each importer mapping with these bodies, which
// are built from the builtins U and CX only, so a wrong recollection shows up as a failing test.
#pragma once

namespace whittle::test {

inline const char* kQelib1Reference = R"(
gate ref_u3(theta,phi,lambda) q { U(theta,phi,lambda) q; }
gate ref_u2(phi,lambda) q { U(pi/2,phi,lambda) q; }
gate ref_u1(lambda) q { U(0,0,lambda) q; }
gate ref_cx c,t { CX c,t; }
gate ref_id a { U(0,0,0) a; }
gate ref_u(theta,phi,lambda) q { U(theta,phi,lambda) q; }
gate ref_p(lambda) q { U(0,0,lambda) q; }
gate ref_x a { ref_u3(pi,0,pi) a; }
gate ref_y a { ref_u3(pi,pi/2,pi/2) a; }
gate ref_z a { ref_u1(pi) a; }
gate ref_h a { ref_u2(0,pi) a; }
gate ref_s a { ref_u1(pi/2) a; }
gate ref_sdg a { ref_u1(-pi/2) a; }
gate ref_t a { ref_u1(pi/4) a; }
gate ref_tdg a { ref_u1(-pi/4) a; }
gate ref_sx a { ref_sdg a; ref_h a; ref_sdg a; }
gate ref_sxdg a { ref_s a; ref_h a; ref_s a; }
gate ref_rx(theta) a { ref_u3(theta,-pi/2,pi/2) a; }
gate ref_ry(theta) a { ref_u3(theta,0,0) a; }
gate ref_rz(phi) a { ref_u1(phi) a; }
gate ref_cz a,b { ref_h b; ref_cx a,b; ref_h b; }
gate ref_cy a,b { ref_sdg b; ref_cx a,b; ref_s b; }
gate ref_swap a,b { ref_cx a,b; ref_cx b,a; ref_cx a,b; }
gate ref_ch a,b { ref_h b; ref_sdg b; ref_cx a,b; ref_h b; ref_t b; ref_cx a,b; ref_t b; ref_h b; ref_s b; ref_x b; ref_s a; }
gate ref_ccx a,b,c {
  ref_h c; ref_cx b,c; ref_tdg c; ref_cx a,c; ref_t c; ref_cx b,c; ref_tdg c; ref_cx a,c;
  ref_t b; ref_t c; ref_h c; ref_cx a,b; ref_t a; ref_tdg b; ref_cx a,b;
}
gate ref_cswap a,b,c { ref_cx c,b; ref_ccx a,b,c; ref_cx c,b; }
gate ref_crz(lambda) a,b { ref_u1(lambda/2) b; ref_cx a,b; ref_u1(-lambda/2) b; ref_cx a,b; }
gate ref_cu1(lambda) a,b { ref_u1(lambda/2) a; ref_cx a,b; ref_u1(-lambda/2) b; ref_cx a,b; ref_u1(lambda/2) b; }
gate ref_cp(lambda) a,b { ref_p(lambda/2) a; ref_cx a,b; ref_p(-lambda/2) b; ref_cx a,b; ref_p(lambda/2) b; }
gate ref_cu3(theta,phi,lambda) c,t {
  ref_u1((lambda-phi)/2) t; ref_cx c,t; ref_u3(-theta/2,0,-(phi+lambda)/2) t; ref_cx c,t; ref_u3(theta/2,phi,0) t;
}
gate ref_crx(lambda) a,b { ref_u1(pi/2) b; ref_cx a,b; ref_u3(-lambda/2,0,0) b; ref_cx a,b; ref_u3(lambda/2,-pi/2,0) b; }
gate ref_cry(lambda) a,b { ref_ry(lambda/2) b; ref_cx a,b; ref_ry(-lambda/2) b; ref_cx a,b; }
gate ref_csx a,b { ref_h b; ref_cu1(pi/2) a,b; ref_h b; }
gate ref_cu(theta,phi,lambda,gamma) c,t {
  ref_p(gamma) c; ref_p((lambda+phi)/2) c; ref_p((lambda-phi)/2) t; ref_cx c,t;
  ref_u(-theta/2,0,-(phi+lambda)/2) t; ref_cx c,t; ref_u(theta/2,phi,0) t;
}
gate ref_rxx(theta) a,b {
  ref_u3(pi/2,theta,0) a; ref_h b; ref_cx a,b; ref_u1(-theta) b; ref_cx a,b; ref_h b; ref_u2(-pi,pi-theta) a;
}
gate ref_rzz(theta) a,b { ref_cx a,b; ref_u1(theta) b; ref_cx a,b; }
)";

}  // namespace whittle::test
