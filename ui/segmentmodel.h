// SPDX-License-Identifier: MIT
#pragma once

#include "core/metric.h"
#include "ui/tablemodelbase.h"

#include <memory>

namespace slatewise::core {
struct RunComparison;
}

namespace slatewise::ui {

/// The comparison broken down by user segment, for one metric: each segment's size, the
/// mean difference with its interval and adjusted p-value, and "too few users to judge"
/// where the segment is under the minimum size.
class SegmentModel : public TableModelBase {
    Q_OBJECT
public:
    enum Column { Segment, Judgement, Users, MeanBase, MeanCandidate, MeanDiff, Interval, PHolm, Verdict, ColumnCount };
    enum Role {
        ValueRole = Qt::UserRole, ///< double behind numeric cells
        TooSmallRole, ///< bool
        SegmentNameRole, ///< QString, e.g. "activity:q2"
    };

    explicit SegmentModel(QObject* parent = nullptr);
    ~SegmentModel() override;

    void setResults(std::shared_ptr<const core::RunComparison> comparison, core::Metric metric);

    int rowCount(const QModelIndex& parent = {}) const override;
    int columnCount(const QModelIndex& parent = {}) const override;
    QVariant data(const QModelIndex& index, int role = Qt::DisplayRole) const override;
    ColumnSpec columnSpec(int column) const override;

private:
    std::shared_ptr<const core::RunComparison> m_comparison;
    core::Metric m_metric = core::Metric::Ndcg;
};

} // namespace slatewise::ui
