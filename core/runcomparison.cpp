// SPDX-License-Identifier: MIT
#include "core/runcomparison.h"

#include "core/bootstrap.h"
#include "core/holmadjustment.h"
#include "core/pairedoutcomes.h"
#include "core/pairedttest.h"
#include "core/parallel.h"
#include "core/usersegment.h"
#include "core/warning.h"
#include "core/wilcoxontest.h"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <numeric>

namespace slatewise::core {

namespace {

std::string fmt(double v, const char* spec = "%.4g")
{
    if (std::isnan(v))
        return "n/a";
    char buffer[64];
    std::snprintf(buffer, sizeof buffer, spec, v);
    return buffer;
}

std::string percent(double level)
{
    return fmt(level * 100.0, "%.0f") + "%";
}

/// Bit masks of the warnings each user carries in one run, by user index.
std::vector<std::uint32_t> warningMasks(const RunEvaluation& e, std::size_t users)
{
    std::vector<std::uint32_t> masks(users, 0u);
    for (const UserWarning& w : e.warnings)
        if (w.user.value < users)
            masks[w.user.value] |= 1u << static_cast<unsigned>(w.code);
    return masks;
}

std::vector<std::string> warningKeys(std::uint32_t mask)
{
    std::vector<std::string> keys;
    for (const auto& info : allWarnings())
        if (mask & (1u << static_cast<unsigned>(info.code)))
            keys.emplace_back(info.key);
    return keys;
}

/// Paired values of one metric for the users both runs define it for, in base-table order.
struct Paired {
    std::vector<UserIndex> users;
    std::vector<double> base, candidate;
};

Paired pairValues(
    const RunEvaluation& base, const RunEvaluation& candidate, const std::vector<std::int64_t>& candidateRow, Metric m)
{
    Paired p;
    const auto& bc = base.users.column(m);
    const auto& cc = candidate.users.column(m);
    for (std::size_t r = 0; r < base.users.size(); ++r) {
        const UserIndex u = base.users.users[r];
        if (u.value >= candidateRow.size() || candidateRow[u.value] < 0)
            continue;
        const double b = bc[r];
        const double c = cc[static_cast<std::size_t>(candidateRow[u.value])];
        if (std::isnan(b) || std::isnan(c))
            continue;
        p.users.push_back(u);
        p.base.push_back(b);
        p.candidate.push_back(c);
    }
    return p;
}

Paired restrict(const Paired& all, const std::vector<char>& member)
{
    Paired p;
    for (std::size_t i = 0; i < all.users.size(); ++i) {
        if (!member[all.users[i].value])
            continue;
        p.users.push_back(all.users[i]);
        p.base.push_back(all.base[i]);
        p.candidate.push_back(all.candidate[i]);
    }
    return p;
}

std::string tests(std::size_t n)
{
    return std::to_string(n) + (n == 1 ? " test" : " tests");
}

std::string holmNote(std::size_t count, const std::string& family)
{
    return "p_holm: paired t-test p-values adjusted by Holm-Bonferroni (Holm 1979) across the " + tests(count) + " of "
        + family + "; p_holm_wilcoxon does the same for the Wilcoxon p-values. Significance is judged on p_holm.";
}

/// Adjusts a family in place (by pointer, so metrics and segment rows share one code path).
void adjustFamily(const std::vector<MetricComparison*>& family, const ComparisonSettings& settings)
{
    std::vector<double> pt, pw;
    for (const auto* m : family) {
        pt.push_back(m->pT);
        pw.push_back(m->pWilcoxon);
    }
    const std::vector<double> at = holmAdjust(pt);
    const std::vector<double> aw = holmAdjust(pw);
    for (std::size_t i = 0; i < family.size(); ++i) {
        family[i]->pHolm = at[i];
        family[i]->pHolmWilcoxon = aw[i];
        family[i]->significant = !family[i]->tooSmall && !std::isnan(at[i]) && at[i] < settings.alpha;
        family[i]->verdict = comparisonVerdict(*family[i], settings);
    }
}

std::size_t countTests(const std::vector<MetricComparison*>& family)
{
    return static_cast<std::size_t>(
        std::count_if(family.begin(), family.end(), [](const MetricComparison* m) { return !std::isnan(m->pT); }));
}

/// Percentile bootstrap interval of the mean of `d` (users resampled with replacement).
/// A single column needs no counting pass: each resample sums n random entries directly,
/// from its own SplitMix64 stream seeded by (seed, b), so results do not depend on threads.
/// About 5x faster than the general table bootstrap at 160,000 users.
Interval meanDifferenceInterval(const std::vector<double>& d, std::int32_t resamples, std::uint64_t seed, double level)
{
    const std::size_t n = d.size();
    std::vector<double> means(static_cast<std::size_t>(resamples));
    parallelFor(means.size(), [&](std::size_t begin, std::size_t end, unsigned) {
        for (std::size_t b = begin; b < end; ++b) {
            std::uint64_t state = seed ^ (0xD1B54A32D192ED03ULL * (static_cast<std::uint64_t>(b) + 1));
            auto next = [&state] {
                std::uint64_t z = (state += 0x9E3779B97F4A7C15ULL);
                z = (z ^ (z >> 30)) * 0xBF58476D1CE4E5B9ULL;
                z = (z ^ (z >> 27)) * 0x94D049BB133111EBULL;
                return z ^ (z >> 31);
            };
            double sum = 0.0;
            for (std::size_t i = 0; i < n; ++i) {
                __extension__ using Uint128 = unsigned __int128;
                sum += d[static_cast<std::size_t>((static_cast<Uint128>(next()) * n) >> 64)];
            }
            means[b] = sum / static_cast<double>(n);
        }
    });
    return Bootstrap::percentileInterval(std::move(means), level);
}

} // namespace

MetricComparison compareValues(
    Metric metric, std::span<const double> base, std::span<const double> candidate, const ComparisonSettings& settings)
{
    MetricComparison m;
    m.metric = metric;
    const std::size_t n = std::min(base.size(), candidate.size());
    m.n = static_cast<std::int64_t>(n);
    m.tooSmall = m.n < settings.minSegmentSize;
    if (n == 0) {
        m.verdict = comparisonVerdict(m, settings);
        return m;
    }
    std::vector<double> diff(n);
    double sb = 0.0, sc = 0.0;
    for (std::size_t i = 0; i < n; ++i) {
        diff[i] = candidate[i] - base[i];
        sb += base[i];
        sc += candidate[i];
    }
    m.meanBase = sb / static_cast<double>(n);
    m.meanCandidate = sc / static_cast<double>(n);

    const PairedTTest t = pairedTTestOnDifferences(diff);
    m.meanDiff = t.meanDiff;
    m.sdDiff = t.sdDiff;
    m.t = t.t;
    m.df = t.df;
    m.pT = t.p;
    if (t.sdDiff > 0.0)
        m.effectSize = t.meanDiff / t.sdDiff;

    const WilcoxonSignedRank w = wilcoxonSignedRank(diff);
    m.wilcoxonW = w.statistic;
    m.pWilcoxon = w.p;
    m.wilcoxonExact = w.exact;
    m.wilcoxonZeros = static_cast<std::int64_t>(w.zeros);

    if (n >= 2 && settings.bootstrap > 0)
        m.ci = meanDifferenceInterval(diff, settings.bootstrap, settings.seed, settings.level);

    const PairedOutcomes o = countPairedOutcomes(diff, metricInfo(metric).better, settings.tolerance);
    m.wins = o.wins;
    m.ties = o.ties;
    m.losses = o.losses;

    m.pHolm = m.pT;
    m.pHolmWilcoxon = m.pWilcoxon;
    m.significant = !m.tooSmall && !std::isnan(m.pHolm) && m.pHolm < settings.alpha;
    m.verdict = comparisonVerdict(m, settings);
    return m;
}

std::string comparisonVerdict(const MetricComparison& m, const ComparisonSettings& settings)
{
    const std::string key(comparisonMetricKey(m.metric));
    const Better better = metricInfo(m.metric).better;
    if (m.n < 2 || std::isnan(m.meanDiff))
        return "Cannot compare " + key + ": only " + std::to_string(m.n) + " user(s) have it in both runs.";

    std::string change;
    if (m.meanDiff == 0.0)
        change = key + " is the same on average";
    else
        change = key + (m.meanDiff > 0 ? " is higher" : " is lower") + " for the candidate by "
            + fmt(std::fabs(m.meanDiff)) + " on average";
    if (better == Better::Lower)
        change += " (lower is better, so a decrease is a win for the candidate)";
    else if (better == Better::Neither)
        change += " (this metric has no better direction: wins count increases, losses decreases)";

    const bool ciKnown = !std::isnan(m.ci.low) && !std::isnan(m.ci.high);
    const bool ciHasZero = ciKnown && m.ci.low <= 0.0 && 0.0 <= m.ci.high;
    const std::string ci
        = ciKnown ? percent(settings.level) + " interval " + fmt(m.ci.low) + " to " + fmt(m.ci.high) : "no interval";

    if (m.tooSmall)
        return "Too small to judge: only " + std::to_string(m.n) + " users (fewer than "
            + std::to_string(settings.minSegmentSize) + "). " + change + "; " + ci + ".";

    if (std::isnan(m.pHolm))
        return change + "; the t-test cannot be computed (every difference is the same); " + ci + ".";

    const std::string p = "p_holm = " + fmt(m.pHolm, "%.3g");
    std::string who;
    if (better != Better::Neither && m.meanDiff != 0.0) {
        const bool candidateBetter = (m.meanDiff > 0) == (better == Better::Higher);
        who = candidateBetter ? "Candidate better on " : "Candidate worse on ";
        who += key + ": ";
    }
    if (m.significant && ciKnown && !ciHasZero)
        return who + change + "; significant after Holm adjustment (" + p + " < " + fmt(settings.alpha) + ") and the "
            + ci + " excludes 0.";
    if (m.significant)
        return "Borderline: " + change + "; significant after Holm adjustment (" + p + ") but the " + ci
            + (ciKnown ? " includes 0." : ".");
    if (ciKnown && !ciHasZero)
        return "Not significant after Holm adjustment: " + change + " (" + p + " >= " + fmt(settings.alpha)
            + "), although the unadjusted " + ci + " excludes 0.";
    return "No real difference shown: " + change + ", but it is not significant after Holm adjustment (" + p
        + " >= " + fmt(settings.alpha) + ") and the " + ci + (ciKnown ? " includes 0." : ".");
}

Result<RunComparison> compareRuns(const RunEvaluation& base, const RunEvaluation& candidate, const Dataset& data,
    const DatasetStats& stats, const ComparisonSettings& settings, const Progress& progress)
{
    const std::string baseSettings = base.settings.toJson();
    if (baseSettings != candidate.settings.toJson()) {
        Error e;
        e.kind = ErrorKind::Usage;
        e.message = "runs '" + base.runName + "' and '" + candidate.runName
            + "' were evaluated under different settings and cannot be compared user by user";
        e.expected = "both runs evaluated with the same k, relevance threshold and warning thresholds";
        return e;
    }
    if (settings.bootstrap < 0 || !(settings.level > 0.0 && settings.level < 1.0) || settings.tolerance < 0.0) {
        Error e;
        e.kind = ErrorKind::Usage;
        e.message = "invalid comparison settings";
        e.value = settings.toJson();
        e.expected = "bootstrap >= 0, 0 < level < 1, tolerance >= 0";
        return e;
    }

    RunComparison out;
    out.base = base.runName;
    out.candidate = candidate.runName;
    out.baseRunId = base.runId;
    out.candidateRunId = candidate.runId;
    out.evaluationSettings = baseSettings;
    out.settings = settings;

    const std::size_t users = data.userCount();
    std::vector<std::int64_t> candidateRow(users, -1);
    for (std::size_t r = 0; r < candidate.users.size(); ++r)
        if (candidate.users.users[r].value < users)
            candidateRow[candidate.users.users[r].value] = static_cast<std::int64_t>(r);

    const std::vector<std::uint32_t> baseMasks = warningMasks(base, users);
    const std::vector<std::uint32_t> candidateMasks = warningMasks(candidate, users);

    // Which metrics both runs define for at least one user.
    std::vector<Metric> metrics;
    std::vector<Paired> paired;
    std::string skipped;
    for (Metric m : settings.effectiveMetrics()) {
        if (std::find(metrics.begin(), metrics.end(), m) != metrics.end())
            continue;
        Paired p = pairValues(base, candidate, candidateRow, m);
        if (p.users.empty()) {
            skipped += (skipped.empty() ? "" : ", ") + std::string(comparisonMetricKey(m));
            continue;
        }
        metrics.push_back(m);
        paired.push_back(std::move(p));
    }
    if (!skipped.empty())
        out.notes.push_back("Left out, as no user has them in both runs: " + skipped
            + " (rmse and mae need scores; ranking and beyond-accuracy metrics need lists).");
    if (metrics.empty()) {
        Error e;
        e.kind = ErrorKind::Usage;
        e.message = "no requested metric is defined for both '" + base.runName + "' and '" + candidate.runName + "'";
        e.value = settings.toJson();
        e.expected = "a metric both runs can be scored on (rmse/mae need scores, ranking metrics need lists)";
        return e;
    }

    // Segments split the users compared on at least one metric.
    std::vector<char> compared(users, 0);
    for (const Paired& p : paired)
        for (UserIndex u : p.users)
            compared[u.value] = 1;
    std::vector<UserIndex> evaluated;
    for (std::size_t u = 0; u < users; ++u)
        if (compared[u])
            evaluated.emplace_back(static_cast<std::uint32_t>(u));
    std::vector<UserSegment> segments;
    for (const SegmentSpec& spec : settings.segments) {
        auto more = buildUserSegments(spec, evaluated, data, stats, base.settings, baseMasks, candidateMasks);
        for (auto& s : more)
            segments.push_back(std::move(s));
    }

    const double tasks = static_cast<double>(metrics.size() * (1 + segments.size()));
    double done = 0.0;
    auto cancelled = [&]() -> bool { return progress.cancelled(); };
    Error cancel;
    cancel.kind = ErrorKind::Cancelled;
    cancel.message = "comparison cancelled; nothing was stored";

    for (std::size_t i = 0; i < metrics.size(); ++i) {
        if (cancelled())
            return cancel;
        out.metrics.push_back(compareValues(metrics[i], paired[i].base, paired[i].candidate, settings));
        UserDifferences d;
        d.metric = metrics[i];
        d.users = paired[i].users;
        d.base = paired[i].base;
        d.candidate = paired[i].candidate;
        out.perUser.push_back(std::move(d));
        progress(++done / tasks, "comparing " + std::string(comparisonMetricKey(metrics[i])));
    }

    std::vector<char> member(users, 0);
    for (const UserSegment& s : segments) {
        SegmentComparison sc;
        sc.group = s.group;
        sc.name = s.name;
        sc.label = s.label;
        sc.size = static_cast<std::int64_t>(s.users.size());
        sc.tooSmall = sc.size < settings.minSegmentSize;
        for (UserIndex u : s.users)
            member[u.value] = 1;
        for (std::size_t i = 0; i < metrics.size(); ++i) {
            if (cancelled())
                return cancel;
            const Paired p = restrict(paired[i], member);
            MetricComparison mc = compareValues(metrics[i], p.base, p.candidate, settings);
            mc.tooSmall = mc.tooSmall || sc.tooSmall;
            sc.metrics.push_back(std::move(mc));
            progress(++done / tasks, "comparing segment " + s.name);
        }
        for (UserIndex u : s.users)
            member[u.value] = 0;
        out.segments.push_back(std::move(sc));
    }

    std::vector<MetricComparison*> family;
    for (auto& m : out.metrics)
        family.push_back(&m);
    adjustFamily(family, settings);
    out.notes.insert(out.notes.begin(), holmNote(countTests(family), "the metrics compared"));
    if (!out.segments.empty()) {
        std::vector<MetricComparison*> segmentFamily;
        for (auto& s : out.segments)
            for (auto& m : s.metrics)
                segmentFamily.push_back(&m);
        adjustFamily(segmentFamily, settings);
        out.notes.push_back("Segment rows are adjusted as a separate Holm family of " + tests(countTests(segmentFamily))
            + " (every segment and metric); segments under " + std::to_string(settings.minSegmentSize)
            + " users are marked too small to judge and never called significant.");
    }
    out.notes.push_back("Differences are candidate - base per user; the interval is a " + percent(settings.level)
        + " percentile bootstrap over users (" + std::to_string(settings.bootstrap) + " resamples, seed "
        + std::to_string(settings.seed) + "); wins/ties/losses use a tie tolerance of " + fmt(settings.tolerance, "%g")
        + ".");

    // Who got worse: the first metric with a better direction.
    for (std::size_t i = 0; i < metrics.size(); ++i) {
        const Better better = metricInfo(metrics[i]).better;
        if (better == Better::Neither)
            continue;
        out.hasPrimary = true;
        out.primary = metrics[i];
        const Paired& p = paired[i];
        std::vector<std::size_t> order;
        std::vector<double> loss(p.users.size());
        for (std::size_t r = 0; r < p.users.size(); ++r) {
            loss[r] = better == Better::Higher ? p.base[r] - p.candidate[r] : p.candidate[r] - p.base[r];
            if (loss[r] > settings.tolerance)
                order.push_back(r);
        }
        // Largest loss first; equal losses by user index so the list is stable.
        std::sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) {
            return loss[a] != loss[b] ? loss[a] > loss[b] : p.users[a] < p.users[b];
        });
        if (order.size() > static_cast<std::size_t>(std::max(0, settings.worst)))
            order.resize(static_cast<std::size_t>(std::max(0, settings.worst)));
        for (std::size_t r : order) {
            WorseUser w;
            w.user = p.users[r];
            w.userId = w.user.value < data.userIds.size() ? data.userIds[w.user.value] : std::to_string(w.user.value);
            w.base = p.base[r];
            w.candidate = p.candidate[r];
            w.loss = loss[r];
            w.baseWarnings = warningKeys(baseMasks[w.user.value]);
            w.candidateWarnings = warningKeys(candidateMasks[w.user.value]);
            out.whoGotWorse.push_back(std::move(w));
        }
        break;
    }
    progress(1.0, "comparison done");
    return out;
}

std::vector<RunComparison> adjustAcrossPairs(std::vector<RunComparison> comparisons)
{
    if (comparisons.size() < 2)
        return comparisons;
    const ComparisonSettings& settings = comparisons.front().settings;
    std::vector<MetricComparison*> family;
    std::vector<MetricComparison*> segmentFamily;
    for (auto& c : comparisons) {
        for (auto& m : c.metrics)
            family.push_back(&m);
        for (auto& s : c.segments)
            for (auto& m : s.metrics)
                segmentFamily.push_back(&m);
    }
    adjustFamily(family, settings);
    if (!segmentFamily.empty())
        adjustFamily(segmentFamily, settings);
    const std::string note = holmNote(countTests(family),
        "every metric of the " + std::to_string(comparisons.size()) + " run pairs compared together");
    for (auto& c : comparisons) {
        if (!c.notes.empty() && c.notes.front().rfind("p_holm:", 0) == 0)
            c.notes.front() = note;
        else
            c.notes.insert(c.notes.begin(), note);
        if (!segmentFamily.empty()) {
            for (auto& n : c.notes)
                if (n.rfind("Segment rows are adjusted", 0) == 0)
                    n = "Segment rows of all " + std::to_string(comparisons.size())
                        + " run pairs are adjusted as a separate Holm family of " + tests(countTests(segmentFamily))
                        + "; segments under " + std::to_string(settings.minSegmentSize)
                        + " users are marked too small to judge and never called significant.";
        }
    }
    return comparisons;
}

std::string shortVerdict(const MetricComparison& m)
{
    if (m.n < 2)
        return "cannot compare";
    if (m.tooSmall)
        return "too small to judge";
    if (std::isnan(m.pHolm))
        return "no test (all differences equal)";
    if (!m.significant)
        return "not significant";
    const auto better = metricInfo(m.metric).better;
    if (better == Better::Neither)
        return "significant change";
    return (m.meanDiff > 0) == (better == Better::Higher) ? "significant: candidate better"
                                                          : "significant: candidate worse";
}

} // namespace slatewise::core
