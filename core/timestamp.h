// SPDX-License-Identifier: MIT
#pragma once

#include "core/dataset.h"

#include <optional>
#include <string>
#include <string_view>

namespace slatewise::core {

/// Parses Unix seconds ("1767225600", optionally negative) or ISO 8601 date-times
/// ("2026-03-04T20:15:00Z", "2026-03-04T20:15:00+01:00", "2026-03-04 20:15:00.250-0530",
/// "2026-03-04" = midnight UTC). A date-time without zone is taken as UTC. Fractions of a
/// second are dropped. nullopt when malformed or out of range (calendar checked).
std::optional<Timestamp> parseTimestamp(std::string_view text);

/// "2026-03-04T20:15:00Z".
std::string formatIso8601(Timestamp t);

/// Days since 1970-01-01 for a proleptic Gregorian date (Howard Hinnant's days_from_civil,
/// common practice).
std::int64_t daysFromCivil(std::int64_t y, unsigned m, unsigned d);

} // namespace slatewise::core
