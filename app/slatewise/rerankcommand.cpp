// SPDX-License-Identifier: MIT
#include "app/slatewise/args.h"
#include "app/slatewise/cliprogress.h"
#include "app/slatewise/commands.h"
#include "app/slatewise/reporting.h"
#include "app/slatewise/runheadlines.h"
#include "core/fitservice.h"
#include "core/workspace.h"

#include <cstdio>
#include <iostream>

namespace slatewise::cli {

namespace {
const CommandSpec& spec()
{
    static const CommandSpec s {
        "rerank",
        "WORKSPACE --run NAME --method mmr|series-order|burst-damp --name NEW [--lambda X]",
        "Re-ranks every list of a run and stores the result as a derived run that records its\n"
        "parent, method and settings and keeps the parent's scores. mmr trades relevance for\n"
        "genre diversity (λ = 1 keeps the order); series-order puts first parts before sequels;\n"
        "burst-damp moves items of a recent-binge genre down toward the user's long-term taste.\n"
        "Both runs are then evaluated (k = 10; stored) and printed side by side. See docs/models.md.",
        1,
        {
            { .name = "run", .valueName = "NAME", .help = "the parent run", .required = true },
            { .name = "method", .valueName = "METHOD", .help = "mmr, series-order or burst-damp", .required = true },
            { .name = "name", .valueName = "NEW", .help = "name of the derived run", .required = true },
            { "lambda", "X", "mmr: relevance weight 0..1 (default 0.5); burst-damp: damping 0..1 (default 1)" },
            { "no-evaluate", "", "store the run without evaluating it" },
            { "replace", "", "replace an existing run of that name" },
            { "quiet", "", "no progress output" },
        },
    };
    return s;
}
} // namespace

int rerankCommand(const std::vector<std::string>& argv)
{
    int exitCode = ExitOk;
    auto args = parseOrExit(spec(), argv, exitCode);
    if (!args)
        return exitCode;
    const auto method = core::rerankMethodFromString(args->value("method"));
    if (!method)
        return usageFailure(
            spec().name, "unknown method '" + args->value("method") + "' (expected mmr, series-order or burst-damp)");
    core::RerankRequest request;
    request.parentName = args->value("run");
    request.name = args->value("name");
    request.replace = args->has("replace");
    request.settings = core::RerankSettings::defaults(*method);
    std::string error;
    const auto lambda = args->number("lambda", request.settings.lambda, error);
    if (!error.empty())
        return usageFailure(spec().name, error);
    request.settings.lambda = *lambda;

    const std::string path = args->positionals()[0];
    auto ws = core::Workspace::open(path);
    if (!ws)
        return printErrors(spec().name, ws.errors());
    CliProgress progress(args->has("quiet"));
    auto info = core::rerankAndStore(ws.value(), request, progress.progress());
    progress.finish();
    if (!info)
        return printErrors(spec().name, info.errors());
    std::printf("stored run '%s' (%s of '%s', %s): %lld list rows for %lld users\n", info->name.c_str(),
        info->method.c_str(), info->parentName.c_str(), info->settingsJson.c_str(),
        static_cast<long long>(info->listRowCount), static_cast<long long>(info->listUserCount));
    if (args->has("no-evaluate"))
        return ExitOk;
    const int rc = printRunHeadlines(ws.value(), { request.parentName, request.name }, progress.progress());
    progress.finish();
    return rc;
}

} // namespace slatewise::cli
