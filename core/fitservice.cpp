// SPDX-License-Identifier: MIT
#include "core/fitservice.h"

#include "core/modelfitter.h"
#include "core/runreranker.h"
#include "core/sqlitedb.h"
#include "core/workspace.h"

#include <nlohmann/json.hpp>

namespace slatewise::core {

namespace {

Error usage(std::string value, std::string message, std::string expected = {})
{
    Error e;
    e.kind = ErrorKind::Usage;
    e.value = std::move(value);
    e.message = std::move(message);
    e.expected = std::move(expected);
    return e;
}

/// Checks the name before any work, so a long fit is not wasted on a taken name.
Status checkName(const Workspace& workspace, const std::string& name, bool replace)
{
    if (name.empty())
        return usage(name, "the new run needs a name", "--name NAME");
    auto existing = workspace.run(name);
    if (existing.ok() && !replace)
        return usage(name, "a run with this name already exists", "a new name, or --replace");
    return Done{};
}

/// Deletes the run being replaced, then stores the new one.
Result<std::int64_t> store(Workspace& workspace, const RunData& run, const Dataset& data, bool replace)
{
    if (replace && workspace.run(run.info.name).ok()) {
        auto deleted = workspace.deleteRun(run.info.name);
        if (!deleted)
            return deleted.errors();
    }
    return workspace.storeRun(run, data);
}

} // namespace

Result<FitOutcome> fitAndStore(Workspace& workspace, const FitRequest& request, const Progress& progress)
{
    if (auto ok = checkName(workspace, request.name, request.replace); !ok)
        return ok.errors();
    if (auto errors = validate(request.settings); !errors.empty())
        return errors;
    progress(0.0, "loading the workspace");
    auto data = workspace.loadDataset();
    if (!data)
        return data.errors();
    auto fit = fitModel(data.value(), request.settings, progress, request.onIteration, request.keepParameters);
    if (!fit)
        return fit.errors();
    if (progress.cancelled())
        return Error{ErrorKind::Cancelled, {}, 0, 0, {}, "fitting was cancelled; nothing was stored", {}};
    FitResult& result = fit.value();
    result.run.info.name = request.name;
    progress(1.0, "storing the run");
    auto id = store(workspace, result.run, data.value(), request.replace);
    if (!id)
        return id.errors();
    try {
        Transaction tx(workspace.db());
        Statement ins(workspace.db(),
                      "INSERT INTO fit_log(run_id, iteration, train_rmse, withheld_rmse) VALUES(?,?,?,?)");
        for (const FitIteration& f : result.log) {
            ins.reset();
            ins.bind(1, id.value()).bind(2, f.iteration).bindOptional(3, f.trainRmse).bindOptional(4, f.withheldRmse);
            ins.run();
        }
        tx.commit();
    } catch (const SqliteError& e) {
        // The run without its log would look complete; take it out again.
        (void)workspace.deleteRun(request.name);
        return Error{ErrorKind::Workspace, workspace.path(), 0, 0, request.name,
                     std::string("cannot store the fit log: ") + e.what(), {}};
    }
    auto info = workspace.run(request.name);
    if (!info)
        return info.errors();
    FitOutcome outcome;
    outcome.info = info.value();
    outcome.log = std::move(result.log);
    outcome.seconds = result.seconds;
    if (request.keepParameters) {
        auto j = nlohmann::ordered_json::parse(result.parametersJson);
        j["user_ids"] = data->userIds;
        std::vector<std::string> items;
        items.reserve(data->itemCount());
        for (const Item& item : data->items)
            items.push_back(item.externalId);
        j["item_ids"] = std::move(items);
        outcome.parametersJson = j.dump();
    }
    return outcome;
}

Result<RunInfo> rerankAndStore(Workspace& workspace, const RerankRequest& request, const Progress& progress)
{
    if (request.name == request.parentName)
        return usage(request.name, "the re-ranked run needs a name of its own", "a name other than --run");
    if (auto ok = checkName(workspace, request.name, request.replace); !ok)
        return ok.errors();
    progress(0.0, "loading the workspace");
    auto data = workspace.loadDataset();
    if (!data)
        return data.errors();
    auto parent = workspace.loadRun(request.parentName, data.value());
    if (!parent)
        return parent.errors();
    auto run = rerankRun(data.value(), parent.value(), request.settings, progress);
    if (!run)
        return run.errors();
    run->info.name = request.name;
    progress(1.0, "storing the run");
    auto id = store(workspace, run.value(), data.value(), request.replace);
    if (!id)
        return id.errors();
    return workspace.run(request.name);
}

} // namespace slatewise::core
