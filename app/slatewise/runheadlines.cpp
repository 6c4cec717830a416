// SPDX-License-Identifier: MIT
#include "app/slatewise/runheadlines.h"

#include "app/slatewise/args.h"
#include "app/slatewise/reporting.h"

#include "core/evaluator.h"
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

/// Evaluates the named runs (k = 10, no bootstrap) and prints one headline line each.
/// Shared with `rerank`, which shows the derived run beside its parent.
int printRunHeadlines(core::Workspace& ws, const std::vector<std::string>& names, const core::Progress& progress)
{
    auto data = ws.loadDataset();
    if (!data)
        return printErrors("evaluate", data.errors());
    const core::DatasetStats stats = core::computeStats(data.value());
    core::EvalSettings settings;
    settings.bootstrap = 0;
    std::printf("evaluation (k = %d, relevant at %.1f):\n", settings.k, settings.relevantAt);
    for (const auto& name : names) {
        auto run = ws.loadRun(name, data.value());
        if (!run)
            return printErrors("evaluate", run.errors());
        auto e = core::evaluateRun(data.value(), stats, run.value(), settings, progress);
        if (!e)
            return printErrors("evaluate", e.errors());
        e->runName = name;
        printHeadline(e.value());
    }
    return ExitOk;
}

} // namespace slatewise::cli
