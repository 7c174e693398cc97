// Uses the installed library through its umbrella header: builds a Toffoli, prints its report, then compiles it.
#include <iostream>

#include <whittle/whittle.h>

int main() {
    using namespace whittle;
    ir::Circuit c;
    uint32_t q = c.add_register("q", 3, ir::Role::Data);
    c.ops.push_back(ir::Op::x(q + 2, {ir::Lit::pos(q), ir::Lit::pos(q + 1)}));
    c.ops.push_back(ir::Op::phase(ir::Angle::pi_times(1, 4), {ir::Lit::pos(q)}));
    std::cout << lowering::count_json(c, "consumer").dump() << "\n";
    std::cout << "stdlib " << frontend::stdlib_dir() << "\n";
    compiler::CompileOptions o;
    o.target = ir::Target::CliffordT;
    o.report = true;
    o.input_name = "consumer";
    const compiler::CompileResult r = compiler::compile(c, o);
    if (r.status != compiler::CompileStatus::Ok) return 1;
    std::cout << r.report.dump() << "\n";
    return 0;
}
