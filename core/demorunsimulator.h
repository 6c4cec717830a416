// SPDX-License-Identifier: MIT
#pragma once

#include <string>
#include <vector>

namespace slatewise::core {

class DemoRandom;
class DemoTasteModel;
struct DemoHistory;

/// One simulated recommendation run: a predicted rating for every withheld pair and a
/// ranked list per member (empty for members the run never saw).
struct DemoRun {
    std::string name;
    std::string character; ///< one sentence for the README and the demo summary
    std::vector<std::vector<double>> scores; ///< [member][withheld row of that member]
    std::vector<std::vector<int>> lists;     ///< [member] title indices, rank 1 first
};

/// Simulates the three runs the club's data team compares, each a deliberate caricature
/// built from the generative model plus run-specific noise and habits:
/// - "tight-fit": predicted ratings close to the model's expected rating (best RMSE), but
///   its lists chase series (later parts first) and echo the member's latest genre;
/// - "crowd-pleaser": ratings from title averages and popularity, lists led by the most
///   chosen titles, and for about a third of members it forgets to drop titles already seen;
/// - "wide-angle": noisier ratings, lists ranked by the model's own chance of a pick with a
///   genre-diversifying re-rank that keeps series in order.
class DemoRunSimulator {
public:
    static constexpr int kListLength = 100;

    static std::vector<DemoRun> simulate(const DemoTasteModel& model, const std::vector<DemoHistory>& histories,
                                         const DemoRandom& rng);
};

} // namespace slatewise::core
