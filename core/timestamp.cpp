// SPDX-License-Identifier: MIT
#include "core/timestamp.h"

#include <charconv>
#include <cstdio>

namespace slatewise::core {

std::int64_t daysFromCivil(std::int64_t y, unsigned m, unsigned d)
{
    y -= m <= 2 ? 1 : 0;
    const std::int64_t era = (y >= 0 ? y : y - 399) / 400;
    const auto yoe = static_cast<unsigned>(y - era * 400);
    const unsigned doy = (153 * (m > 2 ? m - 3 : m + 9) + 2) / 5 + d - 1;
    const unsigned doe = yoe * 365 + yoe / 4 - yoe / 100 + doy;
    return era * 146097 + static_cast<std::int64_t>(doe) - 719468;
}

namespace {

bool digits(std::string_view s, std::size_t pos, std::size_t n, int& out)
{
    if (pos + n > s.size())
        return false;
    int v = 0;
    for (std::size_t i = pos; i < pos + n; ++i) {
        const char c = s[i];
        if (c < '0' || c > '9')
            return false;
        v = v * 10 + (c - '0');
    }
    out = v;
    return true;
}

bool leapYear(int y) { return (y % 4 == 0 && y % 100 != 0) || y % 400 == 0; }

int daysInMonth(int y, int m)
{
    static constexpr int kDays[] = {31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31};
    return m == 2 && leapYear(y) ? 29 : kDays[m - 1];
}

} // namespace

std::optional<Timestamp> parseTimestamp(std::string_view s)
{
    if (s.empty())
        return std::nullopt;
    // Plain integer: Unix seconds.
    bool allDigits = true;
    for (std::size_t i = (s[0] == '-' ? 1 : 0); i < s.size(); ++i)
        if (s[i] < '0' || s[i] > '9')
            allDigits = false;
    if (allDigits && s.size() > (s[0] == '-' ? 1u : 0u) && (s.size() != 10 || s[4] != '-')) {
        std::int64_t v = 0;
        auto [ptr, ec] = std::from_chars(s.data(), s.data() + s.size(), v);
        if (ec != std::errc() || ptr != s.data() + s.size())
            return std::nullopt;
        return v;
    }
    int y = 0, mo = 0, d = 0, h = 0, mi = 0, sec = 0;
    if (!digits(s, 0, 4, y) || s.size() < 10 || s[4] != '-' || !digits(s, 5, 2, mo) || s[7] != '-'
        || !digits(s, 8, 2, d))
        return std::nullopt;
    if (mo < 1 || mo > 12 || d < 1 || d > daysInMonth(y, mo))
        return std::nullopt;
    std::size_t pos = 10;
    std::int64_t offset = 0;
    if (pos < s.size()) {
        if (s[pos] != 'T' && s[pos] != 't' && s[pos] != ' ')
            return std::nullopt;
        ++pos;
        if (!digits(s, pos, 2, h) || pos + 2 >= s.size() || s[pos + 2] != ':' || !digits(s, pos + 3, 2, mi))
            return std::nullopt;
        pos += 5;
        if (pos < s.size() && s[pos] == ':') {
            if (!digits(s, pos + 1, 2, sec))
                return std::nullopt;
            pos += 3;
            if (pos < s.size() && (s[pos] == '.' || s[pos] == ',')) {
                ++pos;
                const std::size_t start = pos;
                while (pos < s.size() && s[pos] >= '0' && s[pos] <= '9')
                    ++pos;
                if (pos == start)
                    return std::nullopt;
            }
        }
        if (h > 23 || mi > 59 || sec > 60)
            return std::nullopt;
        if (pos < s.size()) {
            if (s[pos] == 'Z' || s[pos] == 'z') {
                ++pos;
            } else if (s[pos] == '+' || s[pos] == '-') {
                const int sign = s[pos] == '-' ? -1 : 1;
                int oh = 0, om = 0;
                if (!digits(s, pos + 1, 2, oh))
                    return std::nullopt;
                pos += 3;
                if (pos < s.size() && s[pos] == ':')
                    ++pos;
                if (pos < s.size()) {
                    if (!digits(s, pos, 2, om))
                        return std::nullopt;
                    pos += 2;
                }
                if (oh > 23 || om > 59)
                    return std::nullopt;
                offset = sign * (oh * 3600 + om * 60);
            } else {
                return std::nullopt;
            }
        }
        if (pos != s.size())
            return std::nullopt;
    }
    return daysFromCivil(y, static_cast<unsigned>(mo), static_cast<unsigned>(d)) * 86400 + h * 3600 + mi * 60 + sec
           - offset;
}

std::string formatIso8601(Timestamp t)
{
    std::int64_t days = t >= 0 ? t / 86400 : (t - 86399) / 86400;
    std::int64_t rem = t - days * 86400;
    // civil_from_days (Howard Hinnant), the inverse of daysFromCivil.
    days += 719468;
    const std::int64_t era = (days >= 0 ? days : days - 146096) / 146097;
    const auto doe = static_cast<unsigned>(days - era * 146097);
    const unsigned yoe = (doe - doe / 1460 + doe / 36524 - doe / 146096) / 365;
    std::int64_t y = static_cast<std::int64_t>(yoe) + era * 400;
    const unsigned doy = doe - (365 * yoe + yoe / 4 - yoe / 100);
    const unsigned mp = (5 * doy + 2) / 153;
    const unsigned d = doy - (153 * mp + 2) / 5 + 1;
    const unsigned m = mp < 10 ? mp + 3 : mp - 9;
    y += m <= 2 ? 1 : 0;
    char buf[40];
    const int h = static_cast<int>(rem / 3600), mi = static_cast<int>(rem / 60 % 60), sec = static_cast<int>(rem % 60);
    std::snprintf(buf, sizeof buf, "%04lld-%02u-%02uT%02d:%02d:%02dZ", static_cast<long long>(y), m, d, h, mi, sec);
    return buf;
}

} // namespace slatewise::core
