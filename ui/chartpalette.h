// SPDX-License-Identifier: MIT
#pragma once

#include <QColor>
#include <QPalette>

namespace slatewise::ui {

/// Slatewise's chart colours. Series hues are our own set, chosen so neighbours differ in
/// lightness as well as hue (readable with red-green colour blindness) and each hue comes
/// in a deeper tone for light backgrounds and a lighter tone for dark ones. Text, axes and
/// grid follow the widget's QPalette, so charts read on light and dark system palettes.
class ChartPalette {
public:
    explicit ChartPalette(const QPalette& palette);

    static constexpr int kSeriesCount = 8;
    /// Colour of series i (runs, genres); wraps after kSeriesCount.
    QColor series(int i) const;
    QColor background() const { return m_background; }
    QColor text() const { return m_text; }
    QColor axis() const { return m_axis; }
    QColor grid() const { return m_grid; }
    QColor subGrid() const { return m_subGrid; }
    /// For "better off" and "worse off" users; also distinct in lightness.
    QColor better() const;
    QColor worse() const;
    QColor neutral() const;
    /// Shade behind the recent window of the genre timeline and similar highlights.
    QColor highlight() const;
    bool isDark() const { return m_dark; }

private:
    QColor m_background, m_text, m_axis, m_grid, m_subGrid;
    bool m_dark = false;
};

} // namespace slatewise::ui
