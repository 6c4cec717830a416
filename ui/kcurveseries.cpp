// SPDX-License-Identifier: MIT
#include "ui/kcurveseries.h"

#include <algorithm>

namespace slatewise::ui {

KCurveSeries KCurveSeries::build(const std::vector<core::RunEvaluation>& runs, int maxK)
{
    KCurveSeries s;
    s.maxK = maxK;
    for (const auto& run : runs) {
        if (!run.ranking || run.ranking->curves.k.empty()) {
            s.skippedRuns.push_back(run.runName);
            continue;
        }
        s.evaluatedK = run.settings.k;
        s.runs.push_back(run.runName);
        const auto& c = run.ranking->curves;
        const std::vector<double>* sources[] = {&c.precision, &c.recall, &c.ndcg};
        for (int m = 0; m < static_cast<int>(Measure::Count); ++m) {
            Line line;
            line.run = run.runName;
            line.measure = static_cast<Measure>(m);
            const auto& values = *sources[m];
            for (std::size_t i = 0; i < c.k.size() && i < values.size(); ++i) {
                if (c.k[i] < 1 || c.k[i] > maxK)
                    continue;
                line.k.push_back(c.k[i]);
                line.value.push_back(values[i]);
            }
            s.lines.push_back(std::move(line));
        }
    }
    return s;
}

const KCurveSeries::Line* KCurveSeries::line(const std::string& run, Measure measure) const
{
    for (const auto& l : lines) {
        if (l.run == run && l.measure == measure)
            return &l;
    }
    return nullptr;
}

double KCurveSeries::maxValue(Measure measure) const
{
    double most = 0.0;
    for (const auto& l : lines) {
        if (l.measure != measure)
            continue;
        for (const double v : l.value)
            most = std::max(most, v); // NaN compares false and is skipped
    }
    return most;
}

const char* KCurveSeries::label(Measure measure)
{
    switch (measure) {
    case Measure::Precision:
        return "precision@k";
    case Measure::Recall:
        return "recall@k";
    case Measure::Ndcg:
        return "NDCG@k";
    case Measure::Count:
        break;
    }
    return "";
}

} // namespace slatewise::ui
