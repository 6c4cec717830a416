// SPDX-License-Identifier: MIT
#include "app/slatewise/runheadlines.h"

#include "app/slatewise/args.h"
#include "app/slatewise/reporting.h"
#include "core/evaluationservice.h"
#include "core/workspace.h"

#include <cstdio>

namespace slatewise::cli {

namespace {
void printHeadline(const core::RunEvaluation& e)
{
    std::printf("  %-10s", e.runName.c_str());
    if (e.accuracy)
        std::printf("  RMSE %.4f  MAE %.4f", e.accuracy->rmse, e.accuracy->mae);
    if (e.ranking)
        std::printf("  precision@%d %.4f  recall %.4f  NDCG %.4f", e.settings.k, e.ranking->precision,
            e.ranking->recall, e.ranking->ndcg);
    if (e.beyond)
        std::printf("  ild %.3f  coverage %.3f", e.beyond->ild, e.beyond->coverage);
    std::printf("\n");
}
} // namespace

/// Evaluates the named runs with the default settings, stores the results (so `evaluate`,
/// `compare` and the workbench find them) and prints one headline line each. Shared with
/// `rerank`, which shows the derived run beside its parent.
int printRunHeadlines(core::Workspace& ws, const std::vector<std::string>& names, const core::Progress& progress)
{
    const core::EvalSettings settings;
    auto result = core::evaluateRuns(ws, names, settings, progress);
    if (!result)
        return printErrors("evaluate", result.errors());
    std::printf("evaluation (k = %d, relevant at %.1f; stored in the workspace):\n", settings.k, settings.relevantAt);
    for (const auto& e : result->evaluations)
        printHeadline(e);
    return ExitOk;
}

} // namespace slatewise::cli
