// SPDX-License-Identifier: MIT
#pragma once

#include "core/dataset.h"
#include "core/evalsettings.h"
#include "core/evaluation.h"
#include "core/run.h"

namespace slatewise::core {

/// Beyond-accuracy measures and per-user warnings for one run.
///
/// Precondition: `eval.users` already holds one row per user with at least one withheld
/// item (ascending user index) with nWithheld, nRelevant and nTrain filled, and the
/// accuracy and ranking columns computed by the evaluator.
/// Fills: eval.beyond (when the run has lists), the Ild..SeenInList columns of eval.users,
/// eval.warnings (every warning code, sorted by user then code), eval.users.warningCount
/// and eval.warningShare. Parallel over users.
void computeBeyond(const Dataset& data, const DatasetStats& stats, const RunData& run, const EvalSettings& settings,
                   RunEvaluation& eval);

} // namespace slatewise::core
