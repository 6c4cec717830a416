// SPDX-License-Identifier: MIT
#include "core/run.h"

namespace slatewise::core {

std::string_view toString(RunKind kind)
{
    switch (kind) {
    case RunKind::Imported:
        return "imported";
    case RunKind::Fitted:
        return "fitted";
    case RunKind::Reranked:
        return "reranked";
    }
    return "imported";
}

} // namespace slatewise::core
