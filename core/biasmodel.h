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

/// Baseline predictor b_ui = μ + b_u + b_i (Koren, "Factorization meets the neighborhood",
/// KDD 2008, section 2.1), minimising
///   Σ (r_ui − μ − b_u − b_i)² + λ_u Σ b_u² + λ_i Σ b_i²
/// by alternating exact updates b_i = Σ_u (r_ui − μ − b_u) / (λ_i + n_i), then
/// b_u = Σ_i (r_ui − μ − b_i) / (λ_u + n_u). Each update minimises the objective in one
/// block, so the sweeps converge to its unique minimum.
class BiasModel {
public:
    double globalMean = 0.0;
    std::vector<double> userBias;
    std::vector<double> itemBias;
    std::int32_t iterationsRun = 0;

    double predict(std::uint32_t u, std::uint32_t i) const { return globalMean + userBias[u] + itemBias[i]; }

    /// Fits on `train`; reports each sweep through `onIteration` (train and withheld RMSE).
    static Result<BiasModel> fit(const Dataset& data, const TrainMatrix& train, const ModelSettings& settings,
                                 const Progress& progress, const IterationCallback& onIteration = {},
                                 double progressFrom = 0.0, double progressTo = 0.7);

    /// Scores for every withheld pair and a top-N list per user without seen items. The
    /// ranking is the same for every user (item bias), so one sorted order serves all.
    Result<RunData> toRun(const Dataset& data, const TrainMatrix& train, const ModelSettings& settings,
                          const Progress& progress) const;

    /// {"global_mean":..,"user_bias":[..],"item_bias":[..]} (indices as in the workspace).
    std::string parametersJson() const;
};

} // namespace slatewise::core
