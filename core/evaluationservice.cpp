// SPDX-License-Identifier: MIT
#include "core/evaluationservice.h"

#include "core/evaluationstore.h"
#include "core/evaluator.h"
#include "core/workspace.h"

#include <optional>

namespace slatewise::core {

Result<EvaluateRunsResult> evaluateRuns(Workspace& workspace, const std::vector<std::string>& runNames,
                                        const EvalSettings& settings, const Progress& progress, bool recompute)
{
    std::vector<RunInfo> runs;
    if (runNames.empty()) {
        auto all = workspace.runs();
        if (!all)
            return all.errors();
        runs = std::move(all.value());
    } else {
        for (const auto& name : runNames) {
            auto info = workspace.run(name);
            if (!info)
                return info.errors();
            runs.push_back(std::move(info.value()));
        }
    }

    EvaluateRunsResult out;
    out.evaluations.resize(runs.size());
    out.computed.assign(runs.size(), false);
    std::vector<std::size_t> missing;
    for (std::size_t i = 0; i < runs.size(); ++i) {
        if (!recompute) {
            auto stored = EvaluationStore::load(workspace.db(), runs[i].id, settings);
            if (!stored)
                return stored.errors();
            if (stored.value()) {
                out.evaluations[i] = std::move(*stored.value());
                out.evaluations[i].runName = runs[i].name; // a renamed run keeps its id
                continue;
            }
        }
        missing.push_back(i);
    }
    if (missing.empty())
        return out;

    progress(0.0, "loading the dataset");
    auto data = workspace.loadDataset();
    if (!data)
        return data.errors();
    if (progress.cancelled())
        return Error{ErrorKind::Cancelled, {}, 0, 0, {}, "evaluation cancelled", {}};
    const DatasetStats stats = computeStats(data.value());

    // Each run gets an equal share of the progress bar; loading a run is a tenth of it.
    const double share = 1.0 / static_cast<double>(missing.size());
    for (std::size_t m = 0; m < missing.size(); ++m) {
        const std::size_t i = missing[m];
        const double base = share * static_cast<double>(m);
        const std::string stagePrefix = "run '" + runs[i].name + "': ";
        progress(base, stagePrefix + "loading");
        auto run = workspace.loadRun(runs[i].name, data.value());
        if (!run)
            return run.errors();
        Progress inner;
        inner.cancel = progress.cancel;
        if (progress.report)
            inner.report = [&progress, base, share, &stagePrefix](double f, std::string_view stage) {
                progress(base + share * (0.1 + 0.85 * f), stagePrefix + std::string(stage));
            };
        auto eval = evaluateRun(data.value(), stats, run.value(), settings, inner);
        if (!eval)
            return eval.errors();
        progress(base + share * 0.95, stagePrefix + "storing");
        auto stored = EvaluationStore::store(workspace.db(), eval.value());
        if (!stored)
            return stored.errors();
        out.evaluations[i] = std::move(eval.value());
        out.computed[i] = true;
    }
    progress(1.0, "done");
    return out;
}

} // namespace slatewise::core
