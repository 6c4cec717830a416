// SPDX-License-Identifier: MIT
#include "core/comparisonsettings.h"

#include <nlohmann/json.hpp>

namespace slatewise::core {

std::vector<Metric> ComparisonSettings::defaultMetrics()
{
    return {Metric::Ndcg, Metric::Precision, Metric::Recall, Metric::Ap, Metric::Rmse, Metric::Ild, Metric::Novelty};
}

std::vector<Metric> ComparisonSettings::effectiveMetrics() const
{
    return metrics.empty() ? defaultMetrics() : metrics;
}

std::string_view comparisonMetricKey(Metric m)
{
    if (m == Metric::Ap)
        return "map";
    if (m == Metric::Rr)
        return "mrr";
    return metricInfo(m).key;
}

std::string ComparisonSettings::toJson() const
{
    nlohmann::ordered_json j;
    nlohmann::ordered_json ms = nlohmann::ordered_json::array();
    for (Metric m : effectiveMetrics())
        ms.push_back(std::string(comparisonMetricKey(m)));
    j["metrics"] = ms;
    j["bootstrap"] = bootstrap;
    j["seed"] = seed;
    j["level"] = level;
    j["alpha"] = alpha;
    j["tolerance"] = tolerance;
    j["min_segment_size"] = minSegmentSize;
    j["worst"] = worst;
    nlohmann::ordered_json ss = nlohmann::ordered_json::array();
    for (const auto& s : segments)
        ss.push_back(s.key());
    j["segments"] = ss;
    return j.dump();
}

Result<ComparisonSettings> ComparisonSettings::fromJson(const std::string& json)
{
    const nlohmann::json j = nlohmann::json::parse(json, nullptr, false);
    Error e;
    e.kind = ErrorKind::Workspace;
    e.file = "comparisons.settings";
    if (j.is_discarded() || !j.is_object()) {
        e.message = "comparison settings are not a JSON object";
        e.value = json.substr(0, 80);
        return e;
    }
    ComparisonSettings s;
    std::string current;
    try {
        auto read = [&](const char* key, auto& field) {
            current = key;
            if (auto it = j.find(key); it != j.end())
                field = it->get<std::decay_t<decltype(field)>>();
        };
        read("bootstrap", s.bootstrap);
        read("seed", s.seed);
        read("level", s.level);
        read("alpha", s.alpha);
        read("tolerance", s.tolerance);
        read("min_segment_size", s.minSegmentSize);
        read("worst", s.worst);
        current = "metrics";
        if (auto it = j.find("metrics"); it != j.end()) {
            for (const auto& k : *it) {
                const auto m = metricFromKey(k.get<std::string>());
                if (!m) {
                    e.message = "unknown metric in stored comparison settings";
                    e.value = k.get<std::string>();
                    return e;
                }
                s.metrics.push_back(*m);
            }
        }
        current = "segments";
        if (auto it = j.find("segments"); it != j.end()) {
            for (const auto& k : *it) {
                auto spec = SegmentSpec::parse(k.get<std::string>());
                if (!spec.ok()) {
                    Error inner = spec.error();
                    inner.kind = ErrorKind::Workspace;
                    return inner;
                }
                s.segments.push_back(*spec);
            }
        }
    } catch (const nlohmann::json::exception&) {
        e.message = "comparison setting '" + current + "' has the wrong type";
        return e;
    }
    return s;
}

} // namespace slatewise::core
