// SPDX-License-Identifier: MIT
#pragma once

#include "core/error.h"
#include "core/evaluation.h"
#include "ui/runerrors.h"

#include <QString>
#include <QStringList>

#include <cstdint>
#include <optional>
#include <vector>

namespace slatewise::ui {

/// A plain table for the pack (already formatted text cells).
struct PackTable {
    QString title;
    QStringList headers;
    std::vector<QStringList> rows;
    QString note; ///< printed under the table (e.g. "segment too small to judge")
};

/// One metric of a paired comparison (candidate − base). Filled from the core comparison.
struct PackComparisonRow {
    QString metric;              ///< trade name, e.g. "ndcg"
    bool higherIsBetter = true;
    std::int64_t n = 0;          ///< users compared
    double meanBase = 0, meanCandidate = 0, meanDiff = 0;
    double ciLow = 0, ciHigh = 0; ///< 95% interval of the mean difference
    double pT = 1, pWilcoxon = 1;
    double pHolm = -1;           ///< < 0 when no adjustment was made
    std::int64_t wins = 0, ties = 0, losses = 0;
};

struct PackSegmentRow {
    QString segment;   ///< e.g. "activity: quartile 1"
    QString metric;
    std::int64_t n = 0;
    double meanDiff = 0, ciLow = 0, ciHigh = 0, p = 1;
    bool tooSmall = false; ///< under the minimum segment size
};

struct PackComparison {
    QString base, candidate;
    std::vector<PackComparisonRow> rows;
    std::vector<PackSegmentRow> segments;
    std::vector<double> differences; ///< per-user differences of `differenceMetric`, for the chart
    core::Metric differenceMetric = core::Metric::Ndcg;
    QString note; ///< e.g. how p-values were adjusted
};

/// One worst-served user shown in depth.
struct PackCaseStudy {
    QString userId;
    QString runName;
    QString why;          ///< e.g. "lowest ndcg under run 'x' (0.00)"
    PackTable list;       ///< the run's top-k list with hit / seen / series markers
    PackTable withheld;   ///< withheld items by rating, with the run's score and rank
    QStringList warnings; ///< every warning sentence
    QStringList metrics;  ///< "ndcg 0.00 (run mean 0.31)" ...
};

/// Everything the meeting pack prints; the command line and the GUI fill it from core.
struct MeetingPackContent {
    QString workspaceName;
    QString generatedAt;     ///< ISO 8601
    QString settingsText;    ///< "k = 10, relevant at ≥ 4.0, 1000 bootstrap resamples"
    std::vector<core::RunEvaluation> runs; ///< per-user tables not needed
    std::vector<RunErrors> errors;           ///< optional: per-run errors for the distribution chart
    std::optional<PackComparison> comparison;
    PackTable worstUsers;    ///< the ten worst-served users
    std::vector<PackCaseStudy> caseStudies; ///< three users
};

/// Writes the meeting pack: a multi-page A4 PDF (QPdfWriter + QPainter) with the run summary,
/// the error-by-rating chart, the k-curves, warning prevalence, the comparison (with
/// "not significant" in words where the interval covers zero or p >= 0.05), the worst-served
/// users and the case studies. Needs a QGuiApplication (offscreen is fine).
class MeetingPack {
public:
    static core::Status write(const MeetingPackContent& content, const QString& path);
    /// The run summary table (one row per run, aggregates with 95% intervals) as text cells;
    /// the pack prints it turned (one column per run) to fit the page.
    static PackTable runSummary(const std::vector<core::RunEvaluation>& runs);
    /// "not significant (p = 0.41; the interval −0.01 to 0.02 includes 0)" or
    /// "significant: candidate better (p = 0.003)".
    static QString verdict(const PackComparisonRow& row);
};

} // namespace slatewise::ui
