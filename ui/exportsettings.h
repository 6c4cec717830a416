// SPDX-License-Identifier: MIT
#pragma once

#include <QSize>
#include <QString>

namespace slatewise::ui {

/// The export choices the workbench remembers between sessions (QSettings): the folder last
/// written to and the PNG size and resolution last asked for.
class ExportSettings {
public:
    /// PNG output: pixels and the resolution stored in the file. Defaults match `slatewise export`.
    struct Png {
        QSize pixels { 1600, 1000 };
        int dpi = 144;
        /// The logical size charts are laid out at, so text keeps its physical size (96 dpi = 1:1).
        QSize logicalSize() const;
    };

    static Png png();
    static void setPng(const Png& png);
    /// Folder of the last export (the user's documents folder before the first one).
    static QString lastFolder();
    /// Remembers the folder of `path` (a file) or `path` itself when it is a folder.
    static void rememberPath(const QString& path);
};

} // namespace slatewise::ui
