// SPDX-License-Identifier: MIT
#include "ui/runmetricsmodel.h"

#include "core/evaluation.h"
#include "ui/format.h"

#include <algorithm>
#include <cmath>

namespace slatewise::ui {

namespace {
constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();
}

RunMetricsModel::RunMetricsModel(QObject* parent) : TableModelBase(parent) {}
RunMetricsModel::~RunMetricsModel() = default;

void RunMetricsModel::setResults(std::vector<std::shared_ptr<const core::RunEvaluation>> evaluations)
{
    beginResetModel();
    m_evals = std::move(evaluations);
    endResetModel();
}

const core::RunEvaluation* RunMetricsModel::evaluationAt(int row) const
{
    if (row < 0 || row >= static_cast<int>(m_evals.size()))
        return nullptr;
    return m_evals[static_cast<std::size_t>(row)].get();
}

int RunMetricsModel::rowCount(const QModelIndex& parent) const
{
    return parent.isValid() ? 0 : static_cast<int>(m_evals.size());
}

int RunMetricsModel::columnCount(const QModelIndex& parent) const
{
    return parent.isValid() ? 0 : ColumnCount;
}

const char* RunMetricsModel::keyOf(int column)
{
    switch (column) {
    case Users:
        return "users";
    case Rmse:
        return "rmse";
    case Mae:
        return "mae";
    case MeanError:
        return "mean_error";
    case Precision:
        return "precision";
    case Recall:
        return "recall";
    case Ndcg:
        return "ndcg";
    case Map:
        return "map";
    case Mrr:
        return "mrr";
    case HitRate:
        return "hit_rate";
    case HeldoutTopk:
        return "heldout_topk";
    case Ild:
        return "ild";
    case Novelty:
        return "novelty";
    case Coverage:
        return "coverage";
    case Gini:
        return "gini";
    case WarnedUsers:
        return "warnings";
    default:
        return "";
    }
}

double RunMetricsModel::value(int row, int column) const
{
    const auto* e = evaluationAt(row);
    if (!e)
        return kNaN;
    const auto& a = e->accuracy;
    const auto& r = e->ranking;
    const auto& b = e->beyond;
    switch (column) {
    case Users:
        return static_cast<double>(e->users.size());
    case Rmse:
        return a ? a->rmse : kNaN;
    case Mae:
        return a ? a->mae : kNaN;
    case MeanError:
        return a ? a->meanError : kNaN;
    case Precision:
        return r ? r->precision : kNaN;
    case Recall:
        return r ? r->recall : kNaN;
    case Ndcg:
        return r ? r->ndcg : kNaN;
    case Map:
        return r ? r->map : kNaN;
    case Mrr:
        return r ? r->mrr : kNaN;
    case HitRate:
        return r ? r->hitRate : kNaN;
    case HeldoutTopk:
        return r ? r->heldoutTopk : kNaN;
    case Ild:
        return b ? b->ild : kNaN;
    case Novelty:
        return b ? b->novelty : kNaN;
    case Coverage:
        return b ? b->coverage : kNaN;
    case Gini:
        return b ? b->gini : kNaN;
    case WarnedUsers: {
        const auto& counts = e->users.warningCount;
        if (counts.empty())
            return kNaN;
        const auto warned = std::count_if(counts.begin(), counts.end(), [](std::int32_t c) { return c > 0; });
        return static_cast<double>(warned) / static_cast<double>(counts.size());
    }
    default:
        return kNaN;
    }
}

QVariant RunMetricsModel::data(const QModelIndex& index, int role) const
{
    if (!checkIndex(index, CheckIndexOption::IndexIsValid | CheckIndexOption::ParentIsInvalid))
        return {};
    const auto* e = evaluationAt(index.row());
    const int column = index.column();
    core::Interval interval;
    if (column != Run) {
        auto it = e->ci.find(keyOf(column));
        if (it != e->ci.end())
            interval = it->second;
    }
    switch (role) {
    case Qt::DisplayRole: {
        if (column == Run)
            return toQ(e->runName);
        const double v = value(index.row(), column);
        if (column == Users)
            return QString::number(static_cast<qint64>(v));
        if (column == WarnedUsers)
            return std::isnan(v) ? QStringLiteral("–") : QStringLiteral("%1%").arg(100.0 * v, 0, 'f', 1);
        const QString ci = formatInterval(interval);
        return ci.isEmpty() ? formatNumber(v) : QStringLiteral("%1 %2").arg(formatNumber(v), ci);
    }
    case Qt::ToolTipRole:
        if (column == Run)
            return tr("Evaluated at k = %1, relevant at rating ≥ %2").arg(e->settings.k).arg(e->settings.relevantAt);
        if (!std::isnan(interval.low))
            return tr("%1; 95% bootstrap interval over users %2").arg(formatNumber(value(index.row(), column)), formatInterval(interval));
        return {};
    case Qt::TextAlignmentRole:
        return alignment(column);
    case ValueRole:
        return column == Run ? QVariant() : QVariant(value(index.row(), column));
    case LowRole:
        return interval.low;
    case HighRole:
        return interval.high;
    case RunNameRole:
        return toQ(e->runName);
    default:
        return {};
    }
}

TableModelBase::ColumnSpec RunMetricsModel::columnSpec(int column) const
{
    using core::Metric;
    switch (column) {
    case Run:
        return textColumn(tr("Run"), tr("A model run: its scores and ranked lists."));
    case Users:
        return numberColumn(tr("Users"), aggregateTooltip("users"));
    case Rmse:
        return metricColumn(Metric::Rmse);
    case Mae:
        return metricColumn(Metric::Mae);
    case MeanError:
        return metricColumn(Metric::MeanError);
    case Precision:
        return metricColumn(Metric::Precision);
    case Recall:
        return metricColumn(Metric::Recall);
    case Ndcg:
        return metricColumn(Metric::Ndcg);
    case Map:
        return {tr("MAP@k"), aggregateTooltip("map")};
    case Mrr:
        return {tr("MRR"), aggregateTooltip("mrr")};
    case HitRate:
        return numberColumn(tr("Hit rate"), aggregateTooltip("hit_rate"));
    case HeldoutTopk:
        return metricColumn(Metric::HeldoutTopk);
    case Ild:
        return metricColumn(Metric::Ild);
    case Novelty:
        return metricColumn(Metric::Novelty);
    case Coverage:
        return numberColumn(tr("Coverage"), aggregateTooltip("coverage"));
    case Gini:
        return numberColumn(tr("Gini"), aggregateTooltip("gini"));
    case WarnedUsers:
        return numberColumn(tr("Users warned"), aggregateTooltip("warnings"));
    default:
        return {};
    }
}

} // namespace slatewise::ui
