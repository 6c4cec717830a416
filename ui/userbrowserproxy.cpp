// SPDX-License-Identifier: MIT
#include "ui/userbrowserproxy.h"

#include "core/metric.h"
#include "ui/userbrowsermodel.h"

#include <cmath>

namespace slatewise::ui {

UserBrowserProxy::UserBrowserProxy(QObject* parent) : QSortFilterProxyModel(parent)
{
    // Re-sorting on every data change would fight the user's chosen order; models reset anyway.
    setDynamicSortFilter(false);
}

void UserBrowserProxy::setSourceModel(QAbstractItemModel* model)
{
    m_browser = qobject_cast<UserBrowserModel*>(model);
    QSortFilterProxyModel::setSourceModel(model);
}

UserBrowserModel* UserBrowserProxy::browser() const
{
    return m_browser;
}

void UserBrowserProxy::setWarningFilter(int filter)
{
    if (filter == m_warning)
        return;
    m_warning = filter;
    invalidateFilter();
}

void UserBrowserProxy::setSegment(Segment segment)
{
    if (segment == m_segment)
        return;
    m_segment = segment;
    invalidateFilter();
}

void UserBrowserProxy::setUserText(const QString& text)
{
    if (text == m_text)
        return;
    m_text = text;
    invalidateFilter();
}

bool UserBrowserProxy::filterAcceptsRow(int sourceRow, const QModelIndex& sourceParent) const
{
    if (sourceParent.isValid() || !m_browser)
        return false;
    const std::uint32_t mask = m_browser->warningMask(sourceRow);
    if (m_warning == kAnyWarning && mask == 0)
        return false;
    if (m_warning == kNoWarning && mask != 0)
        return false;
    if (m_warning >= 0 && (mask & (1u << static_cast<unsigned>(m_warning))) == 0)
        return false;
    switch (m_segment) {
    case Segment::All:
        break;
    case Segment::Cold:
        if (!m_browser->isCold(sourceRow))
            return false;
        break;
    case Segment::Activity1:
    case Segment::Activity2:
    case Segment::Activity3:
    case Segment::Activity4:
        if (m_browser->activityQuartile(sourceRow) != static_cast<int>(m_segment) - static_cast<int>(Segment::Activity1) + 1)
            return false;
        break;
    }
    if (!m_text.isEmpty() && !m_browser->userId(sourceRow).contains(m_text, Qt::CaseInsensitive))
        return false;
    return true;
}

double UserBrowserProxy::badness(int sourceRow, int column) const
{
    const double v = m_browser->sortValue(sourceRow, column);
    if (std::isnan(v))
        return v;
    if (auto m = UserBrowserModel::metricOf(column)) {
        switch (core::metricInfo(*m).better) {
        case core::Better::Higher:
            return -v;
        case core::Better::Lower:
            return v;
        case core::Better::Neither:
            return std::abs(v);
        }
    }
    // More warnings is worse; less history, fewer withheld items or favourites make a user
    // harder to serve, so they come first too.
    if (column == UserBrowserModel::Warnings)
        return v;
    return -v;
}

bool UserBrowserProxy::lessThan(const QModelIndex& left, const QModelIndex& right) const
{
    if (!m_browser)
        return QSortFilterProxyModel::lessThan(left, right);
    const int column = left.column();
    if (column == UserBrowserModel::UserId) {
        const int c = QString::compare(m_browser->userId(left.row()), m_browser->userId(right.row()), Qt::CaseInsensitive);
        return c != 0 ? c < 0 : left.row() < right.row();
    }
    const double a = badness(left.row(), column);
    const double b = badness(right.row(), column);
    // Undefined values go last in both directions: Qt sorts descending by swapping the
    // arguments, so the NaN rule flips with the order.
    const bool ascending = sortOrder() == Qt::AscendingOrder;
    if (std::isnan(a) || std::isnan(b)) {
        if (std::isnan(a) && std::isnan(b))
            return ascending ? left.row() < right.row() : left.row() > right.row();
        return std::isnan(a) ? !ascending : ascending;
    }
    if (a != b)
        return a > b;
    // Many users tie (an NDCG of 0 is common), so among equals the user carrying more
    // warnings, then the one with more withheld favourites the run missed, reads as worse.
    if (column != UserBrowserModel::Warnings) {
        const double wa = m_browser->sortValue(left.row(), UserBrowserModel::Warnings);
        const double wb = m_browser->sortValue(right.row(), UserBrowserModel::Warnings);
        if (wa != wb)
            return wa > wb;
        const double ra = m_browser->sortValue(left.row(), UserBrowserModel::Relevant);
        const double rb = m_browser->sortValue(right.row(), UserBrowserModel::Relevant);
        if (ra != rb)
            return ra > rb;
    }
    // Remaining ties keep the stored (user index) order in both directions.
    return ascending ? left.row() < right.row() : left.row() > right.row();
}

} // namespace slatewise::ui
