// SPDX-License-Identifier: MIT
#include "ui/columnorder.h"

#include <QHeaderView>
#include <QTableView>

namespace slatewise::ui {

void showColumnsEarly(QTableView* view, std::initializer_list<int> columns)
{
    QHeaderView* header = view->horizontalHeader();
    int to = 1;
    for (int logical : columns)
        header->moveSection(header->visualIndex(logical), to++);
}

} // namespace slatewise::ui
