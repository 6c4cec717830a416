// SPDX-License-Identifier: MIT
#include "ui/application.h"

#include <QApplication>
#include <QLabel>

namespace slatewise::ui {

int runApplication(int argc, char** argv)
{
    QApplication app(argc, argv);
    QApplication::setApplicationName(QStringLiteral("Slatewise"));
    QLabel label(QStringLiteral("Slatewise"));
    label.show();
    return QApplication::exec();
}

} // namespace slatewise::ui
