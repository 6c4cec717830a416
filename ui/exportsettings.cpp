// SPDX-License-Identifier: MIT
#include "ui/exportsettings.h"

#include <QDir>
#include <QFileInfo>
#include <QSettings>
#include <QStandardPaths>

#include <algorithm>

namespace slatewise::ui {

namespace {
const QString kFolderKey = QStringLiteral("export/folder");
const QString kWidthKey = QStringLiteral("export/pngWidth");
const QString kHeightKey = QStringLiteral("export/pngHeight");
const QString kDpiKey = QStringLiteral("export/pngDpi");
} // namespace

QSize ExportSettings::Png::logicalSize() const
{
    const double scale = std::max(24, dpi) / 96.0;
    return { std::max(16, static_cast<int>(pixels.width() / scale + 0.5)),
        std::max(16, static_cast<int>(pixels.height() / scale + 0.5)) };
}

ExportSettings::Png ExportSettings::png()
{
    const QSettings settings;
    Png png;
    png.pixels.setWidth(std::clamp(settings.value(kWidthKey, png.pixels.width()).toInt(), 16, 20000));
    png.pixels.setHeight(std::clamp(settings.value(kHeightKey, png.pixels.height()).toInt(), 16, 20000));
    png.dpi = std::clamp(settings.value(kDpiKey, png.dpi).toInt(), 24, 1200);
    return png;
}

void ExportSettings::setPng(const Png& png)
{
    QSettings settings;
    settings.setValue(kWidthKey, png.pixels.width());
    settings.setValue(kHeightKey, png.pixels.height());
    settings.setValue(kDpiKey, png.dpi);
}

QString ExportSettings::lastFolder()
{
    const QString folder = QSettings().value(kFolderKey).toString();
    if (!folder.isEmpty() && QFileInfo(folder).isDir())
        return folder;
    const QString documents = QStandardPaths::writableLocation(QStandardPaths::DocumentsLocation);
    return documents.isEmpty() ? QDir::homePath() : documents;
}

void ExportSettings::rememberPath(const QString& path)
{
    if (path.isEmpty())
        return;
    const QFileInfo info(path);
    QSettings().setValue(kFolderKey, info.isDir() ? info.absoluteFilePath() : info.absolutePath());
}

} // namespace slatewise::ui
