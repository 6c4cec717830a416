// SPDX-License-Identifier: MIT
#include "core/importer.h"

#include "core/bulkinsert.h"
#include "core/csvreader.h"
#include "core/idmap.h"
#include "core/migrate.h"
#include "core/runcounts.h"
#include "core/schema.h"
#include "core/sqlitedb.h"
#include "core/timestamp.h"
#include "core/workspace.h"

#include <algorithm>
#include <atomic>
#include <charconv>
#include <chrono>
#include <cmath>
#include <condition_variable>
#include <cstdio>
#include <deque>
#include <fcntl.h>
#include <filesystem>
#include <mutex>
#include <nlohmann/json.hpp>
#include <sqlite3.h>
#include <thread>
#include <unistd.h>
#include <unordered_map>

namespace slatewise::core {

std::string_view toString(FileRole role)
{
    switch (role) {
    case FileRole::Catalog:
        return "catalog";
    case FileRole::Train:
        return "train";
    case FileRole::Withheld:
        return "withheld";
    case FileRole::Scores:
        return "scores";
    case FileRole::Lists:
        return "lists";
    }
    return "catalog";
}

std::optional<RatingScale> parseScale(const std::string& text)
{
    double v[3] = { 0, 0, 0 };
    std::size_t start = 0;
    for (int i = 0; i < 3; ++i) {
        const std::size_t colon = i < 2 ? text.find(':', start) : text.size();
        if (colon == std::string::npos)
            return std::nullopt;
        const char* b = text.data() + start;
        const char* e = text.data() + colon;
        auto [ptr, ec] = std::from_chars(b, e, v[i]);
        if (ec != std::errc() || ptr != e || !std::isfinite(v[i]))
            return std::nullopt;
        start = colon + 1;
    }
    if (!(v[0] < v[1]) || v[2] < 0 || v[2] > v[1] - v[0])
        return std::nullopt;
    return RatingScale { v[0], v[1], v[2], false };
}

namespace {

using Clock = std::chrono::steady_clock;

// ---------------------------------------------------------------------------------------
// Columns

struct ColumnSpec {
    const char* name;
    bool required;
};

const std::vector<ColumnSpec>& columnsFor(FileRole role)
{
    static const std::vector<ColumnSpec> catalog { { "item_id", true }, { "title", true }, { "year", false },
        { "genres", false }, { "series", false }, { "series_part", false } };
    static const std::vector<ColumnSpec> interactions { { "user_id", true }, { "item_id", true }, { "rating", true },
        { "timestamp", false } };
    static const std::vector<ColumnSpec> scores { { "user_id", true }, { "item_id", true }, { "score", true } };
    static const std::vector<ColumnSpec> lists { { "user_id", true }, { "rank", true }, { "item_id", true },
        { "score", false } };
    switch (role) {
    case FileRole::Catalog:
        return catalog;
    case FileRole::Train:
    case FileRole::Withheld:
        return interactions;
    case FileRole::Scores:
        return scores;
    case FileRole::Lists:
        return lists;
    }
    return catalog;
}

std::string columnListText(FileRole role)
{
    std::string out;
    for (const auto& c : columnsFor(role)) {
        if (!out.empty())
            out += ',';
        out += c.required ? c.name : std::string("[") + c.name + "]";
    }
    return out;
}

std::string_view trimSpaces(std::string_view s)
{
    while (!s.empty() && (s.front() == ' ' || s.front() == '\t'))
        s.remove_prefix(1);
    while (!s.empty() && (s.back() == ' ' || s.back() == '\t'))
        s.remove_suffix(1);
    return s;
}

std::string normalizedHeader(std::string_view s)
{
    std::string out(trimSpaces(s));
    std::transform(
        out.begin(), out.end(), out.begin(), [](unsigned char c) { return static_cast<char>(std::tolower(c)); });
    return out;
}

std::optional<double> parseNumber(std::string_view s)
{
    s = trimSpaces(s);
    if (!s.empty() && s.front() == '+')
        s.remove_prefix(1);
    double v = 0;
    auto [ptr, ec] = std::from_chars(s.data(), s.data() + s.size(), v);
    if (s.empty() || ec != std::errc() || ptr != s.data() + s.size())
        return std::nullopt;
    return v;
}

std::optional<std::int64_t> parseInteger(std::string_view s)
{
    s = trimSpaces(s);
    if (!s.empty() && s.front() == '+')
        s.remove_prefix(1);
    std::int64_t v = 0;
    auto [ptr, ec] = std::from_chars(s.data(), s.data() + s.size(), v);
    if (s.empty() || ec != std::errc() || ptr != s.data() + s.size())
        return std::nullopt;
    return v;
}

std::string formatNumber(double v)
{
    char buf[32];
    auto res = std::to_chars(buf, buf + sizeof buf, v);
    return std::string(buf, res.ptr);
}

std::string scaleText(const RatingScale& s)
{
    std::string out = "a rating from " + formatNumber(s.min) + " to " + formatNumber(s.max);
    if (s.step > 0)
        out += " in steps of " + formatNumber(s.step);
    return out;
}

bool onScale(double r, const RatingScale& s)
{
    const double eps = 1e-9 * std::max(1.0, std::fabs(s.max - s.min));
    if (r < s.min - eps || r > s.max + eps)
        return false;
    if (s.step <= 0)
        return true;
    const double k = (r - s.min) / s.step;
    return std::fabs(k - std::round(k)) < 1e-6;
}

/// Errors of one import, in the order found, at most kMaxReportedErrors.
class ErrorList {
public:
    bool full() const { return m_errors.size() >= kMaxReportedErrors; }
    void add(Error e)
    {
        if (!full())
            m_errors.push_back(std::move(e));
    }
    void add(const std::string& file, std::int64_t line, std::int64_t column, std::string value, std::string message,
        std::string expected)
    {
        Error e;
        e.kind = ErrorKind::InputData;
        e.file = file;
        e.line = line;
        e.column = column;
        e.value = std::move(value);
        e.message = std::move(message);
        e.expected = std::move(expected);
        add(std::move(e));
    }
    bool empty() const { return m_errors.empty(); }
    std::vector<Error> take() { return std::move(m_errors); }

private:
    std::vector<Error> m_errors;
};

Error workspaceError(const std::string& path, std::string message)
{
    Error e;
    e.kind = ErrorKind::Workspace;
    e.file = path;
    e.message = std::move(message);
    return e;
}

Error cancelledError()
{
    Error e;
    e.kind = ErrorKind::Cancelled;
    e.message = "cancelled; nothing was written";
    return e;
}

/// Column positions of one file, found by name in its header.
struct Layout {
    std::vector<int> at; ///< per ColumnSpec of the role: field index or -1
    std::size_t fieldCount = 0;
    std::vector<std::string> header;
};

/// Reads the header record; missing required columns are errors, unknown ones one note.
std::optional<Layout> readHeader(
    CsvParser& parser, const CsvReader& reader, FileRole role, ErrorList& errors, std::vector<Note>& notes)
{
    const auto step = parser.next();
    if (step == CsvParser::Step::Error) {
        Error e = parser.error();
        e.file = reader.path();
        errors.add(std::move(e));
        return std::nullopt;
    }
    if (step == CsvParser::Step::End) {
        errors.add(reader.path(), 0, 0, {}, "file is empty", "a header row followed by data rows");
        return std::nullopt;
    }
    const auto& specs = columnsFor(role);
    Layout layout;
    layout.at.assign(specs.size(), -1);
    layout.fieldCount = parser.fields().size();
    std::vector<std::string> unknown;
    std::string headerText;
    for (std::size_t i = 0; i < parser.fields().size(); ++i) {
        const std::string name = normalizedHeader(parser.fields()[i]);
        layout.header.emplace_back(parser.fields()[i]);
        headerText += (i ? "," : "") + std::string(parser.fields()[i]);
        bool known = false;
        for (std::size_t s = 0; s < specs.size(); ++s) {
            if (name == specs[s].name) {
                known = true;
                if (layout.at[s] >= 0) {
                    errors.add(reader.path(), parser.line(), static_cast<std::int64_t>(i + 1), name,
                        "column appears twice in the header", "each column name once");
                    return std::nullopt;
                }
                layout.at[s] = static_cast<int>(i);
            }
        }
        if (!known)
            unknown.push_back(std::string(parser.fields()[i]));
    }
    bool ok = true;
    for (std::size_t s = 0; s < specs.size(); ++s) {
        if (specs[s].required && layout.at[s] < 0) {
            errors.add(reader.path(), parser.line(), 0, headerText,
                std::string("missing required column '") + specs[s].name + "'",
                "a header with the columns " + columnListText(role) + " in any order");
            ok = false;
        }
    }
    if (!ok)
        return std::nullopt;
    if (!unknown.empty()) {
        std::string list;
        for (const auto& u : unknown)
            list += (list.empty() ? "" : ", ") + ("'" + u + "'");
        notes.push_back(Note { reader.path(), "ignored column" + std::string(unknown.size() > 1 ? "s " : " ") + list });
    }
    return layout;
}

// ---------------------------------------------------------------------------------------
// Catalog

struct Catalog {
    IdMap ids;
    std::vector<Item> items;
    IdMap genres;
    IdMap series;
};

bool checkId(std::string_view id, const std::string& file, std::int64_t line, std::int64_t column, const char* what,
    ErrorList& errors)
{
    if (id.empty()) {
        errors.add(file, line, column, {}, std::string(what) + " is empty", "an id of 1 to 256 bytes");
        return false;
    }
    if (id.size() > 256) {
        errors.add(file, line, column, std::string(id), std::string(what) + " is longer than 256 bytes",
            "an id of 1 to 256 bytes");
        return false;
    }
    return true;
}

/// Progress across all files of one operation: fraction of bytes read, rows in the stage text.
class Meter {
public:
    Meter(const Progress& progress, std::uint64_t totalBytes)
        : m_progress(progress)
        , m_total(std::max<std::uint64_t>(1, totalBytes))
    {
    }
    void startFile(const CsvReader& reader)
    {
        m_before += m_current;
        m_current = reader.size();
        m_name = reader.fileName();
        m_rows = 0;
        m_start = Clock::now();
    }
    void tick(std::size_t position, std::int64_t rows)
    {
        m_rows = rows;
        const double seconds = std::chrono::duration<double>(Clock::now() - m_start).count();
        const auto rate = seconds > 0 ? static_cast<std::int64_t>(static_cast<double>(rows) / seconds) : 0;
        const std::string stage
            = "reading " + m_name + ": " + std::to_string(rows) + " rows, " + std::to_string(rate) + " rows/s";
        m_progress(std::min(1.0, static_cast<double>(m_before + position) / static_cast<double>(m_total)), stage);
    }
    void stage(double fraction, const std::string& text) { m_progress(fraction, text); }
    bool cancelled() const { return m_progress.cancelled(); }

private:
    const Progress& m_progress;
    std::uint64_t m_total;
    std::uint64_t m_before = 0, m_current = 0;
    std::string m_name;
    std::int64_t m_rows = 0;
    Clock::time_point m_start = Clock::now();
};

constexpr std::int64_t kTickRows = 1 << 15;

bool readCatalog(CsvReader& reader, Catalog& catalog, ErrorList& errors, std::vector<Note>& notes, Meter& meter)
{
    CsvParser parser(reader.text(), reader.delimiter());
    meter.startFile(reader);
    auto layout = readHeader(parser, reader, FileRole::Catalog, errors, notes);
    if (!layout)
        return false;
    const auto col = [&](int spec) { return layout->at[static_cast<std::size_t>(spec)]; };
    std::vector<std::int64_t> firstLine;
    std::int64_t rows = 0;
    for (;;) {
        const auto step = parser.next();
        if (step == CsvParser::Step::End)
            break;
        if (step == CsvParser::Step::Error) {
            Error e = parser.error();
            e.file = reader.path();
            errors.add(std::move(e));
            return false;
        }
        const auto f = parser.fields();
        const std::int64_t line = parser.line();
        if (f.size() != layout->fieldCount) {
            errors.add(reader.path(), line, static_cast<std::int64_t>(std::min(f.size(), layout->fieldCount) + 1), {},
                "row has " + std::to_string(f.size()) + " fields, the header has " + std::to_string(layout->fieldCount),
                std::to_string(layout->fieldCount) + " fields as in the header");
        } else {
            const auto field = [&](int spec) {
                return col(spec) >= 0 ? f[static_cast<std::size_t>(col(spec))] : std::string_view();
            };
            const auto column = [&](int spec) { return static_cast<std::int64_t>(col(spec) + 1); };
            const std::string_view id = field(0);
            bool ok = checkId(id, reader.path(), line, column(0), "item_id", errors);
            Item item;
            if (ok) {
                const auto ins = catalog.ids.insert(id);
                if (!ins.added) {
                    errors.add(reader.path(), line, column(0), std::string(id),
                        "duplicate item_id, first on line " + std::to_string(firstLine[ins.index]),
                        "each item_id once in the catalog");
                    ok = false;
                } else {
                    firstLine.push_back(line);
                    catalog.items.emplace_back();
                }
            }
            item.externalId = std::string(id);
            item.title = std::string(field(1));
            if (const auto y = trimSpaces(field(2)); !y.empty()) {
                const auto year = parseInteger(y);
                if (!year || *year < 1 || *year > 9999) {
                    errors.add(reader.path(), line, column(2), std::string(y),
                        "year is not a whole number from 1 to 9999", "a year such as 1994, or an empty cell");
                    ok = false;
                } else {
                    item.year = static_cast<std::int32_t>(*year);
                }
            }
            std::string_view genres = field(3);
            while (!genres.empty()) {
                const auto semi = genres.find(';');
                const std::string_view g = trimSpaces(genres.substr(0, semi));
                if (!g.empty()) {
                    const auto index = static_cast<std::int32_t>(catalog.genres.insert(g).index);
                    if (std::find(item.genres.begin(), item.genres.end(), index) == item.genres.end())
                        item.genres.push_back(index);
                }
                if (semi == std::string_view::npos)
                    break;
                genres.remove_prefix(semi + 1);
            }
            const std::string_view series = trimSpaces(field(4));
            const std::string_view part = trimSpaces(field(5));
            if (!series.empty()) {
                const auto p = parseInteger(part);
                if (!p || *p < 1 || *p > 1000000) {
                    errors.add(reader.path(), line, column(5), std::string(part),
                        part.empty() ? "series_part is empty for an item in a series"
                                     : "series_part is not a positive whole number",
                        "a positive whole number giving the order within the series (1 = first)");
                    ok = false;
                } else {
                    item.series = static_cast<std::int32_t>(catalog.series.insert(series).index);
                    item.seriesPart = static_cast<std::int32_t>(*p);
                }
            } else if (!part.empty()) {
                errors.add(reader.path(), line, column(5), std::string(part), "series_part given without a series",
                    "an empty series_part when series is empty");
                ok = false;
            }
            if (ok)
                catalog.items.back() = std::move(item);
        }
        if (errors.full())
            return false;
        if (++rows % kTickRows == 0) {
            reader.consumed(parser.position());
            meter.tick(parser.position(), rows);
            if (meter.cancelled())
                return false;
        }
    }
    reader.consumed(parser.position());
    meter.tick(parser.position(), rows);
    if (rows == 0 && errors.empty())
        errors.add(reader.path(), 0, 0, {}, "file has a header but no data rows", "at least one item");
    return errors.empty();
}

// Genre ids must be ascending within an item (Dataset's contract); genre indices are in
// order of first appearance, so sort each item's list once at the end.
void sortGenres(Catalog& catalog)
{
    for (auto& item : catalog.items)
        std::sort(item.genres.begin(), item.genres.end());
}

// ---------------------------------------------------------------------------------------
// Interactions

struct TrainRow {
    std::int64_t ts;
    std::uint32_t user;
    std::uint32_t item;
    float rating;
};

struct WithheldRow {
    std::int64_t ts;
    std::int64_t line;
    std::uint32_t user;
    std::uint32_t item;
    float rating;
};

/// Scale facts read off the data when --scale is not given.
struct ScaleFacts {
    double min = INFINITY, max = -INFINITY;
    bool integers = true, halves = true;
    void add(double r)
    {
        min = std::min(min, r);
        max = std::max(max, r);
        if (integers && r != std::floor(r))
            integers = false;
        if (halves && r * 2 != std::floor(r * 2))
            halves = false;
    }
    RatingScale scale() const
    {
        RatingScale s;
        s.min = std::isfinite(min) ? min : 0;
        s.max = std::isfinite(max) ? max : 0;
        s.step = integers ? 1.0 : halves ? 0.5 : 0.0;
        s.inferred = true;
        return s;
    }
};

/// Shared state of reading the interaction files (users are numbered in order of first
/// appearance: train first, then withheld).
struct InteractionContext {
    Catalog& catalog;
    IdMap users;
    ErrorList& errors;
    std::vector<Note>& notes;
    const ReadOptions& options;
    std::optional<RatingScale> scale;
    ScaleFacts facts;
    std::int64_t unknownItemRows = 0;
    std::uint32_t catalogSize = 0; ///< items before unknown ones were added
};

/// Reads one interactions file, calling onRow(user, item, rating, ts, line) per valid row.
template <typename OnRow>
bool readInteractions(CsvReader& reader, FileRole role, InteractionContext& ctx, Meter& meter, OnRow&& onRow)
{
    CsvParser parser(reader.text(), reader.delimiter());
    meter.startFile(reader);
    auto layout = readHeader(parser, reader, role, ctx.errors, ctx.notes);
    if (!layout)
        return false;
    const std::size_t cUser = static_cast<std::size_t>(layout->at[0]);
    const std::size_t cItem = static_cast<std::size_t>(layout->at[1]);
    const std::size_t cRating = static_cast<std::size_t>(layout->at[2]);
    const int cTs = layout->at[3];
    const std::string& file = reader.path();
    const std::string expectedRating = ctx.scale ? scaleText(*ctx.scale) : std::string("a decimal number");
    std::int64_t rows = 0;
    std::uint32_t lastUser = 0;
    std::string lastUserId; // a copy: the map's arena may move when it grows
    for (;;) {
        const auto step = parser.next();
        if (step == CsvParser::Step::End)
            break;
        if (step == CsvParser::Step::Error) {
            Error e = parser.error();
            e.file = file;
            ctx.errors.add(std::move(e));
            return false;
        }
        const auto f = parser.fields();
        const std::int64_t line = parser.line();
        ++rows;
        if (f.size() != layout->fieldCount) {
            ctx.errors.add(file, line, static_cast<std::int64_t>(std::min(f.size(), layout->fieldCount) + 1), {},
                "row has " + std::to_string(f.size()) + " fields, the header has " + std::to_string(layout->fieldCount),
                std::to_string(layout->fieldCount) + " fields as in the header");
        } else {
            bool ok = checkId(f[cUser], file, line, static_cast<std::int64_t>(cUser + 1), "user_id", ctx.errors);
            ok = checkId(f[cItem], file, line, static_cast<std::int64_t>(cItem + 1), "item_id", ctx.errors) && ok;
            std::uint32_t item = IdMap::kMissing;
            if (ok) {
                item = ctx.catalog.ids.find(f[cItem]);
                if (item == IdMap::kMissing) {
                    if (ctx.options.allowUnknownItems) {
                        item = ctx.catalog.ids.insert(f[cItem]).index;
                        Item added;
                        added.externalId = std::string(f[cItem]);
                        ctx.catalog.items.push_back(std::move(added));
                        ++ctx.unknownItemRows;
                    } else {
                        ctx.errors.add(file, line, static_cast<std::int64_t>(cItem + 1), std::string(f[cItem]),
                            "unknown item id", "an item_id listed in the catalog (or --allow-unknown-items)");
                        ok = false;
                    }
                } else if (item >= ctx.catalogSize) {
                    ++ctx.unknownItemRows;
                }
            }
            const auto rating = parseNumber(f[cRating]);
            if (!rating) {
                ctx.errors.add(file, line, static_cast<std::int64_t>(cRating + 1), std::string(f[cRating]),
                    f[cRating].empty() ? "rating is empty" : "rating is not a number", expectedRating);
                ok = false;
            } else if (!std::isfinite(*rating)) {
                ctx.errors.add(file, line, static_cast<std::int64_t>(cRating + 1), std::string(f[cRating]),
                    "rating is not a finite number", expectedRating);
                ok = false;
            } else if (ctx.scale && !onScale(*rating, *ctx.scale)) {
                ctx.errors.add(file, line, static_cast<std::int64_t>(cRating + 1), std::string(f[cRating]),
                    "rating is outside the scale", expectedRating);
                ok = false;
            }
            Timestamp ts = kNoTimestamp;
            if (cTs >= 0) {
                const std::string_view text = trimSpaces(f[static_cast<std::size_t>(cTs)]);
                if (!text.empty()) {
                    const auto parsed = parseTimestamp(text);
                    if (!parsed || *parsed == kNoTimestamp) {
                        ctx.errors.add(file, line, cTs + 1, std::string(text), "timestamp is malformed",
                            "Unix seconds or ISO 8601 such as 2026-03-04T20:15:00Z, or an empty cell");
                        ok = false;
                    } else {
                        ts = *parsed;
                    }
                }
            }
            if (ok) {
                // Files are usually grouped by user: skip the hash lookup for a repeated id.
                if (f[cUser] != lastUserId) {
                    lastUser = ctx.users.insert(f[cUser]).index;
                    lastUserId.assign(f[cUser]);
                }
                const std::uint32_t user = lastUser;
                ctx.facts.add(*rating);
                onRow(user, item, static_cast<float>(*rating), ts, line);
            }
        }
        if (ctx.errors.full())
            return false;
        if (rows % kTickRows == 0) {
            reader.consumed(parser.position());
            meter.tick(parser.position(), rows);
            if (meter.cancelled())
                return false;
        }
    }
    reader.consumed(parser.position());
    meter.tick(parser.position(), rows);
    if (rows == 0 && ctx.errors.empty())
        ctx.errors.add(file, 0, 0, {}, "file has a header but no data rows", "at least one interaction");
    return ctx.errors.empty();
}

/// Bounded hand-over of train rows from the reading thread to the SQLite writer.
class BatchQueue {
public:
    void push(std::vector<TrainRow> batch)
    {
        std::unique_lock lock(m_mutex);
        // Up to 64 batches (4 M rows, about 100 MB) may wait: the reader runs ahead of SQLite
        // and has finished the withheld file by the time the last train rows are written.
        m_space.wait(lock, [&] { return m_batches.size() < 64 || m_abandoned; });
        if (m_abandoned)
            return;
        m_batches.push_back(std::move(batch));
        m_ready.notify_one();
    }
    void close()
    {
        std::lock_guard lock(m_mutex);
        m_closed = true;
        m_ready.notify_all();
    }
    /// The writer gave up (SQLite error); the reader must not block on a full queue.
    void abandon()
    {
        std::lock_guard lock(m_mutex);
        m_abandoned = true;
        m_batches.clear();
        m_space.notify_all();
    }
    std::optional<std::vector<TrainRow>> pop()
    {
        std::unique_lock lock(m_mutex);
        m_ready.wait(lock, [&] { return !m_batches.empty() || m_closed; });
        if (m_batches.empty())
            return std::nullopt;
        auto batch = std::move(m_batches.front());
        m_batches.pop_front();
        m_space.notify_one();
        return batch;
    }

private:
    std::mutex m_mutex;
    std::condition_variable m_ready, m_space;
    std::deque<std::vector<TrainRow>> m_batches;
    bool m_closed = false;
    bool m_abandoned = false;
};

/// Open-addressed set of (user,item) keys mapped to a row index; for leakage checks.
class PairIndex {
public:
    explicit PairIndex(std::size_t n)
    {
        std::size_t cap = 16;
        while (cap < n * 2 + 2)
            cap *= 2;
        m_keys.assign(cap, kEmpty);
        m_rows.assign(cap, 0);
        m_mask = cap - 1;
    }
    void insert(std::uint64_t key, std::uint32_t row)
    {
        std::size_t pos = mix(key) & m_mask;
        while (m_keys[pos] != kEmpty && m_keys[pos] != key)
            pos = (pos + 1) & m_mask;
        m_keys[pos] = key;
        m_rows[pos] = row;
    }
    std::optional<std::uint32_t> find(std::uint64_t key) const
    {
        for (std::size_t pos = mix(key) & m_mask;; pos = (pos + 1) & m_mask) {
            if (m_keys[pos] == kEmpty)
                return std::nullopt;
            if (m_keys[pos] == key)
                return m_rows[pos];
        }
    }

private:
    static constexpr std::uint64_t kEmpty = ~0ULL;
    static std::uint64_t mix(std::uint64_t k)
    {
        k ^= k >> 33;
        k *= 0xFF51AFD7ED558CCDULL;
        k ^= k >> 33;
        return k;
    }
    std::vector<std::uint64_t> m_keys;
    std::vector<std::uint32_t> m_rows;
    std::size_t m_mask = 0;
};

std::uint64_t pairKey(std::uint32_t user, std::uint32_t item)
{
    return (std::uint64_t(user) << 32) | item;
}

std::string baseName(const std::string& path)
{
    return std::filesystem::path(path).filename().string();
}

void insertSourceFile(const SqliteDb& db, std::optional<std::int64_t> runId, FileRole role, CsvReader& reader)
{
    BulkInsert ins(db, "source_files", { "run_id", "role", "name", "size", "sha256" });
    if (runId)
        ins.i64(1, *runId);
    else
        ins.null(1);
    ins.text(2, toString(role)).text(3, baseName(reader.path())).i64(4, static_cast<std::int64_t>(reader.size()));
    ins.text(5, reader.sha256()).run();
    ins.finish();
}

void insertItems(const SqliteDb& db, const Catalog& catalog, std::uint32_t from)
{
    BulkInsert ins(db, "items", { "item_id", "external_id", "title", "year", "series_id", "series_part" });
    BulkInsert genre(db, "item_genres", { "item_id", "genre_id" });
    for (std::uint32_t i = from; i < catalog.items.size(); ++i) {
        const Item& item = catalog.items[i];
        ins.i64(1, i).text(2, item.externalId).text(3, item.title);
        if (item.year)
            ins.i64(4, item.year);
        else
            ins.null(4);
        if (item.series != kNone)
            ins.i64(5, item.series).i64(6, item.seriesPart);
        else
            ins.null(5).null(6);
        ins.run();
        for (auto g : item.genres)
            genre.i64(1, i).i64(2, g).run();
    }
    ins.finish();
    genre.finish();
}

/// Rows (index, name) of `names` from `from` on, into table(idColumn, nameColumn).
void insertNames(const SqliteDb& db, std::string_view table, std::string_view idColumn, std::string_view nameColumn,
    const IdMap& names, std::uint32_t from)
{
    BulkInsert ins(db, table, { idColumn, nameColumn });
    for (std::uint32_t i = from; i < names.size(); ++i)
        ins.i64(1, i).text(2, names.id(i)).run();
    ins.finish();
}

void setMeta(const SqliteDb& db, const std::string& key, const std::string& value)
{
    BulkInsert ins(db, "meta", { "key", "value" }, 1, "INSERT OR REPLACE");
    ins.text(1, key).text(2, value).run();
    ins.finish();
}

/// Flushes the temporary file to disk before it replaces the target, so a crash cannot
/// leave a half-written workspace under the real name.
bool syncFile(const std::string& path)
{
    const int fd = ::open(path.c_str(), O_RDONLY | O_CLOEXEC);
    if (fd < 0)
        return false;
    const bool ok = ::fsync(fd) == 0;
    ::close(fd);
    return ok;
}

std::string tempPathFor(const std::string& target)
{
    static std::atomic<int> counter { 0 };
    const std::filesystem::path p(target);
    const auto dir = p.has_parent_path() ? p.parent_path() : std::filesystem::path(".");
    return (dir
        / ("." + p.filename().string() + ".importing-" + std::to_string(::getpid()) + "-" + std::to_string(counter++)))
        .string();
}

/// Removes the temporary file unless release() was called.
class TempFile {
public:
    explicit TempFile(std::string path)
        : m_path(std::move(path))
    {
    }
    ~TempFile()
    {
        if (!m_path.empty()) {
            std::error_code ec;
            std::filesystem::remove(m_path, ec);
            std::filesystem::remove(m_path + "-journal", ec);
        }
    }
    TempFile(const TempFile&) = delete;
    TempFile& operator=(const TempFile&) = delete;
    const std::string& path() const { return m_path; }
    void release() { m_path.clear(); }

private:
    std::string m_path;
};

} // namespace

// ---------------------------------------------------------------------------------------
// import

Result<ImportReport> importWorkspace(const ImportRequest& request, const Progress& progress)
{
    const auto started = Clock::now();
    if (request.workspacePath.empty())
        return workspaceError({}, "no workspace path given");
    {
        std::error_code ec;
        if (std::filesystem::exists(request.workspacePath, ec) && !request.replace) {
            Error e = workspaceError(request.workspacePath, "workspace already exists");
            e.kind = ErrorKind::Usage;
            e.expected = "a new file name, or --replace to overwrite it";
            return e;
        }
    }
    if (request.scale && !(request.scale->min < request.scale->max)) {
        Error e;
        e.kind = ErrorKind::Usage;
        e.message = "invalid rating scale";
        e.expected = "MIN:MAX:STEP with MIN < MAX";
        return e;
    }

    // Open all three files first, so a missing file is reported before any work.
    std::vector<Error> openErrors;
    auto catalogFile = CsvReader::open(request.catalogPath, request.options.delimiter);
    auto trainFile = CsvReader::open(request.trainPath, request.options.delimiter);
    auto withheldFile = CsvReader::open(request.withheldPath, request.options.delimiter);
    for (auto* r : { &catalogFile, &trainFile, &withheldFile })
        if (!r->ok())
            openErrors.push_back(r->error());
    if (!openErrors.empty())
        return openErrors;
    CsvReader& catalogReader = catalogFile.value();
    CsvReader& trainReader = trainFile.value();
    CsvReader& withheldReader = withheldFile.value();

    Meter meter(progress, catalogReader.size() + trainReader.size() + withheldReader.size());
    ErrorList errors;
    ImportReport report;
    Catalog catalog;
    if (!readCatalog(catalogReader, catalog, errors, report.notes, meter)) {
        if (errors.empty())
            return cancelledError();
        return errors.take();
    }
    sortGenres(catalog);

    InteractionContext ctx { catalog, IdMap(), errors, report.notes, request.options, request.scale, ScaleFacts(), 0,
        static_cast<std::uint32_t>(catalog.items.size()) };
    ctx.users.reserve(1024);

    // SQLite's allocation statistics take a global mutex on every malloc; we never read them.
    // Only possible before SQLite initializes; later calls fail harmlessly.
    static const bool statsOff = [] {
        sqlite3_config(SQLITE_CONFIG_MEMSTATUS, 0);
        return true;
    }();
    (void)statsOff;
    TempFile temp(tempPathFor(request.workspacePath));
    SqliteDb db;
    try {
        db = SqliteDb::open(temp.path(), true);
        // The temporary file is thrown away on any failure, so no journal and no syncs while
        // loading; foreign keys are checked by construction (every key comes from our maps).
        db.exec("PRAGMA journal_mode = OFF; PRAGMA synchronous = OFF; PRAGMA locking_mode = EXCLUSIVE;"
                "PRAGMA cache_size = -131072; PRAGMA temp_store = MEMORY; PRAGMA foreign_keys = OFF;"
                "PRAGMA threads = 2;");
        db.exec(schemaVersion1());
        // Version 2 adds the train index. Maintaining it while rows arrive costs the writer
        // thread little (files are mostly grouped by user, so index inserts append) and keeps
        // a serial sort of every train row off the end of the import.
        migrateSchema(db, 1);
        db.exec("BEGIN");
    } catch (const SqliteError& e) {
        return workspaceError(request.workspacePath, std::string("cannot create workspace: ") + e.what());
    }

    // Reading thread: train (streamed to the writer in batches), then withheld (kept), then
    // the withheld checks. The calling thread writes to SQLite meanwhile: on two cores the
    // insert is the bottleneck, so everything else hides behind it.
    BatchQueue queue;
    std::vector<WithheldRow> withheld;
    std::vector<std::uint64_t> trainPairs;
    std::int64_t trainRows = 0;
    bool readerCancelled = false;
    std::thread readerThread([&] {
        std::vector<TrainRow> batch;
        batch.reserve(1 << 16);
        trainPairs.reserve(static_cast<std::size_t>(trainReader.size() / 24));
        const bool trainOk = readInteractions(trainReader, FileRole::Train, ctx, meter,
            [&](std::uint32_t u, std::uint32_t i, float r, Timestamp ts, std::int64_t) {
                batch.push_back(TrainRow { ts, u, i, r });
                trainPairs.push_back(pairKey(u, i));
                if (batch.size() == (1u << 16)) {
                    queue.push(std::move(batch));
                    batch = {};
                    batch.reserve(1 << 16);
                }
            });
        trainRows = static_cast<std::int64_t>(trainPairs.size());
        if (!batch.empty() && trainOk)
            queue.push(std::move(batch));
        queue.close();
        if (!trainOk) {
            readerCancelled = errors.empty();
            return;
        }
        const bool heldOk = readInteractions(withheldReader, FileRole::Withheld, ctx, meter,
            [&](std::uint32_t u, std::uint32_t i, float r, Timestamp ts, std::int64_t line) {
                withheld.push_back(WithheldRow { ts, line, u, i, r });
            });
        if (!heldOk) {
            readerCancelled = errors.empty();
            return;
        }
        std::sort(withheld.begin(), withheld.end(), [](const WithheldRow& a, const WithheldRow& b) {
            return a.user != b.user ? a.user < b.user : a.item != b.item ? a.item < b.item : a.line < b.line;
        });
        std::vector<WithheldRow> unique;
        unique.reserve(withheld.size());
        std::vector<std::pair<std::int64_t, Error>> duplicates;
        for (std::size_t r = 0; r < withheld.size(); ++r) {
            if (!unique.empty() && unique.back().user == withheld[r].user && unique.back().item == withheld[r].item) {
                Error e;
                e.file = withheldReader.path();
                e.line = withheld[r].line;
                e.column = 1;
                e.value = std::string(ctx.users.id(withheld[r].user)) + ", "
                    + std::string(catalog.ids.id(withheld[r].item));
                e.message = "duplicate (user_id, item_id) pair, first on line " + std::to_string(unique.back().line);
                e.expected = "each (user_id, item_id) pair at most once in the withheld file";
                duplicates.emplace_back(e.line, std::move(e));
            } else {
                unique.push_back(withheld[r]);
            }
        }
        std::sort(duplicates.begin(), duplicates.end(), [](const auto& a, const auto& b) { return a.first < b.first; });
        for (auto& d : duplicates)
            errors.add(std::move(d.second));
        if (!errors.empty())
            return;
        withheld.swap(unique);
        // Leakage: withheld pairs also present in train.
        PairIndex index(withheld.size());
        for (std::size_t r = 0; r < withheld.size(); ++r)
            index.insert(pairKey(withheld[r].user, withheld[r].item), static_cast<std::uint32_t>(r));
        std::vector<char> leaked(withheld.size(), 0);
        for (std::uint64_t key : trainPairs)
            if (auto r = index.find(key))
                leaked[*r] = 1;
        std::vector<std::uint64_t>().swap(trainPairs);
        std::vector<std::int64_t> leakLines;
        for (std::size_t r = 0; r < withheld.size(); ++r)
            if (leaked[r])
                leakLines.push_back(withheld[r].line);
        report.leakedPairs = static_cast<std::int64_t>(leakLines.size());
        if (!leakLines.empty()) {
            std::sort(leakLines.begin(), leakLines.end());
            if (request.options.strict) {
                std::vector<std::size_t> rows;
                for (std::size_t r = 0; r < withheld.size(); ++r)
                    if (leaked[r])
                        rows.push_back(r);
                std::sort(rows.begin(), rows.end(),
                    [&](std::size_t a, std::size_t b) { return withheld[a].line < withheld[b].line; });
                for (std::size_t r : rows)
                    errors.add(withheldReader.path(), withheld[r].line, 1,
                        std::string(ctx.users.id(withheld[r].user)) + ", "
                            + std::string(catalog.ids.id(withheld[r].item)),
                        "withheld pair also in train (leakage)",
                        "withheld pairs absent from the train file (or run without --strict)");
            } else {
                report.notes.push_back(Note { withheldReader.path(),
                    "warning: " + std::to_string(leakLines.size())
                        + " withheld (user_id, item_id) pair(s) also appear in train (leakage), first on line "
                        + std::to_string(leakLines.front()) + "; --strict makes this an error" });
            }
        }
    });

    std::string writeFailure;
    try {
        BulkInsert ins(db, "train", { "user_id", "item_id", "rating", "ts" });
        while (auto batch = queue.pop()) {
            if (!writeFailure.empty())
                continue;
            for (const TrainRow& row : *batch) {
                ins.i64(1, row.user).i64(2, row.item).real(3, row.rating);
                if (row.ts == kNoTimestamp)
                    ins.null(4);
                else
                    ins.i64(4, row.ts);
                ins.run();
            }
        }
        if (writeFailure.empty())
            ins.finish();
    } catch (const SqliteError& e) {
        writeFailure = e.what();
        queue.abandon();
    }
    readerThread.join();
    if (!writeFailure.empty())
        return workspaceError(request.workspacePath, "cannot write workspace: " + writeFailure);
    if (!errors.empty())
        return errors.take();
    if (readerCancelled || progress.cancelled())
        return cancelledError();

    report.scale = request.scale ? *request.scale : ctx.facts.scale();
    report.scale.inferred = !request.scale.has_value();
    try {
        meter.stage(1.0, "writing withheld rows and the catalog");
        {
            BulkInsert ins(db, "withheld", { "user_id", "item_id", "rating", "ts" });
            for (const WithheldRow& row : withheld) {
                ins.i64(1, row.user).i64(2, row.item).real(3, row.rating);
                if (row.ts == kNoTimestamp)
                    ins.null(4);
                else
                    ins.i64(4, row.ts);
                ins.run();
            }
            ins.finish();
        }
        insertNames(db, "genres", "genre_id", "name", catalog.genres, 0);
        insertNames(db, "series", "series_id", "name", catalog.series, 0);
        insertItems(db, catalog, 0);
        insertNames(db, "users", "user_id", "external_id", ctx.users, 0);
        insertSourceFile(db, std::nullopt, FileRole::Catalog, catalogReader);
        insertSourceFile(db, std::nullopt, FileRole::Train, trainReader);
        insertSourceFile(db, std::nullopt, FileRole::Withheld, withheldReader);
        setMeta(db, "scale_min", formatNumber(report.scale.min));
        setMeta(db, "scale_max", formatNumber(report.scale.max));
        setMeta(db, "scale_step", formatNumber(report.scale.step));
        setMeta(db, "scale_source", report.scale.inferred ? "inferred" : "given");
        setMeta(db, "created_at", utcNow());
        setMeta(db, "created_with", std::string("slatewise ") + SLATEWISE_VERSION);
        nlohmann::json options { { "strict", request.options.strict },
            { "allow_unknown_items", request.options.allowUnknownItems } };
        setMeta(db, "import_options", options.dump());
        if (progress.cancelled())
            return cancelledError();
        meter.stage(1.0, "committing");
        db.exec("COMMIT");
        db.exec("PRAGMA foreign_keys = ON");
        db.close();
    } catch (const SqliteError& e) {
        return workspaceError(request.workspacePath, std::string("cannot write workspace: ") + e.what());
    }
    if (progress.cancelled())
        return cancelledError();
    meter.stage(1.0, "saving");
    if (!syncFile(temp.path()))
        return workspaceError(request.workspacePath, "cannot flush the new workspace to disk");
    std::error_code ec;
    std::filesystem::rename(temp.path(), request.workspacePath, ec);
    if (ec)
        return workspaceError(request.workspacePath, "cannot move the new workspace into place: " + ec.message());
    temp.release();

    const std::uint32_t catalogSize = ctx.catalogSize;
    report.unknownItemsAdded = static_cast<std::int64_t>(catalog.items.size() - catalogSize);
    if (report.unknownItemsAdded > 0)
        report.notes.push_back(Note { request.trainPath,
            "warning: " + std::to_string(report.unknownItemsAdded) + " unknown item id(s) in "
                + std::to_string(ctx.unknownItemRows) + " row(s) were added to the catalog without title or genres" });
    report.items = static_cast<std::int64_t>(catalog.items.size());
    report.users = ctx.users.size();
    report.genres = catalog.genres.size();
    report.series = catalog.series.size();
    report.trainRows = trainRows;
    report.withheldRows = static_cast<std::int64_t>(withheld.size());
    report.seconds = std::chrono::duration<double>(Clock::now() - started).count();
    return report;
}

// ---------------------------------------------------------------------------------------
// add-run

namespace {

struct ScoreRow {
    std::int64_t line;
    std::uint32_t user, item;
    float score;
};

struct ListRow {
    std::int64_t line;
    std::int64_t rank;
    std::uint32_t user, item;
    float score;
};

/// The workspace's ids, and ids this run adds.
struct RunContext {
    IdMap users;
    std::uint32_t existingUsers = 0;
    Catalog catalog; ///< only ids and externalId of added items are used
    std::uint32_t existingItems = 0;
    std::int64_t unknownItemRows = 0;
    const ReadOptions* options = nullptr;
};

template <typename OnRow>
bool readRunFile(CsvReader& reader, FileRole role, RunContext& ctx, ErrorList& errors, std::vector<Note>& notes,
    Meter& meter, OnRow&& onRow)
{
    CsvParser parser(reader.text(), reader.delimiter());
    meter.startFile(reader);
    auto layout = readHeader(parser, reader, role, errors, notes);
    if (!layout)
        return false;
    const bool lists = role == FileRole::Lists;
    const std::size_t cUser = static_cast<std::size_t>(layout->at[0]);
    const std::size_t cItem = static_cast<std::size_t>(lists ? layout->at[2] : layout->at[1]);
    const int cRank = lists ? layout->at[1] : -1;
    const int cScore = lists ? layout->at[3] : layout->at[2];
    const std::string& file = reader.path();
    std::int64_t rows = 0;
    for (;;) {
        const auto step = parser.next();
        if (step == CsvParser::Step::End)
            break;
        if (step == CsvParser::Step::Error) {
            Error e = parser.error();
            e.file = file;
            errors.add(std::move(e));
            return false;
        }
        const auto f = parser.fields();
        const std::int64_t line = parser.line();
        ++rows;
        if (f.size() != layout->fieldCount) {
            errors.add(file, line, static_cast<std::int64_t>(std::min(f.size(), layout->fieldCount) + 1), {},
                "row has " + std::to_string(f.size()) + " fields, the header has " + std::to_string(layout->fieldCount),
                std::to_string(layout->fieldCount) + " fields as in the header");
        } else {
            bool ok = checkId(f[cUser], file, line, static_cast<std::int64_t>(cUser + 1), "user_id", errors);
            ok = checkId(f[cItem], file, line, static_cast<std::int64_t>(cItem + 1), "item_id", errors) && ok;
            std::uint32_t item = IdMap::kMissing;
            if (ok) {
                item = ctx.catalog.ids.find(f[cItem]);
                if (item == IdMap::kMissing) {
                    if (ctx.options->allowUnknownItems) {
                        item = ctx.catalog.ids.insert(f[cItem]).index;
                        ++ctx.unknownItemRows;
                    } else {
                        errors.add(file, line, static_cast<std::int64_t>(cItem + 1), std::string(f[cItem]),
                            "unknown item id",
                            "an item_id listed in the workspace's catalog (or --allow-unknown-items)");
                        ok = false;
                    }
                } else if (item >= ctx.existingItems) {
                    ++ctx.unknownItemRows;
                }
            }
            std::int64_t rank = 0;
            if (cRank >= 0) {
                const std::string_view text = f[static_cast<std::size_t>(cRank)];
                const auto r = parseInteger(text);
                if (!r || *r < 1) {
                    errors.add(file, line, cRank + 1, std::string(text), "rank is not a positive whole number",
                        "a whole number from 1 (1 = top of the list)");
                    ok = false;
                } else {
                    rank = *r;
                }
            }
            float score = std::nanf("");
            if (cScore >= 0) {
                const std::string_view text = f[static_cast<std::size_t>(cScore)];
                if (!(lists && trimSpaces(text).empty())) {
                    const auto s = parseNumber(text);
                    if (!s) {
                        errors.add(file, line, cScore + 1, std::string(text),
                            text.empty() ? "score is empty" : "score is not a number",
                            lists ? "a finite decimal number, or an empty cell" : "a finite decimal number");
                        ok = false;
                    } else if (!std::isfinite(*s)) {
                        errors.add(file, line, cScore + 1, std::string(text), "score is NaN or infinite",
                            lists ? "a finite decimal number, or an empty cell" : "a finite decimal number");
                        ok = false;
                    } else {
                        score = static_cast<float>(*s);
                    }
                }
            }
            if (ok) {
                const std::uint32_t user = ctx.users.insert(f[cUser]).index;
                onRow(user, item, rank, score, line);
            }
        }
        if (errors.full())
            return false;
        if (rows % kTickRows == 0) {
            reader.consumed(parser.position());
            meter.tick(parser.position(), rows);
            if (meter.cancelled())
                return false;
        }
    }
    reader.consumed(parser.position());
    meter.tick(parser.position(), rows);
    if (rows == 0 && errors.empty())
        errors.add(file, 0, 0, {}, "file has a header but no data rows", "at least one row");
    return errors.empty();
}

} // namespace

Result<AddRunReport> addRun(const AddRunRequest& request, const Progress& progress)
{
    const auto started = Clock::now();
    const auto usage = [](std::string message, std::string expected = {}) {
        Error e;
        e.kind = ErrorKind::Usage;
        e.message = std::move(message);
        e.expected = std::move(expected);
        return e;
    };
    if (request.name.empty() || request.name.size() > 256)
        return usage("run name must be 1 to 256 bytes");
    if (request.scoresPath.empty() && request.listsPath.empty())
        return usage("no run files given", "--scores FILE, --lists FILE or both");

    std::vector<Error> openErrors;
    std::optional<CsvReader> scoresReader, listsReader;
    if (!request.scoresPath.empty()) {
        auto r = CsvReader::open(request.scoresPath, request.options.delimiter);
        if (r.ok())
            scoresReader.emplace(std::move(r.value()));
        else
            openErrors.push_back(r.error());
    }
    if (!request.listsPath.empty()) {
        auto r = CsvReader::open(request.listsPath, request.options.delimiter);
        if (r.ok())
            listsReader.emplace(std::move(r.value()));
        else
            openErrors.push_back(r.error());
    }
    if (!openErrors.empty())
        return openErrors;

    auto opened = Workspace::open(request.workspacePath);
    if (!opened)
        return opened.errors();
    Workspace& ws = opened.value();
    AddRunReport report;
    RunContext ctx;
    ctx.options = &request.options;
    std::vector<std::uint64_t> withheldKeys;
    std::optional<std::int64_t> existingRun;
    try {
        Statement find(ws.db(), "SELECT run_id FROM runs WHERE name = ?");
        find.bind(1, request.name);
        if (find.step())
            existingRun = find.int64(0);
        if (existingRun && !request.replace) {
            Error e = usage("a run named '" + request.name + "' already exists in " + request.workspacePath,
                "a new run name, or --replace to replace the run");
            e.value = request.name;
            return e;
        }
        Statement users(ws.db(), "SELECT user_id, external_id FROM users ORDER BY user_id");
        while (users.step()) {
            const auto ins = ctx.users.insert(users.text(1));
            if (static_cast<std::int64_t>(ins.index) != users.int64(0))
                return workspaceError(request.workspacePath, "user keys are not 0..n-1; the workspace is damaged");
        }
        ctx.existingUsers = ctx.users.size();
        Statement items(ws.db(), "SELECT item_id, external_id FROM items ORDER BY item_id");
        while (items.step()) {
            const auto ins = ctx.catalog.ids.insert(items.text(1));
            if (static_cast<std::int64_t>(ins.index) != items.int64(0))
                return workspaceError(request.workspacePath, "item keys are not 0..n-1; the workspace is damaged");
        }
        ctx.existingItems = ctx.catalog.ids.size();
        Statement held(ws.db(), "SELECT user_id, item_id FROM withheld ORDER BY user_id, item_id");
        while (held.step())
            withheldKeys.push_back(
                pairKey(static_cast<std::uint32_t>(held.int64(0)), static_cast<std::uint32_t>(held.int64(1))));
    } catch (const SqliteError& e) {
        return workspaceError(request.workspacePath, e.what());
    }

    Meter meter(progress, (scoresReader ? scoresReader->size() : 0) + (listsReader ? listsReader->size() : 0));
    ErrorList errors;
    std::vector<ScoreRow> scores;
    std::vector<ListRow> lists;
    if (scoresReader) {
        const bool ok = readRunFile(*scoresReader, FileRole::Scores, ctx, errors, report.notes, meter,
            [&](std::uint32_t u, std::uint32_t i, std::int64_t, float s, std::int64_t line) {
                scores.push_back(ScoreRow { line, u, i, s });
            });
        if (!ok && errors.empty())
            return cancelledError();
        if (ok) {
            std::sort(scores.begin(), scores.end(), [](const ScoreRow& a, const ScoreRow& b) {
                return a.user != b.user ? a.user < b.user : a.item != b.item ? a.item < b.item : a.line < b.line;
            });
            std::vector<std::pair<std::int64_t, Error>> dups;
            for (std::size_t r = 1; r < scores.size(); ++r) {
                if (scores[r].user == scores[r - 1].user && scores[r].item == scores[r - 1].item) {
                    Error e;
                    e.file = scoresReader->path();
                    e.line = scores[r].line;
                    e.column = 1;
                    e.value = std::string(ctx.users.id(scores[r].user)) + ", "
                        + std::string(ctx.catalog.ids.id(scores[r].item));
                    std::size_t first = r - 1;
                    while (first > 0 && scores[first - 1].user == scores[r].user
                        && scores[first - 1].item == scores[r].item)
                        --first;
                    e.message
                        = "duplicate (user_id, item_id) pair, first on line " + std::to_string(scores[first].line);
                    e.expected = "each (user_id, item_id) pair at most once in the scores file";
                    dups.emplace_back(e.line, std::move(e));
                }
            }
            std::sort(dups.begin(), dups.end(), [](const auto& a, const auto& b) { return a.first < b.first; });
            for (auto& d : dups)
                errors.add(std::move(d.second));
        }
    }
    if (listsReader && errors.empty()) {
        const bool ok = readRunFile(*listsReader, FileRole::Lists, ctx, errors, report.notes, meter,
            [&](std::uint32_t u, std::uint32_t i, std::int64_t rank, float s, std::int64_t line) {
                lists.push_back(ListRow { line, rank, u, i, s });
            });
        if (!ok && errors.empty())
            return cancelledError();
        if (ok) {
            std::sort(lists.begin(), lists.end(), [](const ListRow& a, const ListRow& b) {
                return a.user != b.user ? a.user < b.user : a.rank != b.rank ? a.rank < b.rank : a.line < b.line;
            });
            std::vector<std::pair<std::int64_t, Error>> problems;
            const auto problem = [&](const ListRow& row, std::int64_t column, std::string value, std::string message,
                                     std::string expected) {
                Error e;
                e.file = listsReader->path();
                e.line = row.line;
                e.column = column;
                e.value = std::move(value);
                e.message = std::move(message);
                e.expected = std::move(expected);
                problems.emplace_back(row.line, std::move(e));
            };
            std::vector<std::pair<std::uint32_t, std::size_t>> itemsOfUser;
            for (std::size_t b = 0; b < lists.size();) {
                std::size_t e = b;
                while (e < lists.size() && lists[e].user == lists[b].user)
                    ++e;
                const std::string user(ctx.users.id(lists[b].user));
                std::int64_t expectedRank = 1;
                for (std::size_t r = b; r < e; ++r) {
                    if (r > b && lists[r].rank == lists[r - 1].rank) {
                        problem(lists[r], 2, user + ", " + std::to_string(lists[r].rank),
                            "duplicate (user_id, rank), first on line " + std::to_string(lists[r - 1].line),
                            "each rank once per user");
                        continue;
                    }
                    if (lists[r].rank != expectedRank) {
                        problem(lists[r], 2, user + ", " + std::to_string(lists[r].rank),
                            "ranks of this user skip " + std::to_string(expectedRank)
                                + (lists[r].rank - expectedRank > 1 ? " to " + std::to_string(lists[r].rank - 1) : ""),
                            "ranks 1..n without gaps for each user");
                    }
                    expectedRank = lists[r].rank + 1;
                }
                itemsOfUser.clear();
                for (std::size_t r = b; r < e; ++r)
                    itemsOfUser.emplace_back(lists[r].item, r);
                std::sort(itemsOfUser.begin(), itemsOfUser.end());
                for (std::size_t k = 1; k < itemsOfUser.size(); ++k) {
                    if (itemsOfUser[k].first == itemsOfUser[k - 1].first) {
                        const ListRow& first = lists[std::min(itemsOfUser[k].second, itemsOfUser[k - 1].second)];
                        const ListRow& again = lists[std::max(itemsOfUser[k].second, itemsOfUser[k - 1].second)];
                        problem(again, 3, user + ", " + std::string(ctx.catalog.ids.id(again.item)),
                            "item appears twice in this user's list, first on line " + std::to_string(first.line),
                            "each item at most once per list");
                    }
                }
                b = e;
            }
            std::sort(problems.begin(), problems.end(), [](const auto& a, const auto& b) { return a.first < b.first; });
            for (auto& p : problems)
                errors.add(std::move(p.second));
        }
    }
    if (!errors.empty())
        return errors.take();
    if (progress.cancelled())
        return cancelledError();

    // Counts for the report.
    for (const ScoreRow& s : scores)
        if (!std::binary_search(withheldKeys.begin(), withheldKeys.end(), pairKey(s.user, s.item)))
            ++report.scoresOutsideWithheld;
    report.scoreRows = static_cast<std::int64_t>(scores.size());
    if (scoresReader)
        report.withheldWithoutScore
            = static_cast<std::int64_t>(withheldKeys.size()) - (report.scoreRows - report.scoresOutsideWithheld);
    report.listRows = static_cast<std::int64_t>(lists.size());
    for (std::size_t r = 0; r < lists.size(); ++r)
        if (r == 0 || lists[r].user != lists[r - 1].user)
            ++report.listUsers;
    report.usersAdded = ctx.users.size() - ctx.existingUsers;
    report.unknownItemsAdded = ctx.catalog.ids.size() - ctx.existingItems;

    try {
        meter.stage(1.0, "writing run '" + request.name + "'");
        Transaction tx(ws.db());
        if (existingRun) {
            Statement del(ws.db(), "DELETE FROM runs WHERE run_id = ?");
            del.bind(1, *existingRun).run();
            report.replaced = true;
        }
        insertNames(ws.db(), "users", "user_id", "external_id", ctx.users, ctx.existingUsers);
        {
            BulkInsert ins(ws.db(), "items", { "item_id", "external_id", "title" });
            for (std::uint32_t i = ctx.existingItems; i < ctx.catalog.ids.size(); ++i)
                ins.i64(1, i).text(2, ctx.catalog.ids.id(i)).text(3, "").run();
            ins.finish();
        }
        nlohmann::json settings {
            { "scores", request.scoresPath.empty() ? nlohmann::json() : nlohmann::json(baseName(request.scoresPath)) },
            { "lists", request.listsPath.empty() ? nlohmann::json() : nlohmann::json(baseName(request.listsPath)) },
            { "allow_unknown_items", request.options.allowUnknownItems }
        };
        {
            BulkInsert ins(ws.db(), "runs", { "name", "created_at", "settings", "kind" }, 1);
            ins.text(1, request.name).text(2, utcNow()).text(3, settings.dump()).text(4, "imported").run();
            ins.finish();
        }
        report.runId = ws.db().lastInsertId();
        if (scoresReader)
            insertSourceFile(ws.db(), report.runId, FileRole::Scores, *scoresReader);
        if (listsReader)
            insertSourceFile(ws.db(), report.runId, FileRole::Lists, *listsReader);
        {
            BulkInsert ins(ws.db(), "run_scores", { "run_id", "user_id", "item_id", "score" });
            std::size_t n = 0;
            for (const ScoreRow& s : scores) {
                ins.i64(1, report.runId).i64(2, s.user).i64(3, s.item).real(4, s.score).run();
                if (++n % (1 << 16) == 0 && progress.cancelled())
                    return cancelledError();
            }
            ins.finish();
        }
        {
            BulkInsert ins(ws.db(), "run_lists", { "run_id", "user_id", "rank", "item_id", "score" });
            std::size_t n = 0;
            for (const ListRow& l : lists) {
                ins.i64(1, report.runId).i64(2, l.user).i64(3, l.rank).i64(4, l.item);
                if (std::isnan(l.score))
                    ins.null(5);
                else
                    ins.real(5, l.score);
                ins.run();
                if (++n % (1 << 16) == 0 && progress.cancelled())
                    return cancelledError();
            }
            ins.finish();
        }
        recordRunCounts(
            ws.db(), report.runId, static_cast<std::int64_t>(scores.size()), report.listRows, report.listUsers);
        tx.commit();
    } catch (const SqliteError& e) {
        return workspaceError(request.workspacePath, std::string("cannot write run: ") + e.what());
    }
    if (report.usersAdded > 0)
        report.notes.push_back(Note { {},
            std::to_string(report.usersAdded)
                + " user(s) appear only in this run's files; they were added to the workspace's users without train or "
                  "withheld rows" });
    if (report.unknownItemsAdded > 0)
        report.notes.push_back(Note { {},
            "warning: " + std::to_string(report.unknownItemsAdded) + " unknown item id(s) in "
                + std::to_string(ctx.unknownItemRows) + " row(s) were added to the catalog without title or genres" });
    if (report.scoresOutsideWithheld > 0)
        report.notes.push_back(Note { request.scoresPath,
            std::to_string(report.scoresOutsideWithheld)
                + " score(s) are for pairs outside the withheld set; they are stored but not used by accuracy "
                  "measures" });
    if (report.withheldWithoutScore > 0)
        report.notes.push_back(Note { request.scoresPath,
            std::to_string(report.withheldWithoutScore)
                + " withheld pair(s) have no score; accuracy measures count them as missing" });
    report.seconds = std::chrono::duration<double>(Clock::now() - started).count();
    return report;
}

// ---------------------------------------------------------------------------------------
// preview

Result<FilePreview> previewFile(
    const std::string& path, std::size_t maxRows, std::optional<FileRole> role, char delimiter)
{
    auto opened = CsvReader::open(path, delimiter);
    if (!opened)
        return opened.errors();
    CsvReader& reader = opened.value();
    FilePreview preview;
    preview.path = path;
    preview.delimiter = reader.delimiter();
    preview.hasBom = reader.hasBom();
    preview.size = reader.size();
    CsvParser parser(reader.text(), reader.delimiter());
    const auto first = parser.next();
    if (first != CsvParser::Step::Record) {
        Error e = first == CsvParser::Step::Error ? parser.error() : Error {};
        if (first == CsvParser::Step::End) {
            e.message = "file is empty";
            e.expected = "a header row followed by data rows";
        }
        e.file = path;
        return e;
    }
    std::vector<std::string> names;
    for (auto f : parser.fields()) {
        preview.header.emplace_back(f);
        names.push_back(normalizedHeader(f));
    }
    const auto hasColumn = [&](const char* n) { return std::find(names.begin(), names.end(), n) != names.end(); };
    if (!role) {
        if (hasColumn("rank"))
            role = FileRole::Lists;
        else if (hasColumn("score"))
            role = FileRole::Scores;
        else if (hasColumn("rating"))
            role = FileRole::Train;
        else if (hasColumn("title"))
            role = FileRole::Catalog;
    }
    preview.role = role;
    preview.columnRoles.assign(names.size(), {});
    if (role) {
        std::vector<std::string> unknown;
        for (std::size_t i = 0; i < names.size(); ++i) {
            for (const auto& spec : columnsFor(*role))
                if (names[i] == spec.name)
                    preview.columnRoles[i] = spec.name;
            if (preview.columnRoles[i].empty())
                unknown.push_back(preview.header[i]);
        }
        for (const auto& spec : columnsFor(*role))
            if (spec.required && !hasColumn(spec.name))
                preview.missingColumns.emplace_back(spec.name);
        if (!unknown.empty()) {
            std::string list;
            for (const auto& u : unknown)
                list += (list.empty() ? "'" : ", '") + u + "'";
            preview.notes.push_back(
                Note { path, "ignored column" + std::string(unknown.size() > 1 ? "s " : " ") + list });
        }
    } else {
        preview.notes.push_back(Note { path, "cannot tell what this file holds from its header" });
    }
    while (preview.rows.size() < maxRows) {
        const auto step = parser.next();
        if (step == CsvParser::Step::End)
            break;
        if (step == CsvParser::Step::Error) {
            Error e = parser.error();
            e.file = path;
            preview.errors.push_back(std::move(e));
            break;
        }
        std::vector<std::string> row;
        for (auto f : parser.fields())
            row.emplace_back(f);
        if (row.size() != preview.header.size()) {
            Error e;
            e.file = path;
            e.line = parser.line();
            e.column = static_cast<std::int64_t>(std::min(row.size(), preview.header.size()) + 1);
            e.message = "row has " + std::to_string(row.size()) + " fields, the header has "
                + std::to_string(preview.header.size());
            e.expected = std::to_string(preview.header.size()) + " fields as in the header";
            preview.errors.push_back(std::move(e));
        }
        preview.rows.push_back(std::move(row));
    }
    return preview;
}

} // namespace slatewise::core
