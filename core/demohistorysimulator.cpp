// SPDX-License-Identifier: MIT
#include "core/demohistorysimulator.h"

#include "core/demorandom.h"
#include "core/demotastemodel.h"

#include <algorithm>
#include <cmath>

namespace slatewise::core {

namespace {
constexpr std::int64_t kDay = 86400;

int starsFrom(double x)
{
    const double r = std::floor(x + 0.5);
    return static_cast<int>(std::clamp(r, 1.0, 5.0));
}

bool hasGenre(const DemoTitle& t, int g) { return std::find(t.genres.begin(), t.genres.end(), g) != t.genres.end(); }

/// `n` strictly increasing evening timestamps between two instants (18:00-23:00 UTC).
std::vector<std::int64_t> eveningTimes(DemoRandom& rng, int n, std::int64_t from, std::int64_t to)
{
    std::vector<std::int64_t> times;
    const std::int64_t firstDay = from / kDay;
    const std::int64_t days = std::max<std::int64_t>(1, to / kDay - firstDay);
    for (int k = 0; k < n; ++k) {
        const std::int64_t day = firstDay + static_cast<std::int64_t>(rng.uniform() * static_cast<double>(days));
        times.push_back(day * kDay + 18 * 3600 + rng.below(5 * 3600));
    }
    std::sort(times.begin(), times.end());
    for (std::size_t k = 1; k < times.size(); ++k)
        times[k] = std::max(times[k], times[k - 1] + 60);
    return times;
}
} // namespace

int DemoHistorySimulator::withheldCount(int n)
{
    if (n < 2)
        return 0;
    return std::max(1, (2 * n + 5) / 10);
}

std::vector<DemoHistory> DemoHistorySimulator::simulate(const DemoTasteModel& model, const DemoRandom& rootRng)
{
    const auto& titles = model.titles();
    const auto& series = model.series();
    const int titleCount = static_cast<int>(titles.size());
    std::vector<DemoHistory> out;
    out.reserve(model.members().size());

    for (std::size_t mi = 0; mi < model.members().size(); ++mi) {
        const DemoMember& m = model.members()[mi];
        const int u = static_cast<int>(mi);
        DemoRandom rng = rootRng.fork(1000 + mi);
        const int n = std::min(m.interactions, titleCount);
        const int w = withheldCount(n);
        const int t = n - w;
        const bool fan = m.kind == DemoMemberKind::SeriesFan;
        const bool binge = m.kind == DemoMemberKind::Binge;

        std::vector<double> base(static_cast<std::size_t>(titleCount));
        for (int i = 0; i < titleCount; ++i)
            base[static_cast<std::size_t>(i)] = model.choiceWeight(u, i);
        std::vector<int> pureBinge;
        if (binge)
            pureBinge = model.pureTitles(m.bingeGenre);

        // Which positions of a binge member's sequence belong to the binge: 8 of the last
        // 10 train ratings and about half of the withheld ones.
        std::vector<bool> bingePick(static_cast<std::size_t>(n), false);
        if (binge) {
            std::vector<int> window;
            for (int k = std::max(0, t - 10); k < t; ++k)
                window.push_back(k);
            for (int skip = 0; skip < 2 && !window.empty(); ++skip)
                window.erase(window.begin() + rng.below(static_cast<std::uint32_t>(window.size())));
            for (int k : window)
                bingePick[static_cast<std::size_t>(k)] = true;
            for (int k = t; k < n; ++k)
                bingePick[static_cast<std::size_t>(k)] = rng.chance(0.5);
        }

        std::vector<bool> seen(static_cast<std::size_t>(titleCount), false);
        std::vector<int> sequence;
        int inProgress = -1; // series whose next part a fan is waiting to watch
        std::vector<double> cumulative(static_cast<std::size_t>(titleCount));
        for (int k = 0; k < n; ++k) {
            int chosen = -1;
            if (fan && inProgress >= 0 && rng.chance(0.6)) {
                for (int p : series[static_cast<std::size_t>(inProgress)].parts)
                    if (!seen[static_cast<std::size_t>(p)]) {
                        chosen = p;
                        break;
                    }
            }
            if (chosen < 0 && bingePick[static_cast<std::size_t>(k)]) {
                double total = 0.0;
                std::vector<double> cum;
                for (int p : pureBinge) {
                    total += seen[static_cast<std::size_t>(p)] ? 0.0 : base[static_cast<std::size_t>(p)];
                    cum.push_back(total);
                }
                if (total > 0.0)
                    chosen = pureBinge[rng.pickCumulative(cum)];
            }
            if (chosen < 0) {
                const bool beforeBinge = binge && k < t - 10;
                double total = 0.0;
                for (int i = 0; i < titleCount; ++i) {
                    const auto& ti = titles[static_cast<std::size_t>(i)];
                    double wgt = seen[static_cast<std::size_t>(i)] ? 0.0 : base[static_cast<std::size_t>(i)];
                    if (ti.part > 1) {
                        const int prev = series[static_cast<std::size_t>(ti.series)].parts[static_cast<std::size_t>(ti.part - 2)];
                        if (!seen[static_cast<std::size_t>(prev)])
                            wgt *= fan ? 0.0 : 0.25;
                    }
                    if (fan && ti.part == 1)
                        wgt *= 3.0;
                    // Before the binge the genre was not for them.
                    if (beforeBinge && hasGenre(ti, m.bingeGenre))
                        wgt *= 0.08;
                    if (binge && !beforeBinge && k < t && hasGenre(ti, m.bingeGenre))
                        wgt *= 0.3; // the binge picks above carry the genre; keep the rest varied
                    total += wgt;
                    cumulative[static_cast<std::size_t>(i)] = total;
                }
                chosen = static_cast<int>(rng.pickCumulative(cumulative));
            }
            seen[static_cast<std::size_t>(chosen)] = true;
            sequence.push_back(chosen);
            const auto& ct = titles[static_cast<std::size_t>(chosen)];
            if (fan && ct.series >= 0)
                inProgress = ct.series;
        }

        // Timestamps: evenings from joining to the end; a binge fills the last four weeks.
        std::vector<std::int64_t> times;
        const std::int64_t end = DemoTasteModel::kEnd - static_cast<std::int64_t>(rng.below(3)) * kDay;
        if (binge) {
            const int bingeStart = std::max(0, t - 10);
            times = eveningTimes(rng, bingeStart, m.joined, end - 30 * kDay);
            const auto recent = eveningTimes(rng, n - bingeStart, end - 28 * kDay, end);
            times.insert(times.end(), recent.begin(), recent.end());
        } else {
            times = eveningTimes(rng, n, m.joined, end);
        }

        DemoHistory h;
        for (int k = 0; k < n; ++k) {
            const int title = sequence[static_cast<std::size_t>(k)];
            DemoInteraction x{title, starsFrom(model.expectedRating(u, title) + rng.normal(0.0, 0.65)),
                              times[static_cast<std::size_t>(k)]};
            (k < t ? h.train : h.withheld).push_back(x);
        }
        out.push_back(std::move(h));
    }
    return out;
}

} // namespace slatewise::core
