// SPDX-License-Identifier: MIT
#include "core/comparisonresult.h"

#include <nlohmann/json.hpp>

namespace slatewise::core {

namespace {

using Json = nlohmann::ordered_json;

/// JSON has no NaN or infinity: an undefined statistic is null.
Json number(double v)
{
    if (!std::isfinite(v))
        return nullptr;
    return v;
}

double numberFrom(const Json& j, const char* key)
{
    auto it = j.find(key);
    if (it == j.end() || it->is_null())
        return std::nan("");
    return it->get<double>();
}

Json metricJson(const MetricComparison& m)
{
    Json j;
    j["metric"] = std::string(comparisonMetricKey(m.metric));
    j["n"] = m.n;
    j["mean_base"] = number(m.meanBase);
    j["mean_candidate"] = number(m.meanCandidate);
    j["mean_diff"] = number(m.meanDiff);
    j["ci"] = Json::array({number(m.ci.low), number(m.ci.high)});
    j["t"] = number(m.t);
    j["df"] = number(m.df);
    j["p_t"] = number(m.pT);
    j["wilcoxon_w"] = number(m.wilcoxonW);
    j["p_wilcoxon"] = number(m.pWilcoxon);
    j["p_holm"] = number(m.pHolm);
    j["wins"] = m.wins;
    j["ties"] = m.ties;
    j["losses"] = m.losses;
    j["effect_size"] = number(m.effectSize);
    j["better"] = metricInfo(m.metric).better == Better::Higher ? "higher"
        : metricInfo(m.metric).better == Better::Lower            ? "lower"
                                                                  : "neither";
    j["sd_diff"] = number(m.sdDiff);
    j["wilcoxon_exact"] = m.wilcoxonExact;
    j["wilcoxon_zeros"] = m.wilcoxonZeros;
    j["p_holm_wilcoxon"] = number(m.pHolmWilcoxon);
    j["significant"] = m.significant;
    j["too_small"] = m.tooSmall;
    j["verdict"] = m.verdict;
    return j;
}

MetricComparison metricFrom(const Json& j)
{
    MetricComparison m;
    m.metric = metricFromKey(j.at("metric").get<std::string>()).value();
    m.n = j.at("n").get<std::int64_t>();
    m.meanBase = numberFrom(j, "mean_base");
    m.meanCandidate = numberFrom(j, "mean_candidate");
    m.meanDiff = numberFrom(j, "mean_diff");
    const auto& ci = j.at("ci");
    m.ci.low = ci.at(0).is_null() ? std::nan("") : ci.at(0).get<double>();
    m.ci.high = ci.at(1).is_null() ? std::nan("") : ci.at(1).get<double>();
    m.t = numberFrom(j, "t");
    m.df = numberFrom(j, "df");
    m.pT = numberFrom(j, "p_t");
    m.wilcoxonW = numberFrom(j, "wilcoxon_w");
    m.pWilcoxon = numberFrom(j, "p_wilcoxon");
    m.pHolm = numberFrom(j, "p_holm");
    m.wins = j.at("wins").get<std::int64_t>();
    m.ties = j.at("ties").get<std::int64_t>();
    m.losses = j.at("losses").get<std::int64_t>();
    m.effectSize = numberFrom(j, "effect_size");
    m.sdDiff = numberFrom(j, "sd_diff");
    m.wilcoxonExact = j.value("wilcoxon_exact", false);
    m.wilcoxonZeros = j.value("wilcoxon_zeros", std::int64_t{0});
    m.pHolmWilcoxon = numberFrom(j, "p_holm_wilcoxon");
    m.significant = j.value("significant", false);
    m.tooSmall = j.value("too_small", false);
    m.verdict = j.value("verdict", std::string());
    return m;
}

std::vector<std::string> warningList(const Json& j)
{
    std::vector<std::string> out;
    for (const auto& w : j)
        out.push_back(w.get<std::string>());
    return out;
}

} // namespace

std::string RunComparison::settingsKey() const
{
    Json j;
    j["comparison"] = Json::parse(settings.toJson());
    j["evaluation"] = evaluationSettings.empty() ? Json::object() : Json::parse(evaluationSettings);
    return j.dump();
}

std::string RunComparison::toJson(bool includePerUser, int indent) const
{
    Json j;
    j["base"] = base;
    j["candidate"] = candidate;
    Json ms = Json::array();
    for (const auto& m : metrics)
        ms.push_back(metricJson(m));
    j["metrics"] = ms;
    // Flat: one entry per segment and metric, the metric's fields plus the segment's.
    Json ss = Json::array();
    for (const auto& s : segments) {
        for (const auto& m : s.metrics) {
            Json e;
            e["segment"] = s.name;
            e["group"] = s.group;
            e["label"] = s.label;
            e["size"] = s.size;
            e["segment_too_small"] = s.tooSmall;
            const Json fields = metricJson(m);
            for (auto it = fields.begin(); it != fields.end(); ++it)
                e[it.key()] = it.value();
            // A segment is too small to judge when the segment or its usable users are too few.
            e["too_small"] = s.tooSmall || m.tooSmall;
            ss.push_back(e);
        }
    }
    j["segments"] = ss;
    j["primary_metric"] = hasPrimary ? Json(std::string(comparisonMetricKey(primary))) : Json(nullptr);
    Json worse = Json::array();
    for (const auto& w : whoGotWorse) {
        Json e;
        e["user_id"] = w.userId;
        e["user_index"] = w.user.value;
        e["base"] = number(w.base);
        e["candidate"] = number(w.candidate);
        e["loss"] = number(w.loss);
        e["base_warnings"] = w.baseWarnings;
        e["candidate_warnings"] = w.candidateWarnings;
        worse.push_back(e);
    }
    j["who_got_worse"] = worse;
    j["notes"] = notes;
    j["settings"] = Json::parse(settings.toJson());
    j["evaluation_settings"] = evaluationSettings.empty() ? Json::object() : Json::parse(evaluationSettings);
    j["base_run_id"] = baseRunId;
    j["candidate_run_id"] = candidateRunId;
    if (!computedAt.empty())
        j["computed_at"] = computedAt;
    if (includePerUser) {
        Json pu = Json::array();
        for (const auto& d : perUser) {
            Json e;
            e["metric"] = std::string(comparisonMetricKey(d.metric));
            Json users = Json::array();
            for (auto u : d.users)
                users.push_back(u.value);
            e["user_index"] = users;
            Json b = Json::array();
            Json c = Json::array();
            for (double v : d.base)
                b.push_back(number(v));
            for (double v : d.candidate)
                c.push_back(number(v));
            e["base"] = b;
            e["candidate"] = c;
            pu.push_back(e);
        }
        j["per_user"] = pu;
    }
    return j.dump(indent);
}

Result<RunComparison> RunComparison::fromJson(const std::string& text)
{
    Error e;
    e.kind = ErrorKind::Workspace;
    e.file = "comparisons.result";
    const Json j = Json::parse(text, nullptr, false);
    if (j.is_discarded() || !j.is_object()) {
        e.message = "stored comparison is not a JSON object";
        return e;
    }
    RunComparison c;
    try {
        c.base = j.at("base").get<std::string>();
        c.candidate = j.at("candidate").get<std::string>();
        for (const auto& m : j.at("metrics"))
            c.metrics.push_back(metricFrom(m));
        // Regroup the flat segment rows.
        for (const auto& row : j.at("segments")) {
            const std::string name = row.at("segment").get<std::string>();
            if (c.segments.empty() || c.segments.back().name != name) {
                SegmentComparison s;
                s.name = name;
                s.group = row.value("group", std::string());
                s.label = row.value("label", std::string());
                s.size = row.value("size", std::int64_t{0});
                s.tooSmall = row.value("segment_too_small", false);
                c.segments.push_back(std::move(s));
            }
            c.segments.back().metrics.push_back(metricFrom(row));
        }
        if (auto it = j.find("primary_metric"); it != j.end() && !it->is_null()) {
            c.hasPrimary = true;
            c.primary = metricFromKey(it->get<std::string>()).value();
        }
        for (const auto& w : j.at("who_got_worse")) {
            WorseUser u;
            u.userId = w.at("user_id").get<std::string>();
            u.user = UserIndex(w.at("user_index").get<std::uint32_t>());
            u.base = numberFrom(w, "base");
            u.candidate = numberFrom(w, "candidate");
            u.loss = numberFrom(w, "loss");
            u.baseWarnings = warningList(w.at("base_warnings"));
            u.candidateWarnings = warningList(w.at("candidate_warnings"));
            c.whoGotWorse.push_back(std::move(u));
        }
        c.notes = warningList(j.at("notes"));
        auto settings = ComparisonSettings::fromJson(j.at("settings").dump());
        if (!settings.ok())
            return settings.errors();
        c.settings = std::move(*settings);
        if (const auto& ev = j.at("evaluation_settings"); !ev.empty())
            c.evaluationSettings = ev.dump();
        c.baseRunId = j.value("base_run_id", std::int64_t{0});
        c.candidateRunId = j.value("candidate_run_id", std::int64_t{0});
        c.computedAt = j.value("computed_at", std::string());
        if (auto it = j.find("per_user"); it != j.end()) {
            for (const auto& p : *it) {
                UserDifferences d;
                d.metric = metricFromKey(p.at("metric").get<std::string>()).value();
                for (const auto& u : p.at("user_index"))
                    d.users.emplace_back(u.get<std::uint32_t>());
                for (const auto& v : p.at("base"))
                    d.base.push_back(v.is_null() ? std::nan("") : v.get<double>());
                for (const auto& v : p.at("candidate"))
                    d.candidate.push_back(v.is_null() ? std::nan("") : v.get<double>());
                c.perUser.push_back(std::move(d));
            }
        }
    } catch (const std::exception& ex) {
        e.message = std::string("stored comparison is malformed: ") + ex.what();
        return e;
    }
    return c;
}

} // namespace slatewise::core
