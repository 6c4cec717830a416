// SPDX-License-Identifier: MIT
#pragma once

#include "core/dataset.h"
#include "core/error.h"
#include "core/parallel.h"
#include "core/progress.h"
#include "core/run.h"
#include "core/trainmatrix.h"

#include <algorithm>
#include <atomic>
#include <cmath>
#include <cstdint>
#include <numeric>
#include <string>
#include <string_view>
#include <vector>

namespace slatewise::core {

/// Plumbing shared by every model and re-ranker: cancellable parallel loops with progress,
/// and turning per-user lists and per-pair scores into a RunData.
class RunAssembly {
public:
    /// Runs fn(index, worker) for index in [0, n) on all cores. Indices are handed out in
    /// small chunks from a shared counter, so rows of very different cost (a popular item
    /// against a niche one) still keep both cores busy; each index's result depends only on
    /// the index, so the outcome does not depend on the schedule. Worker 0 reports progress
    /// as a fraction mapped into [from, to] under `stage`. Returns false when cancelled
    /// (the remaining indices are skipped).
    template <typename Fn>
    static bool forEach(
        std::size_t n, const Progress& progress, std::string_view stage, double from, double to, Fn&& fn)
    {
        constexpr std::size_t kChunk = 64;
        std::atomic<std::size_t> next { 0 };
        std::atomic<bool> stop { false };
        parallelFor(workerCount(), [&](std::size_t, std::size_t, unsigned worker) {
            for (std::size_t taken = 0;; ++taken) {
                if (progress.cancelled())
                    stop.store(true, std::memory_order_relaxed);
                if (stop.load(std::memory_order_relaxed))
                    return;
                const std::size_t begin = next.fetch_add(kChunk, std::memory_order_relaxed);
                if (begin >= n)
                    return;
                if (worker == 0 && progress.report && taken % 16 == 0)
                    progress(from + (to - from) * static_cast<double>(begin) / static_cast<double>(n), stage);
                const std::size_t end = std::min(n, begin + kChunk);
                for (std::size_t i = begin; i < end; ++i)
                    fn(i, worker);
            }
        });
        if (stop.load() || progress.cancelled())
            return false;
        progress(to, stage);
        return true;
    }

    /// Scores every withheld pair with predict(user, item) (parallel over users), clipped
    /// into the scale when `clip`. Returns an empty vector when cancelled.
    template <typename Predict>
    static std::vector<float> scoreWithheld(
        const Dataset& data, bool clip, const Progress& progress, double from, double to, Predict&& predict)
    {
        std::vector<float> scores(data.withheld.size(), 0.0f);
        const bool ok
            = forEach(data.userCount(), progress, "scoring withheld pairs", from, to, [&](std::size_t u, unsigned) {
                  const std::uint32_t from = data.withheld.offsets[u], to = data.withheld.offsets[u + 1];
                  for (std::uint32_t r = from; r < to; ++r)
                      scores[r] = static_cast<float>(
                          clamp(data, clip, predict(static_cast<std::uint32_t>(u), data.withheld.rows[r].item.value)));
              });
        if (!ok)
            return {};
        return scores;
    }

    /// Root mean squared error of predict(user, item) over all withheld rows (NaN when none).
    template <typename Predict> static double withheldRmse(const Dataset& data, bool clip, Predict&& predict)
    {
        const unsigned workers = workerCount();
        std::vector<double> sums(workers, 0.0);
        parallelFor(
            data.userCount(),
            [&](std::size_t begin, std::size_t end, unsigned w) {
                double s = 0.0;
                for (std::size_t u = begin; u < end; ++u)
                    for (std::uint32_t r = data.withheld.offsets[u]; r < data.withheld.offsets[u + 1]; ++r) {
                        const auto& row = data.withheld.rows[r];
                        const double e
                            = clamp(data, clip, predict(static_cast<std::uint32_t>(u), row.item.value)) - row.rating;
                        s += e * e;
                    }
                sums[w] = s;
            },
            workers);
        double total = 0.0;
        for (double s : sums)
            total += s;
        return data.withheld.size() == 0 ? std::nan("") : std::sqrt(total / static_cast<double>(data.withheld.size()));
    }

    /// Item indices [0, count) ordered by key(i), largest first; ties keep index order.
    template <typename Key> static std::vector<std::uint32_t> itemsByDescending(std::uint32_t count, Key&& key)
    {
        std::vector<std::uint32_t> order(count);
        std::iota(order.begin(), order.end(), 0u);
        std::stable_sort(
            order.begin(), order.end(), [&key](std::uint32_t a, std::uint32_t b) { return key(a) > key(b); });
        return order;
    }

    /// Lists for a model whose ranking is the same for every user (popularity, item bias):
    /// each user gets the first n items of `order` that are not in their train history,
    /// scored by score(user, item). Empty when cancelled.
    template <typename Score>
    static std::vector<std::vector<ListEntry>> listsInSharedOrder(const Dataset& data, const TrainMatrix& train,
        const std::vector<std::uint32_t>& order, std::size_t n, const Progress& progress, std::string_view stage,
        double from, double to, Score&& score)
    {
        std::vector<std::vector<ListEntry>> lists(data.userCount());
        const bool ok = forEach(data.userCount(), progress, stage, from, to, [&](std::size_t user, unsigned) {
            const auto u = static_cast<std::uint32_t>(user);
            auto& list = lists[user];
            list.reserve(n);
            for (std::uint32_t i : order) {
                if (list.size() >= n)
                    break;
                if (!train.seen(u, i))
                    list.push_back({ ItemIndex(i), static_cast<float>(score(u, i)) });
            }
        });
        if (!ok)
            return {};
        return lists;
    }

    static double clamp(const Dataset& data, bool clip, double v)
    {
        if (!clip || data.scale.max < data.scale.min)
            return v;
        return std::min(std::max(v, data.scale.min), data.scale.max);
    }

    /// A run holding `scores` (aligned with data.withheld) and `lists` (one per user).
    static RunData finish(const Dataset& data, std::vector<float> scores, std::vector<std::vector<ListEntry>> lists);

    /// A derived run: the parent's scores for the withheld pairs, new lists.
    static RunData derive(const Dataset& data, const RunData& parent, std::vector<std::vector<ListEntry>> lists);

    static Error cancelled(std::string_view what);
};

} // namespace slatewise::core
