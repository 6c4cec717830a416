// SPDX-License-Identifier: MIT
#pragma once

#ifdef SLATEWISE_WITH_UI
#include <QApplication>

#include <memory>

namespace slatewise::cli {

/// The Qt application for the commands that draw charts and PDFs headless (`export`,
/// `report`): it selects the offscreen platform first, so no display is needed.
class OffscreenApp {
public:
    OffscreenApp();
    ~OffscreenApp();
    OffscreenApp(const OffscreenApp&) = delete;
    OffscreenApp& operator=(const OffscreenApp&) = delete;

private:
    std::unique_ptr<QApplication> m_app;
};

} // namespace slatewise::cli
#endif
