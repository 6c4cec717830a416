// SPDX-License-Identifier: MIT
#include "app/slatewise/args.h"
#include "app/slatewise/cliprogress.h"
#include "app/slatewise/commands.h"
#include "app/slatewise/evalsettingsargs.h"
#include "app/slatewise/reporting.h"
#include "core/evaluationjson.h"
#include "core/evaluationservice.h"
#include "core/evaluationstore.h"
#include "core/workspace.h"

#include <cmath>
#include <cstdio>
#include <fstream>
#include <functional>
#include <iostream>
#include <sstream>

namespace slatewise::cli {

namespace {

const CommandSpec& spec()
{
    static const CommandSpec s = [] {
        CommandSpec c { "evaluate",
            "WORKSPACE [--run NAME]... [--k N] [--relevant-at X] [--json FILE] [--per-user FILE] [--bootstrap B]",
            "Computes accuracy (RMSE, MAE, mean error, by rating band), top-k ranking metrics (precision,\n"
            "recall, hit rate, MRR, MAP, NDCG, graded NDCG, held-out top-k agreement, curves for k = 1..50),\n"
            "beyond-accuracy measures and per-user warnings for each run, with 95% bootstrap intervals over\n"
            "users. Results are stored in the workspace and reused while the run and the settings are\n"
            "unchanged. Without --run every run is evaluated. Without --json a summary is printed.",
            1,
            {
                { "run", "NAME", "evaluate this run (default: every run)", true },
                { "json", "FILE", "write the results as JSON to FILE ('-' for standard output)" },
                { "per-user", "FILE", "write one CSV row per run and user with a withheld item" },
                { "recompute", "", "ignore stored results and compute again" },
                { "quiet", "", "no progress line" },
            } };
        return withEvalSettingsOptions(std::move(c));
    }();
    return s;
}

std::string fixed(double v, int decimals = 4)
{
    if (std::isnan(v))
        return "-";
    char buf[64];
    std::snprintf(buf, sizeof buf, "%.*f", decimals, v);
    return buf;
}

std::string pad(std::string s, std::size_t width, bool right = false)
{
    if (s.size() >= width)
        return s;
    return right ? std::string(width - s.size(), ' ') + s : s + std::string(width - s.size(), ' ');
}

std::string percent(double share)
{
    return std::isnan(share) ? "-" : fixed(100.0 * share, 1) + "%";
}

/// An interval is called wide when it spans more than ±10% of the reference value: the
/// estimate rests on too few users (or too varied ones) to read small differences into.
bool isWide(const core::Interval& ci, double reference)
{
    if (std::isnan(ci.low) || std::isnan(ci.high) || std::isnan(reference))
        return false;
    return (ci.high - ci.low) > 0.2 * std::abs(reference) + 1e-12;
}

struct TablePrinter {
    std::ostream& out;
    bool anyWide = false;

    void line(const core::RunEvaluation& e, const std::string& label, const char* key, double value, double reference)
    {
        out << "    " << pad(label, 22) << pad(fixed(value), 10, true);
        if (auto it = e.ci.find(key); it != e.ci.end()) {
            out << "   [" << fixed(it->second.low) << ", " << fixed(it->second.high) << "]";
            if (isWide(it->second, reference)) {
                out << "  wide";
                anyWide = true;
            }
        }
        out << "\n";
    }
};

void printRun(std::ostream& out, const core::RunEvaluation& e, bool computed, TablePrinter& table)
{
    const auto& s = e.settings;
    out << "Run '" << e.runName << "' (" << e.users.size() << " users with withheld items; "
        << (computed ? "computed now" : "stored result from " + e.computedAt) << ")\n";
    if (e.accuracy) {
        const auto& a = *e.accuracy;
        out << "  Accuracy on " << a.n << " scored withheld pairs (" << percent(a.scoredFraction) << " scored, "
            << a.missingScores << " without a score)\n";
        out << "    " << pad("metric", 22) << pad("value", 10, true) << "   95% interval\n";
        table.line(e, "RMSE", "rmse", a.rmse, a.rmse);
        table.line(e, "MAE", "mae", a.mae, a.mae);
        table.line(e, "mean error (+ = over)", "mean_error", a.meanError, a.rmse);
        table.line(e, "mean of user RMSE", "user_rmse_mean", a.userRmseMean, a.userRmseMean);
        table.line(e, "held-out top-" + std::to_string(s.k), "heldout_topk", a.heldoutTopk, a.heldoutTopk);
        if (!a.bands.empty()) {
            out << "  Error by withheld rating\n    " << pad("rating", 8) << pad("n", 10, true) << pad("RMSE", 10, true)
                << pad("MAE", 10, true) << pad("mean error", 12, true) << "\n";
            for (const auto& b : a.bands)
                out << "    " << pad(core::formatDouble(b.rating), 8) << pad(std::to_string(b.n), 10, true)
                    << pad(fixed(b.rmse), 10, true) << pad(fixed(b.mae), 10, true) << pad(fixed(b.meanError), 12, true)
                    << "\n";
        }
    } else {
        out << "  Accuracy: not available (the run has no scores)\n";
    }
    if (e.ranking) {
        const auto& r = *e.ranking;
        out << "  Ranking at k = " << s.k << ", relevant = rating >= " << core::formatDouble(s.relevantAt) << " ("
            << r.users << " users with a relevant withheld item";
        if (r.usersWithoutList)
            out << "; " << r.usersWithoutList << " of them without a list, scored 0";
        out << ")\n";
        if (r.users == 0) {
            out << "    no user has a relevant withheld item: ranking metrics are not defined\n";
        } else {
            const std::string k = "@" + std::to_string(s.k);
            table.line(e, "precision" + k, "precision", r.precision, r.precision);
            table.line(e, "recall" + k, "recall", r.recall, r.recall);
            table.line(e, "hit rate" + k, "hit_rate", r.hitRate, r.hitRate);
            table.line(e, "MRR" + k, "mrr", r.mrr, r.mrr);
            table.line(e, "MAP" + k, "map", r.map, r.map);
            table.line(e, "NDCG" + k, "ndcg", r.ndcg, r.ndcg);
            table.line(e, "graded NDCG" + k, "ndcg_graded", r.ndcgGraded, r.ndcgGraded);
        }
    } else {
        out << "  Ranking: not available (the run has no lists)\n";
    }
    if (e.beyond) {
        const auto& b = *e.beyond;
        out << "  Beyond accuracy (top " << s.k << ")\n";
        table.line(e, "intra-list diversity", "ild", b.ild, b.ild);
        table.line(e, "novelty (bits)", "novelty", b.novelty, b.novelty);
        table.line(e, "popularity lift", "popularity_lift", b.popularityLift, std::nan(""));
        table.line(e, "calibration KL", "calibration_kl", b.calibrationKl, b.calibrationKl);
        table.line(e, "series share", "series_share", b.seriesShare, b.seriesShare);
        out << "    " << pad("coverage", 22) << pad(fixed(b.coverage), 10, true) << "\n";
        out << "    " << pad("Gini of exposure", 22) << pad(fixed(b.gini), 10, true) << "\n";
        out << "    " << pad("order violations", 22) << pad(std::to_string(b.orderViolations), 10, true) << "   "
            << percent(b.orderViolationsUsers) << " of users\n";
        out << "    " << pad("already seen in list", 22) << pad(std::to_string(b.seenInList), 10, true) << "   "
            << percent(b.seenInListUsers) << " of users\n";
        out << "    " << pad("echoes a recent binge", 22) << pad(percent(b.burstEcho), 10, true) << "\n";
    }
    bool anyWarning = false;
    for (const auto& [key, share] : e.warningShare)
        anyWarning = anyWarning || share > 0;
    if (anyWarning) {
        out << "  Warnings (share of users)\n";
        for (const auto& info : core::allWarnings()) {
            auto it = e.warningShare.find(std::string(info.key));
            if (it == e.warningShare.end() || !(it->second > 0))
                continue;
            out << "    " << pad(std::string(info.key), 15) << pad(percent(it->second), 8, true) << "  " << info.title
                << "\n";
        }
    }
    out << "\n";
}

/// One row per run with the headline numbers, so runs can be read side by side.
void printOverview(std::ostream& out, const std::vector<core::RunEvaluation>& evals, std::int32_t k)
{
    std::size_t nameWidth = 4;
    for (const auto& e : evals)
        nameWidth = std::max(nameWidth, e.runName.size() + 2);
    const std::string at = "@" + std::to_string(k);
    out << pad("run", nameWidth) << pad("RMSE", 9, true) << pad("MAE", 9, true) << pad("prec" + at, 10, true)
        << pad("recall" + at, 12, true) << pad("NDCG" + at, 10, true) << pad("MAP" + at, 9, true)
        << pad("coverage", 10, true) << "\n";
    for (const auto& e : evals) {
        const double nan = std::nan("");
        out << pad(e.runName, nameWidth) << pad(fixed(e.accuracy ? e.accuracy->rmse : nan), 9, true)
            << pad(fixed(e.accuracy ? e.accuracy->mae : nan), 9, true)
            << pad(fixed(e.ranking ? e.ranking->precision : nan), 10, true)
            << pad(fixed(e.ranking ? e.ranking->recall : nan), 12, true)
            << pad(fixed(e.ranking ? e.ranking->ndcg : nan), 10, true)
            << pad(fixed(e.ranking ? e.ranking->map : nan), 9, true)
            << pad(fixed(e.beyond ? e.beyond->coverage : nan), 10, true) << "\n";
    }
    out << "(differences between runs are not tested here; 'slatewise compare' gives paired intervals and tests)\n\n";
}

bool writeFile(const std::string& path, const std::string& what, const std::function<void(std::ostream&)>& write)
{
    if (path == "-") {
        write(std::cout);
        return bool(std::cout);
    }
    // Write beside the target and rename, so a failure never leaves half a file behind.
    const std::string tmp = path + ".part";
    {
        std::ofstream out(tmp, std::ios::binary);
        if (!out) {
            std::cerr << "slatewise evaluate: error: cannot write " << what << " to '" << path << "'\n";
            return false;
        }
        write(out);
        out.flush();
        if (!out) {
            std::cerr << "slatewise evaluate: error: writing " << what << " to '" << path << "' failed\n";
            std::remove(tmp.c_str());
            return false;
        }
    }
    if (std::rename(tmp.c_str(), path.c_str()) != 0) {
        std::cerr << "slatewise evaluate: error: cannot move " << what << " into place at '" << path << "'\n";
        std::remove(tmp.c_str());
        return false;
    }
    return true;
}

} // namespace

int evaluateCommand(const std::vector<std::string>& argv)
{
    int exitCode = ExitOk;
    auto args = parseOrExit(spec(), argv, exitCode);
    if (!args)
        return exitCode;
    std::string usage;
    auto settings = evalSettingsFromArgs(*args, usage);
    if (!settings)
        return usageFailure(spec().name, usage);

    auto ws = core::Workspace::open(args->positionals()[0]);
    if (!ws)
        return printErrors(spec().name, ws.errors());

    CliProgress progress(args->has("quiet"));
    auto result
        = core::evaluateRuns(ws.value(), args->values("run"), *settings, progress.progress(), args->has("recompute"));
    progress.finish();
    if (!result)
        return printErrors(spec().name, result.errors());
    const auto& evals = result->evaluations;
    if (evals.empty()) {
        std::cerr << "slatewise evaluate: the workspace has no runs yet; add one with 'slatewise add-run'\n";
        return ExitUsage;
    }

    if (args->has("json")) {
        const std::string text = core::EvaluationJson::document(evals, *settings).dump(2) + "\n";
        if (!writeFile(args->value("json"), "the JSON results", [&](std::ostream& out) { out << text; }))
            return ExitWorkspace;
    }
    if (args->has("per-user")) {
        auto ids = core::EvaluationStore::userIds(ws->db());
        if (!ids)
            return printErrors(spec().name, ids.errors());
        if (!writeFile(args->value("per-user"), "the per-user CSV",
                [&](std::ostream& out) { core::EvaluationJson::writePerUserCsv(out, evals, ids.value()); }))
            return ExitWorkspace;
    }
    if (!args->has("json")) {
        std::ostringstream out;
        out << "Settings: k = " << settings->k
            << ", relevant = withheld rating >= " << core::formatDouble(settings->relevantAt) << ", "
            << settings->bootstrap << " bootstrap resamples (seed " << settings->seed << ")\n\n";
        if (evals.size() > 1)
            printOverview(out, evals, settings->k);
        TablePrinter table { out };
        for (std::size_t i = 0; i < evals.size(); ++i)
            printRun(out, evals[i], result->computed[i], table);
        if (table.anyWide)
            out << "'wide': the 95% interval spans more than ±10% of the value, so the estimate is uncertain;\n"
                   "do not read small differences into it.\n";
        if (settings->bootstrap == 0)
            out << "Intervals were skipped (--bootstrap 0).\n";
        std::cout << out.str();
    }
    return ExitOk;
}

} // namespace slatewise::cli
