// SPDX-License-Identifier: MIT
#pragma once

#include "core/ids.h"

#include <cstdint>
#include <limits>
#include <string>
#include <vector>

namespace slatewise::core {
struct Dataset;
}

namespace slatewise::ui {

/// One user's train history by genre over time, bucketed in chronological order so that a
/// recent binge stands out: the last `recentWindow` interactions form the final bucket on
/// their own, the older history is split into equal-sized buckets. Each item spreads one
/// unit of weight over its genres (as the calibration measure does), so a bucket's genre
/// weights sum to its interaction count.
struct GenreTimeline {
    struct Bucket {
        std::int64_t firstIndex = 0;  ///< position of its first interaction (0 = oldest)
        std::int64_t count = 0;       ///< interactions in the bucket
        // Unix seconds (core::Timestamp); core::kNoTimestamp when unknown. Plain integers here
        // so that this header stays light for moc.
        std::int64_t firstTime = std::numeric_limits<std::int64_t>::min();
        std::int64_t lastTime = std::numeric_limits<std::int64_t>::min();
        bool recent = false;          ///< the recent window
        std::vector<double> weight;   ///< per shown genre (same order as `genres`)

        double share(std::size_t genre) const; ///< weight / count, 0 when empty
    };

    std::vector<std::string> genres; ///< shown genres, heaviest overall first; "other genres" last when folded
    std::vector<Bucket> buckets;
    std::int64_t interactions = 0;
    bool hasTimestamps = false;      ///< every interaction has one
    std::int32_t recentGenre = -1;   ///< index in `genres` of the recent window's dominant genre, -1 if none
    double recentShare = 0.0;        ///< its share in the recent window
    double priorShare = 0.0;         ///< its share in the older history

    /// `olderBuckets` buckets for the history before the recent window; at most `maxGenres`
    /// genres shown, the rest folded into "other genres".
    static GenreTimeline build(const core::Dataset& data, core::UserIndex user, int recentWindow = 10,
                               int olderBuckets = 8, int maxGenres = 6);
};

} // namespace slatewise::ui
