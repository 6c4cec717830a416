// SPDX-License-Identifier: MIT
#include "core/demogenerator.h"

#include "core/demohistorysimulator.h"
#include "core/demorandom.h"
#include "core/demorunsimulator.h"
#include "core/demotastemodel.h"

#include <algorithm>
#include <cstdio>
#include <filesystem>
#include <fstream>

namespace slatewise::core {

namespace {
/// RFC 4180: quote a field holding a comma, a quote or a line break; double the quotes.
std::string csvField(const std::string& s)
{
    if (s.find_first_of(",\"\r\n") == std::string::npos)
        return s;
    std::string out = "\"";
    for (char c : s) {
        if (c == '"')
            out += '"';
        out += c;
    }
    out += '"';
    return out;
}

std::string isoDate(std::int64_t t)
{
    // Civil-from-days (H. Hinnant's algorithm), so no time-zone library is involved.
    std::int64_t z = t / 86400 + 719468;
    const std::int64_t era = (z >= 0 ? z : z - 146096) / 146097;
    const std::int64_t doe = z - era * 146097;
    const std::int64_t yoe = (doe - doe / 1460 + doe / 36524 - doe / 146096) / 365;
    const std::int64_t doy = doe - (365 * yoe + yoe / 4 - yoe / 100);
    const std::int64_t mp = (5 * doy + 2) / 153;
    const std::int64_t d = doy - (153 * mp + 2) / 5 + 1;
    const std::int64_t mo = mp < 10 ? mp + 3 : mp - 9;
    const std::int64_t y = yoe + era * 400 + (mo <= 2 ? 1 : 0);
    char buf[48];
    std::snprintf(buf, sizeof buf, "%04lld-%02lld-%02lld", static_cast<long long>(y), static_cast<long long>(mo),
                  static_cast<long long>(d));
    return buf;
}

void appendf(std::string& out, const char* fmt, auto... args)
{
    char buf[256];
    const int n = std::snprintf(buf, sizeof buf, fmt, args...);
    out.append(buf, static_cast<std::size_t>(n));
}

/// Members whose train history meets the recent-burst rule with the default settings:
/// among the last 10 train titles one genre holds >= 60% while it held <= 20% of at least
/// 20 older ones (shares counted as "titles carrying the genre").
bool meetsBurstRule(const DemoTasteModel& model, const DemoHistory& h, int genre)
{
    if (genre < 0 || h.train.size() < 30)
        return false;
    const std::size_t split = h.train.size() - 10;
    auto has = [&](const DemoInteraction& x) {
        const auto& g = model.titles()[static_cast<std::size_t>(x.title)].genres;
        return std::find(g.begin(), g.end(), genre) != g.end();
    };
    std::size_t recent = 0, older = 0;
    for (std::size_t k = 0; k < h.train.size(); ++k)
        (k < split ? older : recent) += has(h.train[k]) ? 1 : 0;
    return recent >= 6 && static_cast<double>(older) <= 0.2 * static_cast<double>(split);
}
} // namespace

std::vector<DemoRunFiles> DemoGenerator::runFiles()
{
    std::vector<DemoRunFiles> out;
    for (const char* name : {"tight-fit", "crowd-pleaser", "wide-angle"})
        out.push_back({name, std::string(name) + ".scores.csv", std::string(name) + ".lists.csv", {}});
    return out;
}

std::vector<std::string> DemoGenerator::fileNames()
{
    std::vector<std::string> out{kCatalogFile, kMembersFile, kTrainFile, kWithheldFile};
    for (const auto& r : runFiles()) {
        out.push_back(r.scoresFile);
        out.push_back(r.listsFile);
    }
    return out;
}

DemoOutput DemoGenerator::generate(std::uint64_t seed, const Progress& progress)
{
    const DemoRandom root(seed);
    DemoRandom modelRng = root.fork(11);
    progress(0.0, "inventing the catalog and the members");
    const DemoTasteModel model = DemoTasteModel::build(modelRng);
    progress(0.2, "playing two years of club evenings");
    const auto histories = DemoHistorySimulator::simulate(model, root.fork(12));
    progress(0.6, "simulating the three runs");
    auto runs = DemoRunSimulator::simulate(model, histories, root.fork(13));
    progress(0.9, "writing the files");

    const auto& titles = model.titles();
    const auto& members = model.members();
    DemoOutput out;

    std::string catalog = "item_id,title,year,genres,series,series_part\n";
    for (const auto& t : titles) {
        std::string genres;
        for (int g : t.genres) {
            if (!genres.empty())
                genres += ';';
            genres += model.genreNames()[static_cast<std::size_t>(g)];
        }
        catalog += t.id + ',' + csvField(t.title) + ',' + std::to_string(t.year) + ',' + csvField(genres) + ',';
        if (t.series >= 0)
            catalog += csvField(model.series()[static_cast<std::size_t>(t.series)].name) + ',' + std::to_string(t.part);
        else
            catalog += ',';
        catalog += '\n';
    }

    std::string memberFile = "member_id,kind,joined\n";
    std::string train = "user_id,item_id,rating,timestamp\n";
    std::string withheld = train;
    for (std::size_t mi = 0; mi < members.size(); ++mi) {
        const auto& m = members[mi];
        const auto& h = histories[mi];
        memberFile += m.id + ',' + std::string(toString(m.kind)) + ',' + isoDate(m.joined) + '\n';
        for (const auto& x : h.train)
            appendf(train, "%s,%s,%d,%lld\n", m.id.c_str(), titles[static_cast<std::size_t>(x.title)].id.c_str(),
                    x.rating, static_cast<long long>(x.timestamp));
        for (const auto& x : h.withheld)
            appendf(withheld, "%s,%s,%d,%lld\n", m.id.c_str(), titles[static_cast<std::size_t>(x.title)].id.c_str(),
                    x.rating, static_cast<long long>(x.timestamp));
        out.facts.trainRows += h.train.size();
        out.facts.withheldRows += h.withheld.size();
        if (m.kind == DemoMemberKind::Binge && meetsBurstRule(model, h, m.bingeGenre))
            out.facts.bingeMembers.push_back(m.id);
        if (h.train.size() < 5)
            out.facts.coldMembers.push_back(m.id);
        if (m.kind == DemoMemberKind::LateJoiner)
            out.facts.lateJoiners.push_back(m.id);
        if (m.kind == DemoMemberKind::SeriesFan)
            out.facts.seriesFans.push_back(m.id);
    }
    out.files.push_back({kCatalogFile, std::move(catalog)});
    out.files.push_back({kMembersFile, std::move(memberFile)});
    out.files.push_back({kTrainFile, std::move(train)});
    out.files.push_back({kWithheldFile, std::move(withheld)});

    const auto specs = runFiles();
    for (std::size_t r = 0; r < runs.size(); ++r) {
        std::string scores = "user_id,item_id,score\n";
        std::string lists = "user_id,rank,item_id\n";
        for (std::size_t mi = 0; mi < members.size(); ++mi) {
            const auto& id = members[mi].id;
            const auto& h = histories[mi];
            for (std::size_t k = 0; k < h.withheld.size(); ++k)
                appendf(scores, "%s,%s,%.3f\n", id.c_str(),
                        titles[static_cast<std::size_t>(h.withheld[k].title)].id.c_str(), runs[r].scores[mi][k]);
            const auto& list = runs[r].lists[mi];
            for (std::size_t k = 0; k < list.size(); ++k)
                appendf(lists, "%s,%zu,%s\n", id.c_str(), k + 1, titles[static_cast<std::size_t>(list[k])].id.c_str());
        }
        out.files.push_back({specs[r].scoresFile, std::move(scores)});
        out.files.push_back({specs[r].listsFile, std::move(lists)});
        out.runs.push_back({runs[r].name, specs[r].scoresFile, specs[r].listsFile, runs[r].character});
    }

    out.facts.titles = titles.size();
    out.facts.genres = model.genreNames().size();
    out.facts.series = model.series().size();
    out.facts.members = members.size();
    progress(1.0, "done");
    return out;
}

Status DemoGenerator::write(const DemoOutput& output, const std::string& dir)
{
    namespace fs = std::filesystem;
    std::error_code ec;
    fs::create_directories(dir, ec);
    if (ec)
        return Error{ErrorKind::Usage, dir, 0, 0, {}, "cannot create the output folder: " + ec.message(), {}};
    for (const auto& f : output.files) {
        const fs::path target = fs::path(dir) / f.name;
        const fs::path temp = fs::path(dir) / (f.name + ".part");
        {
            std::ofstream out(temp, std::ios::binary | std::ios::trunc);
            out.write(f.content.data(), static_cast<std::streamsize>(f.content.size()));
            out.close();
            if (!out)
                return Error{ErrorKind::Usage, temp.string(), 0, 0, {}, "cannot write the file", {}};
        }
        // Rename so that an interrupted run never leaves a half-written demo file behind.
        fs::rename(temp, target, ec);
        if (ec)
            return Error{ErrorKind::Usage, target.string(), 0, 0, {}, "cannot replace the file: " + ec.message(), {}};
    }
    return Done{};
}

} // namespace slatewise::core
