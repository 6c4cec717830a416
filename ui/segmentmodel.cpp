// SPDX-License-Identifier: MIT
#include "ui/segmentmodel.h"

#include "core/comparisonresult.h"
#include "core/runcomparison.h"
#include "ui/format.h"

#include <cmath>

namespace slatewise::ui {

SegmentModel::SegmentModel(QObject* parent)
    : TableModelBase(parent)
{
}
SegmentModel::~SegmentModel() = default;

void SegmentModel::setResults(std::shared_ptr<const core::RunComparison> comparison, core::Metric metric)
{
    beginResetModel();
    m_comparison = std::move(comparison);
    m_metric = metric;
    endResetModel();
}

int SegmentModel::rowCount(const QModelIndex& parent) const
{
    return parent.isValid() || !m_comparison ? 0 : static_cast<int>(m_comparison->segments.size());
}

int SegmentModel::columnCount(const QModelIndex& parent) const
{
    return parent.isValid() ? 0 : ColumnCount;
}

QVariant SegmentModel::data(const QModelIndex& index, int role) const
{
    if (!checkIndex(index, CheckIndexOption::IndexIsValid | CheckIndexOption::ParentIsInvalid))
        return {};
    const auto& s = m_comparison->segments[static_cast<std::size_t>(index.row())];
    const core::MetricComparison* m = nullptr;
    for (const auto& candidate : s.metrics)
        if (candidate.metric == m_metric)
            m = &candidate;
    const int c = index.column();
    const bool tooSmall = s.tooSmall || (m && m->tooSmall);
    const auto number = [&]() -> double {
        if (c == Users)
            return static_cast<double>(s.size);
        if (!m)
            return std::nan("");
        switch (c) {
        case MeanBase:
            return m->meanBase;
        case MeanCandidate:
            return m->meanCandidate;
        case MeanDiff:
            return m->meanDiff;
        case PHolm:
            return m->pHolm;
        default:
            return std::nan("");
        }
    };
    switch (role) {
    case Qt::DisplayRole:
        switch (c) {
        case Segment:
            return s.label.empty() ? toQ(s.name) : QStringLiteral("%1 — %2").arg(toQ(s.name), toQ(s.label));
        case Users:
            return QString::number(s.size);
        case MeanBase:
        case MeanCandidate:
        case MeanDiff:
            return formatNumber(number(), 4);
        case Interval:
            return m ? formatInterval(m->ci, 4) : QString();
        case PHolm: {
            const double p = number();
            return std::isnan(p) ? QStringLiteral("–")
                                 : (p < 0.001 ? QStringLiteral("< 0.001") : QString::number(p, 'f', 3));
        }
        case Judgement:
            if (tooSmall)
                return tr("too small to judge");
            return m ? toQ(core::shortVerdict(*m)) : tr("not defined");
        case Verdict:
            if (tooSmall)
                return tr("too small to judge (%1 users; at least %2 needed)")
                    .arg(s.size)
                    .arg(m_comparison->settings.minSegmentSize);
            return m ? toQ(m->verdict) : tr("metric not defined here");
        default:
            return {};
        }
    case Qt::ToolTipRole:
        return (c == Verdict || c == Judgement) && m ? QVariant(toQ(m->verdict)) : QVariant();
    case Qt::TextAlignmentRole:
        return alignment(c);
    case ValueRole:
        return number();
    case TooSmallRole:
        return tooSmall;
    case SegmentNameRole:
        return toQ(s.name);
    default:
        return {};
    }
}

TableModelBase::ColumnSpec SegmentModel::columnSpec(int column) const
{
    switch (column) {
    case Segment:
        return textColumn(
            tr("Segment"), tr("A group of users: by history size (activity), favourite genre or warning."));
    case Judgement:
        return textColumn(tr("Judgement"),
            tr("Significant and in whose favour, not significant, or too few users "
               "to judge. Hover for the full sentence."));
    case Users:
        return numberColumn(tr("Users"), tr("Evaluated users in the segment."));
    case MeanBase:
        return numberColumn(tr("Base mean"), {});
    case MeanCandidate:
        return numberColumn(tr("Candidate mean"), {});
    case MeanDiff:
        return numberColumn(tr("Difference"), tr("Mean per-user difference, candidate − base."));
    case Interval:
        return numberColumn(tr("95% interval"), tr("Paired bootstrap interval of the mean difference."));
    case PHolm:
        return numberColumn(tr("p (Holm)"), tr("t-test p-value adjusted by Holm–Bonferroni across all segment rows."));
    case Verdict:
        return textColumn(tr("In words"), {});
    default:
        return {};
    }
}

} // namespace slatewise::ui
