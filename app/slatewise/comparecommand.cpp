// SPDX-License-Identifier: MIT
#include "app/slatewise/args.h"
#include "app/slatewise/cliprogress.h"
#include "app/slatewise/commands.h"
#include "app/slatewise/evalsettingsargs.h"
#include "app/slatewise/reporting.h"
#include "core/comparisonstore.h"
#include "core/evaluationservice.h"
#include "core/runcomparison.h"
#include "core/workspace.h"

#include <cmath>
#include <cstdio>
#include <fstream>
#include <iostream>
#include <nlohmann/json.hpp>
#include <sstream>

namespace slatewise::cli {

namespace {

std::string metricList()
{
    std::string out;
    for (const auto& m : core::allMetrics()) {
        if (!out.empty())
            out += ", ";
        out += core::comparisonMetricKey(m.metric);
    }
    return out;
}

const CommandSpec& spec()
{
    static const CommandSpec s = [] {
        CommandSpec c { "compare",
            "WORKSPACE [--base A] --candidate B [--metric M]... [--segment activity|genre|warning:CODE]... "
            "[--json FILE] [--bootstrap B] [--k N] [--relevant-at X] [--worst N]",
            "Compares two runs user by user: for each metric, over the users both runs can be scored on,\n"
            "the mean difference (candidate - base) with a 95% bootstrap interval over users, the paired\n"
            "t-test and the Wilcoxon signed-rank test, wins/ties/losses per user and the effect size.\n"
            "p-values are adjusted by Holm across all metrics (and candidates) compared at once. Segments\n"
            "break the comparison down by activity, dominant genre or a warning; segments under 30 users\n"
            "are marked too small to judge. Lists the users who lost most on the first metric. Runs are\n"
            "evaluated first when the workspace has no stored results for the settings. The result is\n"
            "stored in the workspace for the GUI.",
            1,
            {
                { "base", "A", "the run to compare against (default: the parent of a re-ranked candidate)" },
                { .name = "candidate",
                    .valueName = "B",
                    .help = "the run being judged (repeat to compare several against A)",
                    .repeatable = true,
                    .required = true },
                { "metric", "M",
                    "per-user metric to compare (repeatable; default: ndcg, precision, recall, map, rmse, "
                    "ild, novelty, as far as both runs define them). One of: "
                        + metricList(),
                    true },
                { "segment", "S", "break down by activity, genre or warning:CODE (repeatable; default: activity)",
                    true },
                { "no-segments", "", "no segment breakdown" },
                { "json", "FILE", "write the comparison as JSON to FILE ('-' for standard output)" },
                { "per-user", "", "include the per-user values of every metric in the JSON" },
                { "bootstrap", "B", "bootstrap resamples for the interval of the mean difference (default 2000)" },
                { "seed", "S", "seed of the comparison's bootstrap (default 20261206)" },
                { "worst", "N", "length of the who-got-worse list (default 10)" },
                { "quiet", "", "no progress line" },
            } };
        // Evaluation settings, except the evaluation's own bootstrap and seed: here those two
        // options belong to the comparison.
        for (auto& o : evalSettingsOptions())
            if (o.name != "bootstrap" && o.name != "seed")
                c.options.push_back(o);
        return c;
    }();
    return s;
}

std::string num(double v, const char* format = "%.4f")
{
    if (std::isnan(v))
        return "-";
    if (std::isinf(v))
        return v > 0 ? "inf" : "-inf";
    char buf[64];
    std::snprintf(buf, sizeof buf, format, v);
    return buf;
}

std::string pval(double p)
{
    if (std::isnan(p))
        return "-";
    if (p < 0.0001)
        return "<0.0001";
    return num(p, "%.4f");
}

std::string pad(std::string s, std::size_t width, bool right = false)
{
    if (s.size() >= width)
        return s;
    return right ? std::string(width - s.size(), ' ') + s : s + std::string(width - s.size(), ' ');
}

std::string interval(const core::Interval& ci)
{
    if (std::isnan(ci.low))
        return "-";
    return "[" + num(ci.low, "%+.4f") + ", " + num(ci.high, "%+.4f") + "]";
}

void printMetricHeader(std::ostream& out)
{
    out << "  " << pad("metric", 14) << pad("n", 7, true) << pad("base", 10, true) << pad("candidate", 11, true)
        << pad("diff", 10, true) << "  " << pad("95% interval", 21) << pad("p (t)", 9, true)
        << pad("p (Wilc.)", 10, true) << pad("p_holm", 9, true) << pad("wins/ties/losses", 19, true)
        << pad("effect", 8, true) << "  judgement\n";
}

void printMetricRow(std::ostream& out, const core::MetricComparison& m)
{
    std::string name(core::comparisonMetricKey(m.metric));
    if (core::metricInfo(m.metric).better == core::Better::Lower)
        name += " [lower]"; // lower is better
    out << "  " << pad(name, 14) << pad(std::to_string(m.n), 7, true) << pad(num(m.meanBase), 10, true)
        << pad(num(m.meanCandidate), 11, true) << pad(num(m.meanDiff, "%+.4f"), 10, true) << "  "
        << pad(interval(m.ci), 21) << pad(pval(m.pT), 9, true) << pad(pval(m.pWilcoxon), 10, true)
        << pad(pval(m.pHolm), 9, true)
        << pad(std::to_string(m.wins) + "/" + std::to_string(m.ties) + "/" + std::to_string(m.losses), 19, true)
        << pad(num(m.effectSize, "%+.2f"), 8, true) << "  " << core::shortVerdict(m) << "\n";
}

std::string joined(const std::vector<std::string>& v)
{
    if (v.empty())
        return "-";
    std::string out;
    for (const auto& s : v)
        out += (out.empty() ? "" : ",") + s;
    return out;
}

void printComparison(std::ostream& out, const core::RunComparison& c, const core::EvalSettings& eval)
{
    out << "Candidate '" << c.candidate << "' against base '" << c.base << "' (k = " << eval.k
        << ", relevant at rating >= " << num(eval.relevantAt, "%g") << "); differences are candidate - base.\n";
    out << "[lower]: lower is better for this metric, so a negative difference is a win for the candidate.\n\n";
    printMetricHeader(out);
    for (const auto& m : c.metrics)
        printMetricRow(out, m);
    out << "\nIn words:\n";
    for (const auto& m : c.metrics)
        out << "  - " << m.verdict << "\n";

    std::string group;
    for (const auto& s : c.segments) {
        if (s.group != group) {
            group = s.group;
            out << "\nSegments by " << group << " (adjusted as their own Holm family):\n";
        }
        out << "\n  " << s.name << " - " << s.label << " - " << s.size << " users";
        if (s.tooSmall)
            out << " - TOO SMALL TO JUDGE (fewer than " << c.settings.minSegmentSize << " users)";
        out << "\n";
        for (const auto& m : s.metrics)
            printMetricRow(out, m);
    }

    if (c.hasPrimary) {
        const std::string key(core::comparisonMetricKey(c.primary));
        const bool lower = core::metricInfo(c.primary).better == core::Better::Lower;
        out << "\nWho got worse on " << key << " (" << (lower ? "lower" : "higher")
            << " is better; largest loss first):\n";
        if (c.whoGotWorse.empty()) {
            out << "  nobody: no user lost more than the tie tolerance.\n";
        } else {
            out << "  " << pad("user", 16) << pad("base", 10, true) << pad("candidate", 11, true)
                << pad("loss", 10, true) << "  " << pad("warnings in base", 30) << "warnings in candidate\n";
            for (const auto& w : c.whoGotWorse)
                out << "  " << pad(w.userId, 16) << pad(num(w.base), 10, true) << pad(num(w.candidate), 11, true)
                    << pad(num(w.loss), 10, true) << "  " << pad(joined(w.baseWarnings), 30)
                    << joined(w.candidateWarnings) << "\n";
            out << "  (open one with: slatewise explain WORKSPACE --run " << c.candidate << " --user USER)\n";
        }
    }
    out << "\nNotes:\n";
    for (const auto& n : c.notes)
        out << "  - " << n << "\n";
}

bool writeText(const std::string& path, const std::string& text)
{
    if (path == "-") {
        std::cout << text;
        return bool(std::cout);
    }
    const std::string tmp = path + ".part";
    {
        std::ofstream out(tmp, std::ios::binary);
        out << text;
        out.flush();
        if (!out) {
            std::cerr << "slatewise compare: error: cannot write the JSON to '" << path << "'\n";
            std::remove(tmp.c_str());
            return false;
        }
    }
    if (std::rename(tmp.c_str(), path.c_str()) != 0) {
        std::cerr << "slatewise compare: error: cannot move the JSON into place at '" << path << "'\n";
        std::remove(tmp.c_str());
        return false;
    }
    return true;
}

} // namespace

int compareCommand(const std::vector<std::string>& argv)
{
    int exitCode = ExitOk;
    auto args = parseOrExit(spec(), argv, exitCode);
    if (!args)
        return exitCode;
    std::string usage;
    auto eval = evalSettingsFromArgs(*args, usage);
    if (!eval)
        return usageFailure(spec().name, usage);
    // evalSettingsFromArgs also reads --bootstrap and --seed; here they are the comparison's,
    // so the evaluation keeps its own (from --settings or the defaults).
    {
        core::EvalSettings defaults;
        if (args->has("settings")) {
            std::ifstream in(args->value("settings"));
            std::stringstream text;
            text << in.rdbuf();
            defaults = core::EvalSettings::fromJson(text.str());
        }
        eval->bootstrap = defaults.bootstrap;
        eval->seed = defaults.seed;
    }

    core::ComparisonSettings settings;
    for (const auto& key : args->values("metric")) {
        auto m = core::metricFromKey(key);
        if (!m)
            return usageFailure(spec().name, "unknown metric '" + key + "'; expected one of " + metricList());
        settings.metrics.push_back(*m);
    }
    if (!args->has("no-segments")) {
        const auto given = args->values("segment");
        for (const auto& text : given.empty() ? std::vector<std::string> { "activity" } : given) {
            auto segment = core::SegmentSpec::parse(text);
            if (!segment)
                return usageFailure(spec().name,
                    "--segment '" + text + "': " + segment.error().message + " (expected " + segment.error().expected
                        + ")");
            settings.segments.push_back(*segment);
        }
    }
    auto boot = args->integer("bootstrap", settings.bootstrap, usage);
    if (!boot || *boot < 0 || *boot > 1000000)
        return usageFailure(spec().name, usage.empty() ? "--bootstrap must be from 0 to 1000000" : usage);
    settings.bootstrap = static_cast<std::int32_t>(*boot);
    auto seed = args->integer("seed", static_cast<long long>(settings.seed), usage);
    if (!seed || *seed < 0)
        return usageFailure(spec().name, usage.empty() ? "--seed must be a whole number >= 0" : usage);
    settings.seed = static_cast<std::uint64_t>(*seed);
    auto worst = args->integer("worst", settings.worst, usage);
    if (!worst || *worst < 0 || *worst > 1000000)
        return usageFailure(spec().name, usage.empty() ? "--worst must be from 0 to 1000000" : usage);
    settings.worst = static_cast<std::int32_t>(*worst);

    const std::vector<std::string> candidates = args->values("candidate");
    auto ws = core::Workspace::open(args->positionals()[0]);
    if (!ws)
        return printErrors(spec().name, ws.errors());
    std::string baseName = args->value("base");
    if (baseName.empty()) {
        // A fitted or re-ranked run is judged against the run it came from by default, which
        // shows what the what-if change bought and what it cost.
        auto first = ws->run(candidates.front());
        if (!first)
            return printErrors(spec().name, first.errors());
        if (first->parentName.empty())
            return usageFailure(
                spec().name, "--base is required: run '" + candidates.front() + "' was not derived from another run");
        baseName = first->parentName;
        std::fprintf(stderr, "base: '%s', the run '%s' was derived from (%s)\n", baseName.c_str(),
            candidates.front().c_str(), first->method.c_str());
    }
    for (const auto& c : candidates)
        if (c == baseName)
            return usageFailure(spec().name, "the candidate '" + c + "' is the base run; compare two different runs");

    CliProgress progress(args->has("quiet"));
    std::vector<std::string> names { baseName };
    names.insert(names.end(), candidates.begin(), candidates.end());
    auto evaluated = core::evaluateRuns(ws.value(), names, *eval, progress.progress());
    if (!evaluated) {
        progress.finish();
        return printErrors(spec().name, evaluated.errors());
    }
    auto data = ws->loadDataset();
    if (!data) {
        progress.finish();
        return printErrors(spec().name, data.errors());
    }
    const core::DatasetStats stats = core::computeStats(data.value());

    std::vector<core::RunComparison> results;
    const auto& evals = evaluated->evaluations;
    for (std::size_t i = 1; i < evals.size(); ++i) {
        auto r = core::compareRuns(evals[0], evals[i], data.value(), stats, settings, progress.progress());
        if (!r) {
            progress.finish();
            return printErrors(spec().name, r.errors());
        }
        results.push_back(std::move(r.value()));
    }
    results = core::adjustAcrossPairs(std::move(results));
    progress.finish();

    core::ComparisonStore store(ws->db());
    for (auto& r : results) {
        auto stored = store.store(r);
        if (!stored)
            return printErrors(spec().name, stored.errors());
    }

    if (args->has("json")) {
        const bool perUser = args->has("per-user");
        std::string text;
        if (results.size() == 1) {
            text = results.front().toJson(perUser, 2) + "\n";
        } else {
            nlohmann::ordered_json all;
            all["base"] = baseName;
            all["comparisons"] = nlohmann::ordered_json::array();
            for (const auto& r : results)
                all["comparisons"].push_back(nlohmann::ordered_json::parse(r.toJson(perUser, -1)));
            text = all.dump(2) + "\n";
        }
        if (!writeText(args->value("json"), text))
            return ExitWorkspace;
    }
    if (!args->has("json")) {
        std::ostringstream out;
        for (std::size_t i = 0; i < results.size(); ++i) {
            if (i > 0)
                out << "\n" << std::string(100, '-') << "\n\n";
            printComparison(out, results[i], *eval);
        }
        std::cout << out.str();
    }
    return ExitOk;
}

} // namespace slatewise::cli
