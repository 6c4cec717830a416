// SPDX-License-Identifier: MIT
#pragma once

#include "core/evaluation.h"
#include "ui/chartview.h"

#include <map>
#include <string>
#include <vector>

namespace slatewise::ui {

/// Share of evaluated users carrying each warning, per run (horizontal grouped bars, one
/// row per warning code from core/warning.h).
class WarningPrevalenceChart : public ChartView {
    Q_OBJECT
public:
    explicit WarningPrevalenceChart(QWidget* parent = nullptr);
    void setData(const std::vector<core::RunEvaluation>& runs);

protected:
    void rebuild(const ChartPalette& palette) override;

private:
    struct RunShares {
        std::string run;
        std::map<std::string, double> share;
    };
    std::vector<RunShares> m_runs;
};

} // namespace slatewise::ui
