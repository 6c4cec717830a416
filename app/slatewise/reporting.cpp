// SPDX-License-Identifier: MIT
#include "app/slatewise/reporting.h"

#include "core/importer.h"

#include <charconv>
#include <cstdio>
#include <iostream>

namespace slatewise::cli {

namespace {
std::string number(double v)
{
    char buf[32];
    auto res = std::to_chars(buf, buf + sizeof buf, v);
    return std::string(buf, res.ptr);
}
} // namespace

int printErrors(const std::string& command, const std::vector<core::Error>& errors)
{
    for (const auto& e : errors)
        std::cerr << "slatewise " << command << ": error: " << e.toString() << "\n";
    if (errors.size() >= core::kMaxReportedErrors)
        std::cerr << "slatewise " << command << ": stopped after " << core::kMaxReportedErrors << " errors\n";
    if (!errors.empty() && errors.front().kind == core::ErrorKind::InputData)
        std::cerr << "slatewise " << command << ": nothing was written\n";
    return core::exitCodeFor(errors);
}

void printNotes(const std::vector<core::Note>& notes)
{
    for (const auto& n : notes) {
        const bool warning = n.message.rfind("warning: ", 0) == 0;
        std::cerr << (warning ? "warning: " : "note: ") << (n.file.empty() ? "" : n.file + ": ")
                  << (warning ? n.message.substr(9) : n.message) << "\n";
    }
}

int usageFailure(const std::string& command, const std::string& message)
{
    std::cerr << "slatewise " << command << ": " << message << "\n"
              << "Try 'slatewise " << command << " --help'.\n";
    return ExitUsage;
}

std::string scaleDescription(const core::RatingScale& scale)
{
    std::string out = number(scale.min) + " to " + number(scale.max);
    out += scale.step > 0 ? " in steps of " + number(scale.step) : std::string(", continuous");
    out += scale.inferred ? " (inferred from the ratings)" : " (given)";
    return out;
}

std::string formatSeconds(double seconds)
{
    char buf[32];
    std::snprintf(buf, sizeof buf, "%.2f s", seconds);
    return buf;
}

std::optional<char> parseDelimiter(const Args& args, std::string& usage)
{
    if (!args.has("delimiter"))
        return std::nullopt;
    const std::string v = args.value("delimiter");
    if (v == "tab" || v == "\\t" || v == "\t")
        return '\t';
    if (v.size() == 1 && v[0] != '"' && v[0] != '\n' && v[0] != '\r')
        return v[0];
    usage = "--delimiter expects one character or 'tab', got '" + v + "'";
    return std::nullopt;
}

} // namespace slatewise::cli
