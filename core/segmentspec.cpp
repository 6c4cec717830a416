// SPDX-License-Identifier: MIT
#include "core/segmentspec.h"

namespace slatewise::core {

std::string SegmentSpec::key() const
{
    switch (kind) {
    case SegmentKind::Activity:
        return "activity";
    case SegmentKind::Genre:
        return "genre";
    case SegmentKind::Warning:
        return "warning:" + std::string(warningInfo(warning).key);
    }
    return {};
}

Result<SegmentSpec> SegmentSpec::parse(std::string_view text)
{
    if (text == "activity")
        return SegmentSpec{SegmentKind::Activity, WarningCode::ColdUser};
    if (text == "genre")
        return SegmentSpec{SegmentKind::Genre, WarningCode::ColdUser};
    std::string codes;
    for (const auto& w : allWarnings()) {
        if (!codes.empty())
            codes += ", ";
        codes += w.key;
    }
    constexpr std::string_view prefix = "warning:";
    if (text.substr(0, prefix.size()) == prefix) {
        if (auto code = warningFromKey(text.substr(prefix.size())))
            return SegmentSpec{SegmentKind::Warning, *code};
        Error e;
        e.kind = ErrorKind::Usage;
        e.value = std::string(text);
        e.message = "unknown warning code in --segment";
        e.expected = "one of " + codes;
        return e;
    }
    Error e;
    e.kind = ErrorKind::Usage;
    e.value = std::string(text);
    e.message = "unknown segment";
    e.expected = "activity, genre or warning:CODE with CODE one of " + codes;
    return e;
}

} // namespace slatewise::core
