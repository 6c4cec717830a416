// SPDX-License-Identifier: MIT
#pragma once

#include <cstdint>

namespace slatewise::core {

/// Running sums of prediction errors (score − rating) for RMSE, MAE and mean signed error.
class AccuracyAccumulator {
public:
    void add(double score, double rating)
    {
        const double e = score - rating;
        ++m_n;
        m_sum += e;
        m_sumAbs += e < 0 ? -e : e;
        m_sumSquares += e * e;
    }
    void merge(const AccuracyAccumulator& other)
    {
        m_n += other.m_n;
        m_sum += other.m_sum;
        m_sumAbs += other.m_sumAbs;
        m_sumSquares += other.m_sumSquares;
    }

    std::int64_t n() const { return m_n; }
    double sumError() const { return m_sum; }
    double sumAbsError() const { return m_sumAbs; }
    double sumSquaredError() const { return m_sumSquares; }
    /// NaN when nothing was added.
    double rmse() const;
    double mae() const;
    double meanError() const;

private:
    std::int64_t m_n = 0;
    double m_sum = 0.0, m_sumAbs = 0.0, m_sumSquares = 0.0;
};

} // namespace slatewise::core
