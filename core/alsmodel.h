// SPDX-License-Identifier: MIT
#pragma once

#include "core/dataset.h"
#include "core/error.h"
#include "core/modelsettings.h"
#include "core/progress.h"
#include "core/run.h"
#include "core/trainmatrix.h"

#include <Eigen/Core>

#include <cstdint>
#include <string>
#include <vector>

namespace slatewise::core {

/// Matrix factorization with biases, r̂_ui = μ + b_u + b_i + p_u·q_i, fitted by alternating
/// least squares with weighted-λ regularization (Zhou, Wilkinson, Schreiber & Pan,
/// "Large-scale parallel collaborative filtering for the Netflix Prize", AAIM 2008):
/// each row's squared error is penalised by λ·n_u‖(p_u, b_u)‖² (users) or λ·n_i‖(q_i, b_i)‖²
/// (items), n = its train rating count. The bias is solved together with the factors by
/// augmenting the other side's vectors with a constant 1. μ is the train mean and stays fixed.
///
/// One iteration solves every item given the users, then every user given the items:
///   [q_i; b_i] = (Σ_u x_u x_uᵀ + λ n_i I)⁻¹ Σ_u (r_ui − μ − b_u) x_u,  x_u = [p_u; 1]
///   [p_u; b_u] = (Σ_i y_i y_iᵀ + λ n_u I)⁻¹ Σ_i (r_ui − μ − b_i) y_i,  y_i = [q_i; 1]
/// User factors start as N(0, initScale²) draws seeded per user; biases start at 0.
class AlsModel {
public:
    using Matrix = Eigen::Matrix<double, Eigen::Dynamic, Eigen::Dynamic, Eigen::RowMajor>;

    double globalMean = 0.0;
    std::int32_t rank = 0;
    double lambda = 0.0;
    Matrix userFactors; ///< users × rank
    Eigen::VectorXd userBias;
    Matrix itemFactors; ///< items × rank
    Eigen::VectorXd itemBias;

    double predict(std::uint32_t u, std::uint32_t i) const
    {
        return globalMean + userBias[u] + itemBias[i] + userFactors.row(u).dot(itemFactors.row(i));
    }

    /// A model with initial factors (no iteration run yet).
    static AlsModel initial(const TrainMatrix& train, const ModelSettings& settings);
    /// Runs settings.iterations iterations, reporting train and withheld RMSE after each.
    static Result<AlsModel> fit(const Dataset& data, const TrainMatrix& train, const ModelSettings& settings,
                                const Progress& progress, const IterationCallback& onIteration = {});

    /// The item half and the user half of one iteration. false when cancelled.
    bool itemStep(const TrainMatrix& train, const Progress& progress = {}, double from = 0, double to = 0);
    bool userStep(const TrainMatrix& train, const Progress& progress = {}, double from = 0, double to = 0);

    /// Root mean squared error over the train ratings (parallel).
    double trainRmse(const Dataset& data, const TrainMatrix& train, bool clip) const;

    /// Scores for every withheld pair and a top-N list per user: all items are scored per
    /// block of users with one float matrix product, seen items are skipped and the best N
    /// kept by a bounded heap.
    Result<RunData> toRun(const Dataset& data, const TrainMatrix& train, const ModelSettings& settings,
                          const Progress& progress) const;

    std::string parametersJson() const;
};

} // namespace slatewise::core
