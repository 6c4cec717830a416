// SPDX-License-Identifier: MIT
#include "core/syntheticdata.h"

#include "core/parallel.h"
#include "core/timestamp.h"

#include <algorithm>
#include <charconv>
#include <cmath>
#include <cstdio>
#include <numeric>

namespace slatewise::core {

namespace {

// splitmix64: tiny, fast and good enough for synthetic data; seeding one stream per
// (seed, user, purpose) makes the output independent of the thread count.
struct Rng {
    std::uint64_t state;
    std::uint64_t next()
    {
        std::uint64_t z = (state += 0x9E3779B97F4A7C15ULL);
        z = (z ^ (z >> 30)) * 0xBF58476D1CE4E5B9ULL;
        z = (z ^ (z >> 27)) * 0x94D049BB133111EBULL;
        return z ^ (z >> 31);
    }
    double uniform() { return static_cast<double>(next() >> 11) * 0x1.0p-53; }
    std::uint32_t below(std::uint32_t n) { return static_cast<std::uint32_t>((next() >> 32) * n >> 32); }
    double normal()
    {
        const double u1 = std::max(uniform(), 1e-300);
        const double u2 = uniform();
        return std::sqrt(-2.0 * std::log(u1)) * std::cos(6.283185307179586 * u2);
    }
};

Rng streamFor(std::uint64_t seed, std::uint64_t a, std::uint64_t b)
{
    Rng r{seed * 0x9E3779B97F4A7C15ULL ^ (a << 20) ^ (b * 0xD6E8FEB86659FD93ULL)};
    r.next();
    return r;
}

/// Vose's alias method (common practice): O(1) draws from a fixed discrete distribution.
struct AliasTable {
    std::vector<double> prob;
    std::vector<std::uint32_t> alias;

    explicit AliasTable(const std::vector<double>& weights)
    {
        const std::size_t n = weights.size();
        prob.assign(n, 0.0);
        alias.assign(n, 0);
        const double total = std::accumulate(weights.begin(), weights.end(), 0.0);
        std::vector<double> scaled(n);
        std::vector<std::uint32_t> small, large;
        for (std::size_t i = 0; i < n; ++i) {
            scaled[i] = weights[i] * static_cast<double>(n) / total;
            (scaled[i] < 1.0 ? small : large).push_back(static_cast<std::uint32_t>(i));
        }
        while (!small.empty() && !large.empty()) {
            const std::uint32_t s = small.back(), l = large.back();
            small.pop_back();
            prob[s] = scaled[s];
            alias[s] = l;
            scaled[l] = scaled[l] + scaled[s] - 1.0;
            if (scaled[l] < 1.0) {
                large.pop_back();
                small.push_back(l);
            }
        }
        for (auto i : large)
            prob[i] = 1.0;
        for (auto i : small)
            prob[i] = 1.0;
    }
    std::uint32_t draw(Rng& rng) const
    {
        const std::uint32_t i = rng.below(static_cast<std::uint32_t>(prob.size()));
        return rng.uniform() < prob[i] ? i : alias[i];
    }
};

struct UserTaste {
    double bias = 0;
    std::int32_t favourite = 0;
    std::int32_t second = 0;
};

constexpr Timestamp kEpochStart = 1704067200; // 2024-01-01T00:00:00Z

} // namespace

SyntheticWorkspace makeSynthetic(const SyntheticSpec& specIn)
{
    SyntheticSpec spec = specIn;
    spec.users = std::max(1u, spec.users);
    spec.items = std::max(4u, spec.items);
    spec.genres = std::max(1u, spec.genres);

    SyntheticWorkspace out;
    Dataset& data = out.data;
    data.scale = RatingScale{1.0, 5.0, 1.0, false};

    // Genres and catalog.
    for (std::uint32_t g = 0; g < spec.genres; ++g) {
        char buf[32];
        std::snprintf(buf, sizeof buf, "genre%02u", g + 1);
        data.genreNames.emplace_back(buf);
    }
    Rng catalogRng = streamFor(spec.seed, 0xC0FFEE, 1);
    std::vector<double> itemBias(spec.items);
    data.items.resize(spec.items);
    // Genre frequencies are skewed too: a few genres are common.
    std::vector<double> genreWeights(spec.genres);
    for (std::uint32_t g = 0; g < spec.genres; ++g)
        genreWeights[g] = 1.0 / (1.0 + 0.3 * g);
    const AliasTable genreTable(genreWeights);
    for (std::uint32_t i = 0; i < spec.items;) {
        // About one item in ten starts a series of 2-5 parts.
        std::uint32_t parts = 1;
        std::int32_t series = kNone;
        if (catalogRng.uniform() < 0.03 && i + 2 < spec.items) {
            parts = std::min<std::uint32_t>(2 + catalogRng.below(4), spec.items - i);
            series = static_cast<std::int32_t>(data.seriesNames.size());
            data.seriesNames.push_back("Series " + std::to_string(series + 1));
        }
        std::vector<std::int32_t> genres;
        const std::uint32_t genreCount = 1 + catalogRng.below(3);
        while (genres.size() < std::min(genreCount, spec.genres)) {
            const auto g = static_cast<std::int32_t>(genreTable.draw(catalogRng));
            if (std::find(genres.begin(), genres.end(), g) == genres.end())
                genres.push_back(g);
        }
        std::sort(genres.begin(), genres.end());
        const std::int32_t year = 1950 + static_cast<std::int32_t>(catalogRng.below(76));
        for (std::uint32_t p = 0; p < parts; ++p, ++i) {
            Item& item = data.items[i];
            char buf[32];
            std::snprintf(buf, sizeof buf, "item%06u", i + 1);
            item.externalId = buf;
            item.title = series == kNone ? "Title " + std::to_string(i + 1)
                                         : data.seriesNames[static_cast<std::size_t>(series)] + " part "
                                               + std::to_string(p + 1);
            item.year = std::min(2025, year + static_cast<std::int32_t>(p) * 2);
            item.genres = genres;
            item.series = series;
            item.seriesPart = series == kNone ? 0 : static_cast<std::int32_t>(p + 1);
            itemBias[i] = 0.5 * catalogRng.normal();
        }
    }

    // Long-tail popularity: Zipf-like weights over a random permutation of the items.
    std::vector<std::uint32_t> perm(spec.items);
    std::iota(perm.begin(), perm.end(), 0u);
    for (std::uint32_t i = spec.items - 1; i > 0; --i)
        std::swap(perm[i], perm[catalogRng.below(i + 1)]);
    std::vector<double> popularity(spec.items);
    for (std::uint32_t r = 0; r < spec.items; ++r)
        popularity[perm[r]] = 1.0 / std::pow(static_cast<double>(r) + 10.0, 0.9);
    const AliasTable itemTable(popularity);

    // Per-user counts first so the rows can be filled in parallel into their final place.
    const std::uint32_t users = spec.users;
    data.userIds.resize(users);
    std::vector<std::uint32_t> trainCount(users), heldCount(users), listCount(users);
    std::vector<UserTaste> taste(users);
    for (std::uint32_t u = 0; u < users; ++u) {
        Rng r = streamFor(spec.seed, u, 2);
        const auto cap = static_cast<std::uint32_t>(spec.items * 0.6);
        auto t = static_cast<std::uint32_t>(std::llround(spec.trainPerUser * (0.5 + r.uniform())));
        auto w = static_cast<std::uint32_t>(std::llround(spec.withheldPerUser * (0.5 + r.uniform())));
        t = std::clamp(t, 1u, cap);
        w = std::min(w, cap - t);
        trainCount[u] = t;
        heldCount[u] = w;
        listCount[u] = std::min(spec.listLength, spec.items - t);
        taste[u].bias = 0.4 * r.normal();
        taste[u].favourite = static_cast<std::int32_t>(genreTable.draw(r));
        taste[u].second = static_cast<std::int32_t>(genreTable.draw(r));
        char buf[32];
        std::snprintf(buf, sizeof buf, "user%07u", u + 1);
        data.userIds[u] = buf;
    }
    auto prefix = [](const std::vector<std::uint32_t>& counts) {
        std::vector<std::uint32_t> offsets(counts.size() + 1, 0);
        for (std::size_t i = 0; i < counts.size(); ++i)
            offsets[i + 1] = offsets[i] + counts[i];
        return offsets;
    };
    data.train.offsets = prefix(trainCount);
    data.withheld.offsets = prefix(heldCount);
    data.train.rows.resize(data.train.offsets.back());
    data.withheld.rows.resize(data.withheld.offsets.back());

    RunData& run = out.run;
    run.info.name = "synthetic";
    run.info.kind = RunKind::Imported;
    run.info.settingsJson = "{\"generator\":\"synthetic\",\"seed\":" + std::to_string(spec.seed) + "}";
    run.hasScores = true;
    run.hasLists = true;
    run.scores.assign(data.withheld.rows.size(), 0.0f);
    run.listOffsets = prefix(listCount);
    run.listRows.resize(run.listOffsets.back());

    const auto affinity = [&](std::uint32_t u, std::uint32_t item) {
        double a = 0;
        for (auto g : data.items[item].genres) {
            if (g == taste[u].favourite)
                a += 0.8;
            else if (g == taste[u].second)
                a += 0.4;
        }
        return a;
    };
    const auto trueRating = [&](std::uint32_t u, std::uint32_t item, Rng& r) {
        const double v = 3.4 + taste[u].bias + itemBias[item] + affinity(u, item) + 0.7 * r.normal();
        return static_cast<float>(std::clamp(std::round(v), 1.0, 5.0));
    };
    // The run's model knows the biases and affinities but with its own noise; a pair's score
    // is a function of (seed, user, item) so the list and the scores file agree.
    const auto modelScore = [&](std::uint32_t u, std::uint32_t item) {
        Rng r = streamFor(spec.seed ^ 0xABCDEF, u, item + 7);
        const double v = 3.4 + taste[u].bias + itemBias[item] + 0.8 * affinity(u, item) + 0.45 * r.normal();
        return static_cast<float>(std::clamp(v, 0.5, 5.5));
    };

    const unsigned workers = workerCount();
    std::vector<std::vector<std::uint32_t>> stamps(workers, std::vector<std::uint32_t>(spec.items, 0));
    parallelFor(users, [&](std::size_t begin, std::size_t end, unsigned worker) {
        auto& stamp = stamps[worker];
        std::vector<std::uint32_t> picked;
        std::vector<std::pair<float, std::uint32_t>> ranked;
        for (std::size_t uu = begin; uu < end; ++uu) {
            const auto u = static_cast<std::uint32_t>(uu);
            const std::uint32_t mark = u + 1;
            Rng r = streamFor(spec.seed, u, 3);
            const std::uint32_t need = trainCount[u] + heldCount[u];
            picked.clear();
            std::uint32_t tries = 0;
            while (picked.size() < need) {
                std::uint32_t item = 0;
                if (tries++ < need * 20) {
                    item = itemTable.draw(r);
                } else {
                    // Rare fallback for users who take most of a tiny catalog.
                    item = r.below(spec.items);
                    while (stamp[item] == mark)
                        item = (item + 1) % spec.items;
                }
                if (stamp[item] == mark)
                    continue;
                stamp[item] = mark;
                picked.push_back(item);
            }
            Timestamp t = kEpochStart + static_cast<Timestamp>(r.below(365 * 86400));
            auto* trainRows = data.train.rows.data() + data.train.offsets[u];
            for (std::uint32_t j = 0; j < trainCount[u]; ++j) {
                t += 3600 + r.below(3 * 86400);
                trainRows[j] = Interaction{ItemIndex(picked[j]), trueRating(u, picked[j], r), t};
            }
            auto* heldRows = data.withheld.rows.data() + data.withheld.offsets[u];
            for (std::uint32_t j = 0; j < heldCount[u]; ++j) {
                t += 3600 + r.below(3 * 86400);
                const std::uint32_t item = picked[trainCount[u] + j];
                heldRows[j] = Interaction{ItemIndex(item), trueRating(u, item, r), t};
            }
            std::sort(heldRows, heldRows + heldCount[u],
                      [](const Interaction& a, const Interaction& b) { return a.item < b.item; });
            float* scores = run.scores.data() + data.withheld.offsets[u];
            for (std::uint32_t j = 0; j < heldCount[u]; ++j)
                scores[j] = modelScore(u, heldRows[j].item.value);

            // The list: about half of the withheld items plus popular items outside train.
            ranked.clear();
            const std::uint32_t listMark = mark | 0x80000000u;
            for (std::uint32_t j = 0; j < trainCount[u]; ++j)
                stamp[picked[j]] = listMark;
            for (std::uint32_t j = 0; j < heldCount[u] && ranked.size() < listCount[u]; ++j) {
                const std::uint32_t item = heldRows[j].item.value;
                if (r.uniform() < 0.5) {
                    stamp[item] = listMark;
                    ranked.emplace_back(scores[j], item);
                }
            }
            tries = 0;
            while (ranked.size() < listCount[u]) {
                std::uint32_t item = 0;
                if (tries++ < listCount[u] * 20) {
                    item = itemTable.draw(r);
                } else {
                    item = r.below(spec.items);
                    while (stamp[item] == listMark)
                        item = (item + 1) % spec.items;
                }
                if (stamp[item] == listMark)
                    continue;
                stamp[item] = listMark;
                ranked.emplace_back(modelScore(u, item), item);
            }
            std::sort(ranked.begin(), ranked.end(),
                      [](const auto& a, const auto& b) { return a.first != b.first ? a.first > b.first : a.second < b.second; });
            auto* list = run.listRows.data() + run.listOffsets[u];
            for (std::size_t j = 0; j < ranked.size(); ++j)
                list[j] = ListEntry{ItemIndex(ranked[j].second), ranked[j].first};
            // Stamps are per user: marks differ between users, and listMark never equals a mark.
        }
    }, workers);
    run.info.scoreCount = static_cast<std::int64_t>(run.scores.size());
    run.info.listRowCount = static_cast<std::int64_t>(run.listRows.size());
    run.info.listUserCount = users;
    return out;
}

namespace {

/// Buffered writer: formats rows into a large buffer and writes in big blocks.
class CsvOut {
public:
    explicit CsvOut(const std::string& path) : m_file(std::fopen(path.c_str(), "wb")), m_path(path)
    {
        m_buf.reserve(1 << 20);
    }
    ~CsvOut()
    {
        if (m_file)
            std::fclose(m_file);
    }
    CsvOut(const CsvOut&) = delete;
    CsvOut& operator=(const CsvOut&) = delete;
    bool ok() const { return m_file && !m_failed; }
    void text(std::string_view s) { m_buf.append(s); }
    void ch(char c) { m_buf.push_back(c); }
    /// A field quoted as RFC 4180 requires when it holds a comma, quote or line break.
    void field(std::string_view s)
    {
        if (s.find_first_of(",\"\r\n") == std::string_view::npos) {
            m_buf.append(s);
            return;
        }
        m_buf.push_back('"');
        for (char c : s) {
            if (c == '"')
                m_buf.push_back('"');
            m_buf.push_back(c);
        }
        m_buf.push_back('"');
    }
    void integer(std::int64_t v)
    {
        char b[24];
        auto res = std::to_chars(b, b + sizeof b, v);
        m_buf.append(b, res.ptr);
    }
    void real(double v)
    {
        char b[32];
        auto res = std::to_chars(b, b + sizeof b, v, std::chars_format::general, 6);
        m_buf.append(b, res.ptr);
    }
    void endRow()
    {
        m_buf.push_back('\n');
        if (m_buf.size() > (1 << 20) - 4096)
            flush();
    }
    bool finish()
    {
        flush();
        if (m_file && std::fclose(m_file) != 0)
            m_failed = true;
        m_file = nullptr;
        return !m_failed;
    }
    const std::string& path() const { return m_path; }

private:
    void flush()
    {
        if (m_file && !m_buf.empty() && std::fwrite(m_buf.data(), 1, m_buf.size(), m_file) != m_buf.size())
            m_failed = true;
        m_buf.clear();
    }
    std::FILE* m_file;
    std::string m_path;
    std::string m_buf;
    bool m_failed = false;
};

Error writeError(const std::string& path)
{
    Error e;
    e.kind = ErrorKind::Workspace;
    e.file = path;
    e.message = "cannot write file";
    return e;
}

} // namespace

Status writeSyntheticFiles(const SyntheticSpec& spec, const std::string& dir)
{
    const SyntheticWorkspace ws = makeSynthetic(spec);
    const Dataset& data = ws.data;
    const auto path = [&](const char* name) { return dir + "/" + name; };

    {
        CsvOut out(path("catalog.csv"));
        if (!out.ok())
            return writeError(out.path());
        out.text("item_id,title,year,genres,series,series_part\n");
        for (const Item& item : data.items) {
            out.field(item.externalId);
            out.ch(',');
            out.field(item.title);
            out.ch(',');
            out.integer(item.year);
            out.ch(',');
            std::string genres;
            for (std::size_t g = 0; g < item.genres.size(); ++g) {
                if (g)
                    genres += ';';
                genres += data.genreNames[static_cast<std::size_t>(item.genres[g])];
            }
            out.field(genres);
            out.ch(',');
            if (item.series != kNone) {
                out.field(data.seriesNames[static_cast<std::size_t>(item.series)]);
                out.ch(',');
                out.integer(item.seriesPart);
            } else {
                out.ch(',');
            }
            out.endRow();
        }
        if (!out.finish())
            return writeError(out.path());
    }
    const auto writeInteractions = [&](const char* name, const InteractionTable& table, bool iso) -> Status {
        CsvOut out(path(name));
        if (!out.ok())
            return writeError(out.path());
        out.text("user_id,item_id,rating,timestamp\n");
        for (std::size_t u = 0; u < data.userCount(); ++u) {
            for (const auto& row : table.of(UserIndex(static_cast<std::uint32_t>(u)))) {
                out.text(data.userIds[u]);
                out.ch(',');
                out.text(data.items[row.item.value].externalId);
                out.ch(',');
                out.integer(static_cast<std::int64_t>(row.rating));
                out.ch(',');
                if (iso)
                    out.text(formatIso8601(row.timestamp));
                else
                    out.integer(row.timestamp);
                out.endRow();
            }
        }
        if (!out.finish())
            return writeError(out.path());
        return Done{};
    };
    if (auto s = writeInteractions("train.csv", data.train, false); !s)
        return s;
    if (auto s = writeInteractions("withheld.csv", data.withheld, true); !s)
        return s;
    {
        CsvOut out(path("scores.csv"));
        if (!out.ok())
            return writeError(out.path());
        out.text("user_id,item_id,score\n");
        for (std::size_t u = 0; u < data.userCount(); ++u) {
            const auto begin = data.withheld.offsets[u];
            for (auto r = begin; r < data.withheld.offsets[u + 1]; ++r) {
                out.text(data.userIds[u]);
                out.ch(',');
                out.text(data.items[data.withheld.rows[r].item.value].externalId);
                out.ch(',');
                out.real(ws.run.scores[r]);
                out.endRow();
            }
        }
        if (!out.finish())
            return writeError(out.path());
    }
    {
        CsvOut out(path("lists.csv"));
        if (!out.ok())
            return writeError(out.path());
        out.text("user_id,rank,item_id,score\n");
        for (std::size_t u = 0; u < data.userCount(); ++u) {
            const auto list = ws.run.listOf(UserIndex(static_cast<std::uint32_t>(u)));
            for (std::size_t j = 0; j < list.size(); ++j) {
                out.text(data.userIds[u]);
                out.ch(',');
                out.integer(static_cast<std::int64_t>(j + 1));
                out.ch(',');
                out.text(data.items[list[j].item.value].externalId);
                out.ch(',');
                out.real(list[j].score);
                out.endRow();
            }
        }
        if (!out.finish())
            return writeError(out.path());
    }
    return Done{};
}

} // namespace slatewise::core
