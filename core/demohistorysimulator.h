// SPDX-License-Identifier: MIT
#pragma once

#include <cstdint>
#include <vector>

namespace slatewise::core {

class DemoRandom;
class DemoTasteModel;

struct DemoInteraction {
    int title = 0;
    int rating = 0;            ///< 1..5 stars
    std::int64_t timestamp = 0; ///< Unix seconds
};

/// One member's ratings in time order, split into train and withheld.
struct DemoHistory {
    std::vector<DemoInteraction> train;    ///< older ratings, ascending time
    std::vector<DemoInteraction> withheld; ///< the most recent ratings, ascending time
};

/// Plays out two years of club evenings: each member picks titles one after another
/// (long-tail popularity times taste; series fans in part order; binge members switch to
/// one genre just before the split), rates them (expected rating + noise, rounded to whole
/// stars) and gets timestamps on evenings. The split is temporal: each member's most
/// recent 20% (rounded, at least one rating for anyone with two or more) is withheld.
class DemoHistorySimulator {
public:
    /// Withheld count for a member with `n` ratings: round(0.2 n), at least 1 when n >= 2.
    static int withheldCount(int n);

    static std::vector<DemoHistory> simulate(const DemoTasteModel& model, const DemoRandom& rng);
};

} // namespace slatewise::core
