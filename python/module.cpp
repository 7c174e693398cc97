// The Python module: load, compile, count, export and draw circuits from a notebook or a script.
#include <pybind11/pybind11.h>
#include <pybind11/stl.h>

#include <filesystem>
#include <fstream>
#include <memory>
#include <sstream>

#include <fmt/format.h>

#include "frontend/diagnostics.h"
#include "frontend/load.h"
#include "ir/printer.h"
#include "ir/resources.h"
#include "output/draw.h"
#include "output/emit_qasm.h"
#include "output/report.h"
#include "compiler/compile.h"
// whittle.equiv is bound when the equivalence checker is part of the library.
#if __has_include("verify/equivalence.h")
#include "verify/equivalence.h"
#define WHITTLE_PY_HAS_EQUIV 1
#endif

namespace py = pybind11;
using namespace whittle;

namespace {

/// Raised to Python as whittle.Error, carrying the located message (file:line:column, line, caret).
class PyError : public std::runtime_error {
public:
    using std::runtime_error::runtime_error;
};

/// A circuit with the sources it was read from (so later errors can still show the offending line)
/// and, once compiled, what the compile did.
struct PyCircuit {
    std::shared_ptr<frontend::SourceManager> sources;
    ir::Circuit circuit;
    std::string name;
    bool compiled = false;
    lowering::Json report;  ///< once compiled: the compile report (count() returns it)
};

template <class F>
auto located(const frontend::SourceManager& sm, F&& body) -> decltype(body()) {
    try {
        return body();
    } catch (const UserError& e) {
        std::string msg = frontend::format_error(e, sm);
        while (!msg.empty() && msg.back() == '\n') msg.pop_back();
        throw PyError(msg);
    }
}

frontend::InputFormat parse_format(const std::string& f) {
    if (f == "wq") return frontend::InputFormat::Wq;
    if (f == "qasm" || f == "qasm2") return frontend::InputFormat::Qasm2;
    throw PyError(fmt::format("format must be 'wq' or 'qasm', not '{}'", f));
}

PyCircuit load(const std::string& path_or_text, const std::optional<std::string>& format,
               const std::vector<std::string>& include) {
    PyCircuit pc;
    pc.sources = std::make_shared<frontend::SourceManager>();
    frontend::LoadOptions lo;
    lo.include_dirs = include;
    std::error_code ec;
    const bool is_path = path_or_text.find('\n') == std::string::npos && std::filesystem::is_regular_file(path_or_text, ec);
    pc.circuit = located(*pc.sources, [&] {
        if (!is_path)
            return frontend::load_text(path_or_text, "<text>", parse_format(format.value_or("wq")), *pc.sources, lo);
        if (!format) return frontend::load_file(path_or_text, *pc.sources, lo);
        std::ifstream in(path_or_text, std::ios::binary);
        std::ostringstream ss;
        ss << in.rdbuf();
        return frontend::load_text(ss.str(), path_or_text, parse_format(*format), *pc.sources, lo);
    });
    pc.name = is_path ? path_or_text : "<text>";
    return pc;
}

ir::Metric parse_metric(const std::string& s) {
    try {
        return ir::parse_metric(s, "optimize_for");
    } catch (const UserError&) {
        throw PyError(fmt::format("optimize_for must be 't', '2q' or 'depth', not '{}'", s));
    }
}

PyCircuit compile(const PyCircuit& in, const std::string& target, int level, bool allow_measurement,
                  const std::string& optimize_for, const std::optional<std::string>& pass_list, double epsilon,
                  uint32_t extra_ancillas, uint32_t gadget_wires, std::optional<double> total_error,
                  std::optional<uint32_t> qubit_limit, uint32_t rewrite_effort, uint32_t resynth_effort) {
    if (level < 0 || level > 3) throw PyError(fmt::format("level must be 0, 1, 2 or 3, not {}", level));
    compiler::CompileOptions o;
    o.level = level;
    o.allow_measurement = allow_measurement;
    o.optimize_for = parse_metric(optimize_for);
    o.epsilon = epsilon;
    o.total_error = total_error;
    o.qubit_limit = qubit_limit;
    o.extra_ancillas = extra_ancillas;
    o.gadget_wires = gadget_wires;
    o.rewrite_effort = rewrite_effort;
    o.resynth_effort = resynth_effort;
    o.passes = pass_list.value_or("");
    o.check = false;
    o.report = true;  // count() returns it
    o.input_name = in.name;
    PyCircuit out;
    out.sources = in.sources;
    out.name = in.name;
    out.compiled = true;
    located(*in.sources, [&] {
        o.target = ir::parse_optional_target(target);
        py::gil_scoped_release release;
        compiler::CompileResult r = compiler::compile(in.circuit, o);
        out.circuit = std::move(r.circuit);
        out.report = std::move(r.report);
    });
    return out;
}

py::object to_python(const lowering::Json& j) { return py::module_::import("json").attr("loads")(j.dump()); }

py::object count(const PyCircuit& pc) {
    if (!pc.compiled) return to_python(lowering::count_json(pc.circuit, pc.name));
    return to_python(pc.report);
}

#ifdef WHITTLE_PY_HAS_EQUIV
py::dict equiv(const PyCircuit& a, const PyCircuit& b, double time_budget, bool probabilistic, uint64_t seed) {
    passes::EquivOptions o;
    o.time_budget_seconds = time_budget;
    o.allow_probabilistic = probabilistic;
    o.seed = seed;
    passes::EquivResult r = located(*a.sources, [&] {
        py::gil_scoped_release release;
        return passes::check_equivalence(a.circuit, b.circuit, o);
    });
    py::dict d;
    d["equivalent"] = r.verdict == passes::Verdict::Equivalent;
    d["verdict"] = passes::verdict_name(r.verdict);
    d["engine"] = r.engine;
    d["confidence"] = r.confidence;
    d["counterexample"] = r.counterexample;
    d["detail"] = r.detail;
    return d;
}
#endif

}  // namespace

PYBIND11_MODULE(whittle, m) {
    m.doc() = "whittle: compile high-level quantum circuits (.wq, OpenQASM 2.0) into a native gate set, "
              "count their resources and export them";
    py::register_exception<PyError>(m, "Error");

    py::class_<PyCircuit>(m, "Circuit", "a circuit read by whittle.load, or the result of Circuit.compile")
        .def("compile", &compile, py::arg("target") = "clifford+t", py::arg("level") = 2,
             py::arg("allow_measurement") = false, py::arg("optimize_for") = "t", py::arg("passes") = py::none(),
             py::arg("epsilon") = 1e-10, py::arg("extra_ancillas") = 0, py::arg("gadget_wires") = 0,
             py::arg("total_error") = py::none(), py::arg("qubit_limit") = py::none(), py::arg("rewrite_effort") = 1,
             py::arg("resynth_effort") = 0,
             "optimize and lower into a native gate set; returns a new Circuit (this one is unchanged)")
        .def("count", &count,
             "the JSON report as a dict (docs/report-schema.md): resources, plus passes and options after compile")
        .def(
            "to_qasm",
            [](const PyCircuit& pc, int version) {
                if (version != 2 && version != 3) throw PyError(fmt::format("version must be 2 or 3, not {}", version));
                return located(*pc.sources, [&] {
                    return version == 2 ? lowering::emit_qasm2(pc.circuit) : lowering::emit_qasm3(pc.circuit);
                });
            },
            py::arg("version") = 2, "OpenQASM 2.0 or 3.0 text")
        .def(
            "to_wq", [](const PyCircuit& pc) { return located(*pc.sources, [&] { return ir::print_wq(pc.circuit); }); },
            "the circuit as a .wq program")
        .def(
            "draw",
            [](const PyCircuit& pc, const std::string& format, unsigned width, bool ascii) {
                lowering::DrawOptions o;
                o.width = width;
                o.ascii = ascii;
                std::vector<lowering::DrawPanel> panels{{&pc.circuit, pc.name}};
                if (format == "svg") return lowering::draw_svg(panels, o);
                if (format == "text") return lowering::draw_text(panels, o);
                throw PyError(fmt::format("format must be 'text' or 'svg', not '{}'", format));
            },
            py::arg("format") = "text", py::arg("width") = 24, py::arg("ascii") = false, "a diagram as text or SVG")
        .def("_repr_svg_", [](const PyCircuit& pc) { return lowering::draw_svg({{&pc.circuit, pc.name}}, {}); })
        .def_property_readonly("num_qubits", [](const PyCircuit& pc) { return pc.circuit.num_qubits(); })
        .def_property_readonly("num_ops", [](const PyCircuit& pc) { return pc.circuit.ops.size(); })
        .def_property_readonly("name", [](const PyCircuit& pc) { return pc.name; })
        .def("__repr__", [](const PyCircuit& pc) {
            ir::Resources r = ir::count_resources(pc.circuit);
            return fmt::format("<whittle.Circuit {} qubits={} ops={} t_count={}{}>", pc.name, r.qubits, r.ops, r.t_count,
                               pc.compiled ? " compiled" : "");
        });

    m.def("load", &load, py::arg("path_or_text"), py::arg("format") = py::none(),
          py::arg("include") = std::vector<std::string>{},
          "read a program: a path to a .wq/.qasm file, or program text (when it has a newline or names no "
          "file); format='wq' or 'qasm' overrides the extension (text defaults to 'wq')");
#ifdef WHITTLE_PY_HAS_EQUIV
    m.def("equiv", &equiv, py::arg("a"), py::arg("b"), py::arg("time_budget") = 10.0, py::arg("probabilistic") = true,
          py::arg("seed") = 1,
          "are two circuits equivalent up to global phase? A dict: equivalent (bool), verdict ('equivalent', "
          "'not equivalent', 'inconclusive'), engine, confidence, counterexample, detail");
#endif
    m.attr("__version__") = "0.1.0";
}
