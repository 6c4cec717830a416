// SPDX-License-Identifier: MIT
#pragma once

#include <string_view>
#include <vector>

namespace slatewise::core {

/// The workspace schema version this build writes. docs/workspace.md describes it.
inline constexpr int kSchemaVersion = 3;

/// SQL that creates a version-1 workspace (kept so that migrations are tested from it).
std::string_view schemaVersion1();

/// migrations()[v - 1] moves a workspace from version v to v + 1.
const std::vector<std::string_view>& migrations();

} // namespace slatewise::core
