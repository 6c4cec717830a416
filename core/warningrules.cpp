// SPDX-License-Identifier: MIT
#include "core/warningrules.h"

#include <algorithm>
#include <cmath>
#include <cstdio>

namespace slatewise::core {

namespace {

std::string number(double v, int decimals)
{
    char buf[64];
    std::snprintf(buf, sizeof buf, "%.*f", decimals, v);
    return buf;
}

/// Ratings and thresholds print without trailing zeros: 4 rather than 4.00, 3.5 as is.
std::string compact(double v)
{
    char buf[64];
    std::snprintf(buf, sizeof buf, "%g", v);
    return buf;
}

std::string percent(double share) { return number(100.0 * share, 0) + "%"; }

std::string partList(const std::vector<std::int32_t>& parts)
{
    std::string out = parts.size() == 1 ? "part " : "parts ";
    for (std::size_t i = 0; i < parts.size(); ++i) {
        if (i > 0)
            out += i + 1 == parts.size() ? " and " : ", ";
        out += std::to_string(parts[i]);
    }
    return out;
}

std::string titlesWord(std::size_t n) { return n == 1 ? "title" : "titles"; }

UserWarning make(UserIndex user, WarningCode code, double value, double threshold, std::string message)
{
    UserWarning w;
    w.user = user;
    w.code = code;
    w.severity = warningInfo(code).severity;
    w.value = value;
    w.threshold = threshold;
    w.message = std::move(message);
    return w;
}

} // namespace

std::string WarningRules::quoted(ItemIndex item) const
{
    const Item& info = m_data.items[item.value];
    return "\u00AB" + (info.title.empty() ? info.externalId : info.title) + "\u00BB";
}

std::string WarningRules::quotedList(const std::vector<ItemIndex>& items, std::size_t limit) const
{
    const std::size_t shown = std::min(items.size(), std::max<std::size_t>(limit, 1));
    std::string out;
    for (std::size_t i = 0; i < shown; ++i) {
        if (i > 0)
            out += (i + 1 == shown && shown == items.size()) ? " and " : ", ";
        out += quoted(items[i]);
    }
    if (shown < items.size())
        out += " and " + std::to_string(items.size() - shown) + " more";
    return out;
}

std::string WarningRules::genreName(std::int32_t genre) const
{
    if (genre < 0 || static_cast<std::size_t>(genre) >= m_data.genreNames.size())
        return "(no genre)";
    return m_data.genreNames[static_cast<std::size_t>(genre)];
}

std::vector<UserWarning> WarningRules::evaluate(const Subject& s) const
{
    std::vector<UserWarning> out;
    const auto& warn = m_settings.warn;
    const auto& items = m_data.items;
    const BeyondCalculator::UserMeasures* m = s.measures;
    const std::size_t n = s.topk.size();
    const std::string topN = "the top " + std::to_string(n);

    auto itemsWithGenre = [&](std::int32_t genre) {
        std::vector<ItemIndex> with;
        for (const auto& e : s.topk) {
            const auto& g = items[e.item.value].genres;
            if (std::binary_search(g.begin(), g.end(), genre))
                with.push_back(e.item);
        }
        return with;
    };

    if (m && n > 0) {
        // Narrow list.
        if (!std::isnan(m->ild) && m->ild < warn.lowDiversityIld) {
            std::string msg;
            const auto with = m->listGenre == kNone ? std::vector<ItemIndex>{} : itemsWithGenre(m->listGenre);
            if (!with.empty())
                msg = std::to_string(with.size()) + " of " + topN + " titles are " + genreName(m->listGenre) +
                      ", such as " + quotedList(with) + ", so the list is narrow (diversity " + number(m->ild, 2) +
                      ", below " + number(warn.lowDiversityIld, 2) + ").";
            else
                msg = "The titles of " + topN + " carry no genres to tell them apart (diversity " +
                      number(m->ild, 2) + ", below " + number(warn.lowDiversityIld, 2) + ").";
            out.push_back(make(s.user, WarningCode::LowDiversity, m->ild, warn.lowDiversityIld, std::move(msg)));
        }

        // One series dominates: it takes two titles to speak of a series filling the list.
        if (m->topSeries != kNone && m->topSeriesCount >= 2 && m->seriesShare >= warn.seriesShare) {
            std::vector<ItemIndex> members;
            for (const auto& e : s.topk)
                if (items[e.item.value].series == m->topSeries)
                    members.push_back(e.item);
            const std::string& series = m_data.seriesNames.at(static_cast<std::size_t>(m->topSeries));
            out.push_back(make(s.user, WarningCode::OneSeries, m->seriesShare, warn.seriesShare,
                               std::to_string(m->topSeriesCount) + " of " + topN + " titles come from the series \u00AB" +
                                   series + "\u00BB: " + quotedList(members, 4) + "."));
        }

        // Series out of order.
        if (!m->violations.empty()) {
            std::string msg;
            const std::size_t shown = std::min<std::size_t>(m->violations.size(), 3);
            for (std::size_t i = 0; i < shown; ++i) {
                const auto& v = m->violations[i];
                if (i > 0)
                    msg += "; ";
                msg += quoted(v.item) + (i == 0 ? " stands at rank " : " at rank ") + std::to_string(v.rank) +
                       " while " + partList(v.missingParts) + (v.missingParts.size() == 1 ? " is" : " are") +
                       " unseen";
            }
            if (shown < m->violations.size())
                msg += "; and " + std::to_string(m->violations.size() - shown) + " more";
            msg += ".";
            out.push_back(make(s.user, WarningCode::SeriesOrder, static_cast<double>(m->orderViolations), 1.0,
                               std::move(msg)));
        }

        // Recent-burst echo.
        if (m->burst.echoes) {
            const auto& b = m->burst.echoed;
            const auto with = itemsWithGenre(b.genre);
            out.push_back(make(
                s.user, WarningCode::BurstEcho, m->burst.listShare, m_settings.echoShare,
                percent(b.windowShare) + " of the last " + std::to_string(m_settings.burstWindow) +
                    " titles watched were " + genreName(b.genre) + " against " + percent(b.priorShare) +
                    " before, and the list echoes that binge with " + std::to_string(with.size()) + " of " + topN +
                    " in " + genreName(b.genre) + ", such as " + quotedList(with) + "."));
        }

        // Popular titles only.
        const double popularFloor = 100.0 - warn.popularTopPercent;
        if (!std::isnan(m->minPopularityPercentile) && m->minPopularityPercentile >= popularFloor) {
            std::vector<ItemIndex> all;
            for (const auto& e : s.topk)
                all.push_back(e.item);
            out.push_back(make(s.user, WarningCode::PopularOnly, m->minPopularityPercentile, popularFloor,
                               "All " + std::to_string(n) + " listed " + titlesWord(n) + " are among the catalog's " +
                                   compact(warn.popularTopPercent) + "% most watched, such as " + quotedList(all) +
                                   "."));
        }

        // Already seen.
        if (!m->seenRanks.empty()) {
            std::string msg;
            const std::size_t shown = std::min<std::size_t>(m->seenRanks.size(), 3);
            for (std::size_t i = 0; i < shown; ++i) {
                if (i > 0)
                    msg += (i + 1 == shown && shown == m->seenRanks.size()) ? " and " : ", ";
                const auto rank = m->seenRanks[i];
                msg += quoted(s.topk[static_cast<std::size_t>(rank - 1)].item) + " (rank " + std::to_string(rank) + ")";
            }
            if (shown < m->seenRanks.size())
                msg += " and " + std::to_string(m->seenRanks.size() - shown) + " more";
            msg += m->seenRanks.size() == 1 ? " is" : " are";
            msg += " already in the user's history.";
            out.push_back(
                make(s.user, WarningCode::AlreadySeen, static_cast<double>(m->seenInList), 1.0, std::move(msg)));
        }

        // Genre mix far from the history.
        if (!std::isnan(m->calibrationKl) && m->calibrationKl > warn.calibrationKl) {
            const auto with = m->listGenre == kNone ? std::vector<ItemIndex>{} : itemsWithGenre(m->listGenre);
            std::string msg = "The list is " + percent(m->listGenreShare) + " " + genreName(m->listGenre);
            if (!with.empty())
                msg += " (" + quotedList(with, 2) + ")";
            msg += " while the history is " + percent(m->historyGenreShare) + " " + genreName(m->historyGenre);
            if (m->historyGenre != m->listGenre)
                msg += ", which fills only " + percent(m->historyGenreInList) + " of the list";
            msg += " (calibration KL " + number(m->calibrationKl, 2) + ", above " + number(warn.calibrationKl, 2) + ").";
            out.push_back(make(s.user, WarningCode::Miscalibrated, m->calibrationKl, warn.calibrationKl, std::move(msg)));
        }
    }

    // Cold user.
    if (static_cast<std::int64_t>(s.train.size()) < warn.coldTrain) {
        std::string msg;
        if (s.train.empty()) {
            msg = "The user has no titles in the training history, so low scores are expected.";
        } else {
            std::vector<ItemIndex> watched;
            for (const auto& row : s.train)
                watched.push_back(row.item);
            msg = "Only " + std::to_string(s.train.size()) + " " + titlesWord(s.train.size()) +
                  " in the training history (" + quotedList(watched, 4) + "), too few to judge, so low scores are expected.";
        }
        out.push_back(make(s.user, WarningCode::ColdUser, static_cast<double>(s.train.size()),
                           static_cast<double>(warn.coldTrain), std::move(msg)));
    }

    // No list.
    if (s.runHasLists && n == 0) {
        std::vector<ItemIndex> withheld;
        for (const auto& row : s.withheld)
            withheld.push_back(row.item);
        std::string msg = "The run gave this user no list";
        if (!withheld.empty())
            msg += ", so none of the " + std::to_string(withheld.size()) + " withheld " + titlesWord(withheld.size()) +
                   " (" + quotedList(withheld, 2) + ") can be found";
        msg += ".";
        out.push_back(make(s.user, WarningCode::NoList, 0.0, 1.0, std::move(msg)));
    }

    // No relevant withheld items.
    if (!s.withheld.empty() && s.nRelevant == 0) {
        const auto best = std::max_element(s.withheld.begin(), s.withheld.end(),
                                           [](const Interaction& a, const Interaction& b) { return a.rating < b.rating; });
        const std::size_t w = s.withheld.size();
        out.push_back(make(s.user, WarningCode::NoRelevant, best->rating, m_settings.relevantAt,
                           "None of the " + std::to_string(w) + " withheld " + titlesWord(w) +
                               " reaches the relevance threshold " + compact(m_settings.relevantAt) +
                               " (the best, " + quoted(best->item) + ", is rated " + compact(best->rating) +
                               "), so ranking metrics say nothing about this user."));
    }
    return out;
}

} // namespace slatewise::core
