// SPDX-License-Identifier: MIT
#pragma once

#include "core/dataset.h"
#include "core/error.h"
#include "core/evalsettings.h"
#include "core/evaluation.h"
#include "core/progress.h"
#include "core/run.h"

namespace slatewise::core {

/// Evaluates one run: accuracy, bands, ranking, curves, bootstrap intervals, then the
/// beyond-accuracy measures and warnings (computeBeyond). Pure: reads only its arguments.
/// Parallel over users. Returns ErrorKind::Cancelled when progress.cancel is raised.
Result<RunEvaluation> evaluateRun(const Dataset& data, const DatasetStats& stats, const RunData& run,
                                  const EvalSettings& settings, const Progress& progress = {});

} // namespace slatewise::core
