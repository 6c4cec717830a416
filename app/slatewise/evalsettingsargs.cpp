// SPDX-License-Identifier: MIT
#include "app/slatewise/evalsettingsargs.h"

#include <fstream>
#include <sstream>

namespace slatewise::cli {

std::vector<OptionSpec> evalSettingsOptions()
{
    return {
        { "k", "N", "list depth for the ranking metrics (default 10)" },
        { "relevant-at", "X", "a withheld rating >= X counts as relevant (default 4.0)" },
        { "bootstrap", "B", "bootstrap resamples for the 95% intervals, 0 to skip (default 1000)" },
        { "seed", "S", "bootstrap seed (default 20261204)" },
        { "settings", "FILE", "JSON object of evaluation settings (keys as stored with the results)" },
        { "warn-low-diversity-ild", "X", "warn 'narrow' when ild < X (default 0.35)" },
        { "warn-series-share", "X", "warn 'one-series' when series_share >= X (default 0.5)" },
        { "warn-popular-top-percent", "X", "warn 'popular-only' when every item is in the top X% (default 5)" },
        { "warn-calibration-kl", "X", "warn 'off-taste' when calibration_kl > X nats (default 1.0)" },
        { "warn-cold-train", "N", "mark 'cold' users with fewer than N train rows (default 5)" },
    };
}

CommandSpec withEvalSettingsOptions(CommandSpec spec)
{
    for (auto& o : evalSettingsOptions())
        spec.options.push_back(std::move(o));
    return spec;
}

std::optional<core::EvalSettings> evalSettingsFromArgs(const Args& args, std::string& usage)
{
    core::EvalSettings s;
    if (args.has("settings")) {
        const std::string path = args.value("settings");
        std::ifstream in(path);
        if (!in) {
            usage = "--settings: cannot read '" + path + "'";
            return std::nullopt;
        }
        std::stringstream text;
        text << in.rdbuf();
        std::string error;
        s = core::EvalSettings::fromJson(text.str(), &error);
        if (!error.empty()) {
            usage = "--settings " + path + ": " + error;
            return std::nullopt;
        }
    }
    auto integer = [&](const char* name, std::int32_t& field, long long min) {
        auto v = args.integer(name, field, usage);
        if (!v)
            return false;
        if (*v < min || *v > 1000000000) {
            usage
                = std::string("--") + name + " must be at least " + std::to_string(min) + ", got " + std::to_string(*v);
            return false;
        }
        field = static_cast<std::int32_t>(*v);
        return true;
    };
    auto number = [&](const char* name, double& field) {
        auto v = args.number(name, field, usage);
        if (!v)
            return false;
        field = *v;
        return true;
    };
    if (!integer("k", s.k, 1) || !integer("bootstrap", s.bootstrap, 0) || !number("relevant-at", s.relevantAt)
        || !number("warn-low-diversity-ild", s.warn.lowDiversityIld) || !number("warn-series-share", s.warn.seriesShare)
        || !number("warn-popular-top-percent", s.warn.popularTopPercent)
        || !number("warn-calibration-kl", s.warn.calibrationKl) || !integer("warn-cold-train", s.warn.coldTrain, 0))
        return std::nullopt;
    if (args.has("seed")) {
        auto v = args.integer("seed", 0, usage);
        if (!v || *v < 0) {
            if (usage.empty())
                usage = "--seed must be a whole number >= 0";
            return std::nullopt;
        }
        s.seed = static_cast<std::uint64_t>(*v);
    }
    if (s.k < 1) {
        usage = "k must be at least 1 (from --settings)";
        return std::nullopt;
    }
    return s;
}

} // namespace slatewise::cli
