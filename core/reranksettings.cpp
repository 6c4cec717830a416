// SPDX-License-Identifier: MIT
#include "core/reranksettings.h"

#include <nlohmann/json.hpp>

namespace slatewise::core {

std::string_view toString(RerankMethod method)
{
    switch (method) {
    case RerankMethod::Mmr:
        return "mmr";
    case RerankMethod::SeriesOrder:
        return "series-order";
    case RerankMethod::BurstDamp:
        return "burst-damp";
    }
    return "mmr";
}

std::optional<RerankMethod> rerankMethodFromString(std::string_view name)
{
    for (RerankMethod m : {RerankMethod::Mmr, RerankMethod::SeriesOrder, RerankMethod::BurstDamp})
        if (toString(m) == name)
            return m;
    return std::nullopt;
}

RerankSettings RerankSettings::defaults(RerankMethod method)
{
    RerankSettings s;
    s.method = method;
    s.lambda = method == RerankMethod::BurstDamp ? 1.0 : 0.5;
    return s;
}

std::string RerankSettings::toJson() const
{
    nlohmann::ordered_json j;
    j["method"] = std::string(toString(method));
    if (method != RerankMethod::SeriesOrder)
        j["lambda"] = lambda;
    if (method == RerankMethod::BurstDamp) {
        j["burst_window"] = burstWindow;
        j["burst_min_share"] = burstMinShare;
        j["burst_max_prior"] = burstMaxPrior;
        j["burst_min_history"] = burstMinHistory;
    }
    return j.dump();
}

} // namespace slatewise::core
