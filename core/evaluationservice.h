// SPDX-License-Identifier: MIT
#pragma once

#include "core/error.h"
#include "core/evalsettings.h"
#include "core/evaluation.h"
#include "core/progress.h"

#include <string>
#include <vector>

namespace slatewise::core {

class Workspace;

/// What evaluateRuns() did for each run, for the caller to report.
struct EvaluateRunsResult {
    std::vector<RunEvaluation> evaluations; ///< in the order of the requested runs
    std::vector<bool> computed;             ///< per evaluation: true when computed now, false when loaded
};

/// The one entry point the command line and the GUI share: the evaluations of `runNames`
/// (empty = every run, in run order) under `settings`. Stored results for the same run and
/// settings are loaded; the rest are computed (the dataset is loaded once) and stored.
/// `recompute` ignores stored results. Unknown run names are usage errors; cancelling
/// stores nothing further and returns ErrorKind::Cancelled.
Result<EvaluateRunsResult> evaluateRuns(Workspace& workspace, const std::vector<std::string>& runNames,
                                        const EvalSettings& settings, const Progress& progress = {},
                                        bool recompute = false);

} // namespace slatewise::core
