OPENQASM 2.0;
include "qelib1.inc";
qreg q[3];
creg m[1];
h q[0];
cx q[0],q[1];
measure q[1] -> m[0];
if(m==1) x q[2];
barrier q;
