// SPDX-License-Identifier: MIT
#pragma once

#include "app/slatewise/args.h"
#include "core/evalsettings.h"

#include <optional>
#include <string>
#include <vector>

namespace slatewise::cli {

/// The options that set an evaluation's settings, shared by every command that evaluates:
/// --k, --relevant-at, --bootstrap, --seed, --settings FILE (JSON as EvalSettings::toJson
/// writes it) and one --warn-... option per warning threshold. Options override the file.
std::vector<OptionSpec> evalSettingsOptions();

/// `spec` with the options above appended, for a command that evaluates.
CommandSpec withEvalSettingsOptions(CommandSpec spec);

/// Reads the options above onto the defaults. On a bad value returns nullopt and sets
/// `usage` to a message naming the option, the value and what was expected.
std::optional<core::EvalSettings> evalSettingsFromArgs(const Args& args, std::string& usage);

} // namespace slatewise::cli
