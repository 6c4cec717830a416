// SPDX-License-Identifier: MIT
#include "ui/pngsizedialog.h"

#include <QComboBox>
#include <QDialogButtonBox>
#include <QFormLayout>
#include <QLabel>
#include <QLocale>
#include <QPushButton>
#include <QSpinBox>
#include <QVBoxLayout>

namespace slatewise::ui {

PngSizeDialog::PngSizeDialog(const ExportSettings::Png& initial, QWidget* parent)
    : QDialog(parent)
    , m_width(new QSpinBox(this))
    , m_height(new QSpinBox(this))
    , m_dpi(new QSpinBox(this))
    , m_explanation(new QLabel(this))
{
    setWindowTitle(tr("PNG size"));
    // The limits ChartExporter accepts.
    for (auto* box : { m_width, m_height }) {
        box->setRange(16, 20000);
        box->setSuffix(tr(" px"));
        box->setSingleStep(100);
    }
    m_dpi->setRange(24, 1200);
    m_dpi->setSuffix(tr(" dpi"));
    m_dpi->setSingleStep(24);
    m_width->setToolTip(tr("Width of the image in pixels."));
    m_height->setToolTip(tr("Height of the image in pixels."));
    m_dpi->setToolTip(tr("Dots per inch stored in the file. Text keeps its printed size, so more dpi gives a sharper "
                         "chart with relatively larger text; 96 dpi draws it as on screen."));

    auto* presets = new QComboBox(this);
    presets->addItem(tr("Choose a preset…"));
    presets->addItem(tr("Slide, 1600 × 1000 at 144 dpi"), QVariantList { 1600, 1000, 144 });
    presets->addItem(tr("Wide slide, 1920 × 1080 at 144 dpi"), QVariantList { 1920, 1080, 144 });
    presets->addItem(tr("Document, 2400 × 1500 at 300 dpi"), QVariantList { 2400, 1500, 300 });
    presets->addItem(tr("Screen size, 1200 × 800 at 96 dpi"), QVariantList { 1200, 800, 96 });
    connect(presets, &QComboBox::activated, this, [this, presets](int index) {
        const QVariantList values = presets->itemData(index).toList();
        if (values.size() == 3)
            setOptions({ QSize(values[0].toInt(), values[1].toInt()), values[2].toInt() });
        presets->setCurrentIndex(0);
    });

    auto* form = new QFormLayout;
    form->addRow(tr("&Width:"), m_width);
    form->addRow(tr("&Height:"), m_height);
    form->addRow(tr("&Resolution:"), m_dpi);
    form->addRow(tr("&Preset:"), presets);
    m_explanation->setWordWrap(true);

    auto* buttons = new QDialogButtonBox(QDialogButtonBox::Ok | QDialogButtonBox::Cancel, this);
    buttons->button(QDialogButtonBox::Ok)->setText(tr("&Save…"));
    connect(buttons, &QDialogButtonBox::accepted, this, &QDialog::accept);
    connect(buttons, &QDialogButtonBox::rejected, this, &QDialog::reject);

    auto* layout = new QVBoxLayout(this);
    layout->addLayout(form);
    layout->addWidget(m_explanation);
    layout->addWidget(buttons);

    for (auto* box : { m_width, m_height, m_dpi })
        connect(box, &QSpinBox::valueChanged, this, &PngSizeDialog::updateExplanation);
    setOptions(initial);
}

ExportSettings::Png PngSizeDialog::options() const
{
    return { QSize(m_width->value(), m_height->value()), m_dpi->value() };
}

void PngSizeDialog::setOptions(const ExportSettings::Png& options)
{
    m_width->setValue(options.pixels.width());
    m_height->setValue(options.pixels.height());
    m_dpi->setValue(options.dpi);
    updateExplanation();
}

QString PngSizeDialog::explanation() const
{
    return m_explanation->text();
}

void PngSizeDialog::updateExplanation()
{
    const auto o = options();
    const double cmPerPixel = 2.54 / o.dpi;
    const QLocale locale;
    m_explanation->setText(
        tr("Prints at %1 × %2 cm. The chart is laid out at %3 × %4 screen points and drawn %5 times as "
           "sharp.")
            .arg(locale.toString(o.pixels.width() * cmPerPixel, 'f', 1),
                locale.toString(o.pixels.height() * cmPerPixel, 'f', 1))
            .arg(o.logicalSize().width())
            .arg(o.logicalSize().height())
            .arg(locale.toString(o.dpi / 96.0, 'g', 3)));
}

} // namespace slatewise::ui
