// SPDX-License-Identifier: MIT
#pragma once

#include "core/dataset.h"
#include "core/evalsettings.h"
#include "core/ids.h"
#include "core/segmentspec.h"

#include <cstdint>
#include <span>
#include <string>
#include <vector>

namespace slatewise::core {

/// A set of evaluated users that a comparison is broken down by.
struct UserSegment {
    std::string group; ///< SegmentSpec::key()
    std::string name;  ///< stable short name, e.g. "activity:q1"
    std::string label; ///< plain words, e.g. "3 to 11 train interactions"
    std::vector<UserIndex> users; ///< ascending
};

/// Splits `evaluated` (ascending user indices) by `spec`:
/// - activity: "activity:cold" (train count < settings.warn.coldTrain), then "activity:q1".."q4"
///   by the quartiles (numpy's linear percentiles) of the train counts of the other users;
///   q1 holds counts <= the 25th percentile, q4 counts above the 75th; empty quartiles
///   (possible with many equal counts) are left out;
/// - genre: one segment per dominant train genre (the genre the user's train items carry
///   most often; ties go to the genre listed first), plus "genre:(none)"; largest first;
/// - warning:CODE: users carrying CODE in the base or the candidate run, then the rest.
/// `baseWarnings` / `candidateWarnings` are bit masks by user index (bit = WarningCode).
std::vector<UserSegment> buildUserSegments(const SegmentSpec& spec, std::span<const UserIndex> evaluated,
                                           const Dataset& data, const DatasetStats& stats,
                                           const EvalSettings& settings,
                                           std::span<const std::uint32_t> baseWarnings,
                                           std::span<const std::uint32_t> candidateWarnings);

} // namespace slatewise::core
