// SPDX-License-Identifier: MIT
#pragma once

#include "core/evaluation.h"
#include "ui/chartview.h"

#include <QPointer>

#include <map>
#include <string>
#include <vector>

class QCPAxisRect;
class QCPItemText;

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
    /// Shows the value labels only when each bar is tall enough for its text (checked after
    /// every layout, so the screen and each export size decide for themselves).
    void fitLabels();

    struct RunShares {
        std::string run;
        std::map<std::string, double> share;
    };
    std::vector<RunShares> m_runs;
    std::vector<QPointer<QCPItemText>> m_labels;
    QPointer<QCPAxisRect> m_rect;
    double m_barHeight = 1.0; ///< in axis units (one warning row = 1)
};

} // namespace slatewise::ui
