// SPDX-License-Identifier: MIT
#pragma once

// Builds small in-memory datasets and runs by hand for the beyond-accuracy tests, so each
// case states its titles, genres, histories and lists in a few lines.

#include "core/dataset.h"
#include "core/evaluation.h"
#include "core/run.h"

#include <algorithm>
#include <cstdint>
#include <map>
#include <string>
#include <vector>

namespace slatewise::test {

struct Watch {
    std::string title;
    float rating = 4.0f;
    core::Timestamp time = 0;
};

class BeyondFixture {
public:
    std::int32_t genre(const std::string& name)
    {
        for (std::size_t g = 0; g < data.genreNames.size(); ++g)
            if (data.genreNames[g] == name)
                return static_cast<std::int32_t>(g);
        data.genreNames.push_back(name);
        return static_cast<std::int32_t>(data.genreNames.size() - 1);
    }

    /// Adds a title; `series` empty for a stand-alone title.
    core::ItemIndex item(const std::string& title, const std::vector<std::string>& genres,
                         const std::string& series = {}, std::int32_t part = 0)
    {
        core::Item it;
        it.externalId = "i" + std::to_string(data.items.size());
        it.title = title;
        it.year = 2000 + static_cast<std::int32_t>(data.items.size());
        for (const auto& g : genres)
            it.genres.push_back(genre(g));
        std::sort(it.genres.begin(), it.genres.end());
        if (!series.empty()) {
            auto found = std::find(data.seriesNames.begin(), data.seriesNames.end(), series);
            if (found == data.seriesNames.end()) {
                data.seriesNames.push_back(series);
                found = data.seriesNames.end() - 1;
            }
            it.series = static_cast<std::int32_t>(found - data.seriesNames.begin());
            it.seriesPart = part;
        }
        data.items.push_back(it);
        byTitle[title] = core::ItemIndex(static_cast<std::uint32_t>(data.items.size() - 1));
        return byTitle[title];
    }

    core::ItemIndex at(const std::string& title) const { return byTitle.at(title); }

    /// Adds a user with a train history, withheld ratings and a list (titles in rank order).
    /// `hasList` false gives the user no list at all.
    core::UserIndex user(const std::string& id, const std::vector<Watch>& train, const std::vector<Watch>& withheld,
                         const std::vector<std::string>& list, bool hasList = true)
    {
        users.push_back({id, train, withheld, list, hasList});
        return core::UserIndex(static_cast<std::uint32_t>(users.size() - 1));
    }

    /// Train rows with times 1, 2, 3, ... in the given order.
    static std::vector<Watch> watched(const std::vector<std::string>& titles, core::Timestamp start = 1)
    {
        std::vector<Watch> out;
        for (const auto& t : titles)
            out.push_back({t, 4.0f, start++});
        return out;
    }

    /// Finishes the dataset and run (call once, after all users).
    void finish()
    {
        data.userIds.clear();
        data.train = {};
        data.withheld = {};
        run = {};
        run.info.name = "hand-built";
        run.hasLists = true;
        run.hasScores = true;
        data.train.offsets.push_back(0);
        data.withheld.offsets.push_back(0);
        run.listOffsets.push_back(0);
        for (const auto& u : users) {
            data.userIds.push_back(u.id);
            std::vector<core::Interaction> train;
            for (const auto& w : u.train)
                train.push_back({at(w.title), w.rating, w.time});
            std::stable_sort(train.begin(), train.end(),
                             [](const auto& a, const auto& b) { return a.timestamp < b.timestamp; });
            data.train.rows.insert(data.train.rows.end(), train.begin(), train.end());
            data.train.offsets.push_back(static_cast<std::uint32_t>(data.train.rows.size()));
            std::vector<core::Interaction> withheld;
            for (const auto& w : u.withheld)
                withheld.push_back({at(w.title), w.rating, w.time});
            std::sort(withheld.begin(), withheld.end(), [](const auto& a, const auto& b) { return a.item < b.item; });
            data.withheld.rows.insert(data.withheld.rows.end(), withheld.begin(), withheld.end());
            data.withheld.offsets.push_back(static_cast<std::uint32_t>(data.withheld.rows.size()));
            if (u.hasList)
                for (std::size_t r = 0; r < u.list.size(); ++r)
                    run.listRows.push_back({at(u.list[r]), static_cast<float>(10.0 - 0.1 * static_cast<double>(r))});
            run.listOffsets.push_back(static_cast<std::uint32_t>(run.listRows.size()));
        }
        run.scores.assign(data.withheld.rows.size(), 3.0f);
    }

    /// The evaluator's part of the precondition of computeBeyond: one row per user with a
    /// withheld item, counts filled.
    core::RunEvaluation evaluationShell(const core::EvalSettings& settings) const
    {
        core::RunEvaluation eval;
        eval.runName = run.info.name;
        eval.settings = settings;
        std::vector<std::uint32_t> rows;
        for (std::uint32_t u = 0; u < data.userCount(); ++u)
            if (!data.withheld.of(core::UserIndex(u)).empty())
                rows.push_back(u);
        eval.users.resize(rows.size());
        for (std::size_t r = 0; r < rows.size(); ++r) {
            const core::UserIndex u(rows[r]);
            eval.users.users[r] = u;
            const auto w = data.withheld.of(u);
            eval.users.nWithheld[r] = static_cast<std::int32_t>(w.size());
            eval.users.nRelevant[r] = static_cast<std::int32_t>(
                std::count_if(w.begin(), w.end(), [&](const auto& x) { return x.rating >= settings.relevantAt; }));
            eval.users.nTrain[r] = static_cast<std::int32_t>(data.train.of(u).size());
        }
        return eval;
    }

    core::Dataset data;
    core::RunData run;

private:
    struct UserSpec {
        std::string id;
        std::vector<Watch> train, withheld;
        std::vector<std::string> list;
        bool hasList = true;
    };
    std::vector<UserSpec> users;
    std::map<std::string, core::ItemIndex> byTitle;
};

} // namespace slatewise::test
