// SPDX-License-Identifier: MIT
#include "ui/csvexporter.h"

#include <QAbstractItemModel>
#include <QRegularExpression>
#include <QSaveFile>

#include <cmath>

namespace slatewise::ui {

namespace {
bool isNumeric(const QVariant& v)
{
    switch (v.typeId()) {
    case QMetaType::Int:
    case QMetaType::UInt:
    case QMetaType::Long:
    case QMetaType::ULong:
    case QMetaType::LongLong:
    case QMetaType::ULongLong:
    case QMetaType::Short:
    case QMetaType::UShort:
    case QMetaType::Double:
    case QMetaType::Float:
        return true;
    default:
        return false;
    }
}

QString quoteIfNeeded(const QString& text)
{
    // RFC 4180 section 2: fields with commas, quotes or line breaks are enclosed in double
    // quotes and embedded quotes are doubled.
    if (!text.contains(QLatin1Char(',')) && !text.contains(QLatin1Char('"')) && !text.contains(QLatin1Char('\n'))
        && !text.contains(QLatin1Char('\r')))
        return text;
    QString quoted = text;
    quoted.replace(QLatin1Char('"'), QStringLiteral("\"\""));
    return QLatin1Char('"') + quoted + QLatin1Char('"');
}
} // namespace

QString CsvExporter::field(const QVariant& value)
{
    if (!value.isValid() || value.isNull())
        return {};
    if (isNumeric(value)) {
        if (value.typeId() == QMetaType::Double || value.typeId() == QMetaType::Float) {
            const double d = value.toDouble();
            if (!std::isfinite(d))
                return {};
            // Shortest of 15 or 17 significant digits that reads back to the same double.
            QString text = QString::number(d, 'g', 15);
            if (text.toDouble() != d)
                text = QString::number(d, 'g', 17);
            return text;
        }
        return value.toString();
    }
    QString text = value.toString();
    // Models often hand numbers over as formatted text ("-0.125"); a plain decimal number is
    // no formula and must stay a number for the spreadsheet.
    static const QRegularExpression plainNumber(QStringLiteral("^-?(\\d+(\\.\\d*)?|\\.\\d+)([eE][-+]?\\d+)?$"));
    if (plainNumber.match(text).hasMatch())
        return text;
    // Formula injection: spreadsheets evaluate text starting with these characters. A leading
    // apostrophe makes them show the text as it is.
    if (!text.isEmpty()) {
        const QChar first = text.front();
        if (first == QLatin1Char('=') || first == QLatin1Char('+') || first == QLatin1Char('-')
            || first == QLatin1Char('@') || first == QLatin1Char('\t') || first == QLatin1Char('\r'))
            text.prepend(QLatin1Char('\''));
    }
    return quoteIfNeeded(text);
}

std::optional<QString> CsvExporter::toCsv(const QAbstractItemModel& model, int role, const RowProgress& progress)
{
    QString out;
    const int columns = model.columnCount();
    const int rows = model.rowCount();
    const QString lineEnd = QStringLiteral("\r\n");
    for (int c = 0; c < columns; ++c) {
        if (c > 0)
            out += QLatin1Char(',');
        // Headers are text: escape them like any text cell.
        out += field(QVariant(model.headerData(c, Qt::Horizontal, Qt::DisplayRole).toString()));
    }
    out += lineEnd;
    for (int r = 0; r < rows; ++r) {
        if (progress && r % 2048 == 0 && !progress(r, rows))
            return std::nullopt;
        for (int c = 0; c < columns; ++c) {
            if (c > 0)
                out += QLatin1Char(',');
            out += field(model.data(model.index(r, c), role));
        }
        out += lineEnd;
    }
    return out;
}

core::Status CsvExporter::write(
    const QAbstractItemModel& model, const QString& path, int role, const RowProgress& progress)
{
    QSaveFile file(path);
    const auto fileError = [&] {
        return core::Error { .kind = core::ErrorKind::Workspace,
            .file = path.toStdString(),
            .message = file.errorString().toStdString(),
            .expected = "a writable file path" };
    };
    if (!file.open(QIODevice::WriteOnly))
        return fileError();
    const auto text = toCsv(model, role, progress);
    if (!text) {
        file.cancelWriting();
        return core::Error { .kind = core::ErrorKind::Cancelled,
            .file = path.toStdString(),
            .message = "saving was cancelled; nothing was written" };
    }
    file.write(text->toUtf8());
    if (!file.commit())
        return fileError();
    return core::Done {};
}

} // namespace slatewise::ui
