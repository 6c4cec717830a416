// SPDX-License-Identifier: MIT
#pragma once

#include "core/run.h"

#include <algorithm>
#include <cstdint>
#include <vector>

namespace slatewise::core {

/// Keeps the n best (item, score) pairs offered, in O(log n) per accepted pair and one
/// comparison per rejected one, so a user's whole catalog can be scanned cheaply.
/// Ties in score go to the lower item index, so lists are reproducible. NaN is ignored.
class TopNList {
public:
    explicit TopNList(std::size_t n) : m_n(n) { m_heap.reserve(n); }

    void clear() { m_heap.clear(); }
    std::size_t size() const { return m_heap.size(); }
    bool full() const { return m_heap.size() >= m_n; }
    std::size_t capacity() const { return m_n; }

    void offer(std::uint32_t item, float score)
    {
        if (m_n == 0 || !(score == score))
            return;
        if (m_heap.size() < m_n) {
            m_heap.push_back({item, score});
            std::push_heap(m_heap.begin(), m_heap.end(), better);
            return;
        }
        const Entry& worst = m_heap.front();
        if (score < worst.score || (score == worst.score && item > worst.item))
            return;
        std::pop_heap(m_heap.begin(), m_heap.end(), better);
        m_heap.back() = {item, score};
        std::push_heap(m_heap.begin(), m_heap.end(), better);
    }

    /// The kept pairs, best first. Leaves the selector empty.
    std::vector<ListEntry> take()
    {
        std::sort(m_heap.begin(), m_heap.end(), better);
        std::vector<ListEntry> out;
        out.reserve(m_heap.size());
        for (const Entry& e : m_heap)
            out.push_back({ItemIndex(e.item), e.score});
        m_heap.clear();
        return out;
    }

private:
    struct Entry {
        std::uint32_t item;
        float score;
    };
    // As a heap comparator this puts the worst kept entry at the front.
    static bool better(const Entry& a, const Entry& b)
    {
        return a.score > b.score || (a.score == b.score && a.item < b.item);
    }
    std::size_t m_n;
    std::vector<Entry> m_heap;
};

} // namespace slatewise::core
