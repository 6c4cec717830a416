// SPDX-License-Identifier: MIT
#pragma once

#include <cstdint>
#include <string>
#include <utility>
#include <variant>
#include <vector>

namespace slatewise::core {

/// What kind of failure; maps one-to-one onto the command line's exit codes.
enum class ErrorKind {
    Usage = 1,     ///< the caller asked for something impossible (bad option, unknown run)
    InputData = 2, ///< an input file is malformed or inconsistent
    Workspace = 3, ///< the workspace file cannot be opened, migrated or written
    Cancelled = 4, ///< the user cancelled; nothing was written
};

/// Everything a person needs to fix the input. Line and column are 1-based; 0 means
/// "not applicable".
struct Error {
    ErrorKind kind = ErrorKind::InputData;
    // Every member has an initializer, so designated initializers may name only what they need.
    std::string file{};
    std::int64_t line = 0;
    std::int64_t column = 0;
    std::string value{};
    std::string message{};  ///< what is wrong, e.g. "rating is not a number"
    std::string expected{}; ///< what would have been accepted, e.g. "a decimal number from 1 to 5"

    /// "train.csv:12:3: rating is not a number: 'abc' (expected a decimal number from 1 to 5)"
    std::string toString() const;
};

/// Non-fatal remarks (ignored columns, leakage counts, unknown items kept).
struct Note {
    std::string file;
    std::string message;
};

/// Either a value or a non-empty list of errors. std::expected is C++23; this is the
/// small subset we need.
template <typename T>
class Result {
public:
    Result(T value) : m_data(std::move(value)) {}                   // NOLINT(google-explicit-constructor)
    Result(Error error) : m_data(std::vector<Error>{std::move(error)}) {} // NOLINT(google-explicit-constructor)
    Result(std::vector<Error> errors) : m_data(std::move(errors)) {} // NOLINT(google-explicit-constructor)

    bool ok() const { return std::holds_alternative<T>(m_data); }
    explicit operator bool() const { return ok(); }

    T& value() & { return std::get<T>(m_data); }
    const T& value() const& { return std::get<T>(m_data); }
    T&& value() && { return std::get<T>(std::move(m_data)); }
    T* operator->() { return &value(); }
    const T* operator->() const { return &value(); }
    T& operator*() & { return value(); }
    const T& operator*() const& { return value(); }

    const std::vector<Error>& errors() const { return std::get<std::vector<Error>>(m_data); }
    const Error& error() const { return errors().front(); }

private:
    std::variant<T, std::vector<Error>> m_data;
};

/// For operations that return nothing on success.
struct Done {};
using Status = Result<Done>;

/// Exit code for the command line: 0 on success, else the first error's kind.
int exitCodeFor(const std::vector<Error>& errors);

} // namespace slatewise::core
