// SPDX-License-Identifier: MIT
#pragma once

#include "core/dataset.h"
#include "core/error.h"
#include "core/modelsettings.h"
#include "core/progress.h"
#include "core/run.h"
#include "core/trainmatrix.h"

#include <string>

namespace slatewise::core {

/// Global mean: every withheld pair is predicted as the mean train rating μ (the floor any
/// rating model must beat; common practice). All items tie at μ, so each user's list is a
/// seeded random draw of unseen items, a random-list reference for the ranking measures.
class GlobalMeanModel {
public:
    double globalMean = 0.0;

    static GlobalMeanModel fit(const TrainMatrix& train);
    Result<RunData> toRun(const Dataset& data, const TrainMatrix& train, const ModelSettings& settings,
                          const Progress& progress) const;
    std::string parametersJson() const;
};

} // namespace slatewise::core
