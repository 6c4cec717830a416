// SPDX-License-Identifier: MIT
#pragma once

#include <atomic>
#include <functional>
#include <string_view>

namespace slatewise::core {

/// How long work reports progress and learns it was cancelled. Both parts are optional.
/// `report` may be called from worker threads; implementations must be thread-safe
/// (the UI forwards through a queued signal, the command line prints under a mutex).
struct Progress {
    std::function<void(double fraction, std::string_view stage)> report;
    const std::atomic<bool>* cancel = nullptr;

    bool cancelled() const { return cancel && cancel->load(std::memory_order_relaxed); }
    void operator()(double fraction, std::string_view stage) const
    {
        if (report)
            report(fraction, stage);
    }
};

} // namespace slatewise::core
