// SPDX-License-Identifier: MIT
#pragma once

#include "core/burstdetector.h"
#include "core/dataset.h"
#include "core/evalsettings.h"
#include "core/genremix.h"
#include "core/itemmarks.h"
#include "core/listdiversity.h"
#include "core/run.h"
#include "core/seriesorder.h"

#include <cmath>
#include <cstdint>
#include <span>
#include <vector>

namespace slatewise::core {

/// The beyond-accuracy measures of one user's top-k list (docs/metrics.md, "Beyond
/// accuracy and warnings"), with the details the warnings and the user inspector need.
/// Built once per evaluation; measure() is const and thread-safe given one Scratch per
/// thread.
class BeyondCalculator {
public:
    /// Everything measured for one user; NaN where a measure is undefined.
    struct UserMeasures {
        std::size_t listLength = 0; ///< |L_u| (the list cut to k)
        double ild = std::nan("");
        double novelty = std::nan("");
        double popularityLift = std::nan("");
        double calibrationKl = std::nan("");
        double seriesShare = std::nan("");
        std::int32_t orderViolations = 0;
        std::int32_t seenInList = 0;
        double burstEcho = std::nan(""); ///< 1 or 0; NaN without a list or without timestamps

        std::vector<SeriesOrder::Violation> violations;
        std::vector<std::int32_t> seenRanks; ///< 1-based ranks of list items already in train
        BurstDetector::Finding burst;
        std::int32_t topSeries = kNone;      ///< the series with most list items
        std::int32_t topSeriesCount = 0;
        double minPopularityPercentile = std::nan(""); ///< least popular list item
        std::int32_t listGenre = kNone;      ///< dominant genre of the list (unit weights)
        double listGenreShare = 0.0;
        std::int32_t historyGenre = kNone;   ///< dominant genre of the train history
        double historyGenreShare = 0.0;
        double historyGenreInList = 0.0;     ///< the history's dominant genre's share of the list
    };

    /// Per-thread working memory.
    struct Scratch {
        ItemMarks seen;
        GenreMix history;
        GenreMix list;
    };

    BeyondCalculator(const Dataset& data, const DatasetStats& stats, const EvalSettings& settings);

    Scratch makeScratch() const;

    /// The first k entries of the run's list for u (empty when the run has no list for u).
    std::span<const ListEntry> topK(const RunData& run, UserIndex u) const;

    UserMeasures measure(std::span<const Interaction> train, std::span<const ListEntry> topk, Scratch& scratch) const;

    /// −log2((n_i + 1)/(N + 1)) per catalog item.
    const std::vector<double>& selfInformation() const { return m_selfInformation; }
    const SeriesOrder& seriesOrder() const { return m_seriesOrder; }

private:
    const Dataset& m_data;
    const DatasetStats& m_stats;
    EvalSettings m_settings;
    ListDiversity m_diversity;
    SeriesOrder m_seriesOrder;
    BurstDetector m_burst;
    std::vector<double> m_selfInformation;
};

} // namespace slatewise::core
