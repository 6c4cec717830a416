// SPDX-License-Identifier: MIT
#pragma once

#include "app/slatewise/args.h"

#include "core/dataset.h"
#include "core/error.h"

#include <optional>
#include <string>
#include <vector>

namespace slatewise::cli {

/// Prints each error on stderr ("slatewise import: error: train.csv:12:3: ..."), says when
/// the list was cut short, and returns the exit code for the first error.
int printErrors(const std::string& command, const std::vector<core::Error>& errors);
/// Prints notes and warnings on stderr.
void printNotes(const std::vector<core::Note>& notes);
/// Prints a usage error and the hint to --help; returns ExitUsage.
int usageFailure(const std::string& command, const std::string& message);
/// "1 to 5 in steps of 1 (inferred from the ratings)".
std::string scaleDescription(const core::RatingScale& scale);
std::string formatSeconds(double seconds);
/// --delimiter: ',', ';', '|', 'tab' or '\t'. Sets `usage` on a bad value; nullopt when absent.
std::optional<char> parseDelimiter(const Args& args, std::string& usage);

} // namespace slatewise::cli
