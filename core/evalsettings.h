// SPDX-License-Identifier: MIT
#pragma once

#include <cstdint>
#include <string>

namespace slatewise::core {

/// Thresholds for the per-user warnings; defaults are documented in docs/metrics.md.
struct WarningThresholds {
    double lowDiversityIld = 0.35;     ///< warn when ild < this
    double seriesShare = 0.5;          ///< warn when series_share >= this
    double popularTopPercent = 5.0;    ///< "popular only": every list item in the top this % by popularity
    double calibrationKl = 2.0;        ///< warn when calibration_kl > this (nats); 2.0 ≈ the list gives a
                                       ///< one-genre history under 1/8 of its weight
    std::int32_t coldTrain = 5;        ///< cold user when train interactions < this
};

/// Settings that determine an evaluation; stored with its results so that the same
/// settings are never computed twice and a changed setting forces a recompute.
struct EvalSettings {
    std::int32_t k = 10;
    double relevantAt = 4.0;
    std::int32_t bootstrap = 1000;      ///< resamples for the aggregate intervals
    std::uint64_t seed = 20261204;      ///< bootstrap seed
    std::int32_t curveMaxK = 50;        ///< curves run k = 1..curveMaxK

    std::int32_t burstWindow = 10;      ///< last N train interactions form the recent window
    double burstMinShare = 0.6;
    double burstMaxPrior = 0.2;
    std::int32_t burstMinHistory = 20;  ///< older history needed to call anything a burst
    double echoShare = 0.5;
    double calibrationAlpha = 0.01;

    WarningThresholds warn;

    /// Canonical JSON object holding every field (stable key order).
    std::string toJson() const;
    /// Reads fields present in `json`, keeping defaults for the rest. Errors name the key.
    static EvalSettings fromJson(const std::string& json, std::string* error = nullptr);
};

} // namespace slatewise::core
