// SPDX-License-Identifier: MIT
#include "core/runreranker.h"

#include "core/burstdampreranker.h"
#include "core/mmrreranker.h"
#include "core/seriesorderreranker.h"

#include <cmath>

namespace slatewise::core {

Result<RunData> rerankRun(const Dataset& data, const RunData& parent, const RerankSettings& settings,
                          const Progress& progress)
{
    if (!parent.hasLists) {
        Error e;
        e.kind = ErrorKind::Usage;
        e.value = parent.info.name;
        e.message = "run has no lists to re-rank";
        e.expected = "a run imported with --lists or fitted by slatewise";
        return e;
    }
    if (!(settings.lambda >= 0.0 && settings.lambda <= 1.0)) {
        Error e;
        e.kind = ErrorKind::Usage;
        e.value = std::to_string(settings.lambda);
        e.message = "--lambda is out of range";
        e.expected = "a number from 0 to 1";
        return e;
    }
    Result<RunData> run = Error{};
    switch (settings.method) {
    case RerankMethod::Mmr:
        run = MmrReranker::apply(data, parent, settings, progress);
        break;
    case RerankMethod::SeriesOrder:
        run = SeriesOrderReranker::apply(data, parent, settings, progress);
        break;
    case RerankMethod::BurstDamp:
        run = BurstDampReranker::apply(data, parent, settings, progress);
        break;
    }
    if (!run)
        return run;
    run->info.kind = RunKind::Reranked;
    run->info.parentName = parent.info.name;
    run->info.method = std::string(toString(settings.method));
    run->info.settingsJson = settings.toJson();
    return run;
}

} // namespace slatewise::core
