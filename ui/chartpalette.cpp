// SPDX-License-Identifier: MIT
#include "ui/chartpalette.h"

#include <array>

namespace slatewise::ui {

namespace {
struct Tone {
    QRgb onLight;
    QRgb onDark;
};

// Our own series set. Order alternates warm/cool and dark/light so that the first runs on a
// chart (the usual case: two to four) differ in both hue and lightness.
constexpr std::array<Tone, ChartPalette::kSeriesCount> kSeries{{
    {0x2a64a8, 0x84b6ee}, // harbour blue
    {0xd27a22, 0xf5b062}, // amber
    {0x14806f, 0x5fcbb6}, // deep teal
    {0x9c3f8f, 0xdc92d2}, // plum
    {0x8a7a12, 0xe3cf63}, // mustard
    {0x56667c, 0xb0bfd2}, // slate
    {0xb2402f, 0xf08c7a}, // brick
    {0x5e8420, 0xb0d672}, // moss
}};
} // namespace

ChartPalette::ChartPalette(const QPalette& palette)
{
    m_background = palette.color(QPalette::Base);
    m_text = palette.color(QPalette::WindowText);
    m_dark = m_background.lightnessF() < 0.5;
    // Axes a little softer than text; grid lines faint but visible on both palettes.
    const auto mix = [](const QColor& a, const QColor& b, double t) {
        return QColor::fromRgbF(static_cast<float>(a.redF() * (1 - t) + b.redF() * t),
                                static_cast<float>(a.greenF() * (1 - t) + b.greenF() * t),
                                static_cast<float>(a.blueF() * (1 - t) + b.blueF() * t));
    };
    m_axis = mix(m_text, m_background, 0.25);
    m_grid = mix(m_text, m_background, 0.82);
    m_subGrid = mix(m_text, m_background, 0.92);
}

QColor ChartPalette::series(int i) const
{
    const auto& tone = kSeries[static_cast<std::size_t>(((i % kSeriesCount) + kSeriesCount) % kSeriesCount)];
    return QColor::fromRgb(m_dark ? tone.onDark : tone.onLight);
}

QColor ChartPalette::better() const
{
    return QColor::fromRgb(m_dark ? 0x6fb0ea : 0x23619f);
}

QColor ChartPalette::worse() const
{
    return QColor::fromRgb(m_dark ? 0xf4a25c : 0xc8601a);
}

QColor ChartPalette::neutral() const
{
    return m_grid;
}

QColor ChartPalette::highlight() const
{
    QColor c = QColor::fromRgb(m_dark ? 0xe3cf63 : 0xe8c547);
    c.setAlphaF(m_dark ? 0.16f : 0.22f);
    return c;
}

} // namespace slatewise::ui
