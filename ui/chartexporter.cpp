// SPDX-License-Identifier: MIT
#include "ui/chartexporter.h"

#include "ui/chartview.h"

#include <QFileInfo>
#include <QSvgGenerator>

#include <algorithm>

#include <qcustomplot.h>

namespace slatewise::ui {

namespace {
core::Error writeError(const QString& path, const QString& what)
{
    core::Error e;
    e.kind = core::ErrorKind::Workspace;
    e.file = path.toStdString();
    e.message = what.toStdString();
    e.expected = "a writable file path";
    return e;
}

bool validSize(QSize s)
{
    return s.width() >= 16 && s.height() >= 16 && s.width() <= 20000 && s.height() <= 20000;
}

core::Error sizeError(const QString& path, QSize s)
{
    core::Error e = writeError(path, QStringLiteral("chart size %1 x %2 is out of range").arg(s.width()).arg(s.height()));
    e.kind = core::ErrorKind::Usage;
    e.expected = "a width and height from 16 to 20000 pixels";
    return e;
}
} // namespace

core::Status ChartExporter::savePng(ChartView& chart, const QString& path, QSize pixels, int dpi)
{
    if (!validSize(pixels))
        return sizeError(path, pixels);
    if (dpi < 24 || dpi > 1200) {
        core::Error e = writeError(path, QStringLiteral("resolution %1 dpi is out of range").arg(dpi));
        e.kind = core::ErrorKind::Usage;
        e.expected = "a resolution from 24 to 1200 dpi";
        return e;
    }
    chart.refresh();
    // Draw at the logical size that keeps text at its physical size, scaled up to the
    // requested pixels: 1200 px at 192 dpi is a 600-point-wide chart drawn twice as sharp.
    const double scale = dpi / 96.0;
    const int w = std::max(1, static_cast<int>(pixels.width() / scale + 0.5));
    const int h = std::max(1, static_cast<int>(pixels.height() / scale + 0.5));
    const double exactScale = static_cast<double>(pixels.width()) / w;
    QCustomPlot* plot = chart.plot();
    // saveRastered rounds w * scale; render ourselves to get exactly the pixels asked for.
    QImage image(pixels, QImage::Format_ARGB32_Premultiplied);
    image.fill(chart.palette().color(QPalette::Base));
    {
        QCPPainter painter(&image);
        painter.setRenderHint(QPainter::Antialiasing);
        painter.setRenderHint(QPainter::TextAntialiasing);
        painter.scale(exactScale, static_cast<double>(pixels.height()) / h);
        plot->toPainter(&painter, w, h);
    }
    const int dotsPerMeter = static_cast<int>(dpi / 0.0254 + 0.5);
    image.setDotsPerMeterX(dotsPerMeter);
    image.setDotsPerMeterY(dotsPerMeter);
    if (!image.save(path, "PNG"))
        return writeError(path, QStringLiteral("could not write the PNG file"));
    return core::Done{};
}

core::Status ChartExporter::saveSvg(ChartView& chart, const QString& path, QSize size)
{
    if (!validSize(size))
        return sizeError(path, size);
    chart.refresh();
    QSvgGenerator generator;
    generator.setFileName(path);
    generator.setSize(size);
    generator.setViewBox(QRect(QPoint(0, 0), size));
    generator.setTitle(chart.title());
    generator.setDescription(QStringLiteral("Slatewise chart"));
    QCPPainter painter;
    if (!painter.begin(&generator))
        return writeError(path, QStringLiteral("could not write the SVG file"));
    painter.setMode(QCPPainter::pmVectorized);
    painter.setMode(QCPPainter::pmNoCaching);
    chart.plot()->toPainter(&painter, size.width(), size.height());
    painter.end();
    if (!QFileInfo(path).isFile() || QFileInfo(path).size() == 0)
        return writeError(path, QStringLiteral("could not write the SVG file"));
    return core::Done{};
}

core::Status ChartExporter::savePdf(ChartView& chart, const QString& path, QSize size)
{
    if (!validSize(size))
        return sizeError(path, size);
    chart.refresh();
    if (!chart.plot()->savePdf(path, size.width(), size.height(), QCP::epNoCosmetic, QStringLiteral("Slatewise"),
                               chart.title()))
        return writeError(path, QStringLiteral("could not write the PDF file"));
    return core::Done{};
}

void ChartExporter::paint(ChartView& chart, QPainter& painter, const QRectF& rect)
{
    chart.refresh();
    // A sharp raster (3x the logical size) placed into `rect`: a recorded vector picture
    // replayed on a 300 dpi PDF device came out at the wrong scale.
    const QSize logical = chart.width() > 100 ? chart.size() : QSize(900, 560);
    constexpr int scale = 3;
    QImage image(logical * scale, QImage::Format_ARGB32_Premultiplied);
    image.fill(Qt::white);
    {
        QCPPainter p(&image);
        p.setRenderHint(QPainter::Antialiasing);
        p.setRenderHint(QPainter::TextAntialiasing);
        p.scale(scale, scale);
        chart.plot()->toPainter(&p, logical.width(), logical.height());
    }
    painter.drawImage(rect, image);
}

} // namespace slatewise::ui
