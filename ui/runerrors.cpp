// SPDX-License-Identifier: MIT
#include "ui/runerrors.h"

#include "core/dataset.h"
#include "core/run.h"

#include "ui/format.h"

#include <cmath>

namespace slatewise::ui {

RunErrors RunErrors::fromRun(const core::Dataset& data, const core::RunData& run)
{
    RunErrors e;
    e.runName = toQ(run.info.name);
    if (!run.hasScores)
        return e;
    const auto& rows = data.withheld.rows;
    e.errors.reserve(rows.size());
    for (std::size_t r = 0; r < rows.size() && r < run.scores.size(); ++r) {
        if (!std::isnan(run.scores[r]))
            e.errors.push_back(static_cast<double>(run.scores[r]) - static_cast<double>(rows[r].rating));
    }
    return e;
}

} // namespace slatewise::ui
