// SPDX-License-Identifier: MIT
#pragma once

#include "core/progress.h"

#include <chrono>
#include <memory>
#include <mutex>
#include <string>

namespace slatewise::cli {

/// A core::Progress that draws one updating line on stderr ("42% reading train.csv: ...")
/// when stderr is a terminal and `quiet` is off; otherwise it prints nothing. Thread-safe,
/// and throttled to about ten updates a second. Reuse it in every long-running command.
class CliProgress {
public:
    explicit CliProgress(bool quiet);
    ~CliProgress();
    CliProgress(const CliProgress&) = delete;
    CliProgress& operator=(const CliProgress&) = delete;

    /// The Progress to pass into core; valid while this object lives.
    const core::Progress& progress() const { return m_progress; }
    /// Clears the progress line (call before printing results).
    void finish();
    bool enabled() const { return m_enabled; }

private:
    void report(double fraction, std::string_view stage);

    bool m_enabled = false;
    bool m_drawn = false;
    std::mutex m_mutex;
    std::chrono::steady_clock::time_point m_last{};
    core::Progress m_progress;
};

} // namespace slatewise::cli
