// SPDX-License-Identifier: MIT
#pragma once

#include "core/dataset.h"
#include "core/error.h"
#include "core/progress.h"
#include "core/reranksettings.h"
#include "core/run.h"

namespace slatewise::core {

/// Re-ranks every list of `parent` with settings.method. The derived run keeps the
/// parent's scores for the withheld pairs; info.kind = Reranked, parentName, method and
/// settingsJson are set, the name is left empty. ErrorKind::Usage when the parent has no
/// lists or λ is outside 0..1; ErrorKind::Cancelled when cancelled.
Result<RunData> rerankRun(const Dataset& data, const RunData& parent, const RerankSettings& settings,
                          const Progress& progress = {});

} // namespace slatewise::core
