// SPDX-License-Identifier: MIT
#include "core/beyond.h"

#include "core/beyondcalculator.h"
#include "core/exposure.h"
#include "core/parallel.h"
#include "core/warningrules.h"

#include <array>
#include <cmath>

namespace slatewise::core {

namespace {

/// Per-worker sums, combined after the parallel pass.
struct Totals {
    std::int64_t withList = 0;
    double noveltySum = 0, seriesShareSum = 0;
    double ildSum = 0;
    std::int64_t ildUsers = 0;
    double liftSum = 0;
    std::int64_t liftUsers = 0;
    double klSum = 0;
    std::int64_t klUsers = 0;
    std::int64_t orderViolations = 0, orderViolationUsers = 0;
    std::int64_t seenInList = 0, seenUsers = 0;
    std::int64_t burstJudged = 0, burstEchoes = 0, burstSkipped = 0;
    std::vector<UserWarning> warnings;
    std::array<std::int64_t, kWarningCodeCount> warningUsers{};
};

double ratio(double num, std::int64_t den) { return den > 0 ? num / static_cast<double>(den) : std::nan(""); }

} // namespace

void computeBeyond(const Dataset& data, const DatasetStats& stats, const RunData& run, const EvalSettings& settings,
                   RunEvaluation& eval)
{
    auto& table = eval.users;
    const std::size_t rows = table.size();
    const BeyondCalculator calc(data, stats, settings);
    const WarningRules rules(data, settings);
    const unsigned workers = workerCount();
    std::vector<Totals> totals(workers);

    for (const Metric m : {Metric::Ild, Metric::Novelty, Metric::PopularityLift, Metric::CalibrationKl,
                           Metric::SeriesShare, Metric::OrderViolations, Metric::BurstEcho, Metric::SeenInList})
        table.column(m).assign(rows, std::nan(""));

    parallelFor(
        rows,
        [&](std::size_t begin, std::size_t end, unsigned w) {
            Totals& t = totals[w];
            auto scratch = calc.makeScratch();
            for (std::size_t r = begin; r < end; ++r) {
                const UserIndex u = table.users[r];
                const auto train = data.train.of(u);
                const auto topk = calc.topK(run, u);
                WarningRules::Subject subject{u, run.hasLists, nullptr, topk, train, data.withheld.of(u),
                                              table.nRelevant[r]};
                BeyondCalculator::UserMeasures m;
                if (run.hasLists) {
                    m = calc.measure(train, topk, scratch);
                    subject.measures = &m;
                    if (!topk.empty()) {
                        table.column(Metric::Ild)[r] = m.ild;
                        table.column(Metric::Novelty)[r] = m.novelty;
                        table.column(Metric::PopularityLift)[r] = m.popularityLift;
                        table.column(Metric::CalibrationKl)[r] = m.calibrationKl;
                        table.column(Metric::SeriesShare)[r] = m.seriesShare;
                        table.column(Metric::OrderViolations)[r] = m.orderViolations;
                        table.column(Metric::BurstEcho)[r] = m.burstEcho;
                        table.column(Metric::SeenInList)[r] = m.seenInList;
                        ++t.withList;
                        t.noveltySum += m.novelty;
                        t.seriesShareSum += m.seriesShare;
                        if (!std::isnan(m.ild)) {
                            t.ildSum += m.ild;
                            ++t.ildUsers;
                        }
                        if (!std::isnan(m.popularityLift)) {
                            t.liftSum += m.popularityLift;
                            ++t.liftUsers;
                        }
                        if (!std::isnan(m.calibrationKl)) {
                            t.klSum += m.calibrationKl;
                            ++t.klUsers;
                        }
                        t.orderViolations += m.orderViolations;
                        t.orderViolationUsers += m.orderViolations > 0 ? 1 : 0;
                        t.seenInList += m.seenInList;
                        t.seenUsers += m.seenInList > 0 ? 1 : 0;
                        if (m.burst.hasTimestamps) {
                            ++t.burstJudged;
                            t.burstEchoes += m.burst.echoes ? 1 : 0;
                        } else {
                            ++t.burstSkipped;
                        }
                    }
                }
                auto warnings = rules.evaluate(subject);
                table.warningCount[r] = static_cast<std::int32_t>(warnings.size());
                for (auto& warning : warnings) {
                    ++t.warningUsers[static_cast<std::size_t>(warning.code)];
                    t.warnings.push_back(std::move(warning));
                }
            }
        },
        workers);

    // Workers own contiguous, ascending blocks of rows, and rules emit codes in order, so
    // concatenating in worker order leaves the warnings sorted by user, then code.
    Totals all;
    eval.warnings.clear();
    for (auto& t : totals) {
        all.withList += t.withList;
        all.noveltySum += t.noveltySum;
        all.seriesShareSum += t.seriesShareSum;
        all.ildSum += t.ildSum;
        all.ildUsers += t.ildUsers;
        all.liftSum += t.liftSum;
        all.liftUsers += t.liftUsers;
        all.klSum += t.klSum;
        all.klUsers += t.klUsers;
        all.orderViolations += t.orderViolations;
        all.orderViolationUsers += t.orderViolationUsers;
        all.seenInList += t.seenInList;
        all.seenUsers += t.seenUsers;
        all.burstJudged += t.burstJudged;
        all.burstEchoes += t.burstEchoes;
        all.burstSkipped += t.burstSkipped;
        for (std::size_t c = 0; c < kWarningCodeCount; ++c)
            all.warningUsers[c] += t.warningUsers[c];
        eval.warnings.insert(eval.warnings.end(), std::make_move_iterator(t.warnings.begin()),
                             std::make_move_iterator(t.warnings.end()));
    }

    eval.warningShare.clear();
    for (const auto& info : allWarnings())
        eval.warningShare[std::string(info.key)] =
            rows > 0 ? static_cast<double>(all.warningUsers[static_cast<std::size_t>(info.code)]) /
                           static_cast<double>(rows)
                     : std::nan("");

    if (!run.hasLists) {
        eval.beyond.reset();
        return;
    }

    // Exposure is run-wide: every user with a list counts, evaluated or not.
    std::vector<Exposure> exposures(workers, Exposure(0));
    parallelFor(
        data.userCount(),
        [&](std::size_t begin, std::size_t end, unsigned w) {
            Exposure local(data.itemCount());
            for (std::size_t u = begin; u < end; ++u)
                for (const auto& entry : calc.topK(run, UserIndex(static_cast<std::uint32_t>(u))))
                    local.add(entry.item);
            exposures[w] = std::move(local);
        },
        workers);
    Exposure exposure(data.itemCount());
    for (const auto& e : exposures)
        exposure.merge(e);

    BeyondSummary b;
    b.coverage = exposure.coverage();
    b.gini = exposure.gini();
    b.ild = ratio(all.ildSum, all.ildUsers);
    b.novelty = ratio(all.noveltySum, all.withList);
    b.popularityLift = ratio(all.liftSum, all.liftUsers);
    b.calibrationKl = ratio(all.klSum, all.klUsers);
    b.seriesShare = ratio(all.seriesShareSum, all.withList);
    b.orderViolations = all.orderViolations;
    b.orderViolationsUsers = ratio(static_cast<double>(all.orderViolationUsers), all.withList);
    b.seenInList = all.seenInList;
    b.seenInListUsers = ratio(static_cast<double>(all.seenUsers), all.withList);
    b.burstEcho = ratio(static_cast<double>(all.burstEchoes), all.burstJudged);
    b.burstSkippedUsers = all.burstSkipped;
    eval.beyond = b;
}

} // namespace slatewise::core
