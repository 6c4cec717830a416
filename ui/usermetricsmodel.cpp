// SPDX-License-Identifier: MIT
#include "ui/usermetricsmodel.h"

#include "ui/format.h"
#include "ui/userinspection.h"

#include <cmath>

namespace slatewise::ui {

UserMetricsModel::UserMetricsModel(QObject* parent) : TableModelBase(parent) {}
UserMetricsModel::~UserMetricsModel() = default;

void UserMetricsModel::setResults(std::shared_ptr<const UserInspection> inspection)
{
    beginResetModel();
    m_inspection = std::move(inspection);
    endResetModel();
}

int UserMetricsModel::rowCount(const QModelIndex& parent) const
{
    return parent.isValid() || !m_inspection ? 0 : static_cast<int>(core::kMetricCount);
}

int UserMetricsModel::columnCount(const QModelIndex& parent) const
{
    return parent.isValid() ? 0 : ColumnCount;
}

QVariant UserMetricsModel::data(const QModelIndex& index, int role) const
{
    if (!checkIndex(index, CheckIndexOption::IndexIsValid | CheckIndexOption::ParentIsInvalid))
        return {};
    const auto m = static_cast<core::Metric>(index.row());
    const auto r = static_cast<std::size_t>(index.row());
    const double user = m_inspection->metrics[r];
    const double mean = m_inspection->runMean[r];
    switch (role) {
    case Qt::DisplayRole:
        switch (index.column()) {
        case Metric:
            return toQ(core::metricInfo(m).label);
        case User:
            return formatMetric(m, user);
        case RunMean:
            return formatNumber(mean, 3);
        case Comparison: {
            if (std::isnan(user))
                return tr("not defined for this user");
            if (std::isnan(mean))
                return QString();
            const auto better = core::metricInfo(m).better;
            if (better == core::Better::Neither || std::abs(user - mean) < 1e-12)
                return user > mean ? tr("above average") : user < mean ? tr("below average") : tr("average");
            const bool worse = better == core::Better::Higher ? user < mean : user > mean;
            return worse ? tr("worse than average") : tr("better than average");
        }
        default:
            return {};
        }
    case Qt::ToolTipRole:
        return metricTooltip(m);
    case Qt::TextAlignmentRole:
        return alignment(index.column());
    case MetricRole:
        return index.row();
    case ValueRole:
        return index.column() == RunMean ? mean : user;
    default:
        return {};
    }
}

TableModelBase::ColumnSpec UserMetricsModel::columnSpec(int column) const
{
    switch (column) {
    case Metric:
        return textColumn(tr("Metric"), {});
    case User:
        return numberColumn(tr("This user"), {});
    case RunMean:
        return numberColumn(tr("Run average"), tr("Mean over the run's users for whom the metric is defined."));
    case Comparison:
        return textColumn(tr("Compared"), {});
    default:
        return {};
    }
}

} // namespace slatewise::ui
