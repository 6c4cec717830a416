// SPDX-License-Identifier: MIT
#pragma once

#include "core/error.h"

#include <QRectF>
#include <QSize>
#include <QString>

class QPainter;

namespace slatewise::ui {

class ChartView;

/// Writes a chart to PNG, SVG or PDF. Sizes are in output pixels for PNG; `dpi` scales the
/// drawing so that text keeps its physical size (96 = 1:1) and is stored in the PNG.
/// SVG and PDF are vector output at the given logical size.
class ChartExporter {
public:
    static core::Status savePng(ChartView& chart, const QString& path, QSize pixels = {1200, 800}, int dpi = 96);
    static core::Status saveSvg(ChartView& chart, const QString& path, QSize size = {1200, 800});
    static core::Status savePdf(ChartView& chart, const QString& path, QSize size = {1200, 800});
    /// Draws the chart into `rect` of any painter (used by the meeting pack).
    static void paint(ChartView& chart, QPainter& painter, const QRectF& rect);
};

} // namespace slatewise::ui
