// SPDX-License-Identifier: MIT
#pragma once

#include <QAbstractProxyModel>

#include <vector>

namespace slatewise::ui {

class UserBrowserModel;

/// Sorting and filtering of the user browser: a flat proxy that keeps the shown source rows
/// in one array. Sorting computes each row's key once and sorts that array directly (no
/// QModelIndex or QVariant per comparison), so 200,000 users re-sort in tens of
/// milliseconds; selections and the current row follow their users through a sort.
///
/// Ascending order means *worst first*: for a metric where higher is better the lowest value
/// comes first, where lower is better the highest, and where neither is (mean error,
/// popularity lift) the largest magnitude. Among equal values, more warnings and then more
/// withheld favourites read as worse. Undefined values always sort last, and remaining ties
/// keep the stored (user index) order in both directions.
class UserBrowserProxy : public QAbstractProxyModel {
    Q_OBJECT
public:
    /// Which users to show by history size.
    enum class Segment { All, Cold, Activity1, Activity2, Activity3, Activity4 };
    /// Special values for setWarningFilter besides a core::WarningCode.
    static constexpr int kAnyOrNone = -1;
    static constexpr int kAnyWarning = -2;
    static constexpr int kNoWarning = -3;

    explicit UserBrowserProxy(QObject* parent = nullptr);

    void setSourceModel(QAbstractItemModel* model) override;
    UserBrowserModel* browser() const;

    /// kAnyOrNone, kAnyWarning, kNoWarning or a core::WarningCode as int.
    void setWarningFilter(int filter);
    int warningFilter() const { return m_warning; }
    void setSegment(Segment segment);
    Segment segment() const { return m_segment; }
    /// Case-insensitive substring of the user id.
    void setUserText(const QString& text);

    /// sort(column, Qt::AscendingOrder): worst first.
    void sortWorstFirst(int column) { sort(column, Qt::AscendingOrder); }
    void sort(int column, Qt::SortOrder order = Qt::AscendingOrder) override;
    int sortColumn() const { return m_sortColumn; }
    Qt::SortOrder sortOrder() const { return m_sortOrder; }

    QModelIndex index(int row, int column, const QModelIndex& parent = {}) const override;
    QModelIndex parent(const QModelIndex& child) const override;
    int rowCount(const QModelIndex& parent = {}) const override;
    int columnCount(const QModelIndex& parent = {}) const override;
    bool hasChildren(const QModelIndex& parent = {}) const override;
    QModelIndex mapToSource(const QModelIndex& proxyIndex) const override;
    QModelIndex mapFromSource(const QModelIndex& sourceIndex) const override;
    QVariant headerData(int section, Qt::Orientation orientation, int role = Qt::DisplayRole) const override;

private:
    bool accepts(int sourceRow) const;
    /// Source rows passing the filters, in the current sort order.
    std::vector<int> orderedRows() const;
    /// Larger = worse, NaN = undefined, for a column.
    double badness(int sourceRow, int column) const;
    /// Replaces the shown rows, moving persistent indexes with their source rows.
    void applyLayout(std::vector<int> rows);
    void rebuildFromSource();
    void refilter();

    UserBrowserModel* m_browser = nullptr;
    std::vector<int> m_rows; ///< proxy row → source row
    std::vector<int> m_inverse; ///< source row → proxy row, -1 when filtered out
    int m_sortColumn = -1;
    Qt::SortOrder m_sortOrder = Qt::AscendingOrder;
    int m_warning = kAnyOrNone;
    Segment m_segment = Segment::All;
    QString m_text;
};

} // namespace slatewise::ui
