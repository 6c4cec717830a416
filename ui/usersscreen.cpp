// SPDX-License-Identifier: MIT
#include "ui/usersscreen.h"

#include "core/evaluation.h"
#include "ui/format.h"
#include "ui/userbrowsermodel.h"
#include "ui/userbrowserproxy.h"
#include "ui/workspacedocument.h"

#include <QComboBox>
#include <QFontMetrics>
#include <QHBoxLayout>
#include <QHeaderView>
#include <QItemSelectionModel>
#include <QKeyEvent>
#include <QLabel>
#include <QLineEdit>
#include <QStyle>
#include <QTableView>
#include <QVBoxLayout>

#include <algorithm>

namespace slatewise::ui {

UsersScreen::UsersScreen(WorkspaceDocument* document, QWidget* parent)
    : QWidget(parent)
    , m_document(document)
    , m_model(new UserBrowserModel(this))
    , m_proxy(new UserBrowserProxy(this))
    , m_run(new QComboBox(this))
    , m_sortBy(new QComboBox(this))
    , m_warning(new QComboBox(this))
    , m_segment(new QComboBox(this))
    , m_text(new QLineEdit(this))
    , m_count(new QLabel(this))
    , m_table(new QTableView(this))
{
    m_proxy->setSourceModel(m_model);

    // "Worst first by": every column except the user id.
    for (int c = UserBrowserModel::Warnings; c < UserBrowserModel::ColumnCount; ++c)
        m_sortBy->addItem(m_model->columnSpec(c).title, c);
    m_sortBy->setToolTip(tr("Order users so the worst served by this measure come first (undefined values last)."));

    m_warning->addItem(tr("All users"), UserBrowserProxy::kAnyOrNone);
    m_warning->addItem(tr("Any warning"), UserBrowserProxy::kAnyWarning);
    m_warning->addItem(tr("No warning"), UserBrowserProxy::kNoWarning);
    for (const auto& w : core::allWarnings()) {
        m_warning->addItem(toQ(w.title), static_cast<int>(w.code));
        m_warning->setItemData(m_warning->count() - 1, toQ(w.explains), Qt::ToolTipRole);
    }
    m_segment->addItem(tr("All activity levels"), static_cast<int>(UserBrowserProxy::Segment::All));
    m_segment->addItem(tr("Cold users"), static_cast<int>(UserBrowserProxy::Segment::Cold));
    m_segment->addItem(tr("Least active quarter"), static_cast<int>(UserBrowserProxy::Segment::Activity1));
    m_segment->addItem(tr("Second quarter"), static_cast<int>(UserBrowserProxy::Segment::Activity2));
    m_segment->addItem(tr("Third quarter"), static_cast<int>(UserBrowserProxy::Segment::Activity3));
    m_segment->addItem(tr("Most active quarter"), static_cast<int>(UserBrowserProxy::Segment::Activity4));
    m_segment->setToolTip(
        tr("Activity = the number of train interactions (history); quarters split the evaluated users."));
    m_text->setPlaceholderText(tr("Find user id…"));
    m_text->setClearButtonEnabled(true);

    auto* bar = new QHBoxLayout;
    const auto add = [&](const QString& label, QWidget* w) {
        auto* l = new QLabel(label, this);
        l->setBuddy(w);
        bar->addWidget(l);
        bar->addWidget(w);
    };
    add(tr("R&un:"), m_run);
    add(tr("&Worst first by:"), m_sortBy);
    add(tr("W&arning:"), m_warning);
    add(tr("&Segment:"), m_segment);
    bar->addWidget(m_text, 1);
    bar->addWidget(m_count);

    m_table->setModel(m_proxy);
    m_table->setSelectionBehavior(QAbstractItemView::SelectRows);
    m_table->setSelectionMode(QAbstractItemView::SingleSelection);
    m_table->setSortingEnabled(true);
    m_table->setAlternatingRowColors(true);
    m_table->setWordWrap(false);
    m_table->verticalHeader()->hide();
    // Fixed row height: the view never measures 200,000 rows.
    m_table->verticalHeader()->setSectionResizeMode(QHeaderView::Fixed);
    m_table->verticalHeader()->setDefaultSectionSize(m_table->fontMetrics().height() + 6);
    m_table->horizontalHeader()->setSectionResizeMode(QHeaderView::Interactive);
    m_table->horizontalHeader()->setSortIndicatorShown(true);
    {
        // Every header readable in full, sort arrow included; the titles are fixed, so once.
        QHeaderView* header = m_table->horizontalHeader();
        const QFontMetrics metrics(header->font());
        const int room = 2 * header->style()->pixelMetric(QStyle::PM_HeaderMargin, nullptr, header)
            + header->style()->pixelMetric(QStyle::PM_HeaderMarkSize, nullptr, header) + 8;
        for (int c = 0; c < m_model->columnCount(); ++c)
            header->resizeSection(c,
                std::max(header->defaultSectionSize(),
                    metrics.horizontalAdvance(m_model->headerData(c, Qt::Horizontal).toString()) + room));
    }
    m_table->horizontalHeader()->setToolTip(tr("Click a column to sort worst first; click again for best first."));

    auto* layout = new QVBoxLayout(this);
    layout->addLayout(bar);
    layout->addWidget(m_table, 1);

    connect(m_run, &QComboBox::currentIndexChanged, this, &UsersScreen::loadRun);
    connect(
        m_sortBy, &QComboBox::currentIndexChanged, this, [this] { sortWorstFirst(m_sortBy->currentData().toInt()); });
    connect(m_warning, &QComboBox::currentIndexChanged, this, [this] {
        m_proxy->setWarningFilter(m_warning->currentData().toInt());
        updateCount();
    });
    connect(m_segment, &QComboBox::currentIndexChanged, this, [this] {
        m_proxy->setSegment(static_cast<UserBrowserProxy::Segment>(m_segment->currentData().toInt()));
        updateCount();
    });
    connect(m_text, &QLineEdit::textChanged, this, [this](const QString& text) {
        m_proxy->setUserText(text.trimmed());
        updateCount();
    });
    connect(m_table, &QTableView::activated, this, [this] { emitCurrent(true); });
    connect(m_table->selectionModel(), &QItemSelectionModel::currentRowChanged, this, [this] { emitCurrent(false); });
    connect(document, &WorkspaceDocument::evaluationsChanged, this, &UsersScreen::rebuildRuns);
    connect(document, &WorkspaceDocument::datasetLoaded, this, &UsersScreen::loadRun);
    connect(document, &WorkspaceDocument::closed, this, &UsersScreen::rebuildRuns);
    m_sortBy->setCurrentIndex(m_sortBy->findData(UserBrowserModel::columnOf(core::Metric::Ndcg)));
    rebuildRuns();
}

QString UsersScreen::currentRun() const
{
    return m_run->currentText();
}

void UsersScreen::setRun(const QString& runName)
{
    const int i = m_run->findText(runName);
    if (i >= 0)
        m_run->setCurrentIndex(i);
}

void UsersScreen::rebuildRuns()
{
    const QString previous = m_run->currentText();
    {
        const QSignalBlocker block(m_run);
        m_run->clear();
        m_run->addItems(m_document->runNames());
        const int i = m_run->findText(previous);
        m_run->setCurrentIndex(i >= 0 ? i : 0);
    }
    loadRun();
}

void UsersScreen::loadRun()
{
    m_model->setResults(m_document->evaluation(m_run->currentText()), m_document->userIds());
    sortWorstFirst(m_sortBy->currentData().toInt());
    updateCount();
}

void UsersScreen::sortWorstFirst(int column)
{
    {
        const QSignalBlocker block(m_sortBy);
        m_sortBy->setCurrentIndex(m_sortBy->findData(column));
    }
    m_table->sortByColumn(column, Qt::AscendingOrder);
}

void UsersScreen::sortWorstFirst(core::Metric metric)
{
    sortWorstFirst(UserBrowserModel::columnOf(metric));
}

void UsersScreen::updateCount()
{
    m_count->setText(tr("%1 of %2 users").arg(m_proxy->rowCount()).arg(m_model->rowCount()));
}

void UsersScreen::emitCurrent(bool open)
{
    const QModelIndex current = m_table->currentIndex();
    if (!current.isValid())
        return;
    const QModelIndex source = m_proxy->mapToSource(current);
    emit userChosen(m_run->currentText(), m_model->userAt(source.row()), open);
}

std::optional<core::UserIndex> UsersScreen::neighbour(core::UserIndex user, int step) const
{
    const int sourceRow = m_model->rowOfUser(user);
    if (sourceRow < 0)
        return std::nullopt;
    const QModelIndex proxyIndex = m_proxy->mapFromSource(m_model->index(sourceRow, 0));
    if (!proxyIndex.isValid())
        return std::nullopt;
    const int row = proxyIndex.row() + step;
    if (row < 0 || row >= m_proxy->rowCount())
        return std::nullopt;
    return m_model->userAt(m_proxy->mapToSource(m_proxy->index(row, 0)).row());
}

std::optional<core::UserIndex> UsersScreen::firstUser() const
{
    if (m_proxy->rowCount() == 0)
        return std::nullopt;
    return m_model->userAt(m_proxy->mapToSource(m_proxy->index(0, 0)).row());
}

void UsersScreen::selectUser(core::UserIndex user)
{
    const int sourceRow = m_model->rowOfUser(user);
    if (sourceRow < 0)
        return;
    const QModelIndex proxyIndex = m_proxy->mapFromSource(m_model->index(sourceRow, 0));
    if (!proxyIndex.isValid())
        return;
    const QSignalBlocker block(m_table->selectionModel());
    m_table->setCurrentIndex(proxyIndex);
    m_table->scrollTo(proxyIndex);
}

} // namespace slatewise::ui
