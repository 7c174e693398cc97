// The umbrella header of the installed library: the IR, reading programs, passes, lowering, reports.
#pragma once

#include "ir/angle.h"
#include "ir/circuit.h"
#include "ir/error.h"
#include "ir/printer.h"
#include "ir/resources.h"

#include "frontend/diagnostics.h"
#include "frontend/load.h"

#include "passes/pass.h"
#include "passes/pipeline.h"
#include "passes/registry.h"

#include "output/draw.h"
#include "output/emit_qasm.h"
#include "output/report.h"
