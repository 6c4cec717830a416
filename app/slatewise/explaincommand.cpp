// SPDX-License-Identifier: MIT
#include "app/slatewise/args.h"
#include "app/slatewise/cliprogress.h"
#include "app/slatewise/commands.h"
#include "app/slatewise/evalsettingsargs.h"
#include "app/slatewise/reporting.h"
#include "core/evaluationservice.h"
#include "core/userexplanation.h"
#include "core/workspace.h"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <fstream>
#include <iostream>
#include <sstream>

namespace slatewise::cli {

namespace {

const CommandSpec& spec()
{
    static const CommandSpec s = [] {
        CommandSpec c { "explain", "WORKSPACE --run NAME --user ID [--k N] [--relevant-at X] [--json FILE]",
            "Explains how a run serves one user: the top-k list with hit, already-seen and series\n"
            "markers, the user's withheld titles (best rated first) with the score the run gave each\n"
            "and its rank in the list, every warning sentence, and the user's per-user metrics beside\n"
            "the run's mean. The run is evaluated first when no stored evaluation matches the settings.",
            1,
            {
                { .name = "run", .valueName = "NAME", .help = "the run to look at", .required = true },
                { .name = "user", .valueName = "ID", .help = "the user's id as in the input files", .required = true },
                { "json", "FILE", "also write the explanation as JSON to FILE ('-' for stdout only)" },
                { "quiet", "", "no progress line" },
            } };
        return withEvalSettingsOptions(std::move(c));
    }();
    return s;
}

std::string fixed(double v, int decimals)
{
    if (std::isnan(v))
        return "-";
    char buf[64];
    std::snprintf(buf, sizeof buf, "%.*f", decimals, v);
    return buf;
}

std::string compact(double v)
{
    char buf[64];
    std::snprintf(buf, sizeof buf, "%g", v);
    return buf;
}

/// Pads by UTF-8 code points so that titles with «» or accents keep columns aligned.
std::string pad(const std::string& s, std::size_t width, bool right = false)
{
    std::size_t points = 0;
    for (const unsigned char c : s)
        points += (c & 0xC0) != 0x80 ? 1 : 0;
    if (points >= width)
        return s;
    const std::string fill(width - points, ' ');
    return right ? fill + s : s + fill;
}

std::string joined(const std::vector<std::string>& parts, const char* sep)
{
    std::string out;
    for (const auto& p : parts)
        out += (out.empty() ? "" : sep) + p;
    return out;
}

std::string titleWithYear(const std::string& title, std::int32_t year)
{
    return year > 0 ? title + " (" + std::to_string(year) + ")" : title;
}

std::string seriesLabel(const std::string& series, std::int32_t part)
{
    return series.empty() ? std::string() : series + " #" + std::to_string(part);
}

void printText(std::ostream& out, const core::UserExplanation& x)
{
    out << "User " << x.userId << " under run '" << x.runName << "' (top " << x.k
        << ", relevant at rating >= " << compact(x.relevantAt) << ")\n";
    out << "History: " << x.nTrain << " train titles. Withheld: " << x.nWithheld << " titles, " << x.nRelevant
        << " relevant.";
    if (!x.burstGenre.empty())
        out << " Recent burst: " << x.burstGenre << ".";
    out << "\n\n";

    if (!x.runHasLists) {
        out << "The run has no lists, so there is no top " << x.k << " to show.\n\n";
    } else if (x.list.empty()) {
        out << "The run gave this user no list.\n\n";
    } else {
        out << "Top " << x.k << " list";
        if (x.fullListLength > static_cast<std::int32_t>(x.list.size()))
            out << " (of " << x.fullListLength << " listed)";
        out << "\n";
        // Columns as wide as the longest title and genre list shown (within reason).
        std::size_t titleWidth = 5, genreWidth = 6;
        for (const auto& r : x.list) {
            titleWidth = std::max(titleWidth, pad(titleWithYear(r.title, r.year), 0).size());
            genreWidth = std::max(genreWidth, joined(r.genres, "/").size());
        }
        titleWidth = std::min<std::size_t>(titleWidth, 64);
        genreWidth = std::min<std::size_t>(genreWidth, 32);
        out << pad("rank", 5, true) << "  " << pad("marks", 5) << "  " << pad("score", 8, true) << "  "
            << pad("title", titleWidth) << "  " << pad("genres", genreWidth) << "  series\n";
        for (const auto& r : x.list) {
            std::string marks;
            marks += r.hit ? 'H' : (r.withheld ? 'w' : '.');
            marks += r.seen ? 'S' : '.';
            marks += r.orderViolation ? '!' : '.';
            std::string series = seriesLabel(r.series, r.seriesPart);
            if (r.orderViolation) {
                std::vector<std::string> parts;
                for (const auto p : r.missingParts)
                    parts.push_back(std::to_string(p));
                series
                    += "  (missing " + std::string(parts.size() == 1 ? "part " : "parts ") + joined(parts, ", ") + ")";
            }
            out << pad(std::to_string(r.rank), 5, true) << "  " << pad(marks, 5) << "  "
                << pad(fixed(r.score, 3), 8, true) << "  " << pad(titleWithYear(r.title, r.year), titleWidth) << "  "
                << pad(joined(r.genres, "/"), genreWidth) << "  " << series << "\n";
        }
        out << "Marks: H = hit (withheld, rated >= " << compact(x.relevantAt)
            << "), w = withheld but rated lower, S = already seen (in the train history),\n"
               "       ! = sequel placed before earlier parts that are neither seen nor ranked above, . = none\n\n";
    }

    if (x.withheld.empty()) {
        out << "No withheld titles for this user.\n\n";
    } else {
        out << "Withheld titles, best rated first\n";
        out << pad("rating", 6, true) << "  " << pad("score", 8, true) << "  " << pad("in list", 28) << "  title\n";
        for (const auto& w : x.withheld) {
            std::string where;
            if (w.listRank == 0)
                where = x.runHasLists ? "not listed" : "-";
            else if (w.inTopK)
                where = "rank " + std::to_string(w.listRank);
            else
                where = "not in top " + std::to_string(x.k) + " (rank " + std::to_string(w.listRank) + ")";
            std::string title = titleWithYear(w.title, w.year);
            if (!w.series.empty())
                title += "  [" + seriesLabel(w.series, w.seriesPart) + "]";
            out << pad(compact(w.rating) + (w.relevant ? "*" : " "), 6, true) << "  "
                << pad(x.runHasScores ? fixed(w.score, 3) : std::string("-"), 8, true) << "  " << pad(where, 28) << "  "
                << title << "\n";
        }
        out << "* = relevant (rated >= " << compact(x.relevantAt) << ")";
        if (x.runHasScores)
            out << "; score '-' = the run gave no score";
        out << "\n\n";
    }

    if (x.warnings.empty()) {
        out << "Warnings: none.\n\n";
    } else {
        out << "Warnings (" << x.warnings.size() << ")\n";
        for (const auto& w : x.warnings) {
            const auto& info = core::warningInfo(w.code);
            out << "  [" << core::toString(w.severity) << "] " << info.key << ": " << w.message << "  (value "
                << compact(w.value) << ", threshold " << compact(w.threshold) << ")\n";
        }
        out << "\n";
    }

    if (!x.evaluated) {
        out << "Metrics: none (the user has no withheld titles, so the run is not scored on them).\n";
        return;
    }
    out << "Metrics (this user / mean over the run's users where defined)\n";
    for (const auto& m : x.metrics) {
        const auto& info = core::metricInfo(m.metric);
        if (std::isnan(m.user) && std::isnan(m.runMean))
            continue;
        out << "  " << pad(std::string(info.key), 18) << pad(fixed(m.user, 4), 10, true)
            << pad(fixed(m.runMean, 4), 10, true) << "\n";
    }
    out << "('-' = not defined for this user)\n";
}

} // namespace

int explainCommand(const std::vector<std::string>& argv)
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
    auto evaluated = core::evaluateRuns(ws.value(), { args->value("run") }, *settings, progress.progress());
    if (!evaluated) {
        progress.finish();
        return printErrors(spec().name, evaluated.errors());
    }
    auto data = ws->loadDataset();
    if (!data) {
        progress.finish();
        return printErrors(spec().name, data.errors());
    }
    auto run = ws->loadRun(args->value("run"), data.value());
    progress.finish();
    if (!run)
        return printErrors(spec().name, run.errors());

    const std::string userId = args->value("user");
    const auto& ids = data->userIds;
    const auto found = std::find(ids.begin(), ids.end(), userId);
    if (found == ids.end())
        return usageFailure(spec().name, "unknown user '" + userId + "' (ids are as in the train and withheld files)");
    const core::UserIndex user(static_cast<std::uint32_t>(found - ids.begin()));

    const core::DatasetStats stats = core::computeStats(data.value());
    const auto x = core::UserExplanation::build(data.value(), stats, run.value(), evaluated->evaluations.front(), user);

    if (args->has("json")) {
        const std::string path = args->value("json");
        if (path == "-") {
            std::cout << x.toJson() << "\n";
            return ExitOk;
        }
        std::ofstream out(path, std::ios::binary);
        if (!(out << x.toJson() << "\n")) {
            core::Error e;
            e.kind = core::ErrorKind::Usage;
            e.file = path;
            e.message = "cannot write the JSON file";
            return printErrors(spec().name, { e });
        }
    }
    printText(std::cout, x);
    return ExitOk;
}

} // namespace slatewise::cli
