// SPDX-License-Identifier: MIT
#include "app/slatewise/args.h"
#include "app/slatewise/cliprogress.h"
#include "app/slatewise/commands.h"
#include "app/slatewise/reporting.h"
#include "core/importer.h"

#include <iostream>

namespace slatewise::cli {

namespace {
const CommandSpec& spec()
{
    static const CommandSpec s {
        "add-run",
        "WORKSPACE --name NAME [--scores F] [--lists F] [options]",
        "Adds a model run to a workspace: predicted scores (user_id,item_id,score) and/or ranked\n"
        "lists (user_id,rank,item_id[,score]). One transaction: on any error the workspace is\n"
        "unchanged.",
        1,
        {
            { "name", "NAME", "name of the run (must be new unless --replace)" },
            { "scores", "F", "scores file: user_id,item_id,score" },
            { "lists", "F", "lists file: user_id,rank,item_id[,score] (rank 1 = top)" },
            { "replace", "", "replace an existing run of the same name" },
            { "delimiter", "C", "field delimiter: ',' or 'tab' (default: by extension, .tsv = tab)" },
            { "allow-unknown-items", "", "add unknown item ids to the catalog instead of failing" },
            { "quiet", "", "no progress output" },
        },
    };
    return s;
}
} // namespace

int addRunCommand(const std::vector<std::string>& argv)
{
    int exitCode = ExitOk;
    auto args = parseOrExit(spec(), argv, exitCode);
    if (!args)
        return exitCode;
    core::AddRunRequest request;
    request.workspacePath = args->positionals()[0];
    request.name = args->value("name");
    request.scoresPath = args->value("scores");
    request.listsPath = args->value("lists");
    request.replace = args->has("replace");
    request.options.allowUnknownItems = args->has("allow-unknown-items");
    std::string usage;
    if (!args->has("name"))
        usage = "--name is required";
    else if (request.scoresPath.empty() && request.listsPath.empty())
        usage = "give --scores, --lists or both";
    if (auto d = parseDelimiter(*args, usage))
        request.options.delimiter = *d;
    if (!usage.empty())
        return usageFailure(spec().name, usage);

    CliProgress progress(args->has("quiet"));
    auto result = core::addRun(request, progress.progress());
    progress.finish();
    if (!result)
        return printErrors(spec().name, result.errors());
    const core::AddRunReport& r = result.value();
    printNotes(r.notes);
    std::cout << (r.replaced ? "replaced run '" : "added run '") << request.name << "' to " << request.workspacePath
              << "\n";
    if (!request.scoresPath.empty())
        std::cout << "  scores    " << r.scoreRows << " rows (" << r.scoresOutsideWithheld
                  << " outside the withheld pairs, " << r.withheldWithoutScore << " withheld pairs without a score)\n";
    if (!request.listsPath.empty())
        std::cout << "  lists     " << r.listRows << " rows for " << r.listUsers << " users\n";
    std::cout << "  took      " << formatSeconds(r.seconds) << "\n";
    return ExitOk;
}

} // namespace slatewise::cli
