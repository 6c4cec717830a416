// SPDX-License-Identifier: MIT
#pragma once

#include "core/ids.h"
#include "ui/chartview.h"

#include <QString>

#include <vector>

namespace slatewise::core {
struct Dataset;
struct RunData;
}

namespace slatewise::ui {

/// For one user: the run's score against the withheld rating of each withheld item, with
/// the diagonal "score = rating"; points above it were over-predicted.
class ScoreRatingChart : public ChartView {
    Q_OBJECT
public:
    struct Point {
        double rating = 0.0;
        double score = 0.0;
        QString title;
    };

    explicit ScoreRatingChart(QWidget* parent = nullptr);
    void setData(std::vector<Point> points, const QString& userLabel, const QString& runName,
                 double scaleMin = 1.0, double scaleMax = 5.0);
    /// Convenience: the user's scored withheld items under `run`.
    void setData(const core::Dataset& data, const core::RunData& run, core::UserIndex user);

    /// The points for (run, user): withheld items that have a score.
    static std::vector<Point> pointsFor(const core::Dataset& data, const core::RunData& run, core::UserIndex user);

protected:
    void rebuild(const ChartPalette& palette) override;

private:
    /// Range [low, high] with ticks every whole scale step counted from `origin`.
    static void setScaleRange(QCPAxis* axis, double low, double high, double origin);

    std::vector<Point> m_points;
    QString m_user, m_run;
    double m_min = 1.0, m_max = 5.0;
};

} // namespace slatewise::ui
