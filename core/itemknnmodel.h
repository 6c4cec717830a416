// SPDX-License-Identifier: MIT
#pragma once

#include "core/biasmodel.h"
#include "core/dataset.h"
#include "core/error.h"
#include "core/modelsettings.h"
#include "core/progress.h"
#include "core/run.h"
#include "core/trainmatrix.h"

#include <cstdint>
#include <span>
#include <string>
#include <vector>

namespace slatewise::core {

/// Item-based neighbourhood model over baseline residuals (Sarwar, Karypis, Konstan & Riedl,
/// "Item-based collaborative filtering recommendation algorithms", WWW 2001; Koren,
/// "Factorization meets the neighborhood", KDD 2008, section 3).
///
/// With e_uj = r_uj − b_uj the residual of the baseline (BiasModel) and U_ij the users who
/// rated both items, the similarity is the residual Pearson correlation shrunk by support:
///   ρ_ij = Σ_{U_ij} e_ui e_uj / sqrt(Σ_{U_ij} e_ui² · Σ_{U_ij} e_uj²),
///   s_ij = n_ij / (n_ij + shrinkage) · ρ_ij,  n_ij = |U_ij|.
/// (The residuals are already centred by the baseline, so no further mean is subtracted.)
/// The prediction is r̂_ui = b_ui + Σ_{j∈S^k(i;u)} s_ij e_uj / Σ_{j∈S^k(i;u)} s_ij, where
/// S^k(i;u) are the k items rated by u most similar to i. Only positive similarities are
/// used, and each item keeps its `neighbourPool` most similar items, so S^k(i;u) is drawn
/// from that pool.
class ItemKnnModel {
public:
    struct Neighbour {
        std::uint32_t item;
        float similarity; ///< s_ij (shrunk)
        std::uint32_t support; ///< n_ij
    };

    BiasModel baseline;
    std::int32_t neighbours = 40;
    std::vector<std::uint32_t> poolOffsets; ///< size items + 1
    std::vector<Neighbour> pool;            ///< per item, most similar first (ties by item)

    std::span<const Neighbour> neighboursOf(std::uint32_t i) const
    {
        return {pool.data() + poolOffsets[i], pool.data() + poolOffsets[i + 1]};
    }

    static Result<ItemKnnModel> fit(const Dataset& data, const TrainMatrix& train, const ModelSettings& settings,
                                    const Progress& progress, const IterationCallback& onIteration = {});

    /// r̂_ui given `residual`, a dense per-item array holding e_uj for the user's rated
    /// items and NaN elsewhere.
    double predict(std::uint32_t u, std::uint32_t i, std::span<const float> residual) const;

    Result<RunData> toRun(const Dataset& data, const TrainMatrix& train, const ModelSettings& settings,
                          const Progress& progress) const;

    std::string parametersJson() const;
};

} // namespace slatewise::core
