// SPDX-License-Identifier: MIT
#include "ui/genretimeline.h"

#include "core/dataset.h"

#include <algorithm>
#include <numeric>

namespace slatewise::ui {

double GenreTimeline::Bucket::share(std::size_t genre) const
{
    return count > 0 && genre < weight.size() ? weight[genre] / static_cast<double>(count) : 0.0;
}

GenreTimeline GenreTimeline::build(const core::Dataset& data, core::UserIndex user, int recentWindow,
                                   int olderBuckets, int maxGenres)
{
    GenreTimeline t;
    if (user.value >= data.userCount())
        return t;
    const auto rows = data.train.of(user);
    const auto n = static_cast<std::int64_t>(rows.size());
    t.interactions = n;
    if (n == 0)
        return t;
    t.hasTimestamps = std::all_of(rows.begin(), rows.end(),
                                  [](const core::Interaction& i) { return i.timestamp != core::kNoTimestamp; });

    const std::size_t genreCount = data.genreNames.size();
    const std::int64_t recentCount = std::min<std::int64_t>(std::max(1, recentWindow), n);
    const std::int64_t olderCount = n - recentCount;

    // Weight per catalog genre over all, the recent window and the older history. An item
    // without genres adds to a trailing "no genre" slot so bucket weights still sum to counts.
    std::vector<double> total(genreCount + 1, 0.0), recent(genreCount + 1, 0.0), older(genreCount + 1, 0.0);
    auto addItem = [&](std::vector<double>& into, const core::Interaction& row) {
        const auto& genres = data.items[row.item.value].genres;
        if (genres.empty()) {
            into[genreCount] += 1.0;
            return;
        }
        const double w = 1.0 / static_cast<double>(genres.size());
        for (const auto g : genres)
            into[static_cast<std::size_t>(g)] += w;
    };
    for (std::int64_t i = 0; i < n; ++i) {
        addItem(total, rows[static_cast<std::size_t>(i)]);
        addItem(i >= olderCount ? recent : older, rows[static_cast<std::size_t>(i)]);
    }

    // The recent window's dominant genre is always shown, even if small overall: it is the
    // point of the chart.
    std::int32_t recentTop = -1;
    for (std::size_t g = 0; g < genreCount; ++g) {
        if (recent[g] > 0 && (recentTop < 0 || recent[g] > recent[static_cast<std::size_t>(recentTop)]))
            recentTop = static_cast<std::int32_t>(g);
    }
    std::vector<std::size_t> order(genreCount);
    std::iota(order.begin(), order.end(), 0);
    std::stable_sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) { return total[a] > total[b]; });
    std::vector<std::size_t> shown;
    for (const auto g : order) {
        if (total[g] > 0 && static_cast<int>(shown.size()) < std::max(1, maxGenres))
            shown.push_back(g);
    }
    if (recentTop >= 0 && std::find(shown.begin(), shown.end(), static_cast<std::size_t>(recentTop)) == shown.end()) {
        if (static_cast<int>(shown.size()) >= std::max(1, maxGenres))
            shown.back() = static_cast<std::size_t>(recentTop);
        else
            shown.push_back(static_cast<std::size_t>(recentTop));
    }
    // Slot of each catalog genre in `genres`; everything not shown goes to "other genres".
    double shownWeight = 0.0;
    for (const auto g : shown)
        shownWeight += total[g];
    const bool hasOther = shownWeight < static_cast<double>(n) - 1e-9;
    std::vector<std::size_t> slot(genreCount + 1, shown.size());
    for (std::size_t s = 0; s < shown.size(); ++s) {
        slot[shown[s]] = s;
        t.genres.push_back(data.genreNames[shown[s]]);
    }
    if (hasOther)
        t.genres.emplace_back("other genres");

    if (recentTop >= 0) {
        t.recentGenre = static_cast<std::int32_t>(slot[static_cast<std::size_t>(recentTop)]);
        t.recentShare = recent[static_cast<std::size_t>(recentTop)] / static_cast<double>(recentCount);
        t.priorShare = olderCount > 0 ? older[static_cast<std::size_t>(recentTop)] / static_cast<double>(olderCount) : 0.0;
    }

    auto makeBucket = [&](std::int64_t first, std::int64_t last, bool isRecent) {
        Bucket b;
        b.firstIndex = first;
        b.count = last - first;
        b.recent = isRecent;
        b.weight.assign(t.genres.size(), 0.0);
        b.firstTime = rows[static_cast<std::size_t>(first)].timestamp;
        b.lastTime = rows[static_cast<std::size_t>(last - 1)].timestamp;
        for (std::int64_t i = first; i < last; ++i) {
            const auto& row = rows[static_cast<std::size_t>(i)];
            const auto& genres = data.items[row.item.value].genres;
            if (genres.empty()) {
                b.weight[slot[genreCount]] += 1.0;
                continue;
            }
            const double w = 1.0 / static_cast<double>(genres.size());
            for (const auto g : genres)
                b.weight[slot[static_cast<std::size_t>(g)]] += w;
        }
        t.buckets.push_back(std::move(b));
    };
    const std::int64_t bucketsBefore = std::min<std::int64_t>(std::max(1, olderBuckets), olderCount);
    for (std::int64_t i = 0; i < bucketsBefore; ++i)
        makeBucket(i * olderCount / bucketsBefore, (i + 1) * olderCount / bucketsBefore, false);
    makeBucket(olderCount, n, true);
    return t;
}

} // namespace slatewise::ui
