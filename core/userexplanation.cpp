// SPDX-License-Identifier: MIT
#include "core/userexplanation.h"

#include "core/beyondcalculator.h"

#include <nlohmann/json.hpp>

#include <algorithm>

namespace slatewise::core {

namespace {

std::vector<std::string> genreNamesOf(const Dataset& data, const Item& item)
{
    std::vector<std::string> out;
    for (const auto g : item.genres)
        if (g >= 0 && static_cast<std::size_t>(g) < data.genreNames.size())
            out.push_back(data.genreNames[static_cast<std::size_t>(g)]);
    return out;
}

std::string seriesNameOf(const Dataset& data, const Item& item)
{
    if (item.series < 0 || static_cast<std::size_t>(item.series) >= data.seriesNames.size())
        return {};
    return data.seriesNames[static_cast<std::size_t>(item.series)];
}

nlohmann::ordered_json num(double v) { return std::isfinite(v) ? nlohmann::ordered_json(v) : nlohmann::ordered_json(); }

} // namespace

UserExplanation UserExplanation::build(const Dataset& data, const DatasetStats& stats, const RunData& run,
                                       const RunEvaluation& eval, UserIndex user)
{
    UserExplanation x;
    x.user = user;
    x.userId = user.value < data.userIds.size() ? data.userIds[user.value] : std::string();
    x.runName = eval.runName.empty() ? run.info.name : eval.runName;
    x.k = eval.settings.k;
    x.relevantAt = eval.settings.relevantAt;
    x.runHasLists = run.hasLists;
    x.runHasScores = run.hasScores;
    x.genreNames = data.genreNames;
    if (user.value >= data.userCount())
        return x;

    const auto train = data.train.of(user);
    const auto withheld = data.withheld.of(user);
    x.nTrain = static_cast<std::int32_t>(train.size());
    x.nWithheld = static_cast<std::int32_t>(withheld.size());
    x.nRelevant = static_cast<std::int32_t>(std::count_if(
        withheld.begin(), withheld.end(), [&](const Interaction& w) { return w.rating >= x.relevantAt; }));

    const BeyondCalculator calc(data, stats, eval.settings);
    auto scratch = calc.makeScratch();
    const auto fullList = run.listOf(user);
    const auto topk = calc.topK(run, user);
    x.fullListLength = static_cast<std::int32_t>(fullList.size());
    const auto measures = calc.measure(train, topk, scratch);
    if (measures.burst.echoed.genre != kNone && !measures.burst.bursts.empty())
        x.burstGenre = data.genreNames.at(static_cast<std::size_t>(measures.burst.echoed.genre));

    for (std::size_t pos = 0; pos < topk.size(); ++pos) {
        const ItemIndex item = topk[pos].item;
        const Item& info = data.items[item.value];
        ListRow row;
        row.rank = static_cast<std::int32_t>(pos + 1);
        row.item = item;
        row.itemId = info.externalId;
        row.title = info.title;
        row.year = info.year;
        row.genres = genreNamesOf(data, info);
        row.series = seriesNameOf(data, info);
        row.seriesPart = info.seriesPart;
        row.score = topk[pos].score;
        if (const auto w = findWithheld(data, user, item); w >= 0) {
            row.withheld = true;
            row.withheldRating = data.withheld.rows[static_cast<std::size_t>(w)].rating;
            row.hit = row.withheldRating >= x.relevantAt;
        }
        row.seen = std::find(measures.seenRanks.begin(), measures.seenRanks.end(), row.rank) != measures.seenRanks.end();
        for (const auto& v : measures.violations)
            if (v.rank == row.rank) {
                row.orderViolation = true;
                row.missingParts = v.missingParts;
                for (const auto missing : v.missingItems)
                    row.missingTitles.push_back(data.items[missing.value].title);
            }
        x.list.push_back(std::move(row));
    }

    const std::size_t firstWithheld = data.withheld.offsets[user.value];
    for (std::size_t r = 0; r < withheld.size(); ++r) {
        const Item& info = data.items[withheld[r].item.value];
        WithheldRow row;
        row.item = withheld[r].item;
        row.itemId = info.externalId;
        row.title = info.title;
        row.year = info.year;
        row.genres = genreNamesOf(data, info);
        row.series = seriesNameOf(data, info);
        row.seriesPart = info.seriesPart;
        row.rating = withheld[r].rating;
        row.relevant = row.rating >= x.relevantAt;
        if (run.hasScores && firstWithheld + r < run.scores.size())
            row.score = run.scores[firstWithheld + r];
        for (std::size_t pos = 0; pos < fullList.size(); ++pos)
            if (fullList[pos].item == row.item) {
                row.listRank = static_cast<std::int32_t>(pos + 1);
                row.inTopK = pos < topk.size();
                break;
            }
        x.withheld.push_back(std::move(row));
    }
    std::stable_sort(x.withheld.begin(), x.withheld.end(), [](const WithheldRow& a, const WithheldRow& b) {
        return a.rating != b.rating ? a.rating > b.rating : a.title < b.title;
    });

    for (const auto& row : train)
        x.history.push_back({row.timestamp, row.item, data.items[row.item.value].externalId,
                             data.items[row.item.value].title, row.rating, data.items[row.item.value].genres});

    // Per-user results and warnings come from the evaluation, so the explanation shows
    // exactly what was stored and ranked.
    const auto& table = eval.users;
    const auto it = std::lower_bound(table.users.begin(), table.users.end(), user);
    const bool hasRow = it != table.users.end() && *it == user;
    x.evaluated = hasRow;
    const std::size_t row = hasRow ? static_cast<std::size_t>(it - table.users.begin()) : 0;
    for (std::size_t m = 0; m < kMetricCount; ++m) {
        MetricRow mr;
        mr.metric = static_cast<Metric>(m);
        const auto& column = table.metrics[m];
        double sum = 0;
        std::size_t n = 0;
        for (const double v : column)
            if (!std::isnan(v)) {
                sum += v;
                ++n;
            }
        if (n > 0)
            mr.runMean = sum / static_cast<double>(n);
        if (hasRow && row < column.size())
            mr.user = column[row];
        x.metrics.push_back(mr);
    }
    const auto first = std::lower_bound(eval.warnings.begin(), eval.warnings.end(), user,
                                        [](const UserWarning& w, UserIndex u) { return w.user < u; });
    for (auto w = first; w != eval.warnings.end() && w->user == user; ++w)
        x.warnings.push_back(*w);
    return x;
}

std::string UserExplanation::toJson() const
{
    using json = nlohmann::ordered_json;
    json j;
    j["user_id"] = userId;
    j["run"] = runName;
    j["k"] = k;
    j["relevant_at"] = relevantAt;
    j["n_train"] = nTrain;
    j["n_withheld"] = nWithheld;
    j["n_relevant"] = nRelevant;
    j["has_list"] = runHasLists && !list.empty();
    j["burst_genre"] = burstGenre.empty() ? json() : json(burstGenre);
    json listJson = json::array();
    for (const auto& r : list) {
        json e;
        e["rank"] = r.rank;
        e["item_id"] = r.itemId;
        e["title"] = r.title;
        e["year"] = r.year == 0 ? json() : json(r.year);
        e["genres"] = r.genres;
        e["series"] = r.series.empty() ? json() : json(r.series);
        e["series_part"] = r.series.empty() ? json() : json(r.seriesPart);
        e["score"] = num(r.score);
        e["withheld_rating"] = num(r.withheldRating);
        e["hit"] = r.hit;
        e["seen"] = r.seen;
        e["order_violation"] = r.orderViolation;
        e["missing_parts"] = r.missingParts;
        listJson.push_back(std::move(e));
    }
    j["list"] = std::move(listJson);
    json withheldJson = json::array();
    for (const auto& w : withheld) {
        json e;
        e["item_id"] = w.itemId;
        e["title"] = w.title;
        e["rating"] = w.rating;
        e["relevant"] = w.relevant;
        e["score"] = num(w.score);
        e["list_rank"] = w.listRank == 0 ? json() : json(w.listRank);
        e["in_top_k"] = w.inTopK;
        withheldJson.push_back(std::move(e));
    }
    j["withheld"] = std::move(withheldJson);
    json metricsJson = json::object();
    for (const auto& m : metrics) {
        json e;
        e["user"] = num(m.user);
        e["run_mean"] = num(m.runMean);
        metricsJson[std::string(metricInfo(m.metric).key)] = std::move(e);
    }
    j["metrics"] = std::move(metricsJson);
    json warningsJson = json::array();
    for (const auto& w : warnings) {
        json e;
        e["code"] = std::string(warningInfo(w.code).key);
        e["severity"] = std::string(toString(w.severity));
        e["value"] = num(w.value);
        e["threshold"] = num(w.threshold);
        e["message"] = w.message;
        warningsJson.push_back(std::move(e));
    }
    j["warnings"] = std::move(warningsJson);
    json historyJson = json::array();
    for (const auto& h : history) {
        json e;
        e["time"] = h.time == kNoTimestamp ? json() : json(h.time);
        e["item_id"] = h.itemId;
        e["title"] = h.title;
        e["rating"] = h.rating;
        std::vector<std::string> names;
        for (const auto g : h.genres)
            if (g >= 0 && static_cast<std::size_t>(g) < genreNames.size())
                names.push_back(genreNames[static_cast<std::size_t>(g)]);
        e["genres"] = names;
        historyJson.push_back(std::move(e));
    }
    j["history"] = std::move(historyJson);
    return j.dump(2);
}

} // namespace slatewise::core
