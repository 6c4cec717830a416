// SPDX-License-Identifier: MIT
#pragma once

#include "core/beyondcalculator.h"
#include "core/dataset.h"
#include "core/evalsettings.h"
#include "core/run.h"
#include "core/warning.h"

#include <span>
#include <string>
#include <vector>

namespace slatewise::core {

/// Decides which warnings one user carries under one run and writes each one's plain
/// sentence, naming the titles involved. Thresholds come from EvalSettings::warn (and the
/// burst settings); docs/metrics.md lists the defaults.
class WarningRules {
public:
    /// What the rules look at for one user.
    struct Subject {
        UserIndex user;
        bool runHasLists = false;
        const BeyondCalculator::UserMeasures* measures = nullptr; ///< null when the run has no lists
        std::span<const ListEntry> topk;
        std::span<const Interaction> train;
        std::span<const Interaction> withheld;
        std::int32_t nRelevant = 0;
    };

    WarningRules(const Dataset& data, const EvalSettings& settings) : m_data(data), m_settings(settings) {}

    /// The user's warnings in WarningCode order, at most one per code.
    std::vector<UserWarning> evaluate(const Subject& s) const;

    /// «Title» (the external id when the title is empty).
    std::string quoted(ItemIndex item) const;
    /// "«A», «B» and «C»", naming at most `limit` titles and then "and N more".
    std::string quotedList(const std::vector<ItemIndex>& items, std::size_t limit = 3) const;

private:
    std::string genreName(std::int32_t genre) const;

    const Dataset& m_data;
    const EvalSettings& m_settings;
};

} // namespace slatewise::core
