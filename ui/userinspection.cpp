// SPDX-License-Identifier: MIT
#include "ui/userinspection.h"

#include "core/dataset.h"
#include "core/evaluation.h"
#include "core/run.h"

#include <algorithm>
#include <cmath>
#include <set>
#include <unordered_map>
#include <unordered_set>

namespace slatewise::ui {

std::int32_t UserInspection::hits() const
{
    return static_cast<std::int32_t>(std::count_if(list.begin(), list.end(), [](const ListRow& r) { return r.hit; }));
}

std::array<double, core::kMetricCount> UserInspection::columnMeans(const core::RunEvaluation& eval)
{
    std::array<double, core::kMetricCount> means{};
    for (std::size_t m = 0; m < core::kMetricCount; ++m) {
        double sum = 0.0;
        std::size_t n = 0;
        for (double v : eval.users.metrics[m]) {
            if (!std::isnan(v)) {
                sum += v;
                ++n;
            }
        }
        means[m] = n ? sum / static_cast<double>(n) : std::nan("");
    }
    return means;
}

UserInspection UserInspection::build(const core::Dataset& data, const core::RunData& run, const core::RunEvaluation& eval,
                                     core::UserIndex user, const std::array<double, core::kMetricCount>& runMean)
{
    UserInspection out;
    out.user = user;
    out.runName = eval.runName;
    out.k = eval.settings.k;
    out.relevantAt = eval.settings.relevantAt;
    out.runMean = runMean;
    out.metrics.fill(std::nan(""));
    if (user.value >= data.userCount())
        return out;

    const auto& users = eval.users.users;
    auto row = std::lower_bound(users.begin(), users.end(), user);
    if (row != users.end() && *row == user) {
        out.found = true;
        const auto r = static_cast<std::size_t>(row - users.begin());
        for (std::size_t m = 0; m < core::kMetricCount; ++m)
            out.metrics[m] = eval.users.metrics[m][r];
    }
    auto warnings = std::equal_range(eval.warnings.begin(), eval.warnings.end(), user,
                                     [](const auto& a, const auto& b) {
                                         if constexpr (std::is_same_v<std::decay_t<decltype(a)>, core::UserIndex>)
                                             return a < b.user;
                                         else
                                             return a.user < b;
                                     });
    out.warnings.assign(warnings.first, warnings.second);

    const auto train = data.train.of(user);
    out.trainCount = static_cast<std::int32_t>(train.size());
    std::unordered_set<std::uint32_t> seen;
    for (const auto& t : train)
        seen.insert(t.item.value);

    const auto withheld = data.withheld.of(user);
    const auto withheldBase = static_cast<std::size_t>(withheld.data() - data.withheld.rows.data());
    std::unordered_map<std::uint32_t, std::size_t> withheldRow;
    for (std::size_t i = 0; i < withheld.size(); ++i)
        withheldRow.emplace(withheld[i].item.value, i);

    // Series-order check, as defined for the order_violations measure: a part p > 1 is out of
    // order when an earlier part of its series (present in the catalog) is neither in the
    // user's history nor placed higher in the list.
    const auto list = run.listOf(user);
    const std::size_t topK = std::min<std::size_t>(list.size(), static_cast<std::size_t>(std::max(0, out.k)));
    std::unordered_map<std::int32_t, std::set<std::int32_t>> catalogParts; // series -> parts present
    for (std::size_t i = 0; i < topK; ++i) {
        const auto& item = data.items[list[i].item.value];
        if (item.series != core::kNone && item.seriesPart > 1)
            catalogParts.emplace(item.series, std::set<std::int32_t>{});
    }
    if (!catalogParts.empty())
        for (const auto& item : data.items)
            if (item.series != core::kNone && item.seriesPart >= 1) {
                auto it = catalogParts.find(item.series);
                if (it != catalogParts.end())
                    it->second.insert(item.seriesPart);
            }
    std::unordered_map<std::int32_t, std::set<std::int32_t>> available; // series -> parts seen or listed above
    for (const auto& t : train) {
        const auto& item = data.items[t.item.value];
        if (item.series != core::kNone)
            available[item.series].insert(item.seriesPart);
    }

    std::unordered_map<std::uint32_t, std::int32_t> rankOf;
    for (std::size_t i = 0; i < list.size(); ++i)
        rankOf.emplace(list[i].item.value, static_cast<std::int32_t>(i + 1));

    std::unordered_set<std::uint32_t> outOfOrderItems;
    for (std::size_t i = 0; i < topK; ++i) {
        ListRow lr;
        lr.rank = static_cast<std::int32_t>(i + 1);
        lr.item = list[i].item;
        lr.score = static_cast<double>(list[i].score);
        lr.seen = seen.count(lr.item.value) > 0;
        lr.withheldRating = std::nan("");
        if (auto it = withheldRow.find(lr.item.value); it != withheldRow.end()) {
            lr.withheldRating = withheld[it->second].rating;
            lr.hit = lr.withheldRating >= out.relevantAt;
        }
        const auto& item = data.items[lr.item.value];
        if (item.series != core::kNone && item.seriesPart > 1) {
            const auto& parts = catalogParts[item.series];
            const auto& have = available[item.series];
            for (std::int32_t p : parts) {
                if (p >= item.seriesPart)
                    break;
                if (!have.count(p))
                    lr.missingParts.push_back(p);
            }
            lr.outOfOrder = !lr.missingParts.empty();
            if (lr.outOfOrder)
                outOfOrderItems.insert(lr.item.value);
        }
        if (item.series != core::kNone)
            available[item.series].insert(item.seriesPart);
        out.list.push_back(std::move(lr));
    }

    for (std::size_t i = 0; i < withheld.size(); ++i) {
        WithheldRow wr;
        wr.item = withheld[i].item;
        wr.rating = withheld[i].rating;
        wr.relevant = wr.rating >= out.relevantAt;
        wr.score = run.hasScores ? static_cast<double>(run.scores[withheldBase + i]) : std::nan("");
        if (auto it = rankOf.find(wr.item.value); it != rankOf.end())
            wr.rank = it->second;
        wr.inTopK = wr.rank >= 1 && wr.rank <= out.k;
        wr.outOfOrder = outOfOrderItems.count(wr.item.value) > 0;
        out.withheld.push_back(wr);
    }
    std::stable_sort(out.withheld.begin(), out.withheld.end(), [](const WithheldRow& a, const WithheldRow& b) {
        if (a.rating != b.rating)
            return a.rating > b.rating;
        const int ra = a.rank == 0 ? INT32_MAX : a.rank;
        const int rb = b.rank == 0 ? INT32_MAX : b.rank;
        if (ra != rb)
            return ra < rb;
        return a.item < b.item;
    });
    return out;
}

} // namespace slatewise::ui
