// SPDX-License-Identifier: MIT
#include "app/slatewise/args.h"
#include "app/slatewise/commands.h"
#include "app/slatewise/reporting.h"
#include "core/workspace.h"

#include <iostream>
#include <nlohmann/json.hpp>

namespace slatewise::cli {

namespace {
const CommandSpec& spec()
{
    static const CommandSpec s {
        "info",
        "WORKSPACE [--json]",
        "Prints what a workspace holds: items, genres, series, users, train and withheld rows,\n"
        "the rating scale and every run with its counts.",
        1,
        {
            { "json", "", "print the same as one JSON object" },
        },
    };
    return s;
}
} // namespace

int infoCommand(const std::vector<std::string>& argv)
{
    int exitCode = ExitOk;
    auto args = parseOrExit(spec(), argv, exitCode);
    if (!args)
        return exitCode;
    const std::string path = args->positionals()[0];
    auto ws = core::Workspace::open(path, true);
    if (!ws && ws.error().message.find("must be migrated") != std::string::npos)
        ws = core::Workspace::open(path, false);
    if (!ws)
        return printErrors(spec().name, ws.errors());
    auto summary = ws->summary();
    if (!summary)
        return printErrors(spec().name, summary.errors());
    const core::WorkspaceSummary& s = summary.value();
    if (args->has("json")) {
        nlohmann::json runs = nlohmann::json::array();
        for (const auto& r : s.runs)
            runs.push_back(
                { { "name", r.name }, { "kind", std::string(core::toString(r.kind)) }, { "created_at", r.createdAt },
                    { "parent", r.parentName.empty() ? nlohmann::json() : nlohmann::json(r.parentName) },
                    { "method", r.method.empty() ? nlohmann::json() : nlohmann::json(r.method) },
                    { "scores", r.scoreCount }, { "list_rows", r.listRowCount }, { "list_users", r.listUserCount } });
        const nlohmann::json out { { "workspace", path }, { "schema_version", s.schemaVersion }, { "items", s.items },
            { "genres", s.genres }, { "series", s.series }, { "users", s.users }, { "train", s.trainRows },
            { "withheld", s.withheldRows },
            { "scale",
                { { "min", s.scale.min }, { "max", s.scale.max }, { "step", s.scale.step },
                    { "source", s.scale.inferred ? "inferred" : "given" } } },
            { "runs", runs } };
        std::cout << out.dump(2) << "\n";
        return ExitOk;
    }
    std::cout << "workspace " << path << " (schema version " << s.schemaVersion << ")\n"
              << "  items     " << s.items << "\n"
              << "  genres    " << s.genres << "\n"
              << "  series    " << s.series << "\n"
              << "  users     " << s.users << "\n"
              << "  train     " << s.trainRows << "\n"
              << "  withheld  " << s.withheldRows << "\n"
              << "  scale     " << scaleDescription(s.scale) << "\n"
              << "  runs      " << s.runs.size() << "\n";
    for (const auto& r : s.runs) {
        std::cout << "    " << r.name << " (" << core::toString(r.kind);
        if (!r.method.empty())
            std::cout << ", " << r.method;
        if (!r.parentName.empty())
            std::cout << ", from " << r.parentName;
        std::cout << "): scores " << r.scoreCount << ", list rows " << r.listRowCount << " for " << r.listUserCount
                  << " users, created " << r.createdAt << "\n";
    }
    return ExitOk;
}

} // namespace slatewise::cli
