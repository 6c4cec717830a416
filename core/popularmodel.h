// SPDX-License-Identifier: MIT
#pragma once

#include "core/dataset.h"
#include "core/error.h"
#include "core/modelsettings.h"
#include "core/progress.h"
#include "core/run.h"
#include "core/trainmatrix.h"

#include <cstdint>
#include <string>
#include <vector>

namespace slatewise::core {

/// Most popular: every user gets the items with the most train interactions (distinct
/// users) that they have not seen, ties by item index (common practice as a reference
/// list). Popularity alone predicts no rating, so the withheld pairs get the item's train
/// mean shrunk toward the global mean with `kPseudoRatings` pseudo-ratings (common
/// practice), which keeps the run's accuracy numbers meaningful.
class PopularModel {
public:
    static constexpr double kPseudoRatings = 25.0;

    double globalMean = 0.0;
    std::vector<std::int32_t> itemCount; ///< distinct train users per item
    std::vector<double> itemMean;        ///< shrunk item mean

    static Result<PopularModel> fit(const TrainMatrix& train, const Progress& progress);
    /// List scores are the train interaction counts (the ranking criterion).
    Result<RunData> toRun(const Dataset& data, const TrainMatrix& train, const ModelSettings& settings,
                          const Progress& progress) const;
    std::string parametersJson() const;
};

} // namespace slatewise::core
