// SPDX-License-Identifier: MIT
#pragma once

#include "ui/exportsettings.h"

#include <QDialog>

class QLabel;
class QSpinBox;

namespace slatewise::ui {

/// Asks for the PNG size in pixels and its resolution (DPI) before a chart is saved as PNG.
/// It only collects the choice; the caller saves and remembers it (ExportSettings).
class PngSizeDialog : public QDialog {
    Q_OBJECT
public:
    explicit PngSizeDialog(const ExportSettings::Png& initial, QWidget* parent = nullptr);

    ExportSettings::Png options() const;
    void setOptions(const ExportSettings::Png& options);
    /// The explanation under the fields ("prints at 28.2 × 17.6 cm; …").
    QString explanation() const;

private:
    void updateExplanation();

    QSpinBox* m_width;
    QSpinBox* m_height;
    QSpinBox* m_dpi;
    QLabel* m_explanation;
};

} // namespace slatewise::ui
