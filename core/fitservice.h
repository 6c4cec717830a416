// SPDX-License-Identifier: MIT
#pragma once

#include "core/error.h"
#include "core/modelsettings.h"
#include "core/progress.h"
#include "core/reranksettings.h"
#include "core/run.h"

#include <string>
#include <vector>

namespace slatewise::core {

class Workspace;

/// What to fit and where to keep it; used by `slatewise fit` and the GUI's fit dialog.
struct FitRequest {
    std::string name;                ///< name of the new run
    ModelSettings settings;
    bool replace = false;            ///< replace an existing run of that name
    bool keepParameters = false;     ///< return the fitted parameters as JSON
    IterationCallback onIteration;   ///< called after each iteration (live loss chart)
};

struct FitOutcome {
    RunInfo info;                    ///< as stored (id, name, kind, method, settings, counts)
    std::vector<FitIteration> log;   ///< also stored in the fit_log table
    std::string parametersJson;      ///< when keepParameters: parameters plus "user_ids"/"item_ids"
    double seconds = 0.0;            ///< fitting time (without loading and storing)
};

/// What to re-rank and where to keep it; used by `slatewise rerank` and the GUI.
struct RerankRequest {
    std::string parentName;
    std::string name;
    RerankSettings settings;
    bool replace = false;
};

/// Loads the dataset, fits, and stores the run (Workspace::storeRun) and its per-iteration
/// log (fit_log). A name already taken is a usage error unless `replace`. Cancelling
/// (ErrorKind::Cancelled) or any error stores nothing.
Result<FitOutcome> fitAndStore(Workspace& workspace, const FitRequest& request, const Progress& progress = {});

/// Loads the dataset and the parent run, re-ranks and stores the derived run.
Result<RunInfo> rerankAndStore(Workspace& workspace, const RerankRequest& request, const Progress& progress = {});

} // namespace slatewise::core
