// SPDX-License-Identifier: MIT
#include "core/evaluator.h"

#include "core/accuracyaccumulator.h"
#include "core/beyond.h"
#include "core/bootstrap.h"
#include "core/heldouttopk.h"
#include "core/parallel.h"
#include "core/rankingcurves.h"
#include "core/rankingmetrics.h"
#include "core/ratingbands.h"

#include <algorithm>
#include <atomic>
#include <chrono>
#include <cmath>
#include <ctime>
#include <functional>

namespace slatewise::core {

namespace {

constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();

std::string utcNow()
{
    const std::time_t now = std::chrono::system_clock::to_time_t(std::chrono::system_clock::now());
    std::tm tm{};
    gmtime_r(&now, &tm);
    char buf[32];
    std::strftime(buf, sizeof buf, "%Y-%m-%dT%H:%M:%SZ", &tm);
    return buf;
}

/// Per-user sums the aggregates and the bootstrap are built from (one entry per table row).
struct UserSums {
    std::vector<std::int32_t> nScored;
    std::vector<double> sse, sae, se;
    std::vector<std::uint8_t> hasList;

    explicit UserSums(std::size_t n) : nScored(n, 0), sse(n, 0.0), sae(n, 0.0), se(n, 0.0), hasList(n, 0) {}
};

/// Worker-local accumulators, merged in worker order so the result does not depend on timing.
struct WorkerState {
    RatingBands bands;
    RankingCurves curves;
    std::vector<ScoredRating> scored;
    std::vector<double> relevant;
    std::vector<ListHit> hits;
    std::vector<std::uint8_t> used;

    explicit WorkerState(std::int32_t maxK) : curves(maxK) {}
};

Error cancelledError() { return Error{ErrorKind::Cancelled, {}, 0, 0, {}, "evaluation cancelled", {}}; }

double meanOf(const std::vector<double>& column, const std::vector<std::uint8_t>& include)
{
    double sum = 0.0;
    std::int64_t n = 0;
    for (std::size_t r = 0; r < column.size(); ++r)
        if (include[r]) {
            sum += column[r];
            ++n;
        }
    return n ? sum / static_cast<double>(n) : kNaN;
}

/// A bootstrap statistic: sum(numerator) / sum(denominator), optionally square-rooted.
struct CiSpec {
    std::string key;
    std::size_t numerator;
    std::size_t denominator;
    bool root = false;
};

/// Column-wise builder of the bootstrap table.
class BootstrapTable {
public:
    explicit BootstrapTable(std::size_t rows) : m_rows(rows) {}
    std::size_t add(std::function<double(std::size_t)> value)
    {
        m_columns.emplace_back(m_rows);
        auto& column = m_columns.back();
        for (std::size_t r = 0; r < m_rows; ++r)
            column[r] = value(r);
        return m_columns.size() - 1;
    }
    std::size_t cols() const { return m_columns.size(); }
    std::vector<double> rowMajor() const
    {
        std::vector<double> table(m_rows * m_columns.size());
        for (std::size_t c = 0; c < m_columns.size(); ++c)
            for (std::size_t r = 0; r < m_rows; ++r)
                table[r * m_columns.size() + c] = m_columns[c][r];
        return table;
    }

private:
    std::size_t m_rows;
    std::vector<std::vector<double>> m_columns;
};

} // namespace

Result<RunEvaluation> evaluateRun(const Dataset& data, const DatasetStats& stats, const RunData& run,
                                  const EvalSettings& settings, const Progress& progress)
{
    if (settings.k < 1)
        return Error{ErrorKind::Usage, {}, 0, 0, std::to_string(settings.k), "k must be at least 1", "a whole number >= 1"};
    if (settings.bootstrap < 0 || settings.curveMaxK < 0)
        return Error{ErrorKind::Usage, {}, 0, 0, {}, "bootstrap resamples and curve length cannot be negative", "0 or more"};
    if (run.hasScores && run.scores.size() != data.withheld.size())
        return Error{ErrorKind::InputData, run.info.name, 0, 0, {}, "the run's scores are not aligned with the withheld rows", {}};
    if (run.hasLists && run.listOffsets.size() != data.userCount() + 1)
        return Error{ErrorKind::InputData, run.info.name, 0, 0, {}, "the run's lists are not aligned with the users", {}};

    RunEvaluation eval;
    eval.runName = run.info.name;
    eval.runId = run.info.id;
    eval.settings = settings;
    eval.computedAt = utcNow();

    // Rows: every user with at least one withheld item, ascending.
    std::vector<UserIndex> rowsUsers;
    for (std::size_t u = 0; u < data.userCount(); ++u)
        if (data.withheld.offsets[u + 1] > data.withheld.offsets[u])
            rowsUsers.emplace_back(static_cast<std::uint32_t>(u));
    const std::size_t n = rowsUsers.size();
    UserResultTable& table = eval.users;
    table.resize(n);
    table.users = rowsUsers;
    UserSums sums(n);

    const auto k = static_cast<std::size_t>(settings.k);
    const std::size_t listDepth = std::max(k, static_cast<std::size_t>(settings.curveMaxK));
    const double relevantAt = settings.relevantAt;
    auto& colRmse = table.column(Metric::Rmse);
    auto& colMae = table.column(Metric::Mae);
    auto& colMeanError = table.column(Metric::MeanError);
    auto& colPrecision = table.column(Metric::Precision);
    auto& colRecall = table.column(Metric::Recall);
    auto& colAp = table.column(Metric::Ap);
    auto& colRr = table.column(Metric::Rr);
    auto& colNdcg = table.column(Metric::Ndcg);
    auto& colNdcgGraded = table.column(Metric::NdcgGraded);
    auto& colHeldout = table.column(Metric::HeldoutTopk);

    const unsigned workers = workerCount();
    std::vector<WorkerState> states;
    states.reserve(workers);
    for (unsigned w = 0; w < workers; ++w)
        states.emplace_back(settings.curveMaxK);
    std::atomic<bool> stopped{false};

    progress(0.0, "accuracy and ranking");
    parallelFor(
        n,
        [&](std::size_t begin, std::size_t end, unsigned worker) {
            WorkerState& st = states[worker];
            for (std::size_t row = begin; row < end; ++row) {
                if ((row - begin) % 1024 == 0) {
                    if (progress.cancelled()) {
                        stopped = true;
                        return;
                    }
                    if (worker == 0)
                        progress(0.6 * static_cast<double>(row - begin) / static_cast<double>(end - begin),
                                 "accuracy and ranking");
                }
                const UserIndex u = table.users[row];
                const std::size_t firstRow = data.withheld.offsets[u.value];
                const auto withheld = data.withheld.of(u);
                table.nWithheld[row] = static_cast<std::int32_t>(withheld.size());
                table.nTrain[row] = u.value < stats.userTrainCount.size()
                                        ? stats.userTrainCount[u.value]
                                        : static_cast<std::int32_t>(data.train.of(u).size());

                st.relevant.clear();
                for (const auto& w : withheld)
                    if (w.rating >= relevantAt)
                        st.relevant.push_back(w.rating);
                std::sort(st.relevant.begin(), st.relevant.end(), std::greater<>());
                table.nRelevant[row] = static_cast<std::int32_t>(st.relevant.size());

                if (run.hasScores) {
                    AccuracyAccumulator acc;
                    st.scored.clear();
                    for (std::size_t i = 0; i < withheld.size(); ++i) {
                        const float score = run.scores[firstRow + i];
                        if (std::isnan(score))
                            continue;
                        acc.add(score, withheld[i].rating);
                        st.bands.add(score, withheld[i].rating);
                        st.scored.push_back({withheld[i].item, score, withheld[i].rating});
                    }
                    sums.nScored[row] = static_cast<std::int32_t>(acc.n());
                    sums.sse[row] = acc.sumSquaredError();
                    sums.sae[row] = acc.sumAbsError();
                    sums.se[row] = acc.sumError();
                    colRmse[row] = acc.rmse();
                    colMae[row] = acc.mae();
                    colMeanError[row] = acc.meanError();
                    colHeldout[row] = heldoutTopk(st.scored, settings.k);
                }

                if (run.hasLists) {
                    const auto list = run.listOf(u);
                    sums.hasList[row] = list.empty() ? 0 : 1;
                    if (!st.relevant.empty()) {
                        const std::size_t depth = std::min(list.size(), listDepth);
                        st.hits.resize(depth);
                        st.used.assign(withheld.size(), 0);
                        for (std::size_t j = 0; j < depth; ++j) {
                            const ItemIndex item = list[j].item;
                            auto it = std::lower_bound(withheld.begin(), withheld.end(), item,
                                                       [](const Interaction& w, ItemIndex i) { return w.item < i; });
                            ListHit hit;
                            if (it != withheld.end() && it->item == item && it->rating >= relevantAt) {
                                auto& used = st.used[static_cast<std::size_t>(it - withheld.begin())];
                                // A repeated item counts once, at its first position.
                                if (!used) {
                                    used = 1;
                                    hit = {true, it->rating};
                                }
                            }
                            st.hits[j] = hit;
                        }
                        const UserRanking r = rankUser(st.hits, st.relevant, settings.k);
                        colPrecision[row] = r.precision;
                        colRecall[row] = r.recall;
                        colAp[row] = r.ap;
                        colRr[row] = r.rr;
                        colNdcg[row] = r.ndcg;
                        colNdcgGraded[row] = r.ndcgGraded;
                        st.curves.add(st.hits, st.relevant.size());
                    }
                }
            }
        },
        workers);
    if (stopped || progress.cancelled())
        return cancelledError();

    // Aggregates, summed serially in row order so they do not depend on the thread count.
    std::vector<std::uint8_t> scoredUser(n), rankUserRow(n);
    for (std::size_t r = 0; r < n; ++r) {
        scoredUser[r] = sums.nScored[r] > 0;
        rankUserRow[r] = table.nRelevant[r] > 0;
    }
    if (run.hasScores) {
        AccuracySummary a;
        std::int64_t withheldPairs = 0;
        double sse = 0.0, sae = 0.0, se = 0.0;
        for (std::size_t r = 0; r < n; ++r) {
            withheldPairs += table.nWithheld[r];
            a.n += sums.nScored[r];
            sse += sums.sse[r];
            sae += sums.sae[r];
            se += sums.se[r];
        }
        a.missingScores = withheldPairs - a.n;
        a.scoredFraction = withheldPairs ? static_cast<double>(a.n) / static_cast<double>(withheldPairs) : kNaN;
        const double pairs = a.n ? static_cast<double>(a.n) : kNaN;
        a.rmse = std::sqrt(sse / pairs);
        a.mae = sae / pairs;
        a.meanError = se / pairs;
        a.userRmseMean = meanOf(colRmse, scoredUser);
        a.heldoutTopk = meanOf(colHeldout, scoredUser);
        RatingBands bands;
        for (const auto& st : states)
            bands.merge(st.bands);
        a.bands = bands.result();
        eval.accuracy = std::move(a);
    }
    if (run.hasLists) {
        RankingSummary rs;
        std::int64_t hits = 0;
        for (std::size_t r = 0; r < n; ++r) {
            if (!rankUserRow[r])
                continue;
            ++rs.users;
            if (!sums.hasList[r])
                ++rs.usersWithoutList;
            if (colRr[r] > 0.0)
                ++hits;
        }
        rs.precision = meanOf(colPrecision, rankUserRow);
        rs.recall = meanOf(colRecall, rankUserRow);
        rs.hitRate = rs.users ? static_cast<double>(hits) / static_cast<double>(rs.users) : kNaN;
        rs.mrr = meanOf(colRr, rankUserRow);
        rs.map = meanOf(colAp, rankUserRow);
        rs.ndcg = meanOf(colNdcg, rankUserRow);
        rs.ndcgGraded = meanOf(colNdcgGraded, rankUserRow);
        rs.heldoutTopk = run.hasScores ? meanOf(colHeldout, scoredUser) : kNaN;
        RankingCurves curves(settings.curveMaxK);
        for (const auto& st : states)
            curves.merge(st.curves);
        rs.curves = curves.result();
        eval.ranking = std::move(rs);
    }
    states.clear();

    progress(0.6, "beyond accuracy");
    computeBeyond(data, stats, run, settings, eval);
    if (progress.cancelled())
        return cancelledError();

    // Bootstrap intervals: every statistic is a ratio of column sums over resampled users,
    // so one pass over the resamples serves them all.
    if (settings.bootstrap > 0 && n > 0) {
        progress(0.7, "bootstrap intervals");
        BootstrapTable bt(n);
        std::vector<CiSpec> specs;
        if (run.hasScores) {
            const auto withheldCol = bt.add([&](std::size_t r) { return table.nWithheld[r]; });
            const auto scoredCol = bt.add([&](std::size_t r) { return sums.nScored[r]; });
            const auto hasScoredCol = bt.add([&](std::size_t r) { return scoredUser[r] ? 1.0 : 0.0; });
            const auto sseCol = bt.add([&](std::size_t r) { return sums.sse[r]; });
            const auto saeCol = bt.add([&](std::size_t r) { return sums.sae[r]; });
            const auto seCol = bt.add([&](std::size_t r) { return sums.se[r]; });
            const auto userRmseCol = bt.add([&](std::size_t r) { return scoredUser[r] ? colRmse[r] : 0.0; });
            const auto heldoutCol = bt.add([&](std::size_t r) { return scoredUser[r] ? colHeldout[r] : 0.0; });
            specs.push_back({"rmse", sseCol, scoredCol, true});
            specs.push_back({"mae", saeCol, scoredCol});
            specs.push_back({"mean_error", seCol, scoredCol});
            specs.push_back({"scored_fraction", scoredCol, withheldCol});
            specs.push_back({"user_rmse_mean", userRmseCol, hasScoredCol});
            specs.push_back({"heldout_topk", heldoutCol, hasScoredCol});
        }
        if (run.hasLists) {
            const auto rankCol = bt.add([&](std::size_t r) { return rankUserRow[r] ? 1.0 : 0.0; });
            auto addRanking = [&](const char* key, const std::vector<double>& column) {
                const auto c = bt.add([&](std::size_t r) { return rankUserRow[r] ? column[r] : 0.0; });
                specs.push_back({key, c, rankCol});
            };
            addRanking("precision", colPrecision);
            addRanking("recall", colRecall);
            const auto hitCol = bt.add([&](std::size_t r) { return rankUserRow[r] && colRr[r] > 0.0 ? 1.0 : 0.0; });
            specs.push_back({"hit_rate", hitCol, rankCol});
            addRanking("mrr", colRr);
            addRanking("map", colAp);
            addRanking("ndcg", colNdcg);
            addRanking("ndcg_graded", colNdcgGraded);
            // Beyond-accuracy means over the users (with withheld items) each is defined for.
            for (Metric m : {Metric::Ild, Metric::Novelty, Metric::PopularityLift, Metric::CalibrationKl,
                             Metric::SeriesShare}) {
                const auto& column = table.column(m);
                if (std::none_of(column.begin(), column.end(), [](double v) { return !std::isnan(v); }))
                    continue;
                const auto defined = bt.add([&](std::size_t r) { return std::isnan(column[r]) ? 0.0 : 1.0; });
                const auto value = bt.add([&](std::size_t r) { return std::isnan(column[r]) ? 0.0 : column[r]; });
                specs.push_back({std::string(metricInfo(m).key), value, defined});
            }
        }
        if (!specs.empty()) {
            const Bootstrap bootstrap(settings.bootstrap, settings.seed);
            const std::size_t cols = bt.cols();
            Progress inner;
            inner.cancel = progress.cancel;
            if (progress.report)
                inner.report = [&progress](double f, std::string_view stage) { progress(0.7 + 0.3 * f, stage); };
            const std::vector<double> resampled = bootstrap.resampleColumnSums(bt.rowMajor(), n, cols, inner);
            if (progress.cancelled())
                return cancelledError();
            const auto B = static_cast<std::size_t>(settings.bootstrap);
            std::vector<double> statistic(B);
            for (const CiSpec& spec : specs) {
                for (std::size_t b = 0; b < B; ++b) {
                    const double num = resampled[b * cols + spec.numerator];
                    const double den = resampled[b * cols + spec.denominator];
                    const double v = den > 0.0 ? num / den : kNaN;
                    statistic[b] = spec.root ? std::sqrt(v) : v;
                }
                eval.ci[spec.key] = Bootstrap::percentileInterval(statistic);
            }
        }
    }
    progress(1.0, "done");
    return eval;
}

} // namespace slatewise::core
