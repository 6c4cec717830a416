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
        "import",
        "WORKSPACE --catalog F --train F --test F [options]",
        "Creates a workspace (one SQLite file) from a catalog, train interactions and withheld\n"
        "interactions (see docs/formats.md). Nothing is written unless every row is valid; an\n"
        "existing workspace is only replaced with --replace, and only once the import succeeded.",
        1,
        {
            { "catalog", "F", "catalog file: item_id,title,year,genres,series,series_part" },
            { "train", "F", "train interactions: user_id,item_id,rating,timestamp" },
            { "test", "F", "withheld interactions, same columns as --train" },
            { "withheld", "F", "the same as --test" },
            { "scale", "MIN:MAX:STEP", "rating scale, e.g. 1:5:1 (STEP 0 = continuous); inferred when absent" },
            { "delimiter", "C", "field delimiter: ',' or 'tab' (default: by extension, .tsv = tab)" },
            { "replace", "", "overwrite an existing workspace" },
            { "strict", "", "treat leakage (withheld pairs also in train) as an error" },
            { "allow-unknown-items", "", "add unknown item ids to the catalog instead of failing" },
            { "quiet", "", "no progress output" },
        },
    };
    return s;
}
} // namespace

int importCommand(const std::vector<std::string>& argv)
{
    int exitCode = ExitOk;
    auto args = parseOrExit(spec(), argv, exitCode);
    if (!args)
        return exitCode;
    core::ImportRequest request;
    request.workspacePath = args->positionals()[0];
    request.catalogPath = args->value("catalog");
    request.trainPath = args->value("train");
    request.withheldPath = args->has("test") ? args->value("test") : args->value("withheld");
    std::string usage;
    if (request.catalogPath.empty() || request.trainPath.empty() || request.withheldPath.empty())
        usage = "--catalog, --train and --test are required";
    if (args->has("test") && args->has("withheld"))
        usage = "give the withheld file once, with --test or --withheld";
    if (args->has("scale")) {
        request.scale = core::parseScale(args->value("scale"));
        if (!request.scale)
            usage = "--scale expects MIN:MAX:STEP with MIN < MAX and 0 <= STEP <= MAX - MIN, got '"
                + args->value("scale") + "'";
    }
    if (auto d = parseDelimiter(*args, usage))
        request.options.delimiter = *d;
    if (!usage.empty())
        return usageFailure(spec().name, usage);
    request.replace = args->has("replace");
    request.options.strict = args->has("strict");
    request.options.allowUnknownItems = args->has("allow-unknown-items");

    CliProgress progress(args->has("quiet"));
    auto result = core::importWorkspace(request, progress.progress());
    progress.finish();
    if (!result)
        return printErrors(spec().name, result.errors());
    const core::ImportReport& r = result.value();
    printNotes(r.notes);
    std::cout << "created " << request.workspacePath << "\n"
              << "  items     " << r.items << " (" << r.genres << " genres, " << r.series << " series)\n"
              << "  users     " << r.users << "\n"
              << "  train     " << r.trainRows << " rows\n"
              << "  withheld  " << r.withheldRows << " rows\n"
              << "  scale     " << scaleDescription(r.scale) << "\n";
    if (r.leakedPairs > 0)
        std::cout << "  leakage   " << r.leakedPairs << " withheld pair(s) also in train\n";
    const double rows = static_cast<double>(r.trainRows + r.withheldRows);
    std::cout << "  took      " << formatSeconds(r.seconds) << " ("
              << static_cast<long long>(r.seconds > 0 ? rows / r.seconds : 0) << " rows/s)\n";
    return ExitOk;
}

} // namespace slatewise::cli
