// SPDX-License-Identifier: MIT
#include "core/modelsettings.h"

#include <nlohmann/json.hpp>

namespace slatewise::core {

std::string_view toString(ModelKind kind)
{
    switch (kind) {
    case ModelKind::Popular:
        return "popular";
    case ModelKind::Mean:
        return "mean";
    case ModelKind::Bias:
        return "bias";
    case ModelKind::ItemKnn:
        return "itemknn";
    case ModelKind::Als:
        return "als";
    }
    return "als";
}

std::optional<ModelKind> modelKindFromString(std::string_view name)
{
    for (ModelKind k : {ModelKind::Popular, ModelKind::Mean, ModelKind::Bias, ModelKind::ItemKnn, ModelKind::Als})
        if (toString(k) == name)
            return k;
    return std::nullopt;
}

std::string ModelSettings::toJson() const
{
    nlohmann::ordered_json j;
    j["model"] = std::string(toString(kind));
    j["list_length"] = listLength;
    j["seed"] = seed;
    j["clip_to_scale"] = clipToScale;
    if (kind == ModelKind::Bias || kind == ModelKind::ItemKnn) {
        j["bias_user_lambda"] = biasUserLambda;
        j["bias_item_lambda"] = biasItemLambda;
        j["bias_iterations"] = biasIterations;
        j["bias_tolerance"] = biasTolerance;
    }
    if (kind == ModelKind::ItemKnn) {
        j["neighbours"] = neighbours;
        j["shrinkage"] = shrinkage;
        j["neighbour_pool"] = neighbourPool;
    }
    if (kind == ModelKind::Als) {
        j["rank"] = rank;
        j["lambda"] = lambda;
        j["iterations"] = iterations;
        j["init_scale"] = initScale;
    }
    return j.dump();
}

} // namespace slatewise::core
