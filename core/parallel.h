// SPDX-License-Identifier: MIT
#pragma once

#include <algorithm>
#include <cstddef>
#include <thread>
#include <vector>

namespace slatewise::core {

/// Number of worker threads: every core the machine reports (at least one).
inline unsigned workerCount()
{
    return std::max(1u, std::thread::hardware_concurrency());
}

/// Runs fn(begin, end, worker) over [0, n) split into one contiguous block per worker.
/// Blocks are contiguous so per-user results can be written without locks.
template <typename Fn>
void parallelFor(std::size_t n, Fn&& fn, unsigned workers = workerCount())
{
    workers = static_cast<unsigned>(std::min<std::size_t>(workers, std::max<std::size_t>(n, 1)));
    if (workers <= 1) {
        fn(std::size_t{0}, n, 0u);
        return;
    }
    std::vector<std::thread> threads;
    threads.reserve(workers);
    const std::size_t chunk = (n + workers - 1) / workers;
    for (unsigned w = 0; w < workers; ++w) {
        const std::size_t begin = std::min(n, w * chunk);
        const std::size_t end = std::min(n, begin + chunk);
        threads.emplace_back([&fn, begin, end, w] { fn(begin, end, w); });
    }
    for (auto& t : threads)
        t.join();
}

} // namespace slatewise::core
