// SPDX-License-Identifier: MIT
#pragma once

#include <cstddef>
#include <cstdint>
#include <span>
#include <vector>

namespace slatewise::core {

/// A genre distribution built from items, each item's genres sharing one unit of weight
/// (an item tagged Drama and Crime adds 0.5 to each), as in Steck, "Calibrated
/// recommendations", RecSys 2018. Items without genres add nothing.
class GenreMix {
public:
    explicit GenreMix(std::size_t genres = 0) : m_weight(genres, 0.0) {}

    void clear();
    void add(std::span<const std::int32_t> genres);

    double total() const { return m_total; }
    std::size_t size() const { return m_weight.size(); }
    /// Normalised share of genre g (0 when the mix is empty).
    double share(std::size_t g) const { return m_total > 0.0 ? m_weight[g] / m_total : 0.0; }
    const std::vector<double>& weights() const { return m_weight; }
    /// The genre with the largest weight; -1 when empty. Ties go to the lower index.
    std::int32_t dominant() const;

    /// KL(p‖q̃) in nats with q̃ = (1−α)q + αp, after normalising p and q to sum 1; terms with
    /// p_g = 0 contribute 0. NaN when either side has no weight or the sizes differ.
    static double calibrationKl(std::span<const double> p, std::span<const double> q, double alpha);
    static double calibrationKl(const GenreMix& history, const GenreMix& list, double alpha)
    {
        return calibrationKl(history.m_weight, list.m_weight, alpha);
    }

private:
    std::vector<double> m_weight;
    double m_total = 0.0;
};

} // namespace slatewise::core
