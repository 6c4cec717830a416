// SPDX-License-Identifier: MIT
#include "app/slatewise/offscreenapp.h"

#ifdef SLATEWISE_WITH_UI
namespace slatewise::cli {

namespace {
// QApplication keeps references to argc and argv for its whole life.
int qtArgc = 1;
char qtName[] = "slatewise";
char* qtArgv[] = { qtName, nullptr };
} // namespace

OffscreenApp::OffscreenApp()
{
    qputenv("QT_QPA_PLATFORM", "offscreen");
    m_app = std::make_unique<QApplication>(qtArgc, qtArgv);
}

OffscreenApp::~OffscreenApp() = default;

} // namespace slatewise::cli
#endif
