// SPDX-License-Identifier: MIT
#pragma once

#include <map>
#include <optional>
#include <set>
#include <string>
#include <vector>

namespace slatewise::cli {

/// Declares one option of a subcommand: `--name VALUE` (or `--name=VALUE`), or a flag.
struct OptionSpec {
    std::string name; ///< without the leading dashes
    std::string valueName; ///< empty for a flag
    std::string help;
    bool repeatable = false;
    bool required = false; ///< the parser refuses a command line without it
};

struct CommandSpec {
    std::string name;
    std::string synopsis; ///< e.g. "WORKSPACE --catalog F --train F --test F"
    std::string description; ///< one paragraph
    int positionals = 1; ///< how many positional arguments are required
    std::vector<OptionSpec> options;
};

/// Parsed arguments. Unknown options and missing values are usage errors (exit code 1).
class Args {
public:
    /// On error returns nullopt and sets `error`; on --help sets `helpRequested`.
    static std::optional<Args> parse(
        const CommandSpec& spec, const std::vector<std::string>& argv, std::string& error, bool& helpRequested);

    const std::vector<std::string>& positionals() const { return m_positionals; }
    bool has(const std::string& name) const { return m_values.count(name) > 0; }
    std::string value(const std::string& name, const std::string& fallback = {}) const;
    std::vector<std::string> values(const std::string& name) const;
    /// Parses an integer or a number; on failure returns nullopt and sets `error`.
    std::optional<long long> integer(const std::string& name, long long fallback, std::string& error) const;
    std::optional<double> number(const std::string& name, double fallback, std::string& error) const;

private:
    std::vector<std::string> m_positionals;
    std::map<std::string, std::vector<std::string>> m_values;
};

/// Prints `slatewise NAME SYNOPSIS`, the description and the option table.
std::string helpText(const CommandSpec& spec);

/// Exit codes, documented in README.md and `slatewise --help`.
enum ExitCode { ExitOk = 0, ExitUsage = 1, ExitInput = 2, ExitWorkspace = 3 };

/// Parses, prints help or the usage error, and returns nullopt with `exitCode` set when
/// the command should stop.
std::optional<Args> parseOrExit(const CommandSpec& spec, const std::vector<std::string>& argv, int& exitCode);

} // namespace slatewise::cli
