// SPDX-License-Identifier: MIT
#pragma once

#include <QSortFilterProxyModel>

namespace slatewise::ui {

class UserBrowserModel;

/// Sorting and filtering of the user browser. Sorting reads the source's columns directly
/// (no QVariant per comparison) so 200,000 rows re-sort quickly.
///
/// Ascending order means *worst first*: for a metric where higher is better the lowest value
/// comes first, where lower is better the highest, and where neither is (mean error,
/// popularity lift) the largest magnitude. Undefined values always sort last.
class UserBrowserProxy : public QSortFilterProxyModel {
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

protected:
    bool filterAcceptsRow(int sourceRow, const QModelIndex& sourceParent) const override;
    bool lessThan(const QModelIndex& left, const QModelIndex& right) const override;

private:
    /// Larger = worse, NaN = undefined, for a column.
    double badness(int sourceRow, int column) const;

    UserBrowserModel* m_browser = nullptr;
    int m_warning = kAnyOrNone;
    Segment m_segment = Segment::All;
    QString m_text;
};

} // namespace slatewise::ui
