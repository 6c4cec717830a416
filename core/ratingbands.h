// SPDX-License-Identifier: MIT
#pragma once

#include "core/accuracyaccumulator.h"
#include "core/evaluation.h"

#include <map>
#include <vector>

namespace slatewise::core {

/// Accuracy split by the withheld rating value: one band per distinct rating.
class RatingBands {
public:
    void add(double score, double rating) { m_bands[rating].add(score, rating); }
    void merge(const RatingBands& other)
    {
        for (const auto& [rating, acc] : other.m_bands)
            m_bands[rating].merge(acc);
    }
    /// Ascending by rating.
    std::vector<BandStats> result() const;

private:
    std::map<double, AccuracyAccumulator> m_bands;
};

} // namespace slatewise::core
