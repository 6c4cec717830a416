// SPDX-License-Identifier: MIT
#pragma once

#include "core/error.h"
#include "core/sha256.h"

#include <cstdint>
#include <memory>
#include <span>
#include <string>
#include <string_view>
#include <vector>

namespace slatewise::core {

/// Longest physical line accepted (1 MiB); longer lines are reported as errors, since no
/// valid row of ours comes near it and a runaway quote would otherwise swallow the file.
inline constexpr std::size_t kMaxLineBytes = 1u << 20;

/// Parses RFC 4180 records from a byte range without allocating per field: fields are views
/// into the input, except quoted fields with doubled quotes, which are unescaped into a
/// scratch buffer reused across records. Views stay valid until the next call to next().
///
/// Beyond RFC 4180: the delimiter may be a tab; a record ends at LF or CRLF; blank lines are
/// skipped; bytes must be valid UTF-8 without NUL. Errors name the line (physical, 1-based,
/// where the record starts unless the fault is further down) and the column (1-based field
/// number).
class CsvParser {
public:
    enum class Step { Record, End, Error };

    CsvParser(std::string_view text, char delimiter, std::int64_t firstLine = 1);

    Step next();
    std::span<const std::string_view> fields() const { return m_fields; }
    std::int64_t line() const { return m_recordLine; }
    /// Bytes of `text` consumed so far.
    std::size_t position() const { return static_cast<std::size_t>(m_p - m_begin); }
    /// Valid after Step::Error; `file` is left empty for the caller to fill.
    const Error& error() const { return m_error; }

private:
    Step fail(std::int64_t line, std::string value, std::string message, std::string expected);
    bool checkSpecial(); ///< at a NUL or non-ASCII byte: validates, advances or fails
    bool newline(bool inField); ///< at '\n': counts the line and checks its length

    const char* m_begin;
    const char* m_p;
    const char* m_end;
    const char* m_lineStart;
    char m_delimiter;
    std::int64_t m_line;
    std::int64_t m_recordLine = 0;
    std::vector<std::string_view> m_fields;
    std::string m_scratch;
    struct Fixup {
        std::size_t field, offset, length;
    };
    std::vector<Fixup> m_fixups;
    Error m_error;
    unsigned char m_class[256];
};

/// One input file, memory-mapped read-only. Knows its delimiter and BOM, hashes itself as it
/// is consumed (SHA-256 for the workspace's provenance records) and releases pages already
/// parsed so a large file does not stay resident.
class CsvReader {
public:
    /// `delimiter` 0 = by extension (.tsv -> tab, anything else -> comma). Fails on a missing
    /// or unreadable file, an empty file and a binary file (NUL in the first 64 KiB).
    static Result<CsvReader> open(const std::string& path, char delimiter = 0);

    CsvReader(CsvReader&& other) noexcept;
    CsvReader& operator=(CsvReader&& other) noexcept;
    CsvReader(const CsvReader&) = delete;
    CsvReader& operator=(const CsvReader&) = delete;
    ~CsvReader();

    const std::string& path() const { return m_path; }
    std::string fileName() const;
    char delimiter() const { return m_delimiter; }
    bool hasBom() const { return m_bom; }
    std::uint64_t size() const { return m_size; }
    /// The text after the BOM.
    std::string_view text() const;

    /// Hashes the file up to `textPosition` (an offset into text()) and lets the kernel drop
    /// the pages before it. Call as parsing advances; cheap when called often.
    void consumed(std::size_t textPosition);
    /// Hashes what is left and returns the file's SHA-256 (hex).
    std::string sha256();

private:
    CsvReader() = default;
    std::string m_path;
    const char* m_data = nullptr;
    std::uint64_t m_size = 0;
    bool m_mapped = false;
    std::unique_ptr<char[]> m_copy; ///< when mmap is not possible
    char m_delimiter = ',';
    bool m_bom = false;
    std::unique_ptr<Sha256> m_hash;
    std::uint64_t m_hashed = 0;
    std::uint64_t m_released = 0;
};

/// The delimiter a path implies: tab for .tsv (any case), comma otherwise.
char delimiterForPath(const std::string& path);

} // namespace slatewise::core
