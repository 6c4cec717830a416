// SPDX-License-Identifier: MIT
#pragma once

#include "core/error.h"

#include <QString>
#include <QVariant>

#include <functional>
#include <optional>

class QAbstractItemModel;

namespace slatewise::ui {

/// Writes any table model as CSV (RFC 4180: comma separated, CRLF line ends, a field with a
/// comma, quote, CR or LF is quoted and its quotes doubled). Text cells that a spreadsheet
/// would run as a formula (starting with '=', '+', '-', '@', tab or carriage return) get a
/// leading single quote; numbers, negative ones included, are written as numbers.
class CsvExporter {
public:
    /// One field, escaped and quoted as needed. Numeric QVariants (int, double, ...) are
    /// numbers; everything else is text. NaN and invalid variants give an empty field.
    static QString field(const QVariant& value);
    /// Called every few thousand rows with (rows done, rows in all); returning false cancels.
    using RowProgress = std::function<bool(int done, int total)>;

    /// Header row (horizontal header, DisplayRole) then every row of `model`'s top level.
    /// Empty when `progress` cancelled.
    static std::optional<QString> toCsv(
        const QAbstractItemModel& model, int role = Qt::DisplayRole, const RowProgress& progress = {});
    /// Writes through a temporary file: on an error or a cancel (ErrorKind::Cancelled) the
    /// target is left as it was.
    static core::Status write(const QAbstractItemModel& model, const QString& path, int role = Qt::DisplayRole,
        const RowProgress& progress = {});
};

} // namespace slatewise::ui
