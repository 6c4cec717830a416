// SPDX-License-Identifier: MIT
#include "core/error.h"

namespace slatewise::core {

std::string Error::toString() const
{
    std::string out;
    if (!file.empty()) {
        out += file;
        if (line > 0) {
            out += ':' + std::to_string(line);
            if (column > 0)
                out += ':' + std::to_string(column);
        }
        out += ": ";
    }
    out += message;
    if (!value.empty()) {
        // Long values (a whole binary line) would drown the message.
        std::string shown = value.size() > 80 ? value.substr(0, 77) + "..." : value;
        out += ": '" + shown + "'";
    }
    if (!expected.empty())
        out += " (expected " + expected + ")";
    return out;
}

int exitCodeFor(const std::vector<Error>& errors)
{
    if (errors.empty())
        return 0;
    return static_cast<int>(errors.front().kind == ErrorKind::Cancelled ? ErrorKind::Workspace : errors.front().kind);
}

} // namespace slatewise::core
