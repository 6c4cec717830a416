// SPDX-License-Identifier: MIT
#include "app/slatewise/args.h"
#include "app/slatewise/cliprogress.h"
#include "app/slatewise/commands.h"
#include "app/slatewise/evalsettingsargs.h"
#include "app/slatewise/reporting.h"
#include "core/evaluationservice.h"
#include "core/evaluationstore.h"
#include "core/workspace.h"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <iostream>
#include <numeric>
#include <sstream>

namespace slatewise::cli {

namespace {

const CommandSpec& spec()
{
    static const CommandSpec s = [] {
        CommandSpec c { "worst", "WORKSPACE --run NAME --by METRIC [--limit N] [--warning CODE]",
            "Lists the users a run serves worst on one per-user metric (lowest NDCG, highest RMSE, ...),\n"
            "worst first, with their withheld and train counts and warning codes. Users for whom the\n"
            "metric is not defined are left out and counted. Metrics where neither direction is better\n"
            "(mean_error, popularity_lift) are ordered by their size, largest first.",
            1,
            {
                { .name = "run", .valueName = "NAME", .help = "the run to look at", .required = true },
                { .name = "by",
                    .valueName = "METRIC",
                    .help = "per-user metric: rmse, mae, mean_error, precision, recall, ap (map), rr (mrr), "
                            "ndcg, ndcg_graded, heldout_topk, ild, novelty, popularity_lift, calibration_kl, "
                            "series_share, order_violations, burst_echo, seen_in_list",
                    .required = true },
                { "limit", "N", "how many users to list (default 20; 0 = all)" },
                { "warning", "CODE", "only users carrying this warning (e.g. sequel-first)" },
                { "quiet", "", "no progress line" },
            } };
        return withEvalSettingsOptions(std::move(c));
    }();
    return s;
}

std::string pad(std::string s, std::size_t width, bool right = false)
{
    if (s.size() >= width)
        return s;
    return right ? std::string(width - s.size(), ' ') + s : s + std::string(width - s.size(), ' ');
}

std::string knownWarnings()
{
    std::string out;
    for (const auto& w : core::allWarnings())
        out += (out.empty() ? "" : ", ") + std::string(w.key);
    return out;
}

} // namespace

int worstCommand(const std::vector<std::string>& argv)
{
    int exitCode = ExitOk;
    auto args = parseOrExit(spec(), argv, exitCode);
    if (!args)
        return exitCode;
    const auto metric = core::metricFromKey(args->value("by"));
    if (!metric)
        return usageFailure(spec().name,
            "unknown metric '" + args->value("by")
                + "'; expected one of: " + spec().options[1].help.substr(spec().options[1].help.find(':') + 2));
    std::optional<core::WarningCode> warning;
    if (args->has("warning")) {
        warning = core::warningFromKey(args->value("warning"));
        if (!warning)
            return usageFailure(spec().name,
                "unknown warning code '" + args->value("warning") + "'; expected one of: " + knownWarnings());
    }
    std::string usage;
    const auto limit = args->integer("limit", 20, usage);
    if (!limit || *limit < 0)
        return usageFailure(spec().name, usage.empty() ? "--limit must be 0 or more" : usage);
    auto settings = evalSettingsFromArgs(*args, usage);
    if (!settings)
        return usageFailure(spec().name, usage);

    auto ws = core::Workspace::open(args->positionals()[0]);
    if (!ws)
        return printErrors(spec().name, ws.errors());
    CliProgress progress(args->has("quiet"));
    auto result = core::evaluateRuns(ws.value(), { args->value("run") }, *settings, progress.progress());
    progress.finish();
    if (!result)
        return printErrors(spec().name, result.errors());
    auto ids = core::EvaluationStore::userIds(ws->db());
    if (!ids)
        return printErrors(spec().name, ids.errors());
    const core::RunEvaluation& e = result->evaluations.front();
    const core::UserResultTable& t = e.users;
    const auto& info = core::metricInfo(*metric);

    // Warning codes per table row (warnings are sorted by user, like the rows).
    std::vector<std::string> codes(t.size());
    std::vector<bool> carries(t.size(), !warning.has_value());
    {
        std::size_t r = 0;
        for (const auto& w : e.warnings) {
            while (r < t.size() && t.users[r] < w.user)
                ++r;
            if (r == t.size() || t.users[r] != w.user)
                continue;
            codes[r] += (codes[r].empty() ? "" : ",") + std::string(core::warningInfo(w.code).key);
            if (warning && w.code == *warning)
                carries[r] = true;
        }
    }

    std::vector<std::size_t> rows;
    std::size_t undefined = 0, filtered = 0;
    for (std::size_t r = 0; r < t.size(); ++r) {
        if (!carries[r]) {
            ++filtered;
            continue;
        }
        if (std::isnan(t.value(*metric, r)))
            ++undefined;
        else
            rows.push_back(r);
    }
    auto badness = [&](std::size_t r) {
        const double v = t.value(*metric, r);
        switch (info.better) {
        case core::Better::Higher:
            return -v;
        case core::Better::Lower:
            return v;
        case core::Better::Neither:
            return std::abs(v);
        }
        return v;
    };
    std::stable_sort(rows.begin(), rows.end(), [&](std::size_t a, std::size_t b) { return badness(a) > badness(b); });
    const std::size_t shown
        = *limit == 0 ? rows.size() : std::min<std::size_t>(rows.size(), static_cast<std::size_t>(*limit));

    std::ostringstream out;
    out << "Worst-served users of run '" << e.runName << "' by " << info.key << " ("
        << (info.better == core::Better::Higher         ? "lowest first"
                   : info.better == core::Better::Lower ? "highest first"
                                                        : "largest size first")
        << ", k = " << e.settings.k << ")";
    if (warning)
        out << ", carrying '" << core::warningInfo(*warning).key << "'";
    out << "\n";
    std::size_t idWidth = 7;
    for (std::size_t i = 0; i < shown; ++i) {
        const auto u = t.users[rows[i]].value;
        idWidth = std::max(idWidth, (u < ids->size() ? (*ids)[u].size() : 0) + 2);
    }
    out << pad("#", 6) << pad("user", idWidth) << pad(std::string(info.key), 14, true) << pad("withheld", 10, true)
        << pad("train", 8, true) << "  warnings\n";
    for (std::size_t i = 0; i < shown; ++i) {
        const std::size_t r = rows[i];
        const auto u = t.users[r].value;
        char value[32];
        std::snprintf(value, sizeof value, "%.4f", t.value(*metric, r));
        out << pad(std::to_string(i + 1), 6) << pad(u < ids->size() ? (*ids)[u] : std::to_string(u), idWidth)
            << pad(value, 14, true) << pad(std::to_string(t.nWithheld[r]), 10, true)
            << pad(std::to_string(t.nTrain[r]), 8, true) << "  " << (codes[r].empty() ? "-" : codes[r]) << "\n";
    }
    out << shown << " of " << rows.size() << " users shown.";
    if (undefined)
        out << " " << undefined << " more have no " << info.key
            << " value (for example no relevant withheld item, no score or no list) and are not listed.";
    if (warning && filtered)
        out << " " << filtered << " users without '" << core::warningInfo(*warning).key << "' were left out.";
    out << "\n";
    std::cout << out.str();
    return ExitOk;
}

} // namespace slatewise::cli
