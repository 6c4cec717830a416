// SPDX-License-Identifier: MIT
#pragma once

#include "core/ids.h"

#include <QString>

namespace slatewise::core {
struct Dataset;
}

namespace slatewise::ui {

/// Catalog facts as display text, shared by the inspector's two tables.
struct ItemText {
    static QString title(const core::Dataset& data, core::ItemIndex item);
    static QString year(const core::Dataset& data, core::ItemIndex item);
    static QString genres(const core::Dataset& data, core::ItemIndex item);
    /// "Harbour Lights, part 2" or empty.
    static QString series(const core::Dataset& data, core::ItemIndex item);
};

} // namespace slatewise::ui
