// SPDX-License-Identifier: MIT
#include "ui/userbrowserproxy.h"

#include "core/metric.h"
#include "ui/userbrowsermodel.h"

#include <algorithm>
#include <cmath>
#include <numeric>

namespace slatewise::ui {

UserBrowserProxy::UserBrowserProxy(QObject* parent)
    : QAbstractProxyModel(parent)
{
}

void UserBrowserProxy::setSourceModel(QAbstractItemModel* model)
{
    beginResetModel();
    if (QAbstractItemModel* old = sourceModel())
        disconnect(old, nullptr, this, nullptr);
    m_browser = qobject_cast<UserBrowserModel*>(model);
    QAbstractProxyModel::setSourceModel(model);
    if (model) {
        // The browser's data changes only by a reset (a new run or new settings); any
        // structural change is handled the same way, re-applying the filters and the order.
        connect(model, &QAbstractItemModel::modelAboutToBeReset, this, &UserBrowserProxy::beginResetModel);
        connect(model, &QAbstractItemModel::modelReset, this, [this] {
            rebuildFromSource();
            endResetModel();
        });
        for (auto signal : { &QAbstractItemModel::rowsInserted, &QAbstractItemModel::rowsRemoved,
                 &QAbstractItemModel::columnsInserted, &QAbstractItemModel::columnsRemoved })
            connect(model, signal, this, [this] {
                beginResetModel();
                rebuildFromSource();
                endResetModel();
            });
        connect(model, &QAbstractItemModel::layoutChanged, this, [this] { applyLayout(orderedRows()); });
        connect(model, &QAbstractItemModel::dataChanged, this,
            [this](const QModelIndex& topLeft, const QModelIndex& bottomRight, const QList<int>& roles) {
                if (m_rows.empty())
                    return;
                // Rows may be scattered in the proxy; report the whole span of columns.
                emit dataChanged(index(0, topLeft.column()),
                    index(static_cast<int>(m_rows.size()) - 1, bottomRight.column()), roles);
            });
        connect(model, &QAbstractItemModel::headerDataChanged, this, &UserBrowserProxy::headerDataChanged);
    }
    rebuildFromSource();
    endResetModel();
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
    refilter();
}

void UserBrowserProxy::setSegment(Segment segment)
{
    if (segment == m_segment)
        return;
    m_segment = segment;
    refilter();
}

void UserBrowserProxy::setUserText(const QString& text)
{
    if (text == m_text)
        return;
    m_text = text;
    refilter();
}

void UserBrowserProxy::sort(int column, Qt::SortOrder order)
{
    m_sortColumn = column;
    m_sortOrder = order;
    applyLayout(orderedRows());
}

QModelIndex UserBrowserProxy::index(int row, int column, const QModelIndex& parent) const
{
    if (parent.isValid() || row < 0 || column < 0 || row >= rowCount() || column >= columnCount())
        return {};
    return createIndex(row, column);
}

QModelIndex UserBrowserProxy::parent(const QModelIndex&) const
{
    return {};
}

int UserBrowserProxy::rowCount(const QModelIndex& parent) const
{
    return parent.isValid() ? 0 : static_cast<int>(m_rows.size());
}

int UserBrowserProxy::columnCount(const QModelIndex& parent) const
{
    return parent.isValid() || !sourceModel() ? 0 : sourceModel()->columnCount();
}

bool UserBrowserProxy::hasChildren(const QModelIndex& parent) const
{
    return !parent.isValid() && !m_rows.empty() && columnCount() > 0;
}

QModelIndex UserBrowserProxy::mapToSource(const QModelIndex& proxyIndex) const
{
    if (!proxyIndex.isValid() || !sourceModel() || proxyIndex.model() != this
        || proxyIndex.row() >= static_cast<int>(m_rows.size()))
        return {};
    return sourceModel()->index(m_rows[static_cast<std::size_t>(proxyIndex.row())], proxyIndex.column());
}

QModelIndex UserBrowserProxy::mapFromSource(const QModelIndex& sourceIndex) const
{
    if (!sourceIndex.isValid() || sourceIndex.model() != sourceModel()
        || sourceIndex.row() >= static_cast<int>(m_inverse.size()))
        return {};
    const int row = m_inverse[static_cast<std::size_t>(sourceIndex.row())];
    return row < 0 ? QModelIndex() : index(row, sourceIndex.column());
}

QVariant UserBrowserProxy::headerData(int section, Qt::Orientation orientation, int role) const
{
    if (!sourceModel())
        return {};
    if (orientation == Qt::Horizontal)
        return sourceModel()->headerData(section, orientation, role);
    // Row headers count the shown rows (1 = worst under the current order).
    if (role == Qt::DisplayRole && section >= 0 && section < rowCount())
        return section + 1;
    return {};
}

bool UserBrowserProxy::accepts(int sourceRow) const
{
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
        if (m_browser->activityQuartile(sourceRow)
            != static_cast<int>(m_segment) - static_cast<int>(Segment::Activity1) + 1)
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

std::vector<int> UserBrowserProxy::orderedRows() const
{
    std::vector<int> rows;
    if (!m_browser)
        return rows;
    const int n = m_browser->rowCount();
    rows.reserve(static_cast<std::size_t>(n));
    for (int r = 0; r < n; ++r)
        if (accepts(r))
            rows.push_back(r);
    const int column = m_sortColumn;
    if (column < 0 || column >= m_browser->columnCount())
        return rows;
    const bool ascending = m_sortOrder == Qt::AscendingOrder;

    if (column == UserBrowserModel::UserId) {
        std::vector<QString> keys(static_cast<std::size_t>(n));
        for (int r : rows)
            keys[static_cast<std::size_t>(r)] = m_browser->userId(r).toCaseFolded();
        std::sort(rows.begin(), rows.end(), [&](int a, int b) {
            const int c = keys[static_cast<std::size_t>(a)].compare(keys[static_cast<std::size_t>(b)]);
            return c != 0 ? (ascending ? c < 0 : c > 0) : a < b;
        });
        return rows;
    }

    // One key per row, read once: badness, then warnings and favourites as tie-breakers.
    struct Key {
        double bad;
        double warnings;
        double relevant;
    };
    std::vector<Key> keys(static_cast<std::size_t>(n));
    const bool tieBreak = column != UserBrowserModel::Warnings;
    for (int r : rows) {
        Key& k = keys[static_cast<std::size_t>(r)];
        k.bad = badness(r, column);
        k.warnings = tieBreak ? m_browser->sortValue(r, UserBrowserModel::Warnings) : 0.0;
        k.relevant = tieBreak ? m_browser->sortValue(r, UserBrowserModel::Relevant) : 0.0;
    }
    std::sort(rows.begin(), rows.end(), [&](int a, int b) {
        const Key& x = keys[static_cast<std::size_t>(a)];
        const Key& y = keys[static_cast<std::size_t>(b)];
        const bool xn = std::isnan(x.bad), yn = std::isnan(y.bad);
        if (xn != yn)
            return yn; // undefined last in both directions
        if (!xn) {
            // Worst first ascending; best first descending, tie-breakers flipped with it.
            if (x.bad != y.bad)
                return ascending ? x.bad > y.bad : x.bad < y.bad;
            if (x.warnings != y.warnings)
                return ascending ? x.warnings > y.warnings : x.warnings < y.warnings;
            if (x.relevant != y.relevant)
                return ascending ? x.relevant > y.relevant : x.relevant < y.relevant;
        }
        return a < b;
    });
    return rows;
}

void UserBrowserProxy::applyLayout(std::vector<int> rows)
{
    emit layoutAboutToBeChanged({}, QAbstractItemModel::VerticalSortHint);
    const QModelIndexList before = persistentIndexList();
    std::vector<std::pair<int, int>> sources; // (source row, column) of each persistent index
    sources.reserve(static_cast<std::size_t>(before.size()));
    for (const QModelIndex& p : before)
        sources.emplace_back(m_rows[static_cast<std::size_t>(p.row())], p.column());
    m_rows = std::move(rows);
    m_inverse.assign(m_browser ? static_cast<std::size_t>(m_browser->rowCount()) : 0, -1);
    for (std::size_t p = 0; p < m_rows.size(); ++p)
        m_inverse[static_cast<std::size_t>(m_rows[p])] = static_cast<int>(p);
    QModelIndexList after;
    after.reserve(before.size());
    for (const auto& [row, column] : sources) {
        const int moved = m_inverse[static_cast<std::size_t>(row)];
        after.append(moved < 0 ? QModelIndex() : index(moved, column));
    }
    changePersistentIndexList(before, after);
    emit layoutChanged({}, QAbstractItemModel::VerticalSortHint);
}

void UserBrowserProxy::rebuildFromSource()
{
    m_rows = orderedRows();
    m_inverse.assign(m_browser ? static_cast<std::size_t>(m_browser->rowCount()) : 0, -1);
    for (std::size_t p = 0; p < m_rows.size(); ++p)
        m_inverse[static_cast<std::size_t>(m_rows[p])] = static_cast<int>(p);
}

void UserBrowserProxy::refilter()
{
    // Rows come and go, so views are told by a reset rather than a layout change.
    beginResetModel();
    rebuildFromSource();
    endResetModel();
}

} // namespace slatewise::ui
