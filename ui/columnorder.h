// SPDX-License-Identifier: MIT
#pragma once

#include <initializer_list>

class QTableView;

namespace slatewise::ui {

/// Shows the logical `columns` right after the view's first column, in that order, leaving
/// the model (and so CSV export) unchanged: verdicts and the numbers a reader acts on stay
/// in sight while long text columns scroll.
void showColumnsEarly(QTableView* view, std::initializer_list<int> columns);

} // namespace slatewise::ui
