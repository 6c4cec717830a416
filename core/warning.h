// SPDX-License-Identifier: MIT
#pragma once

#include "core/ids.h"

#include <array>
#include <cstddef>
#include <optional>
#include <string>
#include <string_view>

namespace slatewise::core {

/// Per-user warning kinds. Codes are short, stable and ours; they appear in JSON, CSV,
/// the workspace and on the command line (`--warning CODE`).
enum class WarningCode {
    LowDiversity,   ///< "narrow"
    OneSeries,      ///< "one-series"
    SeriesOrder,    ///< "sequel-first"
    BurstEcho,      ///< "binge-echo"
    PopularOnly,    ///< "popular-only"
    AlreadySeen,    ///< "seen-again"
    Miscalibrated,  ///< "off-taste"
    ColdUser,       ///< "cold"
    NoList,         ///< "no-list"
    NoRelevant,     ///< "no-favourites"
    Count
};
inline constexpr std::size_t kWarningCodeCount = static_cast<std::size_t>(WarningCode::Count);

enum class Severity { Info, Warn, Severe };

struct WarningInfo {
    WarningCode code;
    std::string_view key;     ///< e.g. "sequel-first"
    std::string_view title;   ///< e.g. "Sequel before first part"
    Severity severity;        ///< default severity
    std::string_view explains; ///< one sentence: what it means and why it matters
};

const WarningInfo& warningInfo(WarningCode code);
const std::array<WarningInfo, kWarningCodeCount>& allWarnings();
std::optional<WarningCode> warningFromKey(std::string_view key);
std::string_view toString(Severity s);

/// One warning raised for one user under one run.
struct UserWarning {
    UserIndex user;
    WarningCode code = WarningCode::LowDiversity;
    Severity severity = Severity::Warn;
    double value = 0.0;     ///< the measured value
    double threshold = 0.0; ///< the threshold it crossed
    std::string message;    ///< one plain sentence naming the titles involved
};

} // namespace slatewise::core
