// SPDX-License-Identifier: MIT
#include "core/beyond.h"

namespace slatewise::core {

// Placeholder: beyond-accuracy measures are not computed yet.
void computeBeyond(const Dataset&, const DatasetStats&, const RunData&, const EvalSettings&, RunEvaluation&) {}

} // namespace slatewise::core
