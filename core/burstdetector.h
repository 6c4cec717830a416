// SPDX-License-Identifier: MIT
#pragma once

#include "core/dataset.h"
#include "core/run.h"

#include <cstdint>
#include <span>
#include <vector>

namespace slatewise::core {

/// Recent-burst detection on one user's time-ordered train history, and whether a list
/// echoes the burst. The recent window is the last `window` train interactions; the
/// older history is everything before it. A genre's share of a set of interactions is the
/// fraction of them whose item carries the genre. A genre is a burst when its window share
/// is ≥ minShare while its older share is ≤ maxPrior and the older history has at least
/// minHistory interactions. The list echoes a burst when the burst genre's share of the
/// list is ≥ echoShare.
class BurstDetector {
public:
    struct Params {
        std::int32_t window = 10;
        double minShare = 0.6;
        double maxPrior = 0.2;
        std::int32_t minHistory = 20;
        double echoShare = 0.5;
    };

    struct Burst {
        std::int32_t genre = kNone;
        double windowShare = 0.0;
        double priorShare = 0.0;
    };

    struct Finding {
        bool hasTimestamps = true;  ///< false: some train row lacks a time, the user is skipped
        bool enoughHistory = false; ///< older history has at least minHistory interactions
        std::vector<Burst> bursts;  ///< by window share, largest first
        bool echoes = false;
        Burst echoed;               ///< the burst the list echoes (or the strongest burst)
        double listShare = 0.0;     ///< that genre's share of the list
    };

    BurstDetector(const std::vector<Item>& items, std::size_t genreCount, Params params);

    /// `train` must be sorted by time, oldest first (as InteractionTable keeps it).
    Finding detect(std::span<const Interaction> train, std::span<const ListEntry> list) const;

    /// Share of list items carrying `genre`; 0 for an empty list.
    double listShare(std::span<const ListEntry> list, std::int32_t genre) const;

    const Params& params() const { return m_params; }

private:
    const std::vector<Item>* m_items;
    std::size_t m_genreCount;
    Params m_params;
};

} // namespace slatewise::core
