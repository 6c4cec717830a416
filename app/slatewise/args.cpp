// SPDX-License-Identifier: MIT
#include "app/slatewise/args.h"

#include <charconv>
#include <cmath>
#include <cstdio>
#include <iostream>

namespace slatewise::cli {

std::optional<Args> Args::parse(
    const CommandSpec& spec, const std::vector<std::string>& argv, std::string& error, bool& helpRequested)
{
    Args args;
    helpRequested = false;
    for (std::size_t i = 0; i < argv.size(); ++i) {
        const std::string& arg = argv[i];
        if (arg == "--help" || arg == "-h") {
            helpRequested = true;
            return args;
        }
        if (arg.rfind("--", 0) != 0 || arg == "--") {
            args.m_positionals.push_back(arg);
            continue;
        }
        std::string name = arg.substr(2);
        std::optional<std::string> inlineValue;
        if (auto eq = name.find('='); eq != std::string::npos) {
            inlineValue = name.substr(eq + 1);
            name = name.substr(0, eq);
        }
        const OptionSpec* option = nullptr;
        for (const auto& o : spec.options)
            if (o.name == name)
                option = &o;
        if (!option) {
            error = "unknown option --" + name + " for '" + spec.name + "'";
            return std::nullopt;
        }
        std::string value;
        if (option->valueName.empty()) {
            if (inlineValue) {
                error = "--" + name + " takes no value";
                return std::nullopt;
            }
            value = "1";
        } else if (inlineValue) {
            value = *inlineValue;
        } else if (i + 1 < argv.size()) {
            value = argv[++i];
        } else {
            error = "--" + name + " needs a value (" + option->valueName + ")";
            return std::nullopt;
        }
        auto& slot = args.m_values[name];
        if (!slot.empty() && !option->repeatable) {
            error = "--" + name + " given more than once";
            return std::nullopt;
        }
        slot.push_back(value);
    }
    for (const auto& o : spec.options) {
        if (o.required && !args.has(o.name)) {
            error = "--" + o.name + (o.valueName.empty() ? "" : " " + o.valueName) + " is required";
            return std::nullopt;
        }
    }
    if (static_cast<int>(args.m_positionals.size()) != spec.positionals) {
        error = "'" + spec.name + "' expects " + std::to_string(spec.positionals) + " positional argument"
            + (spec.positionals == 1 ? "" : "s") + ", got " + std::to_string(args.m_positionals.size());
        return std::nullopt;
    }
    return args;
}

std::string Args::value(const std::string& name, const std::string& fallback) const
{
    auto it = m_values.find(name);
    return it == m_values.end() ? fallback : it->second.back();
}

std::vector<std::string> Args::values(const std::string& name) const
{
    auto it = m_values.find(name);
    return it == m_values.end() ? std::vector<std::string> {} : it->second;
}

std::optional<long long> Args::integer(const std::string& name, long long fallback, std::string& error) const
{
    if (!has(name))
        return fallback;
    const std::string text = value(name);
    long long v = 0;
    auto [ptr, ec] = std::from_chars(text.data(), text.data() + text.size(), v);
    if (ec != std::errc() || ptr != text.data() + text.size()) {
        error = "--" + name + " expects a whole number, got '" + text + "'";
        return std::nullopt;
    }
    return v;
}

std::optional<double> Args::number(const std::string& name, double fallback, std::string& error) const
{
    if (!has(name))
        return fallback;
    const std::string text = value(name);
    double v = 0;
    auto [ptr, ec] = std::from_chars(text.data(), text.data() + text.size(), v);
    if (ec != std::errc() || ptr != text.data() + text.size() || !std::isfinite(v)) {
        error = "--" + name + " expects a number, got '" + text + "'";
        return std::nullopt;
    }
    return v;
}

std::string helpText(const CommandSpec& spec)
{
    std::string out = "usage: slatewise " + spec.name + " " + spec.synopsis + "\n\n" + spec.description + "\n";
    if (!spec.options.empty()) {
        out += "\noptions:\n";
        for (const auto& o : spec.options) {
            std::string left = "  --" + o.name + (o.valueName.empty() ? "" : " " + o.valueName);
            if (left.size() < 28)
                left.resize(28, ' ');
            else
                left += "\n" + std::string(28, ' ');
            out += left + o.help + (o.required ? " (required)" : "") + (o.repeatable ? " (repeatable)" : "") + "\n";
        }
    }
    out += "  --help                    show this help\n";
    out += "\nexit codes: 0 success, 1 usage error, 2 input data error, 3 workspace error\n";
    return out;
}

std::optional<Args> parseOrExit(const CommandSpec& spec, const std::vector<std::string>& argv, int& exitCode)
{
    std::string error;
    bool help = false;
    auto args = Args::parse(spec, argv, error, help);
    if (help) {
        std::cout << helpText(spec);
        exitCode = ExitOk;
        return std::nullopt;
    }
    if (!args) {
        std::cerr << "slatewise " << spec.name << ": " << error << "\n"
                  << "Try 'slatewise " << spec.name << " --help'.\n";
        exitCode = ExitUsage;
        return std::nullopt;
    }
    return args;
}

} // namespace slatewise::cli
