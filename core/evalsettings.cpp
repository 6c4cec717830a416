// SPDX-License-Identifier: MIT
#include "core/evalsettings.h"

#include <nlohmann/json.hpp>

namespace slatewise::core {

std::string EvalSettings::toJson() const
{
    nlohmann::ordered_json j;
    j["k"] = k;
    j["relevant_at"] = relevantAt;
    j["bootstrap"] = bootstrap;
    j["seed"] = seed;
    j["curve_max_k"] = curveMaxK;
    j["burst_window"] = burstWindow;
    j["burst_min_share"] = burstMinShare;
    j["burst_max_prior"] = burstMaxPrior;
    j["burst_min_history"] = burstMinHistory;
    j["echo_share"] = echoShare;
    j["calibration_alpha"] = calibrationAlpha;
    j["warn_low_diversity_ild"] = warn.lowDiversityIld;
    j["warn_series_share"] = warn.seriesShare;
    j["warn_popular_top_percent"] = warn.popularTopPercent;
    j["warn_calibration_kl"] = warn.calibrationKl;
    j["warn_cold_train"] = warn.coldTrain;
    return j.dump();
}

EvalSettings EvalSettings::fromJson(const std::string& json, std::string* error)
{
    EvalSettings s;
    nlohmann::json j = nlohmann::json::parse(json, nullptr, false);
    if (j.is_discarded() || !j.is_object()) {
        if (error)
            *error = "settings are not a JSON object";
        return s;
    }
    std::string current;
    try {
        auto read = [&](const char* key, auto& field) {
            current = key;
            if (auto it = j.find(key); it != j.end())
                field = it->get<std::decay_t<decltype(field)>>();
        };
        read("k", s.k);
        read("relevant_at", s.relevantAt);
        read("bootstrap", s.bootstrap);
        read("seed", s.seed);
        read("curve_max_k", s.curveMaxK);
        read("burst_window", s.burstWindow);
        read("burst_min_share", s.burstMinShare);
        read("burst_max_prior", s.burstMaxPrior);
        read("burst_min_history", s.burstMinHistory);
        read("echo_share", s.echoShare);
        read("calibration_alpha", s.calibrationAlpha);
        read("warn_low_diversity_ild", s.warn.lowDiversityIld);
        read("warn_series_share", s.warn.seriesShare);
        read("warn_popular_top_percent", s.warn.popularTopPercent);
        read("warn_calibration_kl", s.warn.calibrationKl);
        read("warn_cold_train", s.warn.coldTrain);
    } catch (const nlohmann::json::exception&) {
        if (error)
            *error = "setting '" + current + "' has the wrong type";
    }
    return s;
}

} // namespace slatewise::core
