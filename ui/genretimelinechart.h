// SPDX-License-Identifier: MIT
#pragma once

#include "ui/chartview.h"
#include "ui/genretimeline.h"

#include <QString>

namespace slatewise::ui {

/// One user's train history by genre, oldest to newest, as stacked genre shares per bucket;
/// the recent window is shaded and labelled so a recent binge is visible at a glance.
class GenreTimelineChart : public ChartView {
    Q_OBJECT
public:
    explicit GenreTimelineChart(QWidget* parent = nullptr);
    void setData(const GenreTimeline& timeline, const QString& userLabel);
    /// Convenience: builds the timeline from the dataset.
    void setData(const core::Dataset& data, core::UserIndex user, int recentWindow = 10);

protected:
    void rebuild(const ChartPalette& palette) override;

private:
    GenreTimeline m_timeline;
    QString m_user;
};

} // namespace slatewise::ui
