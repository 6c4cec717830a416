// SPDX-License-Identifier: MIT
#include "ui/userbrowsermodel.h"

#include "core/evaluation.h"
#include "ui/format.h"

#include <algorithm>
#include <cmath>

namespace slatewise::ui {

UserBrowserModel::UserBrowserModel(QObject* parent) : TableModelBase(parent) {}
UserBrowserModel::~UserBrowserModel() = default;

void UserBrowserModel::setResults(std::shared_ptr<const core::RunEvaluation> evaluation,
                                  std::shared_ptr<const std::vector<std::string>> userIds)
{
    beginResetModel();
    m_eval = std::move(evaluation);
    m_userIds = std::move(userIds);
    m_warningMask.clear();
    m_bounds.clear();
    if (m_eval) {
        const auto& table = m_eval->users;
        m_warningMask.assign(table.size(), 0u);
        // Warnings are sorted by user, as are the table's rows: one merge pass.
        std::size_t row = 0;
        for (const auto& w : m_eval->warnings) {
            while (row < table.size() && table.users[row] < w.user)
                ++row;
            if (row < table.size() && table.users[row] == w.user)
                m_warningMask[row] |= 1u << static_cast<unsigned>(w.code);
        }
        if (!table.nTrain.empty()) {
            std::vector<std::int32_t> sorted = table.nTrain;
            std::sort(sorted.begin(), sorted.end());
            const auto at = [&](double q) { return sorted[static_cast<std::size_t>(q * static_cast<double>(sorted.size() - 1))]; };
            m_bounds = {at(0.25), at(0.5), at(0.75)};
        }
    }
    endResetModel();
}

int UserBrowserModel::rowCount(const QModelIndex& parent) const
{
    return parent.isValid() || !m_eval ? 0 : static_cast<int>(m_eval->users.size());
}

int UserBrowserModel::columnCount(const QModelIndex& parent) const
{
    return parent.isValid() ? 0 : ColumnCount;
}

std::optional<core::Metric> UserBrowserModel::metricOf(int column)
{
    if (column < FirstMetric || column >= ColumnCount)
        return std::nullopt;
    return static_cast<core::Metric>(column - FirstMetric);
}

double UserBrowserModel::sortValue(int row, int column) const
{
    const auto r = static_cast<std::size_t>(row);
    const auto& t = m_eval->users;
    switch (column) {
    case UserId:
        return static_cast<double>(t.users[r].value);
    case Warnings:
        return t.warningCount[r];
    case Train:
        return t.nTrain[r];
    case Withheld:
        return t.nWithheld[r];
    case Relevant:
        return t.nRelevant[r];
    default:
        break;
    }
    if (auto m = metricOf(column))
        return t.value(*m, r);
    return std::nan("");
}

core::UserIndex UserBrowserModel::userAt(int row) const
{
    return m_eval->users.users[static_cast<std::size_t>(row)];
}

int UserBrowserModel::rowOfUser(core::UserIndex user) const
{
    if (!m_eval)
        return -1;
    const auto& users = m_eval->users.users;
    auto it = std::lower_bound(users.begin(), users.end(), user);
    if (it == users.end() || *it != user)
        return -1;
    return static_cast<int>(it - users.begin());
}

QString UserBrowserModel::userIdOf(core::UserIndex user) const
{
    if (m_userIds && user.value < m_userIds->size())
        return toQ((*m_userIds)[user.value]);
    return QStringLiteral("#%1").arg(user.value);
}

QString UserBrowserModel::userId(int row) const
{
    return userIdOf(userAt(row));
}

int UserBrowserModel::activityQuartile(int row) const
{
    if (m_bounds.size() != 3)
        return 1;
    const auto n = m_eval->users.nTrain[static_cast<std::size_t>(row)];
    if (n <= m_bounds[0])
        return 1;
    if (n <= m_bounds[1])
        return 2;
    if (n <= m_bounds[2])
        return 3;
    return 4;
}

bool UserBrowserModel::isCold(int row) const
{
    return m_eval->users.nTrain[static_cast<std::size_t>(row)] < m_eval->settings.warn.coldTrain;
}

QVariant UserBrowserModel::data(const QModelIndex& index, int role) const
{
    if (!checkIndex(index, CheckIndexOption::IndexIsValid | CheckIndexOption::ParentIsInvalid) || !m_eval)
        return {};
    const int row = index.row();
    const int column = index.column();
    switch (role) {
    case Qt::DisplayRole: {
        if (column == UserId)
            return userId(row);
        if (auto m = metricOf(column))
            return formatMetric(*m, sortValue(row, column));
        return QString::number(static_cast<qint64>(sortValue(row, column)));
    }
    case Qt::TextAlignmentRole:
        return alignment(column);
    case Qt::ToolTipRole:
        if (column == Warnings && warningMask(row) != 0) {
            QStringList names;
            for (const auto& w : core::allWarnings())
                if (warningMask(row) & (1u << static_cast<unsigned>(w.code)))
                    names << toQ(w.title);
            return names.join(QStringLiteral(", "));
        }
        return {};
    case SortValueRole:
        return sortValue(row, column);
    case UserIndexRole:
        return QVariant::fromValue<quint32>(userAt(row).value);
    case WarningMaskRole:
        return QVariant::fromValue<quint32>(warningMask(row));
    default:
        return {};
    }
}

TableModelBase::ColumnSpec UserBrowserModel::columnSpec(int column) const
{
    switch (column) {
    case UserId:
        return textColumn(tr("User"), tr("The user's id as given in the input files."));
    case Warnings:
        return numberColumn(tr("Warnings"), tr("How many kinds of warning this run raises for the user."));
    case Train:
        return numberColumn(tr("History"), tr("Activity: the user's train interactions (their history)."));
    case Withheld:
        return numberColumn(tr("Withheld"), tr("The user's withheld interactions the run is judged on."));
    case Relevant:
        return numberColumn(tr("Favourites"),
                            tr("Withheld items rated at or above the relevance threshold (the items a good list should hold)."));
    default:
        break;
    }
    if (auto m = metricOf(column))
        return metricColumn(*m);
    return {};
}

} // namespace slatewise::ui
