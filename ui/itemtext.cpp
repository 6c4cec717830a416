// SPDX-License-Identifier: MIT
#include "ui/itemtext.h"

#include "core/dataset.h"
#include "ui/format.h"

#include <QCoreApplication>
#include <QStringList>

namespace slatewise::ui {

QString ItemText::title(const core::Dataset& data, core::ItemIndex item)
{
    const auto& it = data.items[item.value];
    return it.title.empty() ? toQ(it.externalId) : toQ(it.title);
}

QString ItemText::year(const core::Dataset& data, core::ItemIndex item)
{
    const auto y = data.items[item.value].year;
    return y > 0 ? QString::number(y) : QString();
}

QString ItemText::genres(const core::Dataset& data, core::ItemIndex item)
{
    QStringList names;
    for (auto g : data.items[item.value].genres)
        if (g >= 0 && static_cast<std::size_t>(g) < data.genreNames.size())
            names << toQ(data.genreNames[static_cast<std::size_t>(g)]);
    return names.join(QStringLiteral(", "));
}

QString ItemText::series(const core::Dataset& data, core::ItemIndex item)
{
    const auto& it = data.items[item.value];
    if (it.series == core::kNone || static_cast<std::size_t>(it.series) >= data.seriesNames.size())
        return {};
    return QCoreApplication::translate("ItemText", "%1, part %2")
        .arg(toQ(data.seriesNames[static_cast<std::size_t>(it.series)]))
        .arg(it.seriesPart);
}

} // namespace slatewise::ui
