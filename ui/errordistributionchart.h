// SPDX-License-Identifier: MIT
#pragma once

#include "ui/chartview.h"
#include "ui/runerrors.h"

#include <vector>

namespace slatewise::ui {

/// Distribution of errors (score − withheld rating) per run: shared bins, drawn as the
/// share of the run's scored pairs per bin so runs of different size compare.
class ErrorDistributionChart : public ChartView {
    Q_OBJECT
public:
    explicit ErrorDistributionChart(QWidget* parent = nullptr);
    void setData(std::vector<RunErrors> runs);

protected:
    void rebuild(const ChartPalette& palette) override;

private:
    std::vector<RunErrors> m_runs;
};

} // namespace slatewise::ui
