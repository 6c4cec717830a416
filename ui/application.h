// SPDX-License-Identifier: MIT
#pragma once

namespace slatewise::ui {

/// Entry point of slatewise-gui: parses arguments (WORKSPACE, --screenshots DIR) and runs.
int runApplication(int argc, char** argv);

} // namespace slatewise::ui
