// SPDX-License-Identifier: MIT
#include "core/evaluationjson.h"

#include <charconv>
#include <cmath>

namespace slatewise::core {

namespace {

using ojson = nlohmann::ordered_json;

ojson number(double v)
{
    if (std::isnan(v) || std::isinf(v))
        return nullptr;
    return v;
}

double readNumber(const nlohmann::json& j, const char* key)
{
    auto it = j.find(key);
    if (it == j.end() || it->is_null())
        return std::nan("");
    return it->get<double>();
}

std::int64_t readInt(const nlohmann::json& j, const char* key)
{
    auto it = j.find(key);
    if (it == j.end() || it->is_null())
        return 0;
    return it->get<std::int64_t>();
}

ojson numbers(const std::vector<double>& values)
{
    ojson a = ojson::array();
    for (double v : values)
        a.push_back(number(v));
    return a;
}

std::vector<double> readNumbers(const nlohmann::json& j, const char* key)
{
    std::vector<double> out;
    auto it = j.find(key);
    if (it == j.end() || !it->is_array())
        return out;
    for (const auto& v : *it)
        out.push_back(v.is_null() ? std::nan("") : v.get<double>());
    return out;
}

ojson accuracyJson(const AccuracySummary& a)
{
    ojson j;
    j["n"] = a.n;
    j["missing_scores"] = a.missingScores;
    j["scored_fraction"] = number(a.scoredFraction);
    j["rmse"] = number(a.rmse);
    j["mae"] = number(a.mae);
    j["mean_error"] = number(a.meanError);
    j["user_rmse_mean"] = number(a.userRmseMean);
    j["heldout_topk"] = number(a.heldoutTopk);
    ojson bands = ojson::array();
    for (const auto& b : a.bands) {
        ojson band;
        band["rating"] = b.rating;
        band["n"] = b.n;
        band["rmse"] = number(b.rmse);
        band["mae"] = number(b.mae);
        band["mean_error"] = number(b.meanError);
        bands.push_back(std::move(band));
    }
    j["bands"] = std::move(bands);
    return j;
}

AccuracySummary readAccuracy(const nlohmann::json& j)
{
    AccuracySummary a;
    a.n = readInt(j, "n");
    a.missingScores = readInt(j, "missing_scores");
    a.scoredFraction = readNumber(j, "scored_fraction");
    a.rmse = readNumber(j, "rmse");
    a.mae = readNumber(j, "mae");
    a.meanError = readNumber(j, "mean_error");
    a.userRmseMean = readNumber(j, "user_rmse_mean");
    a.heldoutTopk = readNumber(j, "heldout_topk");
    if (auto it = j.find("bands"); it != j.end() && it->is_array())
        for (const auto& b : *it)
            a.bands.push_back({readNumber(b, "rating"), readInt(b, "n"), readNumber(b, "rmse"), readNumber(b, "mae"),
                               readNumber(b, "mean_error")});
    return a;
}

ojson rankingJson(const RankingSummary& r)
{
    ojson j;
    j["users"] = r.users;
    j["users_without_list"] = r.usersWithoutList;
    j["precision"] = number(r.precision);
    j["recall"] = number(r.recall);
    j["hit_rate"] = number(r.hitRate);
    j["mrr"] = number(r.mrr);
    j["map"] = number(r.map);
    j["ndcg"] = number(r.ndcg);
    j["ndcg_graded"] = number(r.ndcgGraded);
    j["heldout_topk"] = number(r.heldoutTopk);
    ojson curves;
    curves["k"] = r.curves.k;
    curves["precision"] = numbers(r.curves.precision);
    curves["recall"] = numbers(r.curves.recall);
    curves["ndcg"] = numbers(r.curves.ndcg);
    j["curves"] = std::move(curves);
    return j;
}

RankingSummary readRanking(const nlohmann::json& j)
{
    RankingSummary r;
    r.users = readInt(j, "users");
    r.usersWithoutList = readInt(j, "users_without_list");
    r.precision = readNumber(j, "precision");
    r.recall = readNumber(j, "recall");
    r.hitRate = readNumber(j, "hit_rate");
    r.mrr = readNumber(j, "mrr");
    r.map = readNumber(j, "map");
    r.ndcg = readNumber(j, "ndcg");
    r.ndcgGraded = readNumber(j, "ndcg_graded");
    r.heldoutTopk = readNumber(j, "heldout_topk");
    if (auto it = j.find("curves"); it != j.end() && it->is_object()) {
        if (auto k = it->find("k"); k != it->end() && k->is_array())
            r.curves.k = k->get<std::vector<std::int32_t>>();
        r.curves.precision = readNumbers(*it, "precision");
        r.curves.recall = readNumbers(*it, "recall");
        r.curves.ndcg = readNumbers(*it, "ndcg");
    }
    return r;
}

ojson beyondJson(const BeyondSummary& b)
{
    ojson j;
    j["ild"] = number(b.ild);
    j["novelty"] = number(b.novelty);
    j["coverage"] = number(b.coverage);
    j["gini"] = number(b.gini);
    j["popularity_lift"] = number(b.popularityLift);
    j["calibration_kl"] = number(b.calibrationKl);
    j["series_share"] = number(b.seriesShare);
    j["order_violations"] = b.orderViolations;
    j["order_violations_users"] = number(b.orderViolationsUsers);
    j["burst_echo"] = number(b.burstEcho);
    j["seen_in_list"] = b.seenInList;
    j["seen_in_list_users"] = number(b.seenInListUsers);
    j["burst_skipped_users"] = b.burstSkippedUsers;
    return j;
}

BeyondSummary readBeyond(const nlohmann::json& j)
{
    BeyondSummary b;
    b.ild = readNumber(j, "ild");
    b.novelty = readNumber(j, "novelty");
    b.coverage = readNumber(j, "coverage");
    b.gini = readNumber(j, "gini");
    b.popularityLift = readNumber(j, "popularity_lift");
    b.calibrationKl = readNumber(j, "calibration_kl");
    b.seriesShare = readNumber(j, "series_share");
    b.orderViolations = readInt(j, "order_violations");
    b.orderViolationsUsers = readNumber(j, "order_violations_users");
    b.burstEcho = readNumber(j, "burst_echo");
    b.seenInList = readInt(j, "seen_in_list");
    b.seenInListUsers = readNumber(j, "seen_in_list_users");
    b.burstSkippedUsers = readInt(j, "burst_skipped_users");
    return b;
}

void appendCell(std::string& line, double v)
{
    line += ',';
    line += formatDouble(v);
}

/// RFC 4180 quoting for text cells that need it.
std::string csvText(const std::string& s)
{
    if (s.find_first_of(",\"\r\n") == std::string::npos)
        return s;
    std::string out = "\"";
    for (char c : s) {
        if (c == '"')
            out += '"';
        out += c;
    }
    return out + "\"";
}

} // namespace

std::string formatDouble(double v)
{
    if (std::isnan(v))
        return {};
    char buf[64];
    auto [ptr, ec] = std::to_chars(buf, buf + sizeof buf, v);
    return ec == std::errc() ? std::string(buf, ptr) : std::string{};
}

nlohmann::ordered_json EvaluationJson::runSummary(const RunEvaluation& eval)
{
    ojson j;
    j["name"] = eval.runName;
    j["run_id"] = eval.runId;
    j["computed_at"] = eval.computedAt;
    j["accuracy"] = eval.accuracy ? accuracyJson(*eval.accuracy) : ojson(nullptr);
    j["ranking"] = eval.ranking ? rankingJson(*eval.ranking) : ojson(nullptr);
    j["beyond"] = eval.beyond ? beyondJson(*eval.beyond) : ojson(nullptr);
    ojson ci = ojson::object();
    for (const auto& [key, interval] : eval.ci)
        ci[key] = ojson::array({number(interval.low), number(interval.high)});
    j["ci"] = std::move(ci);
    ojson warnings = ojson::object();
    for (const auto& [key, share] : eval.warningShare)
        warnings[key] = number(share);
    j["warnings"] = std::move(warnings);
    j["users_evaluated"] = eval.users.size();
    return j;
}

Status EvaluationJson::readRunSummary(const nlohmann::json& j, RunEvaluation& eval)
{
    try {
        if (!j.is_object())
            return Error{ErrorKind::Workspace, {}, 0, 0, {}, "stored evaluation summary is not a JSON object", {}};
        if (auto it = j.find("name"); it != j.end() && it->is_string())
            eval.runName = it->get<std::string>();
        eval.runId = readInt(j, "run_id");
        if (auto it = j.find("computed_at"); it != j.end() && it->is_string())
            eval.computedAt = it->get<std::string>();
        eval.accuracy.reset();
        eval.ranking.reset();
        eval.beyond.reset();
        if (auto it = j.find("accuracy"); it != j.end() && it->is_object())
            eval.accuracy = readAccuracy(*it);
        if (auto it = j.find("ranking"); it != j.end() && it->is_object())
            eval.ranking = readRanking(*it);
        if (auto it = j.find("beyond"); it != j.end() && it->is_object())
            eval.beyond = readBeyond(*it);
        eval.ci.clear();
        if (auto it = j.find("ci"); it != j.end() && it->is_object())
            for (const auto& [key, pair] : it->items()) {
                Interval interval;
                if (pair.is_array() && pair.size() == 2) {
                    interval.low = pair[0].is_null() ? std::nan("") : pair[0].get<double>();
                    interval.high = pair[1].is_null() ? std::nan("") : pair[1].get<double>();
                }
                eval.ci[key] = interval;
            }
        eval.warningShare.clear();
        if (auto it = j.find("warnings"); it != j.end() && it->is_object())
            for (const auto& [key, share] : it->items())
                eval.warningShare[key] = share.is_null() ? std::nan("") : share.get<double>();
    } catch (const nlohmann::json::exception& e) {
        return Error{ErrorKind::Workspace, {}, 0, 0, {}, std::string("stored evaluation summary is malformed: ") + e.what(), {}};
    }
    return Done{};
}

nlohmann::ordered_json EvaluationJson::document(const std::vector<RunEvaluation>& evals, const EvalSettings& settings)
{
    ojson j;
    ojson s = ojson::parse(settings.toJson());
    j["settings"] = std::move(s);
    ojson runs = ojson::array();
    for (const auto& e : evals)
        runs.push_back(runSummary(e));
    j["runs"] = std::move(runs);
    return j;
}

std::string EvaluationJson::perUserCsvHeader()
{
    std::string header = "run,user_id,n_withheld,n_relevant";
    for (const auto& info : allMetrics()) {
        header += ',';
        header += info.key;
    }
    return header;
}

void EvaluationJson::writePerUserCsv(std::ostream& out, const std::vector<RunEvaluation>& evals,
                                     const std::vector<std::string>& userIds)
{
    out << perUserCsvHeader() << '\n';
    std::string line;
    for (const auto& e : evals) {
        const std::string run = csvText(e.runName);
        const UserResultTable& t = e.users;
        for (std::size_t r = 0; r < t.size(); ++r) {
            const auto u = t.users[r].value;
            line = run;
            line += ',';
            line += csvText(u < userIds.size() ? userIds[u] : std::to_string(u));
            line += ',' + std::to_string(t.nWithheld[r]) + ',' + std::to_string(t.nRelevant[r]);
            for (std::size_t m = 0; m < kMetricCount; ++m)
                appendCell(line, t.metrics[m][r]);
            line += '\n';
            out << line;
        }
    }
}

} // namespace slatewise::core
