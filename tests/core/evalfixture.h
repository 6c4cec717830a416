// SPDX-License-Identifier: MIT
#pragma once

// Small in-memory datasets and runs for the evaluation-engine tests, and a tolerance
// comparison that prints both sides on failure.

#include "core/dataset.h"
#include "core/run.h"

#include <QString>
#include <QTest>

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <limits>
#include <string>
#include <vector>

/// Fails with "expr = actual, expected E (tolerance T)" unless |actual − expected| <= tol.
/// NaN equals NaN (a metric "not defined" is an expected value too).
#define COMPARE_NEAR(actual, expected, tol)                                                                    \
    do {                                                                                                       \
        const double a_ = (actual);                                                                            \
        const double e_ = (expected);                                                                          \
        const bool same_ = (std::isnan(a_) && std::isnan(e_)) || std::abs(a_ - e_) <= (tol);                  \
        if (!same_)                                                                                            \
            QFAIL(qPrintable(QStringLiteral("%1 = %2, expected %3 (tolerance %4)")                              \
                                 .arg(QStringLiteral(#actual))                                                 \
                                 .arg(a_, 0, 'g', 17)                                                          \
                                 .arg(e_, 0, 'g', 17)                                                          \
                                 .arg(static_cast<double>(tol))));                                             \
    } while (false)

namespace slatewise::test {

inline constexpr float kNoScore = std::numeric_limits<float>::quiet_NaN();

/// One user's withheld ratings, the run's scores for them and the run's list.
struct EvalUser {
    std::vector<std::pair<std::uint32_t, float>> withheld; ///< (item, rating)
    std::vector<float> scores;                              ///< parallel to withheld; kNoScore = missing
    std::vector<std::uint32_t> list;                        ///< item indices in rank order
    std::int32_t train = 1;                                 ///< train rows (items are 0, 1, ...)
};

struct EvalCase {
    core::Dataset data;
    core::RunData run;
};

/// Builds a dataset of `items` items and the given users, and a run with scores (when
/// `withScores`) and lists (when `withLists`).
inline EvalCase makeCase(std::uint32_t items, const std::vector<EvalUser>& users, bool withScores = true,
                         bool withLists = true)
{
    EvalCase c;
    for (std::uint32_t i = 0; i < items; ++i) {
        core::Item it;
        it.externalId = "item" + std::to_string(i);
        it.title = "Title " + std::to_string(i);
        c.data.items.push_back(it);
    }
    c.data.train.offsets.push_back(0);
    c.data.withheld.offsets.push_back(0);
    c.run.info.name = "run";
    c.run.info.id = 1;
    c.run.hasScores = withScores;
    c.run.hasLists = withLists;
    if (withLists)
        c.run.listOffsets.push_back(0);
    for (std::size_t u = 0; u < users.size(); ++u) {
        const EvalUser& user = users[u];
        c.data.userIds.push_back("u" + std::to_string(u));
        for (std::int32_t t = 0; t < user.train; ++t)
            c.data.train.rows.push_back({core::ItemIndex(static_cast<std::uint32_t>(t) % items), 3.0f, 0});
        c.data.train.offsets.push_back(static_cast<std::uint32_t>(c.data.train.rows.size()));
        std::vector<std::size_t> order(user.withheld.size());
        for (std::size_t i = 0; i < order.size(); ++i)
            order[i] = i;
        std::sort(order.begin(), order.end(),
                  [&](std::size_t a, std::size_t b) { return user.withheld[a].first < user.withheld[b].first; });
        for (std::size_t i : order) {
            c.data.withheld.rows.push_back({core::ItemIndex(user.withheld[i].first), user.withheld[i].second, 0});
            if (withScores)
                c.run.scores.push_back(i < user.scores.size() ? user.scores[i] : kNoScore);
        }
        c.data.withheld.offsets.push_back(static_cast<std::uint32_t>(c.data.withheld.rows.size()));
        if (withLists) {
            for (std::uint32_t item : user.list)
                c.run.listRows.push_back({core::ItemIndex(item), kNoScore});
            c.run.listOffsets.push_back(static_cast<std::uint32_t>(c.run.listRows.size()));
        }
    }
    return c;
}

} // namespace slatewise::test
