// SPDX-License-Identifier: MIT
#include "core/usersegment.h"

#include "core/warning.h"

#include <algorithm>
#include <cmath>

namespace slatewise::core {

namespace {

/// numpy.percentile(values, q) with the default linear interpolation; `sorted` ascending.
double percentile(const std::vector<double>& sorted, double q)
{
    const double h = q / 100.0 * static_cast<double>(sorted.size() - 1);
    const auto lo = static_cast<std::size_t>(std::floor(h));
    const std::size_t hi = std::min(lo + 1, sorted.size() - 1);
    return sorted[lo] + (h - static_cast<double>(lo)) * (sorted[hi] - sorted[lo]);
}

std::string countRange(std::int64_t lo, std::int64_t hi)
{
    if (lo == hi)
        return std::to_string(lo) + (lo == 1 ? " train interaction" : " train interactions");
    return std::to_string(lo) + " to " + std::to_string(hi) + " train interactions";
}

std::int32_t trainCount(const Dataset& data, const DatasetStats& stats, UserIndex u)
{
    if (u.value < stats.userTrainCount.size())
        return stats.userTrainCount[u.value];
    return static_cast<std::int32_t>(data.train.of(u).size());
}

std::vector<UserSegment> activitySegments(std::span<const UserIndex> evaluated, const Dataset& data,
                                          const DatasetStats& stats, const EvalSettings& settings)
{
    UserSegment cold{"activity", "activity:cold",
                     "cold: fewer than " + std::to_string(settings.warn.coldTrain) + " train interactions", {}};
    std::vector<UserIndex> rest;
    std::vector<double> counts;
    for (UserIndex u : evaluated) {
        const std::int32_t c = trainCount(data, stats, u);
        if (c < settings.warn.coldTrain) {
            cold.users.push_back(u);
        } else {
            rest.push_back(u);
            counts.push_back(c);
        }
    }
    std::vector<UserSegment> out;
    if (!cold.users.empty())
        out.push_back(std::move(cold));
    if (rest.empty())
        return out;
    std::vector<double> sorted = counts;
    std::sort(sorted.begin(), sorted.end());
    const double cuts[3] = {percentile(sorted, 25), percentile(sorted, 50), percentile(sorted, 75)};
    std::vector<UserSegment> quartiles(4);
    std::vector<std::int64_t> lo(4, INT64_MAX), hi(4, INT64_MIN);
    for (std::size_t i = 0; i < rest.size(); ++i) {
        const double c = counts[i];
        const std::size_t q = c <= cuts[0] ? 0 : c <= cuts[1] ? 1 : c <= cuts[2] ? 2 : 3;
        quartiles[q].users.push_back(rest[i]);
        lo[q] = std::min(lo[q], static_cast<std::int64_t>(c));
        hi[q] = std::max(hi[q], static_cast<std::int64_t>(c));
    }
    for (std::size_t q = 0; q < 4; ++q) {
        if (quartiles[q].users.empty())
            continue;
        quartiles[q].group = "activity";
        quartiles[q].name = "activity:q" + std::to_string(q + 1);
        quartiles[q].label = "quartile " + std::to_string(q + 1) + ": " + countRange(lo[q], hi[q]);
        out.push_back(std::move(quartiles[q]));
    }
    return out;
}

std::vector<UserSegment> genreSegments(std::span<const UserIndex> evaluated, const Dataset& data)
{
    const std::size_t genres = data.genreNames.size();
    std::vector<UserSegment> byGenre(genres + 1); // last: no genre
    std::vector<std::int32_t> tally(genres);
    for (UserIndex u : evaluated) {
        std::fill(tally.begin(), tally.end(), 0);
        for (const Interaction& row : data.train.of(u)) {
            if (row.item.value >= data.items.size())
                continue;
            for (std::int32_t g : data.items[row.item.value].genres)
                if (g >= 0 && static_cast<std::size_t>(g) < genres)
                    ++tally[static_cast<std::size_t>(g)];
        }
        std::size_t best = genres;
        std::int32_t bestCount = 0;
        for (std::size_t g = 0; g < genres; ++g) {
            if (tally[g] > bestCount) {
                bestCount = tally[g];
                best = g;
            }
        }
        byGenre[best].users.push_back(u);
    }
    std::vector<UserSegment> out;
    for (std::size_t g = 0; g <= genres; ++g) {
        if (byGenre[g].users.empty())
            continue;
        UserSegment s = std::move(byGenre[g]);
        s.group = "genre";
        if (g < genres) {
            s.name = "genre:" + data.genreNames[g];
            s.label = "mostly " + data.genreNames[g] + " in train";
        } else {
            s.name = "genre:(none)";
            s.label = "no genre in train (no train interactions or untagged items)";
        }
        out.push_back(std::move(s));
    }
    std::stable_sort(out.begin(), out.end(),
                     [](const UserSegment& a, const UserSegment& b) { return a.users.size() > b.users.size(); });
    return out;
}

} // namespace

std::vector<UserSegment> buildUserSegments(const SegmentSpec& spec, std::span<const UserIndex> evaluated,
                                           const Dataset& data, const DatasetStats& stats,
                                           const EvalSettings& settings, std::span<const std::uint32_t> baseWarnings,
                                           std::span<const std::uint32_t> candidateWarnings)
{
    switch (spec.kind) {
    case SegmentKind::Activity:
        return activitySegments(evaluated, data, stats, settings);
    case SegmentKind::Genre:
        return genreSegments(evaluated, data);
    case SegmentKind::Warning:
        break;
    }
    const std::string code(warningInfo(spec.warning).key);
    const std::uint32_t bit = 1u << static_cast<unsigned>(spec.warning);
    UserSegment with{spec.key(), "warning:" + code,
                     "carries '" + code + "' (" + std::string(warningInfo(spec.warning).title) + ") in either run", {}};
    UserSegment without{spec.key(), "not warning:" + code, "carries '" + code + "' in neither run", {}};
    for (UserIndex u : evaluated) {
        const std::uint32_t mask = (u.value < baseWarnings.size() ? baseWarnings[u.value] : 0u)
            | (u.value < candidateWarnings.size() ? candidateWarnings[u.value] : 0u);
        (mask & bit ? with : without).users.push_back(u);
    }
    return {std::move(with), std::move(without)};
}

} // namespace slatewise::core
