// SPDX-License-Identifier: MIT
#include "ui/bandgrouping.h"

#include <algorithm>
#include <cmath>
#include <limits>

namespace slatewise::ui {

namespace {
// Ratings read from files can carry float noise (3.9999999); bands a thousandth apart are one.
bool sameRating(double a, double b)
{
    return std::abs(a - b) < 1e-6;
}
} // namespace

BandGrouping BandGrouping::build(const std::vector<core::RunEvaluation>& runs)
{
    BandGrouping g;
    for (const auto& run : runs) {
        if (!run.accuracy) {
            g.skippedRuns.push_back(run.runName);
            continue;
        }
        for (const auto& band : run.accuracy->bands) {
            if (std::none_of(g.ratings.begin(), g.ratings.end(),
                             [&](double r) { return sameRating(r, band.rating); }))
                g.ratings.push_back(band.rating);
        }
    }
    std::sort(g.ratings.begin(), g.ratings.end());
    const double nan = std::numeric_limits<double>::quiet_NaN();
    for (const auto& run : runs) {
        if (!run.accuracy)
            continue;
        g.runs.push_back(run.runName);
        std::vector<double> rmse(g.ratings.size(), nan), me(g.ratings.size(), nan);
        std::vector<std::int64_t> n(g.ratings.size(), 0);
        for (const auto& band : run.accuracy->bands) {
            for (std::size_t b = 0; b < g.ratings.size(); ++b) {
                if (sameRating(g.ratings[b], band.rating) && band.n > 0) {
                    rmse[b] = band.rmse;
                    me[b] = band.meanError;
                    n[b] = band.n;
                }
            }
        }
        g.rmse.push_back(std::move(rmse));
        g.meanError.push_back(std::move(me));
        g.n.push_back(std::move(n));
    }
    return g;
}

double BandGrouping::bandSpacing() const
{
    double spacing = std::numeric_limits<double>::infinity();
    for (std::size_t i = 1; i < ratings.size(); ++i)
        spacing = std::min(spacing, ratings[i] - ratings[i - 1]);
    return std::isfinite(spacing) && spacing > 0 ? spacing : 1.0;
}

double BandGrouping::barWidth() const
{
    const auto runCount = std::max<std::size_t>(1, runs.size());
    return bandSpacing() * groupWidth / static_cast<double>(runCount);
}

double BandGrouping::barCentre(std::size_t run, std::size_t band) const
{
    const auto runCount = static_cast<double>(std::max<std::size_t>(1, runs.size()));
    // Bars sit side by side, the group centred on the band's rating.
    return ratings[band] + barWidth() * (static_cast<double>(run) - (runCount - 1.0) / 2.0);
}

std::int64_t BandGrouping::bandCount(std::size_t band) const
{
    std::int64_t most = 0;
    for (const auto& perRun : n)
        most = std::max(most, perRun[band]);
    return most;
}

} // namespace slatewise::ui
