// SPDX-License-Identifier: MIT
#include "ui/warningprevalencechart.h"

#include "core/warning.h"
#include "ui/chartpalette.h"
#include "ui/format.h"

#include <QFontMetrics>

#include <algorithm>

#include <qcustomplot.h>

namespace slatewise::ui {

WarningPrevalenceChart::WarningPrevalenceChart(QWidget* parent) : ChartView(parent)
{
    setTitle(tr("Warning prevalence: share of users carrying each warning, per run"));
    setFileStem(QStringLiteral("warning-prevalence"));
    connect(plot(), &QCustomPlot::afterLayout, this, &WarningPrevalenceChart::fitLabels);
    refresh();
}

void WarningPrevalenceChart::setData(const std::vector<core::RunEvaluation>& runs)
{
    m_runs.clear();
    for (const auto& run : runs)
        m_runs.push_back({run.runName, run.warningShare});
    refresh();
}

void WarningPrevalenceChart::rebuild(const ChartPalette& palette)
{
    if (m_runs.empty()) {
        setEmpty(true, tr("No run evaluated yet."));
        return;
    }
    setEmpty(false);
    m_labels.clear();
    const auto& warnings = core::allWarnings();
    const int rows = static_cast<int>(warnings.size());
    int row = addTitle(palette, tr("Users evaluated = users with at least one withheld item. One user can carry "
                                   "several warnings."));
    QCPAxisRect* rect = addAxisRect(palette, row++);
    m_rect = rect;
    addLegendRow(palette, row, std::min<int>(4, static_cast<int>(m_runs.size())));
    QCPAxis* y = rect->axis(QCPAxis::atLeft);   // warnings
    QCPAxis* x = rect->axis(QCPAxis::atBottom); // share
    styleAxis(x, palette, tr("users carrying the warning (% of users evaluated)"));
    styleAxis(y, palette, {});
    QSharedPointer<QCPAxisTickerText> ticker(new QCPAxisTickerText);
    for (int w = 0; w < rows; ++w)
        ticker->addTick(w, toQ(warnings[static_cast<std::size_t>(w)].title));
    y->setTicker(ticker);
    y->setRangeReversed(true); // first warning at the top, as in the tables
    y->setRange(-0.6, rows - 0.4);
    y->grid()->setVisible(false);

    const auto runCount = static_cast<double>(m_runs.size());
    const double barHeight = 0.8 / runCount;
    m_barHeight = barHeight;
    const bool labels = m_runs.size() <= 4;
    double most = 0.0;
    for (std::size_t r = 0; r < m_runs.size(); ++r) {
        auto* bars = new QCPBars(y, x);
        bars->setWidth(barHeight * 0.9);
        bars->setPen(Qt::NoPen);
        bars->setBrush(palette.series(static_cast<int>(r)));
        bars->setName(toQ(m_runs[r].run));
        QVector<double> keys, values;
        for (int w = 0; w < rows; ++w) {
            const auto it = m_runs[r].share.find(std::string(warnings[static_cast<std::size_t>(w)].key));
            const double pct = it == m_runs[r].share.end() ? 0.0 : 100.0 * it->second;
            const double key = w + barHeight * (static_cast<double>(r) - (runCount - 1.0) / 2.0);
            keys << key;
            values << pct;
            most = std::max(most, pct);
            if (labels) {
                auto* text = new QCPItemText(plot());
                text->setClipAxisRect(rect);
                text->position->setAxes(x, y);
                text->position->setCoords(pct, key);
                text->setPositionAlignment(Qt::AlignLeft | Qt::AlignVCenter);
                text->setPadding(QMargins(4, 0, 0, 0));
                text->setText(QLocale().toString(pct, 'f', pct < 10 && pct > 0 ? 1 : 0) + QStringLiteral(" %"));
                text->setFont(chartFont(0.8));
                text->setColor(palette.axis());
                m_labels.emplace_back(text);
            }
        }
        bars->setData(keys, values, true);
    }
    // Room on the right for the value labels, but no tick beyond 100 %.
    const double high = std::max(1.0, most * 1.15);
    if (high <= 100.0) {
        setNiceRange(x, 0.0, high, 5);
    } else {
        QSharedPointer<QCPAxisTickerText> percent(new QCPAxisTickerText);
        for (int t = 0; t <= 100; t += 25)
            percent->addTick(t, QString::number(t));
        x->setTicker(percent);
        x->setRange(0.0, high);
    }
}

void WarningPrevalenceChart::fitLabels()
{
    if (!m_rect || m_labels.empty())
        return;
    const double rows = static_cast<double>(core::allWarnings().size());
    const double pixelsPerBar = m_rect->height() / std::max(1.0, rows) * m_barHeight;
    const QFontMetrics metrics(chartFont(0.8));
    const bool fits = pixelsPerBar >= 0.85 * metrics.height();
    for (const auto& label : m_labels)
        if (label)
            label->setVisible(fits);
}

} // namespace slatewise::ui
