// SPDX-License-Identifier: MIT
#include "app/slatewise/args.h"
#include "app/slatewise/cliprogress.h"
#include "app/slatewise/commands.h"
#include "app/slatewise/reporting.h"
#include "app/slatewise/runheadlines.h"
#include "core/fitservice.h"
#include "core/workspace.h"

#include <cstdio>
#include <fstream>
#include <iostream>

namespace slatewise::cli {

namespace {
const CommandSpec& spec()
{
    static const CommandSpec s {
        "fit",
        "WORKSPACE --model popular|mean|bias|itemknn|als --name NAME [options]",
        "Fits a reference model on the workspace's train rows and stores it as a run: a score\n"
        "for every withheld pair and a top-N list per user without seen items. The run is then\n"
        "evaluated with the default settings (k = 10), the evaluation stored, and its headline\n"
        "numbers printed. Models and their sources:\n"
        "docs/models.md. Fitting is seeded: the same settings give the same run.",
        1,
        {
            { .name = "model", .valueName = "MODEL", .help = "popular, mean, bias, itemknn or als", .required = true },
            { .name = "name", .valueName = "NAME", .help = "name of the new run", .required = true },
            { "rank", "R", "als: number of latent factors (default 32)" },
            { "lambda", "L",
                "als: weighted-λ regularization (default 0.05); bias/itemknn: λ of the item biases "
                "(default 25; user biases use 10)" },
            { "iterations", "N", "als: iterations (default 10); bias/itemknn: at most N bias sweeps (default 20)" },
            { "neighbours", "K", "itemknn: neighbours per prediction (default 40)" },
            { "shrinkage", "S", "itemknn: similarity shrinkage (default 100)" },
            { "seed", "S", "random seed (default 20261202)" },
            { "list-length", "N", "items per user list (default 100)" },
            { "no-clip", "", "do not clip predicted ratings into the rating scale" },
            { "dump-model", "FILE", "also write the fitted parameters as JSON (with user and item ids)" },
            { "no-evaluate", "", "store the run without evaluating it" },
            { "replace", "", "replace an existing run of that name" },
            { "quiet", "", "no progress output" },
        },
    };
    return s;
}

} // namespace

int fitCommand(const std::vector<std::string>& argv)
{
    int exitCode = ExitOk;
    auto args = parseOrExit(spec(), argv, exitCode);
    if (!args)
        return exitCode;
    const auto kind = core::modelKindFromString(args->value("model"));
    if (!kind)
        return usageFailure(
            spec().name, "unknown model '" + args->value("model") + "' (expected popular, mean, bias, itemknn or als)");
    core::FitRequest request;
    request.name = args->value("name");
    request.replace = args->has("replace");
    request.keepParameters = args->has("dump-model");
    core::ModelSettings& s = request.settings;
    s.kind = *kind;
    s.clipToScale = !args->has("no-clip");
    std::string error;
    const bool biasLike = s.kind == core::ModelKind::Bias || s.kind == core::ModelKind::ItemKnn;
    const auto rank = args->integer("rank", s.rank, error);
    const auto lambda = args->number("lambda", biasLike ? s.biasItemLambda : s.lambda, error);
    const auto iterations = args->integer("iterations", biasLike ? s.biasIterations : s.iterations, error);
    const auto neighbours = args->integer("neighbours", s.neighbours, error);
    const auto shrinkage = args->number("shrinkage", s.shrinkage, error);
    const auto seed = args->integer("seed", static_cast<long long>(s.seed), error);
    const auto listLength = args->integer("list-length", s.listLength, error);
    if (!error.empty())
        return usageFailure(spec().name, error);
    s.rank = static_cast<std::int32_t>(*rank);
    s.neighbours = static_cast<std::int32_t>(*neighbours);
    s.shrinkage = *shrinkage;
    s.seed = static_cast<std::uint64_t>(*seed);
    s.listLength = static_cast<std::int32_t>(*listLength);
    if (biasLike) {
        s.biasItemLambda = *lambda;
        s.biasIterations = static_cast<std::int32_t>(*iterations);
    } else {
        s.lambda = *lambda;
        s.iterations = static_cast<std::int32_t>(*iterations);
    }

    const std::string path = args->positionals()[0];
    auto ws = core::Workspace::open(path);
    if (!ws)
        return printErrors(spec().name, ws.errors());

    CliProgress progress(args->has("quiet"));
    request.onIteration = [&progress](const core::FitIteration& f) {
        progress.finish();
        std::printf("iteration %d/%d  train RMSE %.4f  withheld RMSE %.4f  (%s)\n", f.iteration, f.iterations,
            f.trainRmse, f.withheldRmse, formatSeconds(f.seconds).c_str());
        std::fflush(stdout);
    };
    auto outcome = core::fitAndStore(ws.value(), request, progress.progress());
    progress.finish();
    if (!outcome)
        return printErrors(spec().name, outcome.errors());
    const core::RunInfo& info = outcome->info;
    std::printf("stored run '%s' (%s, %s): %lld scores, %lld list rows for %lld users, fitted in %s\n",
        info.name.c_str(), info.method.c_str(), info.settingsJson.c_str(), static_cast<long long>(info.scoreCount),
        static_cast<long long>(info.listRowCount), static_cast<long long>(info.listUserCount),
        formatSeconds(outcome->seconds).c_str());
    if (args->has("dump-model")) {
        std::ofstream out(args->value("dump-model"), std::ios::binary);
        out << outcome->parametersJson << "\n";
        if (!out)
            return printErrors(spec().name,
                { core::Error { core::ErrorKind::Usage, args->value("dump-model"), 0, 0, {},
                    "cannot write the model parameters", "a writable file" } });
    }
    if (args->has("no-evaluate"))
        return ExitOk;
    const int rc = printRunHeadlines(ws.value(), { info.name }, progress.progress());
    progress.finish();
    return rc;
}

} // namespace slatewise::cli
