// SPDX-License-Identifier: MIT
#pragma once

#include <QString>

#include <vector>

namespace slatewise::core {
struct Dataset;
struct RunData;
}

namespace slatewise::ui {

/// The signed errors (score − withheld rating) of one run, one per scored withheld pair:
/// the input of the error distribution chart.
struct RunErrors {
    QString runName;
    std::vector<double> errors;

    /// Reads the run's scores against data.withheld; empty when the run has no scores.
    static RunErrors fromRun(const core::Dataset& data, const core::RunData& run);
};

} // namespace slatewise::ui
