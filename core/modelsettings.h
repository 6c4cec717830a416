// SPDX-License-Identifier: MIT
#pragma once

#include <cmath>
#include <cstdint>
#include <functional>
#include <optional>
#include <string>
#include <string_view>

namespace slatewise::core {

/// The reference models Slatewise can fit (docs/models.md describes each with its source).
enum class ModelKind { Popular, Mean, Bias, ItemKnn, Als };

std::string_view toString(ModelKind kind);
/// "popular", "mean", "bias", "itemknn" or "als"; nullopt for anything else.
std::optional<ModelKind> modelKindFromString(std::string_view name);

/// Every setting of every model; a model reads only its own. Stored with the run as JSON.
struct ModelSettings {
    ModelKind kind = ModelKind::Als;
    std::int32_t listLength = 100;   ///< top-N list length per user
    std::uint64_t seed = 20261202;   ///< random initialisation and tie-free random lists
    bool clipToScale = true;         ///< clip predicted ratings into the workspace's scale

    // Baseline predictor (also the residual base of itemknn).
    double biasUserLambda = 10.0;    ///< λ on user biases
    double biasItemLambda = 25.0;    ///< λ on item biases
    std::int32_t biasIterations = 20;
    double biasTolerance = 1e-7;     ///< stop when no bias moves by more than this

    // Item-based neighbourhood model.
    std::int32_t neighbours = 40;    ///< k in S^k(i; u)
    double shrinkage = 100.0;        ///< s_ij = n_ij / (n_ij + shrinkage) · ρ_ij
    std::int32_t neighbourPool = 200;///< most similar items kept per item

    // Matrix factorization by ALS with weighted-λ regularization.
    std::int32_t rank = 32;
    double lambda = 0.05;            ///< weighted-λ: each row is regularized by λ · (its rating count)
    std::int32_t iterations = 10;
    double initScale = 0.1;          ///< standard deviation of the initial user factors

    /// Canonical JSON of the settings the chosen model uses (stable key order).
    std::string toJson() const;
};

/// One finished iteration of an iterative model, handed to the per-iteration callback
/// (the GUI draws its live loss chart from these) and stored in the fit_log table.
struct FitIteration {
    std::int32_t iteration = 0;              ///< 1-based
    std::int32_t iterations = 0;             ///< planned total
    double trainRmse = std::nan("");
    double withheldRmse = std::nan("");      ///< NaN when the workspace has no withheld rows
    double seconds = 0.0;                    ///< wall time of this iteration
};

/// Called from the fitting thread after each iteration; must be cheap.
using IterationCallback = std::function<void(const FitIteration&)>;

} // namespace slatewise::core
