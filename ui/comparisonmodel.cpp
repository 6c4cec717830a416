// SPDX-License-Identifier: MIT
#include "ui/comparisonmodel.h"

#include "core/comparisonresult.h"
#include "core/runcomparison.h"
#include "ui/format.h"

#include <QFont>

#include <cmath>

namespace slatewise::ui {

namespace {
QString formatP(double p)
{
    if (std::isnan(p))
        return QStringLiteral("–");
    if (p < 0.001)
        return QStringLiteral("< 0.001");
    return QString::number(p, 'f', 3);
}
} // namespace

ComparisonModel::ComparisonModel(QObject* parent)
    : TableModelBase(parent)
{
}
ComparisonModel::~ComparisonModel() = default;

void ComparisonModel::setResults(std::shared_ptr<const core::RunComparison> comparison)
{
    beginResetModel();
    m_comparison = std::move(comparison);
    endResetModel();
}

int ComparisonModel::rowCount(const QModelIndex& parent) const
{
    return parent.isValid() || !m_comparison ? 0 : static_cast<int>(m_comparison->metrics.size());
}

int ComparisonModel::columnCount(const QModelIndex& parent) const
{
    return parent.isValid() ? 0 : ColumnCount;
}

QVariant ComparisonModel::data(const QModelIndex& index, int role) const
{
    if (!checkIndex(index, CheckIndexOption::IndexIsValid | CheckIndexOption::ParentIsInvalid))
        return {};
    const auto& m = m_comparison->metrics[static_cast<std::size_t>(index.row())];
    const int c = index.column();
    const auto number = [&]() -> double {
        switch (c) {
        case Users:
            return static_cast<double>(m.n);
        case MeanBase:
            return m.meanBase;
        case MeanCandidate:
            return m.meanCandidate;
        case MeanDiff:
            return m.meanDiff;
        case PT:
            return m.pT;
        case PWilcoxon:
            return m.pWilcoxon;
        case PHolm:
            return m.pHolm;
        case Wins:
            return static_cast<double>(m.wins);
        case Ties:
            return static_cast<double>(m.ties);
        case Losses:
            return static_cast<double>(m.losses);
        case Effect:
            return m.effectSize;
        default:
            return std::nan("");
        }
    };
    switch (role) {
    case Qt::DisplayRole:
        switch (c) {
        case Metric:
            return toQ(core::metricInfo(m.metric).label);
        case Users:
        case Wins:
        case Ties:
        case Losses:
            return QString::number(static_cast<qint64>(number()));
        case MeanBase:
        case MeanCandidate:
            return formatNumber(number(), 4);
        case MeanDiff:
            return std::isnan(m.meanDiff) ? QStringLiteral("–")
                                          : QStringLiteral("%1%2")
                                                .arg(m.meanDiff >= 0 ? QStringLiteral("+") : QString())
                                                .arg(m.meanDiff, 0, 'f', 4);
        case Interval:
            return formatInterval(m.ci, 4);
        case PT:
        case PWilcoxon:
        case PHolm:
            return formatP(number());
        case Effect:
            return formatNumber(m.effectSize, 2);
        case Judgement:
            return toQ(core::shortVerdict(m));
        case Verdict:
            if (m.tooSmall)
                return tr("too few users to judge");
            return toQ(m.verdict);
        default:
            return {};
        }
    case Qt::ToolTipRole:
        if (c == Verdict || c == Judgement)
            return toQ(m.verdict);
        if (c == Metric)
            return metricTooltip(m.metric);
        return {};
    case Qt::FontRole:
        if ((c == Verdict || c == Judgement) && m.significant) {
            QFont f;
            f.setBold(true);
            return f;
        }
        return {};
    case Qt::TextAlignmentRole:
        return alignment(c);
    case ValueRole:
        return number();
    case SignificantRole:
        return m.significant;
    case MetricRole:
        return static_cast<int>(m.metric);
    default:
        return {};
    }
}

TableModelBase::ColumnSpec ComparisonModel::columnSpec(int column) const
{
    switch (column) {
    case Metric:
        return textColumn(tr("Metric"), {});
    case Judgement:
        return textColumn(tr("Judgement"),
            tr("Significant (Holm-adjusted p below 0.05) and in whose favour, not "
               "significant, or too few users to judge. Hover for the full sentence."));
    case Users:
        return numberColumn(tr("Users"), tr("Users for whom both runs define the metric (the pairs compared)."));
    case MeanBase:
        return numberColumn(tr("Base mean"), {});
    case MeanCandidate:
        return numberColumn(tr("Candidate mean"), {});
    case MeanDiff:
        return numberColumn(tr("Difference"), tr("Mean of the per-user differences, candidate − base."));
    case Interval:
        return numberColumn(
            tr("95% interval"), tr("Paired bootstrap interval of the mean difference (users resampled)."));
    case PT:
        return numberColumn(tr("p (t-test)"), tr("Two-sided p-value of the paired t-test."));
    case PWilcoxon:
        return numberColumn(tr("p (Wilcoxon)"), tr("Two-sided p-value of the Wilcoxon signed-rank test."));
    case PHolm:
        return numberColumn(
            tr("p (Holm)"), tr("t-test p-value adjusted by Holm–Bonferroni across all metrics compared."));
    case Wins:
        return numberColumn(tr("Better"), tr("Users for whom the candidate is better."));
    case Ties:
        return numberColumn(tr("Same"), tr("Users with no difference."));
    case Losses:
        return numberColumn(tr("Worse"), tr("Users for whom the candidate is worse."));
    case Effect:
        return numberColumn(tr("Effect size"), tr("Mean difference / standard deviation of the differences."));
    case Verdict:
        return textColumn(tr("In words"),
            tr("Whether the difference is real, judged from the Holm-adjusted p-value and the interval."));
    default:
        return {};
    }
}

} // namespace slatewise::ui
