// SPDX-License-Identifier: MIT
#include "app/slatewise/commands.h"

#include <iostream>

namespace slatewise::cli {

// Placeholder until this command is written; reports a usage error rather than pretending.
int fitCommand(const std::vector<std::string>&)
{
    std::cerr << "slatewise: this command is not available in this build yet\n";
    return 1;
}

} // namespace slatewise::cli
