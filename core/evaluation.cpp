// SPDX-License-Identifier: MIT
#include "core/evaluation.h"

namespace slatewise::core {

void UserResultTable::resize(std::size_t n)
{
    users.resize(n);
    nWithheld.resize(n);
    nRelevant.resize(n);
    nTrain.resize(n);
    warningCount.resize(n);
    for (auto& column : metrics)
        column.assign(n, std::nan(""));
}

} // namespace slatewise::core
