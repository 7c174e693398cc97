// Toffoli/CCZ forms as Clifford+T op lists (T = Phase(pi/4) on one wire, CNOT = X with one control).
#include "lowering/toffoli_forms.h"

namespace whittle::lowering {
namespace {

using ir::Angle;
using ir::Lit;

void t(OpSink& s, uint32_t w, bool dagger = false) { s.phase(Angle::pi_times(dagger ? -1 : 1, 4), {Lit::pos(w)}); }
void cx(OpSink& s, uint32_t c, uint32_t w) { s.cx(Lit::pos(c), w); }

}  // namespace

void ccz_7t(OpSink& s, uint32_t a, uint32_t b, uint32_t c) {
    // e^{i pi abc} = e^{i pi/4 (a + b + c - a^b - a^c - b^c + a^b^c)}.
    cx(s, b, c);
    t(s, c, true);
    cx(s, a, c);
    t(s, c);
    cx(s, b, c);
    t(s, c, true);
    cx(s, a, c);
    t(s, b);
    t(s, c);
    cx(s, a, b);
    t(s, a);
    t(s, b, true);
    cx(s, a, b);
}

void toffoli_7t(OpSink& s, uint32_t a, uint32_t b, uint32_t tw) {
    s.h(tw);
    ccz_7t(s, a, b, tw);
    s.h(tw);
}

void ccz_tdepth3(OpSink& s, uint32_t a, uint32_t b, uint32_t c) {
    t(s, a);
    t(s, b);
    t(s, c);
    cx(s, a, b);  // b = a^b
    cx(s, a, c);  // c = a^c
    cx(s, b, a);  // a = b
    cx(s, c, a);  // a = a^b^c
    t(s, a);
    t(s, b, true);
    t(s, c, true);
    cx(s, b, c);  // c = b^c
    t(s, c, true);
    cx(s, c, a);  // a = a
    cx(s, a, b);  // b = b
    cx(s, b, c);  // c = c
}

void toffoli_tdepth3(OpSink& s, uint32_t a, uint32_t b, uint32_t tw) {
    s.h(tw);
    ccz_tdepth3(s, a, b, tw);
    s.h(tw);
}

void toffoli_relative_phase(OpSink& s, uint32_t a, uint32_t b, uint32_t tw, bool inverse) {
    // H t; T t; CX(b,t); Tdg t; CX(a,t); T t; CX(b,t); Tdg t; H t. Phases on t, t^b, t^a^b, t^a.
    // The sequence reversed and daggered is itself, so the form is its own inverse (then D = D^dagger
    // up to the Toffoli: CZ(a,t) Tof CS^dagger(a,b) squared is CZ(a,b) CS^dagger(a,b)^2 = I).
    (void)inverse;
    s.h(tw);
    t(s, tw);
    cx(s, b, tw);
    t(s, tw, true);
    cx(s, a, tw);
    t(s, tw);
    cx(s, b, tw);
    t(s, tw, true);
    s.h(tw);
}

void temporary_and(OpSink& s, uint32_t a, uint32_t b, uint32_t tw) {
    // t = |+>, phases e^{i pi/4 (t - t^a + t^a^b - t^b)} = CCZ * CS^dagger(a,b); after H, t = a&b and
    // S on t undoes CS^dagger.
    s.h(tw);
    t(s, tw);
    cx(s, a, tw);
    t(s, tw, true);
    cx(s, b, tw);
    t(s, tw);
    cx(s, a, tw);
    t(s, tw, true);
    cx(s, b, tw);
    s.h(tw);
    s.phase(Angle::pi_times(1, 2), {Lit::pos(tw)});
}

void measured_erase(OpSink& s, uint32_t a, uint32_t b, uint32_t tw, int32_t creg, int32_t cbit) {
    s.h(tw);
    s.push(ir::Op::measure(tw, cbit));
    ir::Op cz = ir::Op::phase(Angle::pi_times(1), {Lit::pos(a), Lit::pos(b)});
    ir::Op flip = ir::Op::x(tw);
    // The fix-ups run on outcome 1 only: the sink copies the source's condition, so set ours after.
    std::vector<ir::Op>& out = s.out();
    s.push(cz);
    s.push(flip);
    for (size_t i = out.size() - 2; i < out.size(); ++i) {
        out[i].set_condition(creg, 1);
    }
}

}  // namespace whittle::lowering
