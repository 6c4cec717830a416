// SPDX-License-Identifier: MIT
#include "core/demotastemodel.h"

#include "core/demorandom.h"
#include "core/demotitlemaker.h"

#include <algorithm>
#include <cstdio>
#include <numeric>

namespace slatewise::core {

namespace {
enum Genre {
    Drama, Comedy, Thriller, Romance, Documentary, Animation, ScienceFiction, Horror,
    Western, Musical, Mystery, Adventure, Family, War, Crime, Fantasy, GenreCount
};

// How common each genre is as a title's main genre.
constexpr std::array<double, GenreCount> kGenreWeight{10, 9, 7, 6, 5, 5, 6, 6, 4, 3, 6, 6, 5, 3, 6, 5};
// How often each genre carries a series.
constexpr std::array<double, GenreCount> kSeriesGenreWeight{1, 3, 4, 0.5, 0, 3, 4, 3, 2, 0.5, 5, 5, 3, 1, 5, 5};
// Genres a member may suddenly binge on; each gets extra single-genre titles.
constexpr std::array<int, 8> kBingeGenres{Horror, ScienceFiction, Western, Documentary,
                                          Animation, Musical, Crime, Fantasy};

int pickWeighted(DemoRandom& rng, const std::array<double, GenreCount>& weights)
{
    std::array<double, GenreCount> cumulative{};
    std::partial_sum(weights.begin(), weights.end(), cumulative.begin());
    return static_cast<int>(rng.pickCumulative(cumulative));
}

std::string numberedId(char prefix, std::size_t n, int width)
{
    char buf[32];
    std::snprintf(buf, sizeof buf, "%c%0*zu", prefix, width, n);
    return buf;
}

template <typename T>
void shuffle(DemoRandom& rng, std::vector<T>& v)
{
    for (std::size_t i = v.size(); i > 1; --i)
        std::swap(v[i - 1], v[rng.below(static_cast<std::uint32_t>(i))]);
}

DemoLatent randomLatent(DemoRandom& rng, double sd)
{
    DemoLatent l{};
    for (auto& x : l)
        x = rng.normal(0.0, sd);
    return l;
}

bool isBingeGenre(int g) { return std::find(kBingeGenres.begin(), kBingeGenres.end(), g) != kBingeGenres.end(); }
} // namespace

std::string_view toString(DemoMemberKind kind)
{
    switch (kind) {
    case DemoMemberKind::Light:
        return "light";
    case DemoMemberKind::Steady:
        return "steady";
    case DemoMemberKind::Heavy:
        return "heavy";
    case DemoMemberKind::SeriesFan:
        return "series-fan";
    case DemoMemberKind::HarshCritic:
        return "harsh-critic";
    case DemoMemberKind::Binge:
        return "binge";
    case DemoMemberKind::Cold:
        return "cold";
    case DemoMemberKind::LateJoiner:
        return "late-joiner";
    }
    return "steady";
}

const std::vector<std::string>& DemoTasteModel::genreNames() const { return DemoTitleMaker::genreNames(); }

DemoTasteModel DemoTasteModel::build(DemoRandom& rng)
{
    DemoTasteModel model;
    DemoRandom catalogRng = rng.fork(1);
    DemoRandom memberRng = rng.fork(2);
    model.buildCatalog(catalogRng);
    model.buildMembers(memberRng);
    return model;
}

void DemoTasteModel::buildCatalog(DemoRandom& rng)
{
    DemoTitleMaker maker;
    std::vector<DemoTitle> raw;
    std::vector<DemoSeries> series;
    std::vector<double> popularityScore;

    auto addTitle = [&](DemoTitle t, double popularityBoost) {
        popularityScore.push_back(t.quality + rng.normal(0.0, 0.6) + popularityBoost + (t.year >= 2015 ? 0.2 : 0.0));
        raw.push_back(std::move(t));
    };
    auto standaloneYear = [&] {
        const double u = rng.uniform();
        return 2026 - static_cast<int>(78.0 * u * u);
    };

    // Series: 34 of them, 2 to 6 parts, parts in consecutive years.
    const std::vector<int> partCounts{2, 2, 2, 2, 2, 2, 2, 2, 3, 3, 3, 3, 3, 3, 3, 3, 3, 3,
                                      4, 4, 4, 4, 4, 4, 4, 5, 5, 5, 5, 5, 6, 6, 6, 6};
    for (std::size_t s = 0; s < partCounts.size(); ++s) {
        DemoSeries ser;
        ser.genre = pickWeighted(rng, kSeriesGenreWeight);
        std::vector<int> genres{ser.genre};
        if (rng.chance(0.4)) {
            int second = pickWeighted(rng, kGenreWeight);
            if (second != ser.genre)
                genres.push_back(second);
        }
        std::sort(genres.begin(), genres.end());
        ser.name = maker.seriesName(rng, ser.genre);
        const double baseQuality = rng.normal(0.1, 0.3);
        const DemoLatent baseLatent = randomLatent(rng, 0.5);
        int year = 1962 + static_cast<int>(rng.below(56));
        for (int p = 1; p <= partCounts[s]; ++p) {
            DemoTitle t;
            t.title = maker.seriesPartTitle(rng, ser.name, p, ser.genre);
            t.year = std::min(year, 2026);
            year += 1 + static_cast<int>(rng.below(4));
            t.genres = genres;
            t.series = static_cast<int>(s);
            t.part = p;
            t.quality = baseQuality - 0.08 * (p - 1) + rng.normal(0.0, 0.1);
            t.latent = baseLatent;
            for (auto& x : t.latent)
                x += rng.normal(0.0, 0.15);
            ser.parts.push_back(static_cast<int>(raw.size()));
            addTitle(std::move(t), p == 1 ? 0.4 : -0.15 * (p - 1));
        }
        series.push_back(std::move(ser));
    }

    // Single-genre titles, more of them in the genres members binge on.
    for (int g = 0; g < GenreCount; ++g) {
        const int count = isBingeGenre(g) ? 22 : 10;
        for (int n = 0; n < count; ++n) {
            DemoTitle t;
            t.title = maker.title(rng, g);
            t.year = standaloneYear();
            t.genres = {g};
            t.quality = rng.normal(0.0, 0.35);
            t.latent = randomLatent(rng, 0.5);
            addTitle(std::move(t), 0.0);
        }
    }
    // Titles with two or three genres.
    for (int n = 0; n < 264; ++n) {
        DemoTitle t;
        const int main = pickWeighted(rng, kGenreWeight);
        t.title = maker.title(rng, main);
        t.year = standaloneYear();
        t.genres = {main};
        const int extra = rng.chance(0.7) ? 1 : 2;
        while (static_cast<int>(t.genres.size()) < 1 + extra) {
            const int g = pickWeighted(rng, kGenreWeight);
            if (std::find(t.genres.begin(), t.genres.end(), g) == t.genres.end())
                t.genres.push_back(g);
        }
        std::sort(t.genres.begin(), t.genres.end());
        t.quality = rng.normal(0.0, 0.35);
        t.latent = randomLatent(rng, 0.5);
        addTitle(std::move(t), 0.0);
    }

    // Popularity: a long tail over a noisy ranking of quality.
    std::vector<int> byPopularity(raw.size());
    std::iota(byPopularity.begin(), byPopularity.end(), 0);
    std::sort(byPopularity.begin(), byPopularity.end(), [&](int a, int b) {
        if (popularityScore[a] != popularityScore[b])
            return popularityScore[a] > popularityScore[b];
        return a < b;
    });
    for (std::size_t r = 0; r < byPopularity.size(); ++r) {
        raw[byPopularity[r]].popularityRank = static_cast<int>(r);
        raw[byPopularity[r]].popularity = 1.0 / (static_cast<double>(r) + 8.0);
    }

    // Shuffle so ids say nothing about genre or series.
    std::vector<int> order(raw.size());
    std::iota(order.begin(), order.end(), 0);
    shuffle(rng, order);
    std::vector<int> newIndex(raw.size());
    m_titles.clear();
    for (std::size_t n = 0; n < order.size(); ++n) {
        newIndex[order[n]] = static_cast<int>(n);
        m_titles.push_back(std::move(raw[order[n]]));
        m_titles.back().id = numberedId('t', n + 1, 3);
    }
    for (auto& s : series)
        for (auto& p : s.parts)
            p = newIndex[p];
    m_series = std::move(series);
}

void DemoTasteModel::buildMembers(DemoRandom& rng)
{
    std::vector<DemoMemberKind> kinds;
    auto add = [&](DemoMemberKind k, int n) { kinds.insert(kinds.end(), n, k); };
    add(DemoMemberKind::Light, 1000);
    add(DemoMemberKind::Steady, 850);
    add(DemoMemberKind::Heavy, 300);
    add(DemoMemberKind::SeriesFan, 350);
    add(DemoMemberKind::HarshCritic, 150);
    add(DemoMemberKind::Binge, 200);
    add(DemoMemberKind::Cold, 150);
    shuffle(rng, kinds);
    // Members who joined after the runs were produced get the last ids.
    add(DemoMemberKind::LateJoiner, 40);

    // Genres that carry a series, for the series fans' favourites.
    std::array<double, GenreCount> seriesGenres{};
    for (const auto& s : m_series)
        seriesGenres[static_cast<std::size_t>(s.genre)] += 1.0;

    constexpr std::int64_t day = 86400;
    m_members.clear();
    for (std::size_t n = 0; n < kinds.size(); ++n) {
        DemoMember m;
        m.id = numberedId('m', n + 1, 4);
        m.kind = kinds[n];
        m.genreTaste.resize(GenreCount);
        for (auto& t : m.genreTaste)
            t = rng.normal(0.0, 0.35);
        const int favourites = 1 + static_cast<int>(rng.below(3));
        for (int f = 0; f < favourites; ++f) {
            const int g = m.kind == DemoMemberKind::SeriesFan && f == 0 ? pickWeighted(rng, seriesGenres)
                                                                         : pickWeighted(rng, kGenreWeight);
            m.genreTaste[static_cast<std::size_t>(g)] = 1.2 + rng.normal(0.0, 0.2);
        }
        const int dislikes = 1 + static_cast<int>(rng.below(2));
        for (int d = 0; d < dislikes; ++d) {
            const auto g = rng.below(GenreCount);
            if (m.genreTaste[g] < 1.0)
                m.genreTaste[g] = -1.0 + rng.normal(0.0, 0.2);
        }
        m.latent = randomLatent(rng, 0.5);
        m.bias = rng.normal(0.0, 0.3);

        std::int64_t joinFrom = kStart, joinTo = kStart + 400 * day;
        switch (m.kind) {
        case DemoMemberKind::Light:
            m.interactions = rng.between(6, 16);
            joinTo = kEnd - 45 * day;
            break;
        case DemoMemberKind::Steady:
            m.interactions = rng.between(18, 60);
            break;
        case DemoMemberKind::Heavy:
            m.interactions = rng.between(80, 200);
            joinTo = kStart + 150 * day;
            break;
        case DemoMemberKind::SeriesFan:
            m.interactions = rng.between(25, 70);
            break;
        case DemoMemberKind::HarshCritic:
            m.interactions = rng.between(8, 30);
            m.bias = -1.1 + rng.normal(0.0, 0.15);
            joinTo = kEnd - 60 * day;
            break;
        case DemoMemberKind::Binge: {
            m.interactions = rng.between(40, 90);
            // A genre the member never cared for, discovered lately and enjoyed.
            std::vector<int> candidates;
            for (int g : kBingeGenres)
                if (m.genreTaste[static_cast<std::size_t>(g)] < 0.5)
                    candidates.push_back(g);
            m.bingeGenre = candidates.empty() ? kBingeGenres[0]
                                              : candidates[rng.below(static_cast<std::uint32_t>(candidates.size()))];
            m.genreTaste[static_cast<std::size_t>(m.bingeGenre)] = 0.8 + rng.normal(0.0, 0.2);
            joinTo = kStart + 300 * day;
            break;
        }
        case DemoMemberKind::Cold:
            m.interactions = rng.between(3, 5);
            joinFrom = kEnd - 120 * day;
            joinTo = kEnd - 20 * day;
            break;
        case DemoMemberKind::LateJoiner:
            m.interactions = rng.between(4, 8);
            joinFrom = kRunsProduced + 1 * day;
            joinTo = kEnd - 6 * day;
            break;
        }
        m.joined = joinFrom + static_cast<std::int64_t>(rng.uniform() * static_cast<double>(joinTo - joinFrom));
        m_members.push_back(std::move(m));
    }
}

double DemoTasteModel::affinity(int member, int title) const
{
    const auto& m = m_members[static_cast<std::size_t>(member)];
    const auto& t = m_titles[static_cast<std::size_t>(title)];
    double genre = 0.0;
    for (int g : t.genres)
        genre += m.genreTaste[static_cast<std::size_t>(g)];
    genre /= static_cast<double>(t.genres.size());
    double dot = 0.0;
    for (int d = 0; d < kDemoLatentDims; ++d)
        dot += m.latent[static_cast<std::size_t>(d)] * t.latent[static_cast<std::size_t>(d)];
    return genre + dot;
}

double DemoTasteModel::expectedRating(int member, int title) const
{
    return 3.3 + m_members[static_cast<std::size_t>(member)].bias + m_titles[static_cast<std::size_t>(title)].quality +
           0.75 * affinity(member, title);
}

double DemoTasteModel::choiceWeight(int member, int title) const
{
    const auto& t = m_titles[static_cast<std::size_t>(title)];
    const double f = std::max(0.03, 1.0 + 0.7 * affinity(member, title) + 0.5 * t.quality);
    return t.popularity * f * f * f;
}

double DemoTasteModel::titleMean(int title) const { return 3.3 + m_titles[static_cast<std::size_t>(title)].quality; }

std::vector<int> DemoTasteModel::pureTitles(int genre) const
{
    std::vector<int> out;
    for (std::size_t i = 0; i < m_titles.size(); ++i)
        if (m_titles[i].genres.size() == 1 && m_titles[i].genres[0] == genre)
            out.push_back(static_cast<int>(i));
    return out;
}

} // namespace slatewise::core
