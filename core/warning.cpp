// SPDX-License-Identifier: MIT
#include "core/warning.h"

namespace slatewise::core {

namespace {
constexpr std::array<WarningInfo, kWarningCodeCount> kWarnings{{
    {WarningCode::LowDiversity, "narrow", "Narrow list", Severity::Warn,
     "The list's titles share most of their genres, so it offers little variety."},
    {WarningCode::OneSeries, "one-series", "One series dominates", Severity::Warn,
     "Half or more of the list comes from a single series."},
    {WarningCode::SeriesOrder, "sequel-first", "Sequel before first part", Severity::Severe,
     "A later part of a series is offered while earlier parts are neither seen nor ranked above it."},
    {WarningCode::BurstEcho, "binge-echo", "Echoes a recent binge", Severity::Warn,
     "The list mostly repeats a genre the user only started watching recently."},
    {WarningCode::PopularOnly, "popular-only", "Only blockbusters", Severity::Info,
     "Every title in the list is among the most watched in the catalog."},
    {WarningCode::AlreadySeen, "seen-again", "Already seen", Severity::Severe,
     "The list offers titles the user has already watched."},
    {WarningCode::Miscalibrated, "off-taste", "Genre mix off", Severity::Warn,
     "The list's genre mix is far from the mix of the user's own history."},
    {WarningCode::ColdUser, "cold", "Cold user", Severity::Info,
     "Too little history to judge; low scores are expected."},
    {WarningCode::NoList, "no-list", "No list", Severity::Severe, "The run produced no list for this user."},
    {WarningCode::NoRelevant, "no-favourites", "No withheld favourites", Severity::Info,
     "None of the user's withheld ratings reaches the relevance threshold, so ranking metrics are undefined."},
}};
} // namespace

const std::array<WarningInfo, kWarningCodeCount>& allWarnings() { return kWarnings; }

const WarningInfo& warningInfo(WarningCode code) { return kWarnings[static_cast<std::size_t>(code)]; }

std::optional<WarningCode> warningFromKey(std::string_view key)
{
    for (const auto& w : kWarnings)
        if (w.key == key)
            return w.code;
    return std::nullopt;
}

std::string_view toString(Severity s)
{
    switch (s) {
    case Severity::Info:
        return "info";
    case Severity::Warn:
        return "warn";
    case Severity::Severe:
        return "severe";
    }
    return "warn";
}

} // namespace slatewise::core
