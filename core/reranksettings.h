// SPDX-License-Identifier: MIT
#pragma once

#include <cstdint>
#include <optional>
#include <string>
#include <string_view>

namespace slatewise::core {

/// What-if re-rankings of an existing run's lists (docs/models.md describes each).
enum class RerankMethod { Mmr, SeriesOrder, BurstDamp };

std::string_view toString(RerankMethod method);
/// "mmr", "series-order" or "burst-damp"; nullopt for anything else.
std::optional<RerankMethod> rerankMethodFromString(std::string_view name);

/// Settings of a re-ranking; stored with the derived run as JSON.
struct RerankSettings {
    RerankMethod method = RerankMethod::Mmr;
    /// mmr: weight of relevance against diversity, 0..1 (1 keeps the parent's order).
    /// burst-damp: damping strength, 0..1 (0 keeps the parent's order).
    double lambda = 0.5;

    // The recent-burst definition of the beyond-accuracy measures (EvalSettings defaults).
    std::int32_t burstWindow = 10;
    double burstMinShare = 0.6;
    double burstMaxPrior = 0.2;
    std::int32_t burstMinHistory = 20;

    /// Defaults for `method`: λ = 0.5 for mmr, 1.0 for burst-damp.
    static RerankSettings defaults(RerankMethod method);
    /// Canonical JSON of the settings the method uses (stable key order).
    std::string toJson() const;
};

} // namespace slatewise::core
