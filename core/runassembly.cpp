// SPDX-License-Identifier: MIT
#include "core/runassembly.h"

namespace slatewise::core {

RunData RunAssembly::finish(const Dataset& data, std::vector<float> scores, std::vector<std::vector<ListEntry>> lists)
{
    RunData run;
    run.hasScores = !scores.empty() || data.withheld.size() == 0;
    run.scores = std::move(scores);
    run.hasLists = true;
    run.listOffsets.assign(data.userCount() + 1, 0);
    std::size_t total = 0;
    for (const auto& l : lists)
        total += l.size();
    run.listRows.reserve(total);
    for (std::size_t u = 0; u < data.userCount(); ++u) {
        if (u < lists.size()) {
            run.listRows.insert(run.listRows.end(), lists[u].begin(), lists[u].end());
            lists[u] = {};
        }
        run.listOffsets[u + 1] = static_cast<std::uint32_t>(run.listRows.size());
    }
    run.info.scoreCount = static_cast<std::int64_t>(run.scores.size());
    run.info.listRowCount = static_cast<std::int64_t>(run.listRows.size());
    std::int64_t users = 0;
    for (std::size_t u = 0; u < data.userCount(); ++u)
        users += run.listOffsets[u + 1] > run.listOffsets[u] ? 1 : 0;
    run.info.listUserCount = users;
    return run;
}

RunData RunAssembly::derive(const Dataset& data, const RunData& parent, std::vector<std::vector<ListEntry>> lists)
{
    RunData run = finish(data, parent.scores, std::move(lists));
    run.hasScores = parent.hasScores;
    run.info.scoreCount = parent.info.scoreCount;
    return run;
}

Error RunAssembly::cancelled(std::string_view what)
{
    Error e;
    e.kind = ErrorKind::Cancelled;
    e.message = std::string(what) + " was cancelled; nothing was stored";
    return e;
}

} // namespace slatewise::core
