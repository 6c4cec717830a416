// SPDX-License-Identifier: MIT
#include "core/csvreader.h"

#include <fcntl.h>
#include <sys/mman.h>
#include <sys/stat.h>
#include <unistd.h>

#include <algorithm>
#include <cctype>
#include <cerrno>
#include <cstring>
#include <new>
#include <utility>

namespace slatewise::core {

namespace {

enum : unsigned char { kNormal = 0, kDelim = 1, kLf = 2, kCr = 3, kQuote = 4, kSpecial = 5 };

/// Length of the valid UTF-8 sequence at p (RFC 3629 table 3-7), 0 when invalid.
std::size_t utf8Length(const unsigned char* p, const unsigned char* end)
{
    const unsigned char c = p[0];
    const auto cont = [&](std::size_t i, unsigned char lo = 0x80, unsigned char hi = 0xBF) {
        return p + i < end && p[i] >= lo && p[i] <= hi;
    };
    if (c >= 0xC2 && c <= 0xDF)
        return cont(1) ? 2 : 0;
    if (c == 0xE0)
        return cont(1, 0xA0) && cont(2) ? 3 : 0;
    if ((c >= 0xE1 && c <= 0xEC) || c == 0xEE || c == 0xEF)
        return cont(1) && cont(2) ? 3 : 0;
    if (c == 0xED)
        return cont(1, 0x80, 0x9F) && cont(2) ? 3 : 0;
    if (c == 0xF0)
        return cont(1, 0x90) && cont(2) && cont(3) ? 4 : 0;
    if (c >= 0xF1 && c <= 0xF3)
        return cont(1) && cont(2) && cont(3) ? 4 : 0;
    if (c == 0xF4)
        return cont(1, 0x80, 0x8F) && cont(2) && cont(3) ? 4 : 0;
    return 0;
}

std::string hexBytes(const char* p, const char* end, std::size_t n)
{
    static constexpr char kHex[] = "0123456789ABCDEF";
    std::string out;
    for (std::size_t i = 0; i < n && p + i < end; ++i) {
        const auto c = static_cast<unsigned char>(p[i]);
        if (!out.empty())
            out += ' ';
        out += "0x";
        out += kHex[c >> 4];
        out += kHex[c & 0xF];
    }
    return out;
}

} // namespace

CsvParser::CsvParser(std::string_view text, char delimiter, std::int64_t firstLine)
    : m_begin(text.data()), m_p(text.data()), m_end(text.data() + text.size()), m_lineStart(text.data()),
      m_delimiter(delimiter), m_line(firstLine)
{
    std::memset(m_class, kNormal, sizeof m_class);
    for (int c = 0x80; c < 0x100; ++c)
        m_class[c] = kSpecial;
    m_class[0] = kSpecial;
    m_class[static_cast<unsigned char>('\n')] = kLf;
    m_class[static_cast<unsigned char>('\r')] = kCr;
    m_class[static_cast<unsigned char>('"')] = kQuote;
    m_class[static_cast<unsigned char>(delimiter)] = kDelim;
    m_fields.reserve(16);
}

CsvParser::Step CsvParser::fail(std::int64_t line, std::string value, std::string message, std::string expected)
{
    m_error = Error{};
    m_error.kind = ErrorKind::InputData;
    m_error.line = line;
    m_error.column = static_cast<std::int64_t>(m_fields.size() + 1);
    m_error.value = std::move(value);
    m_error.message = std::move(message);
    m_error.expected = std::move(expected);
    return Step::Error;
}

bool CsvParser::newline(bool inField)
{
    if (static_cast<std::size_t>(m_p - m_lineStart) > kMaxLineBytes) {
        fail(m_line, {}, "line is longer than 1 MiB (" + std::to_string(m_p - m_lineStart) + " bytes)",
             "lines of at most 1048576 bytes");
        // Between records the last field read is the long one.
        if (!inField)
            m_error.column = std::max<std::int64_t>(1, static_cast<std::int64_t>(m_fields.size()));
        return false;
    }
    ++m_line;
    ++m_p;
    m_lineStart = m_p;
    return true;
}

bool CsvParser::checkSpecial()
{
    const auto* u = reinterpret_cast<const unsigned char*>(m_p);
    if (*u == 0) {
        fail(m_line, {}, "NUL byte: this looks like a binary file, not text", "a UTF-8 text file");
        return false;
    }
    const std::size_t n = utf8Length(u, reinterpret_cast<const unsigned char*>(m_end));
    if (n == 0) {
        fail(m_line, hexBytes(m_p, m_end, 4), "invalid UTF-8", "text encoded as UTF-8");
        return false;
    }
    m_p += n;
    return true;
}

CsvParser::Step CsvParser::next()
{
    m_fields.clear();
    m_fixups.clear();
    m_scratch.clear();
    // Blank lines carry no record.
    for (;;) {
        if (m_p == m_end)
            return Step::End;
        if (*m_p == '\n') {
            if (!newline(false))
                return Step::Error;
            continue;
        }
        if (*m_p == '\r' && m_p + 1 < m_end && m_p[1] == '\n') {
            ++m_p;
            if (!newline(false))
                return Step::Error;
            continue;
        }
        break;
    }
    m_recordLine = m_line;
    for (;;) {
        if (m_p < m_end && *m_p == '"') {
            // RFC 4180 rule 5-7: quoted field; "" stands for one quote.
            ++m_p;
            const char* segment = m_p;
            bool escaped = false;
            const std::size_t scratchStart = m_scratch.size();
            const std::int64_t openedOn = m_line;
            const char* fieldEnd = nullptr;
            while (!fieldEnd) {
                while (m_p < m_end) {
                    const unsigned char cls = m_class[static_cast<unsigned char>(*m_p)];
                    if (cls == kQuote || cls == kLf || cls == kSpecial)
                        break;
                    ++m_p;
                }
                if (m_p == m_end)
                    return fail(openedOn, {}, "quoted field is not closed before the end of the file",
                                "a closing double quote");
                const char c = *m_p;
                if (c == '"') {
                    if (m_p + 1 < m_end && m_p[1] == '"') {
                        m_scratch.append(segment, static_cast<std::size_t>(m_p + 1 - segment));
                        escaped = true;
                        m_p += 2;
                        segment = m_p;
                        continue;
                    }
                    fieldEnd = m_p;
                    ++m_p;
                } else if (c == '\n') {
                    if (!newline(true))
                        return Step::Error;
                } else if (!checkSpecial()) {
                    return Step::Error;
                }
            }
            if (escaped) {
                m_scratch.append(segment, static_cast<std::size_t>(fieldEnd - segment));
                m_fixups.push_back({m_fields.size(), scratchStart, m_scratch.size() - scratchStart});
                m_fields.emplace_back();
            } else {
                m_fields.emplace_back(segment, static_cast<std::size_t>(fieldEnd - segment));
            }
            if (m_p < m_end && *m_p != m_delimiter && *m_p != '\n' && !(*m_p == '\r' && m_p + 1 < m_end && m_p[1] == '\n')) {
                m_fields.pop_back();
                return fail(m_line, std::string(m_p, std::min<std::size_t>(16, static_cast<std::size_t>(m_end - m_p))),
                            "text after the closing quote of a quoted field",
                            "a delimiter or the end of the line after a closing quote");
            }
        } else {
            const char* start = m_p;
            for (;;) {
                while (m_p < m_end && m_class[static_cast<unsigned char>(*m_p)] == kNormal)
                    ++m_p;
                if (m_p < m_end && m_class[static_cast<unsigned char>(*m_p)] == kSpecial) {
                    if (!checkSpecial())
                        return Step::Error;
                    continue;
                }
                break;
            }
            if (m_p < m_end) {
                if (*m_p == '"')
                    return fail(m_line, std::string(start, static_cast<std::size_t>(m_p + 1 - start)),
                                "double quote inside an unquoted field",
                                "the whole field enclosed in double quotes, with inner quotes doubled (RFC 4180)");
                if (*m_p == '\r' && !(m_p + 1 < m_end && m_p[1] == '\n'))
                    return fail(m_line, {}, "carriage return inside an unquoted field",
                                "line breaks as LF or CRLF, or the field enclosed in double quotes");
            }
            m_fields.emplace_back(start, static_cast<std::size_t>(m_p - start));
        }
        // After a field: delimiter, line break or end of input.
        if (m_p == m_end) {
            if (static_cast<std::size_t>(m_p - m_lineStart) > kMaxLineBytes) {
                fail(m_line, {}, "line is longer than 1 MiB (" + std::to_string(m_p - m_lineStart) + " bytes)",
                     "lines of at most 1048576 bytes");
                m_error.column = static_cast<std::int64_t>(m_fields.size());
                return Step::Error;
            }
            break;
        }
        if (*m_p == m_delimiter) {
            ++m_p;
            continue;
        }
        if (*m_p == '\r')
            ++m_p;
        if (!newline(false))
            return Step::Error;
        break;
    }
    for (const Fixup& f : m_fixups)
        m_fields[f.field] = std::string_view(m_scratch.data() + f.offset, f.length);
    return Step::Record;
}

char delimiterForPath(const std::string& path)
{
    if (path.size() >= 4) {
        std::string ext = path.substr(path.size() - 4);
        std::transform(ext.begin(), ext.end(), ext.begin(), [](unsigned char c) { return static_cast<char>(std::tolower(c)); });
        if (ext == ".tsv")
            return '\t';
    }
    return ',';
}

Result<CsvReader> CsvReader::open(const std::string& path, char delimiter)
{
    const auto fileError = [&](std::string message, std::string expected = {}) {
        Error e;
        e.kind = ErrorKind::InputData;
        e.file = path;
        e.message = std::move(message);
        e.expected = std::move(expected);
        return e;
    };
    const int fd = ::open(path.c_str(), O_RDONLY | O_CLOEXEC);
    if (fd < 0)
        return fileError(std::string("cannot open file: ") + std::strerror(errno));
    struct stat st {};
    if (::fstat(fd, &st) != 0 || !S_ISREG(st.st_mode)) {
        ::close(fd);
        return fileError("not a regular file");
    }
    CsvReader reader;
    reader.m_path = path;
    reader.m_size = static_cast<std::uint64_t>(st.st_size);
    reader.m_delimiter = delimiter ? delimiter : delimiterForPath(path);
    reader.m_hash = std::make_unique<Sha256>();
    if (reader.m_size > 0) {
        void* p = ::mmap(nullptr, reader.m_size, PROT_READ, MAP_PRIVATE, fd, 0);
        if (p != MAP_FAILED) {
            ::madvise(p, reader.m_size, MADV_SEQUENTIAL);
            reader.m_data = static_cast<const char*>(p);
            reader.m_mapped = true;
        } else {
            reader.m_copy = std::make_unique<char[]>(reader.m_size);
            std::uint64_t got = 0;
            while (got < reader.m_size) {
                const ssize_t n = ::read(fd, reader.m_copy.get() + got, reader.m_size - got);
                if (n <= 0)
                    break;
                got += static_cast<std::uint64_t>(n);
            }
            if (got != reader.m_size) {
                ::close(fd);
                return fileError("cannot read file");
            }
            reader.m_data = reader.m_copy.get();
        }
    }
    ::close(fd);
    reader.m_bom = reader.m_size >= 3 && std::memcmp(reader.m_data, "\xEF\xBB\xBF", 3) == 0;
    const std::string_view text = reader.text();
    if (text.find_first_not_of(" \t\r\n") == std::string_view::npos)
        return fileError("file is empty", "a header row followed by data rows");
    // A NUL early on means a binary file; say so rather than reporting odd CSV errors.
    const std::string_view head = text.substr(0, 65536);
    if (const auto nul = head.find('\0'); nul != std::string_view::npos) {
        Error e = fileError("NUL byte: this looks like a binary file, not text", "a UTF-8 text file");
        e.line = 1 + std::count(head.begin(), head.begin() + static_cast<std::ptrdiff_t>(nul), '\n');
        const auto lineStart = head.rfind('\n', nul);
        e.column = 1 + std::count(head.begin() + static_cast<std::ptrdiff_t>(lineStart == std::string_view::npos ? 0 : lineStart + 1),
                                  head.begin() + static_cast<std::ptrdiff_t>(nul), reader.m_delimiter);
        return e;
    }
    return reader;
}

CsvReader::CsvReader(CsvReader&& other) noexcept
    : m_path(std::move(other.m_path)), m_data(std::exchange(other.m_data, nullptr)), m_size(std::exchange(other.m_size, 0)),
      m_mapped(std::exchange(other.m_mapped, false)), m_copy(std::move(other.m_copy)), m_delimiter(other.m_delimiter),
      m_bom(other.m_bom), m_hash(std::move(other.m_hash)), m_hashed(other.m_hashed), m_released(other.m_released)
{
}

CsvReader& CsvReader::operator=(CsvReader&& other) noexcept
{
    if (this != &other) {
        this->~CsvReader();
        new (this) CsvReader(std::move(other));
    }
    return *this;
}

CsvReader::~CsvReader()
{
    if (m_mapped && m_data)
        ::munmap(const_cast<char*>(m_data), m_size);
}

std::string CsvReader::fileName() const
{
    const auto slash = m_path.find_last_of('/');
    return slash == std::string::npos ? m_path : m_path.substr(slash + 1);
}

std::string_view CsvReader::text() const
{
    const std::size_t skip = m_bom ? 3 : 0;
    return {m_data + skip, static_cast<std::size_t>(m_size) - skip};
}

void CsvReader::consumed(std::size_t textPosition)
{
    const std::uint64_t upTo = std::min<std::uint64_t>(m_size, textPosition + (m_bom ? 3 : 0));
    if (upTo <= m_hashed)
        return;
    m_hash->update(m_data + m_hashed, upTo - m_hashed);
    m_hashed = upTo;
    // Drop parsed pages from this process's resident set in 16 MiB steps; they stay in the
    // page cache, so nothing is read twice.
    if (m_mapped) {
        constexpr std::uint64_t kStep = 16u << 20;
        const std::uint64_t releasable = (m_hashed / kStep) * kStep;
        if (releasable > m_released + kStep) {
            ::madvise(const_cast<char*>(m_data) + m_released, releasable - m_released, MADV_DONTNEED);
            m_released = releasable;
        }
    }
}

std::string CsvReader::sha256()
{
    if (m_hashed < m_size) {
        m_hash->update(m_data + m_hashed, m_size - m_hashed);
        m_hashed = m_size;
    }
    return m_hash->hexDigest();
}

} // namespace slatewise::core
