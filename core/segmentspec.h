// SPDX-License-Identifier: MIT
#pragma once

#include "core/error.h"
#include "core/warning.h"

#include <string>
#include <string_view>

namespace slatewise::core {

/// How a comparison splits users into segments.
enum class SegmentKind {
    Activity, ///< cold users (train count < warn.coldTrain), then quartiles of the train count of the rest
    Genre,    ///< the genre the user's train items carry most often
    Warning,  ///< users carrying a warning in either run, against the rest
};

/// One `--segment` argument: "activity", "genre" or "warning:CODE".
struct SegmentSpec {
    SegmentKind kind = SegmentKind::Activity;
    WarningCode warning = WarningCode::ColdUser; ///< only for SegmentKind::Warning

    /// The text form accepted by parse().
    std::string key() const;
    /// Usage error naming the accepted forms when `text` is none of them.
    static Result<SegmentSpec> parse(std::string_view text);

    bool operator==(const SegmentSpec&) const = default;
};

} // namespace slatewise::core
