// SPDX-License-Identifier: MIT
#pragma once

#include "core/dataset.h"
#include "core/error.h"
#include "core/modelsettings.h"
#include "core/progress.h"
#include "core/run.h"

#include <string>
#include <vector>

namespace slatewise::core {

/// A fitted model's run with what the fit reported.
struct FitResult {
    RunData run;                      ///< info.kind = Fitted, method and settingsJson set; name empty
    std::vector<FitIteration> log;    ///< one entry per iteration (bias, itemknn's baseline, als)
    std::string parametersJson;       ///< the fitted parameters, when asked for
    double seconds = 0.0;             ///< wall time of the whole fit
};

/// Fits settings.kind on data's train rows: scores for every withheld pair and a top-N list
/// per user without seen items. Pure (reads only its arguments), parallel, seeded and
/// reproducible. Returns ErrorKind::Cancelled when progress is cancelled, ErrorKind::Usage
/// for impossible settings.
Result<FitResult> fitModel(const Dataset& data, const ModelSettings& settings, const Progress& progress = {},
                           const IterationCallback& onIteration = {}, bool keepParameters = false);

/// Settings a person cannot ask for (rank < 1, negative λ, ...), as a usage error.
std::vector<Error> validate(const ModelSettings& settings);

} // namespace slatewise::core
