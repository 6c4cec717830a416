// SPDX-License-Identifier: MIT
#include "app/slatewise/args.h"
#include "app/slatewise/cliprogress.h"
#include "app/slatewise/commands.h"
#include "core/demogenerator.h"
#include "core/evaluationservice.h"
#include "core/evaluationstore.h"
#include "core/importer.h"
#include "core/warning.h"
#include "core/workspace.h"

#include <algorithm>
#include <array>
#include <chrono>
#include <cmath>
#include <cstdio>
#include <filesystem>
#include <iostream>
#include <map>

namespace slatewise::cli {

namespace {
namespace fs = std::filesystem;

/// Where the committed demo files are: --from, then the folder the build was configured
/// with, then places relative to the executable (a build tree or an installed layout).
std::string findDemoDir(const Args& args)
{
    if (args.has("from"))
        return args.value("from");
    std::vector<fs::path> candidates;
#ifdef SLATEWISE_DEMO_DIR
    candidates.emplace_back(SLATEWISE_DEMO_DIR);
#endif
    std::error_code ec;
    const fs::path exe = fs::read_symlink("/proc/self/exe", ec);
    if (!ec) {
        const fs::path dir = exe.parent_path();
        candidates.push_back(dir / "demo-catalog");
        candidates.push_back(dir / ".." / "share" / "slatewise" / "demo-catalog");
        candidates.push_back(dir / ".." / ".." / "demo-catalog");
        candidates.push_back(dir / ".." / ".." / ".." / "demo-catalog");
    }
    for (const auto& c : candidates)
        if (fs::exists(c / core::DemoGenerator::kCatalogFile, ec))
            return c.lexically_normal().string();
    return {};
}

std::string fixed(double v, int decimals)
{
    if (std::isnan(v))
        return "-";
    char buf[64];
    std::snprintf(buf, sizeof buf, "%.*f", decimals, v);
    return buf;
}

std::string pad(std::string s, std::size_t width)
{
    if (s.size() < width)
        s.resize(width, ' ');
    return s;
}

int failWith(const std::vector<core::Error>& errors, const char* what)
{
    std::cerr << "slatewise demo: " << what << "\n";
    for (const auto& e : errors)
        std::cerr << "  " << e.toString() << "\n";
    return core::exitCodeFor(errors);
}
} // namespace

int demoCommand(const std::vector<std::string>& argv)
{
    const CommandSpec spec { "demo", "WORKSPACE [--replace] [--from DIR] [--quiet]",
        "Builds the ready-to-explore demo workspace of the Lantern Street Film Club, an invented neighbourhood\n"
        "film club whose data team is choosing between three recommendation runs: imports the catalog, the\n"
        "train and withheld ratings, adds the runs tight-fit, crowd-pleaser and wide-angle, evaluates them\n"
        "with the default settings and prints what to look at. All titles and members are invented.",
        1,
        { { "replace", "", "overwrite an existing workspace file" },
            { "from", "DIR", "read the demo files from DIR (default: the demo-catalog folder of this build)" },
            { "quiet", "", "no progress line and only a one-line summary" } } };
    int exitCode = ExitOk;
    const auto args = parseOrExit(spec, argv, exitCode);
    if (!args)
        return exitCode;
    const auto started = std::chrono::steady_clock::now();
    const std::string workspacePath = args->positionals().front();
    const std::string dir = findDemoDir(*args);
    if (dir.empty()) {
        std::cerr << "slatewise demo: cannot find the demo files (demo-catalog/); give their folder with --from DIR\n";
        return ExitUsage;
    }
    const fs::path demo(dir);
    for (const auto& name : core::DemoGenerator::fileNames()) {
        std::error_code ec;
        if (!fs::exists(demo / name, ec)) {
            std::cerr << "slatewise demo: " << (demo / name).string() << " is missing (expected the files written by "
                      << "'slatewise demo-data')\n";
            return ExitUsage;
        }
    }
    {
        std::error_code ec;
        if (fs::exists(workspacePath, ec) && !args->has("replace")) {
            std::cerr << "slatewise demo: " << workspacePath
                      << " already exists; pass --replace to overwrite it or choose another path\n";
            return ExitWorkspace;
        }
    }

    const bool quiet = args->has("quiet");
    CliProgress progress(quiet);
    core::ImportRequest import;
    import.workspacePath = workspacePath;
    import.catalogPath = (demo / core::DemoGenerator::kCatalogFile).string();
    import.trainPath = (demo / core::DemoGenerator::kTrainFile).string();
    import.withheldPath = (demo / core::DemoGenerator::kWithheldFile).string();
    import.scale = core::RatingScale { 1.0, 5.0, 1.0, false };
    import.replace = args->has("replace");
    const auto imported = core::importWorkspace(import, progress.progress());
    if (!imported)
        return failWith(imported.errors(), "importing the demo files failed");

    const auto runs = core::DemoGenerator::runFiles();
    std::vector<std::string> runNames;
    for (const auto& r : runs) {
        core::AddRunRequest add;
        add.workspacePath = workspacePath;
        add.name = r.name;
        add.scoresPath = (demo / r.scoresFile).string();
        add.listsPath = (demo / r.listsFile).string();
        const auto added = core::addRun(add, progress.progress());
        if (!added)
            return failWith(added.errors(), ("adding the run " + r.name + " failed").c_str());
        runNames.push_back(r.name);
    }

    auto ws = core::Workspace::open(workspacePath);
    if (!ws)
        return failWith(ws.errors(), "opening the new workspace failed");
    const core::EvalSettings settings;
    const auto evaluated = core::evaluateRuns(*ws, runNames, settings, progress.progress());
    if (!evaluated)
        return failWith(evaluated.errors(), "evaluating the runs failed");
    progress.finish();
    const double seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - started).count();
    const auto& evals = evaluated->evaluations;

    const auto& report = *imported;
    if (quiet) {
        std::printf("demo workspace %s: %lld titles, %lld members, %lld train and %lld withheld ratings, %zu runs "
                    "evaluated (%.1f s)\n",
            workspacePath.c_str(), static_cast<long long>(report.items), static_cast<long long>(report.users),
            static_cast<long long>(report.trainRows), static_cast<long long>(report.withheldRows), evals.size(),
            seconds);
        return ExitOk;
    }

    const auto userIds = core::EvaluationStore::userIds(ws->db());
    auto idOf = [&](core::UserIndex u) {
        return userIds && u.value < userIds->size() ? (*userIds)[u.value] : std::to_string(u.value);
    };

    std::printf("The Lantern Street Film Club demo is ready in %s (built in %.1f s from %s).\n\n",
        workspacePath.c_str(), seconds, dir.c_str());
    std::printf("The club: %lld invented titles in %lld genres and %lld series, %lld members, %lld train and %lld "
                "withheld ratings (each member's most recent 20%% is withheld).\n",
        static_cast<long long>(report.items), static_cast<long long>(report.genres),
        static_cast<long long>(report.series), static_cast<long long>(report.users),
        static_cast<long long>(report.trainRows), static_cast<long long>(report.withheldRows));
    std::printf("On Friday the data team picks next season's run from three candidates (k = %d, relevant at %.1f "
                "stars):\n\n",
        settings.k, settings.relevantAt);
    std::printf(
        "  %s %8s %8s %8s   members with the most common warnings\n", pad("run", 14).c_str(), "RMSE", "NDCG", "ILD");

    std::size_t rmseBest = 0, ndcgBest = 0, ildBest = 0;
    auto metricOf = [&](std::size_t r, int which) {
        const auto& e = evals[r];
        if (which == 0)
            return e.accuracy ? e.accuracy->rmse : std::nan("");
        if (which == 1)
            return e.ranking ? e.ranking->ndcg : std::nan("");
        return e.beyond ? e.beyond->ild : std::nan("");
    };
    // The first member carrying each warning in each run, to point at.
    std::vector<std::map<core::WarningCode, std::pair<std::size_t, core::UserIndex>>> firstOf(evals.size());
    for (std::size_t r = 0; r < evals.size(); ++r) {
        std::array<std::size_t, core::kWarningCodeCount> counts {};
        for (const auto& w : evals[r].warnings) {
            auto& slot = counts[static_cast<std::size_t>(w.code)];
            if (slot == 0)
                firstOf[r][w.code] = { 0, w.user };
            ++slot;
        }
        for (auto& [code, entry] : firstOf[r])
            entry.first = counts[static_cast<std::size_t>(code)];
        std::vector<std::pair<std::size_t, core::WarningCode>> ordered;
        for (std::size_t c = 0; c < counts.size(); ++c)
            if (counts[c] > 0)
                ordered.push_back({ counts[c], static_cast<core::WarningCode>(c) });
        std::sort(ordered.begin(), ordered.end(),
            [](const auto& a, const auto& b) { return a.first != b.first ? a.first > b.first : a.second < b.second; });
        std::string common;
        for (std::size_t i = 0; i < ordered.size() && i < 4; ++i)
            common += (i ? ", " : "") + std::string(core::warningInfo(ordered[i].second).key) + " "
                + std::to_string(ordered[i].first);
        std::printf("  %s %8s %8s %8s   %s\n", pad(evals[r].runName, 14).c_str(), fixed(metricOf(r, 0), 4).c_str(),
            fixed(metricOf(r, 1), 4).c_str(), fixed(metricOf(r, 2), 4).c_str(), common.c_str());
        if (metricOf(r, 0) < metricOf(rmseBest, 0))
            rmseBest = r;
        if (metricOf(r, 1) > metricOf(ndcgBest, 1))
            ndcgBest = r;
        if (metricOf(r, 2) > metricOf(ildBest, 2))
            ildBest = r;
    }

    std::printf("\nThe trade-off: %s predicts stars best (lowest RMSE), but %s puts more of each member's "
                "withheld favourites in the top %d (NDCG) and %s offers the widest lists (ILD).\n",
        evals[rmseBest].runName.c_str(), evals[ndcgBest].runName.c_str(), settings.k, evals[ildBest].runName.c_str());

    std::printf("\nWhere to look:\n");
    auto point = [&](const char* run, core::WarningCode code, const char* story) {
        for (std::size_t r = 0; r < evals.size(); ++r) {
            if (evals[r].runName != run)
                continue;
            const auto it = firstOf[r].find(code);
            if (it == firstOf[r].end())
                return;
            const std::string id = idOf(it->second.second);
            std::printf("  - %s (%zu members with '%s' in %s), e.g. member %s:\n      slatewise explain %s --run %s "
                        "--user %s\n",
                story, it->second.first, std::string(core::warningInfo(code).key).c_str(), run, id.c_str(),
                workspacePath.c_str(), run, id.c_str());
        }
    };
    point("tight-fit", core::WarningCode::BurstEcho, "tight-fit echoes a recent binge");
    point("tight-fit", core::WarningCode::SeriesOrder, "tight-fit offers sequels before first parts");
    point("crowd-pleaser", core::WarningCode::AlreadySeen, "crowd-pleaser offers titles already seen");
    point("crowd-pleaser", core::WarningCode::PopularOnly, "crowd-pleaser offers only the club's most watched titles");
    point("wide-angle", core::WarningCode::NoList, "members who joined after the runs were made have no list");
    point("wide-angle", core::WarningCode::ColdUser, "cold members have too little history to judge");
    std::printf("  - the worst-served members of a run:  slatewise worst %s --run wide-angle --by ndcg\n",
        workspacePath.c_str());
    std::printf(
        "  - two runs side by side:              slatewise compare %s --base tight-fit --candidate wide-angle\n",
        workspacePath.c_str());
    std::printf("\ndemo-catalog/README.md tells the club's story and how the data was made.\n");
    return ExitOk;
}

} // namespace slatewise::cli
