// SPDX-License-Identifier: MIT
#include "ui/worseusersmodel.h"

#include "core/comparisonresult.h"
#include "ui/format.h"

#include <QStringList>

#include <cmath>

namespace slatewise::ui {

namespace {
QString warningList(const std::vector<std::string>& codes)
{
    QStringList titles;
    for (const auto& code : codes) {
        if (auto w = core::warningFromKey(code))
            titles << toQ(core::warningInfo(*w).title);
        else
            titles << toQ(code);
    }
    return titles.isEmpty() ? QStringLiteral("–") : titles.join(QStringLiteral(", "));
}
} // namespace

WorseUsersModel::WorseUsersModel(QObject* parent) : TableModelBase(parent) {}
WorseUsersModel::~WorseUsersModel() = default;

void WorseUsersModel::setResults(std::shared_ptr<const core::RunComparison> comparison)
{
    beginResetModel();
    m_comparison = std::move(comparison);
    endResetModel();
}

int WorseUsersModel::rowCount(const QModelIndex& parent) const
{
    return parent.isValid() || !m_comparison ? 0 : static_cast<int>(m_comparison->whoGotWorse.size());
}

int WorseUsersModel::columnCount(const QModelIndex& parent) const
{
    return parent.isValid() ? 0 : ColumnCount;
}

QVariant WorseUsersModel::data(const QModelIndex& index, int role) const
{
    if (!checkIndex(index, CheckIndexOption::IndexIsValid | CheckIndexOption::ParentIsInvalid))
        return {};
    const auto& w = m_comparison->whoGotWorse[static_cast<std::size_t>(index.row())];
    const int c = index.column();
    const double value = c == Base ? w.base : c == Candidate ? w.candidate : c == Loss ? w.loss : std::nan("");
    switch (role) {
    case Qt::DisplayRole:
        switch (c) {
        case User:
            return toQ(w.userId);
        case Base:
        case Candidate:
            return formatMetric(m_comparison->primary, value);
        case Loss:
            return formatNumber(value, 3);
        case BaseWarnings:
            return warningList(w.baseWarnings);
        case CandidateWarnings:
            return warningList(w.candidateWarnings);
        default:
            return {};
        }
    case Qt::TextAlignmentRole:
        return alignment(c);
    case UserIndexRole:
        return QVariant::fromValue<quint32>(w.user.value);
    case ValueRole:
        return value;
    default:
        return {};
    }
}

TableModelBase::ColumnSpec WorseUsersModel::columnSpec(int column) const
{
    const QString metric = m_comparison ? toQ(core::metricInfo(m_comparison->primary).label) : tr("metric");
    switch (column) {
    case User:
        return textColumn(tr("User"), tr("Double-click to open the user in the inspector."));
    case Base:
        return numberColumn(tr("%1 (base)").arg(metric), {});
    case Candidate:
        return numberColumn(tr("%1 (candidate)").arg(metric), {});
    case Loss:
        return numberColumn(tr("Loss"), tr("How much worse the candidate serves this user, in the metric's unit."));
    case BaseWarnings:
        return textColumn(tr("Warnings (base)"), {});
    case CandidateWarnings:
        return textColumn(tr("Warnings (candidate)"), {});
    default:
        return {};
    }
}

} // namespace slatewise::ui
