// SPDX-License-Identifier: MIT
#include "app/slatewise/cliprogress.h"

#include <atomic>
#include <csignal>
#include <cstdio>
#include <unistd.h>

namespace slatewise::cli {

namespace {
// Ctrl-C cancels through core::Progress, so the command stops cleanly and writes nothing.
std::atomic<bool> g_interrupted { false };
extern "C" void onInterrupt(int)
{
    g_interrupted.store(true);
}
} // namespace

CliProgress::CliProgress(bool quiet)
    : m_enabled(!quiet && ::isatty(STDERR_FILENO) == 1)
{
    std::signal(SIGINT, onInterrupt);
    m_progress.cancel = &g_interrupted;
    if (m_enabled)
        m_progress.report = [this](double fraction, std::string_view stage) { report(fraction, stage); };
}

CliProgress::~CliProgress()
{
    finish();
}

void CliProgress::report(double fraction, std::string_view stage)
{
    std::lock_guard lock(m_mutex);
    const auto now = std::chrono::steady_clock::now();
    if (m_drawn && now - m_last < std::chrono::milliseconds(100) && fraction < 1.0)
        return;
    m_last = now;
    std::string line = std::to_string(static_cast<int>(fraction * 100.0 + 0.5)) + "% " + std::string(stage);
    if (line.size() > 100)
        line.resize(100);
    std::fprintf(stderr, "\r\033[K%s", line.c_str());
    std::fflush(stderr);
    m_drawn = true;
}

void CliProgress::finish()
{
    std::lock_guard lock(m_mutex);
    if (m_drawn) {
        std::fprintf(stderr, "\r\033[K");
        std::fflush(stderr);
        m_drawn = false;
    }
}

} // namespace slatewise::cli
