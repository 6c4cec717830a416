// SPDX-License-Identifier: MIT
#include "core/beyondcalculator.h"

#include <algorithm>

namespace slatewise::core {

namespace {
BurstDetector::Params burstParams(const EvalSettings& s)
{
    return {s.burstWindow, s.burstMinShare, s.burstMaxPrior, s.burstMinHistory, s.echoShare};
}
} // namespace

BeyondCalculator::BeyondCalculator(const Dataset& data, const DatasetStats& stats, const EvalSettings& settings)
    : m_data(data), m_stats(stats), m_settings(settings), m_diversity(data.items, data.genreNames.size()),
      m_seriesOrder(data.items), m_burst(data.items, data.genreNames.size(), burstParams(settings))
{
    m_selfInformation.resize(data.itemCount());
    const double denominator = static_cast<double>(stats.trainUsers) + 1.0;
    for (std::size_t i = 0; i < data.itemCount(); ++i) {
        const double n = i < stats.itemTrainUsers.size() ? stats.itemTrainUsers[i] : 0.0;
        m_selfInformation[i] = -std::log2((n + 1.0) / denominator);
    }
}

BeyondCalculator::Scratch BeyondCalculator::makeScratch() const
{
    return {ItemMarks(m_data.itemCount()), GenreMix(m_data.genreNames.size()), GenreMix(m_data.genreNames.size())};
}

std::span<const ListEntry> BeyondCalculator::topK(const RunData& run, UserIndex u) const
{
    if (!run.hasLists || u.value + 1 >= run.listOffsets.size() || m_settings.k <= 0)
        return {};
    const auto list = run.listOf(u);
    return list.first(std::min(list.size(), static_cast<std::size_t>(m_settings.k)));
}

BeyondCalculator::UserMeasures BeyondCalculator::measure(std::span<const Interaction> train,
                                                         std::span<const ListEntry> topk, Scratch& scratch) const
{
    UserMeasures m;
    const auto& items = m_data.items;
    const auto& percentile = m_stats.itemPopularityPercentile;

    // The user's distinct train items: membership for seen/order checks, and the history
    // side of popularity lift and calibration.
    scratch.seen.clear();
    scratch.history.clear();
    double historyPercentileSum = 0.0;
    std::size_t historyDistinct = 0;
    for (const auto& row : train) {
        if (!scratch.seen.insert(row.item))
            continue;
        ++historyDistinct;
        historyPercentileSum += percentile[row.item.value];
        scratch.history.add(items[row.item.value].genres);
    }
    m.historyGenre = scratch.history.dominant();
    if (m.historyGenre != kNone)
        m.historyGenreShare = scratch.history.share(static_cast<std::size_t>(m.historyGenre));

    m.listLength = topk.size();
    m.burst = m_burst.detect(train, topk);
    if (topk.empty())
        return m;

    scratch.list.clear();
    double novelty = 0.0;
    double listPercentileSum = 0.0;
    double minPercentile = 101.0;
    // k is small (10, at most a few hundred): counting series by linear search beats a map.
    std::vector<std::pair<std::int32_t, std::int32_t>> seriesCounts;
    for (std::size_t pos = 0; pos < topk.size(); ++pos) {
        const ItemIndex item = topk[pos].item;
        const Item& info = items[item.value];
        novelty += m_selfInformation[item.value];
        listPercentileSum += percentile[item.value];
        minPercentile = std::min(minPercentile, percentile[item.value]);
        scratch.list.add(info.genres);
        if (scratch.seen.contains(item))
            m.seenRanks.push_back(static_cast<std::int32_t>(pos + 1));
        if (info.series >= 0) {
            auto it = std::find_if(seriesCounts.begin(), seriesCounts.end(),
                                   [&](const auto& sc) { return sc.first == info.series; });
            if (it == seriesCounts.end())
                seriesCounts.emplace_back(info.series, 1);
            else
                ++it->second;
        }
    }
    const double n = static_cast<double>(topk.size());
    m.ild = m_diversity.ild(topk);
    m.novelty = novelty / n;
    m.minPopularityPercentile = minPercentile;
    if (historyDistinct > 0)
        m.popularityLift = listPercentileSum / n - historyPercentileSum / static_cast<double>(historyDistinct);
    m.calibrationKl = GenreMix::calibrationKl(scratch.history, scratch.list, m_settings.calibrationAlpha);
    m.seriesShare = 0.0;
    for (const auto& [series, count] : seriesCounts)
        if (count > m.topSeriesCount || (count == m.topSeriesCount && series < m.topSeries)) {
            m.topSeries = series;
            m.topSeriesCount = count;
        }
    m.seriesShare = static_cast<double>(m.topSeriesCount) / n;
    m.seenInList = static_cast<std::int32_t>(m.seenRanks.size());
    m.violations = m_seriesOrder.check(topk, scratch.seen);
    m.orderViolations = static_cast<std::int32_t>(m.violations.size());
    if (m.burst.hasTimestamps)
        m.burstEcho = m.burst.echoes ? 1.0 : 0.0;
    m.listGenre = scratch.list.dominant();
    if (m.listGenre != kNone)
        m.listGenreShare = scratch.list.share(static_cast<std::size_t>(m.listGenre));
    if (m.historyGenre != kNone)
        m.historyGenreInList = scratch.list.share(static_cast<std::size_t>(m.historyGenre));
    return m;
}

} // namespace slatewise::core
