// SPDX-License-Identifier: MIT
#pragma once

#include "core/ids.h"

#include <cstddef>
#include <cstdint>
#include <vector>

namespace slatewise::core {

/// How often each catalog item is shown across all users' top-k lists. Gives catalog
/// coverage and the Gini index of exposure; items never shown count as zero exposure.
/// One per worker, merged at the end.
class Exposure {
public:
    explicit Exposure(std::size_t items = 0) : m_counts(items, 0) {}

    void add(ItemIndex item) { ++m_counts[item.value]; }
    void merge(const Exposure& other);

    const std::vector<std::int64_t>& counts() const { return m_counts; }
    std::int64_t total() const;
    std::size_t distinctShown() const;

    /// Distinct items shown / catalog items; NaN for an empty catalog.
    double coverage() const;
    /// Gini index of the counts (see gini(std::vector<double>)).
    double gini() const;

    /// G = Σ_{i=1..n} (2i − n − 1)·x_i / (n·Σx) with x sorted ascending (the 1/n form of
    /// the Gini index; zero entries must be included). NaN when Σx = 0 or n = 0.
    static double gini(std::vector<double> values);

private:
    std::vector<std::int64_t> m_counts;
};

} // namespace slatewise::core
