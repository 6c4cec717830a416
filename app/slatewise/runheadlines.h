// SPDX-License-Identifier: MIT
#pragma once

#include "core/progress.h"

#include <string>
#include <vector>

namespace slatewise::core {
class Workspace;
}

namespace slatewise::cli {

/// Evaluates the named runs with the default settings, stores the evaluations and prints one
/// headline line each, so a fitted or re-ranked run can be read beside its parent.
/// Returns the exit code.
int printRunHeadlines(core::Workspace& ws, const std::vector<std::string>& names, const core::Progress& progress);

} // namespace slatewise::cli
