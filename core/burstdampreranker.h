// SPDX-License-Identifier: MIT
#pragma once

#include "core/burstdetector.h"
#include "core/dataset.h"
#include "core/error.h"
#include "core/progress.h"
#include "core/reranksettings.h"
#include "core/run.h"

#include <span>
#include <vector>

namespace slatewise::core {

/// Damps a recent binge. A genre g is a burst for a user exactly as the beyond-accuracy
/// measures define it (BurstDetector): in the user's last `burstWindow` train interactions
/// its share is ≥ burstMinShare while its share in the older history is ≤ burstMaxPrior,
/// with at least burstMinHistory older interactions. Users with a train row lacking a
/// timestamp are left alone.
///
/// Each list item carrying burst genres is scored rel(i) · w_i with rel = listRelevance()
/// and w_i = 1 − λ (1 − ρ_i), ρ_i = min over its burst genres of older share / window share
/// (the long-term share the genre should fall back to, relative to its burst share), and
/// the list is re-sorted by that value (ties by the parent's order). λ = 0 keeps the list.
class BurstDampReranker {
public:
    /// The user's burst genres (empty when none, or when timestamps are missing).
    static std::vector<BurstDetector::Burst> bursts(const Dataset& data, UserIndex u, const RerankSettings& settings);
    static std::vector<ListEntry> rerankList(const Dataset& data, std::span<const BurstDetector::Burst> bursts,
                                             std::span<const ListEntry> list, double lambda);
    static Result<RunData> apply(const Dataset& data, const RunData& parent, const RerankSettings& settings,
                                 const Progress& progress);
};

} // namespace slatewise::core
