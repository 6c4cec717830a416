// SPDX-License-Identifier: MIT
#include "core/demorunsimulator.h"

#include "core/demohistorysimulator.h"
#include "core/demorandom.h"
#include "core/demotastemodel.h"

#include <algorithm>
#include <cmath>
#include <numeric>

namespace slatewise::core {

namespace {
/// Natural logarithm from +, *, / and sqrt only (argument halving by square roots,
/// then the atanh series), so results do not depend on the platform's libm.
double portableLog(double x)
{
    if (x <= 0.0)
        return -1e300;
    double scale = 0.0;
    // Bring x close to 1: each square root halves the logarithm.
    while (x > 1.0625 || x < 0.94) {
        x = std::sqrt(x);
        scale += 1.0;
    }
    const double y = (x - 1.0) / (x + 1.0);
    const double y2 = y * y;
    double term = y, sum = 0.0;
    for (int k = 1; k < 30; k += 2) {
        sum += term / k;
        term *= y2;
    }
    double result = 2.0 * sum;
    for (double s = 0.0; s < scale; s += 1.0)
        result *= 2.0;
    return result;
}

bool hasGenre(const DemoTitle& t, int g) { return std::find(t.genres.begin(), t.genres.end(), g) != t.genres.end(); }

/// Indices of the `n` largest keys, ties broken by index (a total order, so every
/// standard library sorts the same way).
std::vector<int> topByKey(const std::vector<double>& key, const std::vector<bool>& allowed, int n)
{
    std::vector<int> idx;
    for (std::size_t i = 0; i < key.size(); ++i)
        if (allowed[i])
            idx.push_back(static_cast<int>(i));
    auto better = [&](int a, int b) {
        if (key[static_cast<std::size_t>(a)] != key[static_cast<std::size_t>(b)])
            return key[static_cast<std::size_t>(a)] > key[static_cast<std::size_t>(b)];
        return a < b;
    };
    const auto cut = std::min<std::size_t>(static_cast<std::size_t>(n), idx.size());
    std::partial_sort(idx.begin(), idx.begin() + static_cast<std::ptrdiff_t>(cut), idx.end(), better);
    idx.resize(cut);
    return idx;
}

double jaccard(const std::vector<int>& a, const std::vector<int>& b)
{
    std::size_t common = 0;
    for (int g : a)
        if (std::find(b.begin(), b.end(), g) != b.end())
            ++common;
    const std::size_t unite = a.size() + b.size() - common;
    return unite == 0 ? 1.0 : static_cast<double>(common) / static_cast<double>(unite);
}

void addMix(std::vector<double>& mix, const std::vector<int>& genres)
{
    for (int g : genres)
        mix[static_cast<std::size_t>(g)] += 1.0 / static_cast<double>(genres.size());
}

/// KL divergence (nats) of the member's genre mix from the list's mix once `genres` joins
/// a list of `count` titles, smoothed with 1% of the member's mix. Uses log only through
/// a fixed-order series so every platform computes the same bits.
double calibrationGap(const std::vector<double>& taste, const std::vector<double>& listMix,
                      const std::vector<int>& genres, std::size_t count)
{
    double kl = 0.0;
    const double n = static_cast<double>(count + 1);
    for (std::size_t g = 0; g < taste.size(); ++g) {
        if (taste[g] <= 0.0)
            continue;
        double q = listMix[g];
        for (int x : genres)
            if (static_cast<std::size_t>(x) == g)
                q += 1.0 / static_cast<double>(genres.size());
        const double smoothed = 0.99 * (q / n) + 0.01 * taste[g];
        kl += taste[g] * portableLog(taste[g] / smoothed);
    }
    return kl;
}

double clampStars(double x) { return std::clamp(x, 1.0, 5.0); }

/// The genre that fills at least half of the member's last ten train titles, or -1.
int recentGenre(const DemoTasteModel& model, const DemoHistory& h, int genreCount)
{
    if (h.train.size() < 10)
        return -1;
    std::vector<int> count(static_cast<std::size_t>(genreCount), 0);
    for (std::size_t k = h.train.size() - 10; k < h.train.size(); ++k)
        for (int g : model.titles()[static_cast<std::size_t>(h.train[k].title)].genres)
            ++count[static_cast<std::size_t>(g)];
    const auto best = std::max_element(count.begin(), count.end());
    return *best >= 5 ? static_cast<int>(best - count.begin()) : -1;
}

int mostWatchedGenre(const DemoTasteModel& model, const DemoHistory& h, int genreCount)
{
    std::vector<int> count(static_cast<std::size_t>(genreCount), 0);
    for (const auto& x : h.train)
        for (int g : model.titles()[static_cast<std::size_t>(x.title)].genres)
            ++count[static_cast<std::size_t>(g)];
    const auto best = std::max_element(count.begin(), count.end());
    return *best > 0 ? static_cast<int>(best - count.begin()) : -1;
}
} // namespace

std::vector<DemoRun> DemoRunSimulator::simulate(const DemoTasteModel& model, const std::vector<DemoHistory>& histories,
                                                const DemoRandom& rootRng)
{
    const auto& titles = model.titles();
    const auto& series = model.series();
    const int titleCount = static_cast<int>(titles.size());
    const int genreCount = static_cast<int>(model.genreNames().size());
    const std::size_t memberCount = model.members().size();

    std::vector<DemoRun> runs(3);
    runs[0].name = "tight-fit";
    runs[0].character = "closest on predicted stars, but its lists chase series (later parts first) and echo "
                        "whatever genre the member watched last";
    runs[1].name = "crowd-pleaser";
    runs[1].character = "leans on what the whole club watches; for about a third of members it forgets to drop "
                        "titles they have already seen";
    runs[2].name = "wide-angle";
    runs[2].character = "a little rougher on predicted stars, but its lists follow each member's own mix, spread "
                        "across genres and keep series in order";
    for (auto& r : runs) {
        r.scores.resize(memberCount);
        r.lists.resize(memberCount);
    }

    for (std::size_t mi = 0; mi < memberCount; ++mi) {
        const int u = static_cast<int>(mi);
        const DemoMember& m = model.members()[mi];
        const DemoHistory& h = histories[mi];
        DemoRandom rng = rootRng.fork(500000 + mi);
        const bool known = m.kind != DemoMemberKind::LateJoiner;

        // Predicted ratings for the withheld pairs. Members unknown to a run get the
        // title's average from every run (the scoring service's fallback).
        for (const auto& x : h.withheld) {
            const double mean = model.titleMean(x.title);
            const auto& t = titles[static_cast<std::size_t>(x.title)];
            if (!known) {
                for (auto& r : runs)
                    r.scores[mi].push_back(clampStars(mean + rng.normal(0.0, 0.1)));
                continue;
            }
            const double expected = model.expectedRating(u, x.title);
            runs[0].scores[mi].push_back(clampStars(expected + rng.normal(0.0, 0.25)));
            const double popularityLift = 0.8 * (0.5 - static_cast<double>(t.popularityRank) / titleCount);
            runs[1].scores[mi].push_back(clampStars(3.3 + 0.6 * t.quality + popularityLift + rng.normal(0.0, 0.35)));
            runs[2].scores[mi].push_back(clampStars(0.8 * expected + 0.2 * mean + rng.normal(0.0, 0.45)));
        }
        if (!known)
            continue;

        std::vector<bool> seen(static_cast<std::size_t>(titleCount), false);
        for (const auto& x : h.train)
            seen[static_cast<std::size_t>(x.title)] = true;
        std::vector<bool> unseen(seen.size());
        std::transform(seen.begin(), seen.end(), unseen.begin(), [](bool s) { return !s; });
        std::vector<bool> everything(seen.size(), true);

        // tight-fit: expected rating plus a pull towards series and the latest genre.
        {
            std::vector<int> seriesSeen(series.size(), 0);
            for (const auto& x : h.train)
                if (titles[static_cast<std::size_t>(x.title)].series >= 0)
                    ++seriesSeen[static_cast<std::size_t>(titles[static_cast<std::size_t>(x.title)].series)];
            // The member's "franchise": the series with at least three unseen parts they like best.
            int franchise = -1;
            double bestTaste = -1e9;
            for (std::size_t s = 0; s < series.size(); ++s) {
                int open = 0;
                double taste = 0.0;
                for (int p : series[s].parts) {
                    open += seen[static_cast<std::size_t>(p)] ? 0 : 1;
                    taste += model.affinity(u, p);
                }
                taste /= static_cast<double>(series[s].parts.size());
                if (open >= 3 && taste > 0.65 && taste > bestTaste) {
                    bestTaste = taste;
                    franchise = static_cast<int>(s);
                }
            }
            const int recent = recentGenre(model, h, genreCount);
            const int top = mostWatchedGenre(model, h, genreCount);
            std::vector<double> key(static_cast<std::size_t>(titleCount));
            for (int i = 0; i < titleCount; ++i) {
                const auto& t = titles[static_cast<std::size_t>(i)];
                double k = model.expectedRating(u, i) + rng.normal(0.0, 0.3);
                if (t.series >= 0) {
                    const bool touched = seriesSeen[static_cast<std::size_t>(t.series)] > 0;
                    const bool favourite = t.series == franchise;
                    // Later parts score higher: the run learnt that sequels get rated well by
                    // the members who reach them.
                    if (touched)
                        k += 0.3 * t.part;
                    if (touched)
                        k += 1.5;
                    if (favourite)
                        k += 2.5;
                }
                if (recent >= 0 && hasGenre(t, recent))
                    k += t.genres.size() == 1 ? 4.0 : 2.5;
                if (top >= 0 && hasGenre(t, top))
                    k += 0.6;
                key[static_cast<std::size_t>(i)] = k;
            }
            runs[0].lists[mi] = topByKey(key, unseen, kListLength);
        }

        // crowd-pleaser: popularity with a light touch of taste; a hasty filter.
        {
            const bool filters = !rng.chance(0.33);
            std::vector<double> key(static_cast<std::size_t>(titleCount));
            for (int i = 0; i < titleCount; ++i) {
                const double taste = std::clamp(model.affinity(u, i), -1.0, 1.0);
                key[static_cast<std::size_t>(i)] =
                    titles[static_cast<std::size_t>(i)].popularity * (1.0 + 0.25 * taste) * (0.85 + 0.3 * rng.uniform());
            }
            runs[1].lists[mi] = topByKey(key, filters ? unseen : everything, kListLength);
        }

        // wide-angle: the chance of a pick, then a greedy re-rank of the head that trades a
        // little relevance for genre variety, at most two titles per series, in part order.
        {
            std::vector<double> key(static_cast<std::size_t>(titleCount));
            for (int i = 0; i < titleCount; ++i)
                key[static_cast<std::size_t>(i)] = model.choiceWeight(u, i) * (0.75 + 0.5 * rng.uniform());
            std::vector<int> ranked = topByKey(key, unseen, titleCount);
            const double top = ranked.empty() ? 1.0 : key[static_cast<std::size_t>(ranked.front())];
            std::vector<int> list;
            std::vector<bool> placed(static_cast<std::size_t>(titleCount), false);
            std::vector<int> perSeries(series.size(), 0);
            // The member's genre mix (each title's genres share one unit), which the
            // re-rank tries to match (Steck, RecSys 2018).
            std::vector<double> taste(static_cast<std::size_t>(genreCount), 0.0);
            for (const auto& x : h.train)
                addMix(taste, titles[static_cast<std::size_t>(x.title)].genres);
            const double tasteTotal = std::accumulate(taste.begin(), taste.end(), 0.0);
            for (auto& v : taste)
                v = tasteTotal > 0.0 ? v / tasteTotal : 0.0;
            std::vector<double> listMix(static_cast<std::size_t>(genreCount), 0.0);
            auto orderOk = [&](int i) {
                const auto& t = titles[static_cast<std::size_t>(i)];
                if (t.series < 0)
                    return true;
                if (perSeries[static_cast<std::size_t>(t.series)] >= 2)
                    return false;
                for (int q = 1; q < t.part; ++q) {
                    const int prev = series[static_cast<std::size_t>(t.series)].parts[static_cast<std::size_t>(q - 1)];
                    if (!seen[static_cast<std::size_t>(prev)] && !placed[static_cast<std::size_t>(prev)])
                        return false;
                }
                return true;
            };
            const std::size_t pool = std::min<std::size_t>(ranked.size(), 60);
            while (list.size() < 20) {
                int bestItem = -1;
                double bestValue = -1e9;
                for (std::size_t c = 0; c < pool; ++c) {
                    const int i = ranked[c];
                    if (placed[static_cast<std::size_t>(i)] || !orderOk(i))
                        continue;
                    double similar = 0.0;
                    for (int j : list)
                        similar = std::max(similar, jaccard(titles[static_cast<std::size_t>(i)].genres,
                                                            titles[static_cast<std::size_t>(j)].genres));
                    const double value = key[static_cast<std::size_t>(i)] / top - 0.2 * similar -
                                         0.6 * calibrationGap(taste, listMix, titles[static_cast<std::size_t>(i)].genres,
                                                               list.size());
                    if (value > bestValue) {
                        bestValue = value;
                        bestItem = i;
                    }
                }
                if (bestItem < 0)
                    break;
                list.push_back(bestItem);
                placed[static_cast<std::size_t>(bestItem)] = true;
                addMix(listMix, titles[static_cast<std::size_t>(bestItem)].genres);
                const int s = titles[static_cast<std::size_t>(bestItem)].series;
                if (s >= 0)
                    ++perSeries[static_cast<std::size_t>(s)];
            }
            for (int i : ranked) {
                if (static_cast<int>(list.size()) >= kListLength)
                    break;
                if (!placed[static_cast<std::size_t>(i)]) {
                    list.push_back(i);
                    placed[static_cast<std::size_t>(i)] = true;
                }
            }
            runs[2].lists[mi] = std::move(list);
        }
    }
    return runs;
}

} // namespace slatewise::core
