// The umbrella header of the installed library: the compile entry, the IR, reading programs, the report.
#pragma once

#include "compiler/compile.h"

#include "ir/angle.h"
#include "ir/circuit.h"
#include "ir/error.h"
#include "ir/printer.h"
#include "ir/resources.h"
#include "ir/target.h"

#include "frontend/diagnostics.h"
#include "frontend/load.h"

#include "passes/pass.h"
#include "passes/pipeline.h"

#include "output/report.h"
