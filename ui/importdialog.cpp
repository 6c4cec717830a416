// SPDX-License-Identifier: MIT
#include "ui/importdialog.h"

#include "core/importer.h"
#include "core/progress.h"
#include "ui/backgroundtask.h"
#include "ui/format.h"

#include <QApplication>
#include <QClipboard>
#include <QDialogButtonBox>
#include <QFileDialog>
#include <QFileInfo>
#include <QFormLayout>
#include <QGroupBox>
#include <QHBoxLayout>
#include <QHeaderView>
#include <QLabel>
#include <QLineEdit>
#include <QListWidget>
#include <QProgressBar>
#include <QPushButton>
#include <QTableWidget>
#include <QVBoxLayout>

#include <optional>

namespace slatewise::ui {

namespace {
std::optional<core::FileRole> roleOf(const QString& role)
{
    if (role == QLatin1String("catalog"))
        return core::FileRole::Catalog;
    if (role == QLatin1String("train"))
        return core::FileRole::Train;
    if (role == QLatin1String("withheld"))
        return core::FileRole::Withheld;
    if (role == QLatin1String("scores"))
        return core::FileRole::Scores;
    if (role == QLatin1String("lists"))
        return core::FileRole::Lists;
    return std::nullopt;
}

QString rateText(double rowsPerSecond)
{
    if (rowsPerSecond <= 0)
        return {};
    if (rowsPerSecond >= 1e6)
        return QCoreApplication::translate("ImportDialog", "≈ %1 million rows/s").arg(rowsPerSecond / 1e6, 0, 'f', 2);
    return QCoreApplication::translate("ImportDialog", "≈ %1 rows/s").arg(static_cast<qint64>(rowsPerSecond));
}
} // namespace

ImportDialog::ImportDialog(Mode mode, const QString& workspacePath, QWidget* parent)
    : QDialog(parent), m_mode(mode), m_previewCaption(new QLabel(this)), m_previewTable(new QTableWidget(this)),
      m_errors(new QListWidget(this)), m_copy(new QPushButton(tr("Copy errors"), this)), m_progress(new QProgressBar(this)),
      m_rate(new QLabel(this)), m_start(new QPushButton(this)), m_cancel(new QPushButton(tr("Cancel import"), this)),
      m_buttons(new QDialogButtonBox(QDialogButtonBox::Close, this)), m_task(new BackgroundTask(this))
{
    setWindowTitle(mode == Mode::NewWorkspace ? tr("New workspace from files") : tr("Add a run"));
    auto* form = new QFormLayout;
    const auto addFile = [&](const QString& role, const QString& label, const QString& help, const QString& value = {}) {
        auto* edit = new QLineEdit(value, this);
        edit->setToolTip(help);
        edit->setPlaceholderText(help);
        auto* browseButton = new QPushButton(tr("Browse…"), this);
        auto* previewButton = new QPushButton(tr("Preview"), this);
        auto* row = new QHBoxLayout;
        row->addWidget(edit, 1);
        row->addWidget(browseButton);
        row->addWidget(previewButton);
        form->addRow(label, row);
        m_fields.push_back({role, edit});
        connect(browseButton, &QPushButton::clicked, this, [this, role] { browse(role); });
        connect(previewButton, &QPushButton::clicked, this, [this, role] { preview(role); });
        connect(edit, &QLineEdit::editingFinished, this, [this, role] { preview(role); });
    };
    if (mode == Mode::NewWorkspace) {
        addFile(QStringLiteral("workspace"), tr("&Workspace to create:"), tr("The new .sqlite file"), workspacePath);
        addFile(QStringLiteral("catalog"), tr("&Catalog:"), tr("item_id,title,year,genres,series,series_part"));
        addFile(QStringLiteral("train"), tr("&Train (history):"), tr("user_id,item_id,rating,timestamp"));
        addFile(QStringLiteral("withheld"), tr("W&ithheld:"), tr("user_id,item_id,rating,timestamp — what runs are judged on"));
        m_scale = new QLineEdit(this);
        m_scale->setPlaceholderText(tr("MIN:MAX:STEP, e.g. 1:5:1 (empty: read off the ratings)"));
        form->addRow(tr("Rating &scale:"), m_scale);
    } else {
        addFile(QStringLiteral("workspace"), tr("&Workspace:"), tr("The open workspace"), workspacePath);
        field(QStringLiteral("workspace"))->setReadOnly(true);
    }
    m_runName = new QLineEdit(this);
    m_runName->setPlaceholderText(mode == Mode::NewWorkspace ? tr("optional: also add a first run with this name")
                                                             : tr("name of the new run"));
    form->addRow(tr("Run &name:"), m_runName);
    addFile(QStringLiteral("scores"), tr("Sc&ores:"), tr("user_id,item_id,score — predicted ratings (optional)"));
    addFile(QStringLiteral("lists"), tr("&Lists:"), tr("user_id,rank,item_id[,score] — ranked lists (optional)"));

    auto* previewBox = new QGroupBox(tr("First rows and detected columns"), this);
    auto* previewLayout = new QVBoxLayout(previewBox);
    m_previewCaption->setWordWrap(true);
    m_previewCaption->setText(tr("Pick a file to see its first rows and how each column will be read."));
    m_previewTable->setEditTriggers(QAbstractItemView::NoEditTriggers);
    m_previewTable->verticalHeader()->hide();
    m_previewTable->horizontalHeader()->setSectionResizeMode(QHeaderView::ResizeToContents);
    previewLayout->addWidget(m_previewCaption);
    previewLayout->addWidget(m_previewTable);

    auto* errorBox = new QGroupBox(tr("Problems found"), this);
    auto* errorLayout = new QVBoxLayout(errorBox);
    m_errors->setSelectionMode(QAbstractItemView::ExtendedSelection);
    m_errors->setWordWrap(true);
    errorLayout->addWidget(m_errors);
    errorLayout->addWidget(m_copy, 0, Qt::AlignRight);
    connect(m_copy, &QPushButton::clicked, this, [this] { QApplication::clipboard()->setText(errorLines().join(QLatin1Char('\n'))); });

    m_start->setText(mode == Mode::NewWorkspace ? tr("&Import") : tr("&Add run"));
    m_start->setDefault(true);
    m_cancel->setEnabled(false);
    m_progress->setRange(0, 1000);
    m_progress->setValue(0);
    auto* progressRow = new QHBoxLayout;
    progressRow->addWidget(m_progress, 1);
    progressRow->addWidget(m_rate);
    progressRow->addWidget(m_cancel);
    progressRow->addWidget(m_start);

    auto* layout = new QVBoxLayout(this);
    layout->addLayout(form);
    layout->addWidget(previewBox, 3);
    layout->addWidget(errorBox, 2);
    layout->addLayout(progressRow);
    layout->addWidget(m_buttons);
    connect(m_buttons, &QDialogButtonBox::rejected, this, &ImportDialog::reject);
    connect(m_start, &QPushButton::clicked, this, &ImportDialog::startImport);
    connect(m_cancel, &QPushButton::clicked, this, &ImportDialog::cancel);
    connect(m_task, &BackgroundTask::progressed, this, [this](double fraction, const QString& stage) {
        m_progress->setValue(static_cast<int>(fraction * 1000.0));
        m_progress->setFormat(QStringLiteral("%1 — %p%").arg(stage));
        m_rate->setText(rateText(m_task->rate(fraction, m_totalRows)));
    });
    m_progress->setTextVisible(true);
    resize(900, 700);
}

ImportDialog::~ImportDialog() = default;

QLineEdit* ImportDialog::field(const QString& role) const
{
    for (const auto& f : m_fields)
        if (f.role == role)
            return f.edit;
    return nullptr;
}

void ImportDialog::setFile(const QString& role, const QString& path)
{
    if (auto* edit = field(role))
        edit->setText(path);
}

void ImportDialog::setRunName(const QString& name)
{
    m_runName->setText(name);
}

bool ImportDialog::isRunning() const
{
    return m_task->isRunning();
}

void ImportDialog::browse(const QString& role)
{
    QString path;
    if (role == QLatin1String("workspace"))
        path = QFileDialog::getSaveFileName(this, tr("New workspace"), field(role)->text(), tr("Slatewise workspace (*.sqlite)"));
    else
        path = QFileDialog::getOpenFileName(this, tr("Choose the %1 file").arg(role), field(role)->text(),
                                            tr("Tables (*.csv *.tsv);;All files (*)"));
    if (path.isEmpty())
        return;
    field(role)->setText(path);
    preview(role);
}

void ImportDialog::preview(const QString& role)
{
    const auto fileRole = roleOf(role);
    const QString path = field(role) ? field(role)->text().trimmed() : QString();
    if (!fileRole || path.isEmpty())
        return;
    auto result = core::previewFile(path.toStdString(), 20, fileRole);
    m_previewTable->clear();
    if (!result) {
        m_previewTable->setRowCount(0);
        m_previewTable->setColumnCount(0);
        m_previewCaption->setText(tr("%1 cannot be read:").arg(QFileInfo(path).fileName()));
        showErrors(result.errors());
        return;
    }
    const auto& p = result.value();
    m_previewTable->setColumnCount(static_cast<int>(p.header.size()));
    QStringList headers;
    for (std::size_t c = 0; c < p.header.size(); ++c) {
        const QString use = c < p.columnRoles.size() && !p.columnRoles[c].empty() ? tr("→ %1").arg(toQ(p.columnRoles[c])) : tr("(ignored)");
        headers << QStringLiteral("%1\n%2").arg(toQ(p.header[c]), use);
    }
    m_previewTable->setHorizontalHeaderLabels(headers);
    m_previewTable->setRowCount(static_cast<int>(p.rows.size()));
    for (std::size_t r = 0; r < p.rows.size(); ++r)
        for (std::size_t c = 0; c < p.rows[r].size() && c < p.header.size(); ++c)
            m_previewTable->setItem(static_cast<int>(r), static_cast<int>(c), new QTableWidgetItem(toQ(p.rows[r][c])));
    QStringList caption;
    caption << tr("%1 (%2 KB, %3-separated%4): first %5 rows as the %6 file.")
                   .arg(QFileInfo(path).fileName())
                   .arg(static_cast<qint64>(p.size / 1024))
                   .arg(p.delimiter == '\t' ? tr("tab") : tr("comma"))
                   .arg(p.hasBom ? tr(", with BOM") : QString())
                   .arg(p.rows.size())
                   .arg(role);
    if (!p.missingColumns.empty()) {
        QStringList missing;
        for (const auto& m : p.missingColumns)
            missing << toQ(m);
        caption << tr("Missing required columns: %1.").arg(missing.join(QStringLiteral(", ")));
    }
    for (const auto& n : p.notes)
        caption << toQ(n.message);
    m_previewCaption->setText(caption.join(QLatin1Char(' ')));
    showErrors(p.errors);
}

void ImportDialog::showErrors(const std::vector<core::Error>& errors)
{
    m_errors->clear();
    for (const auto& e : errors)
        m_errors->addItem(toQ(e.toString()));
    m_copy->setEnabled(!errors.empty());
}

QStringList ImportDialog::errorLines() const
{
    QStringList lines;
    for (int i = 0; i < m_errors->count(); ++i)
        lines << m_errors->item(i)->text();
    return lines;
}

double ImportDialog::estimateRows() const
{
    // Rows are estimated from file sizes and the preview's average line length, so the rate
    // is shown while reading, before the true count is known.
    double rows = 0;
    for (const auto& f : m_fields) {
        if (!roleOf(f.role) || f.edit->text().trimmed().isEmpty())
            continue;
        auto p = core::previewFile(f.edit->text().trimmed().toStdString(), 50, roleOf(f.role));
        if (!p || p->rows.empty())
            continue;
        double bytes = 0;
        for (const auto& row : p->rows) {
            for (const auto& cell : row)
                bytes += static_cast<double>(cell.size()) + 1;
        }
        rows += static_cast<double>(p->size) / std::max(1.0, bytes / static_cast<double>(p->rows.size()));
    }
    return rows;
}

bool ImportDialog::startImport()
{
    if (m_task->isRunning())
        return false;
    const auto text = [this](const QString& role) { return field(role) ? field(role)->text().trimmed().toStdString() : std::string(); };
    std::vector<core::Error> problems;
    const auto require = [&](const QString& role, const char* what) {
        if (text(role).empty())
            problems.push_back(core::Error{core::ErrorKind::Usage, {}, 0, 0, {}, what, {}});
    };
    const std::string runName = m_runName->text().trimmed().toStdString();
    const bool withRun = !text(QStringLiteral("scores")).empty() || !text(QStringLiteral("lists")).empty();
    if (m_mode == Mode::NewWorkspace) {
        require(QStringLiteral("workspace"), "choose where to create the workspace");
        require(QStringLiteral("catalog"), "choose the catalog file");
        require(QStringLiteral("train"), "choose the train file");
        require(QStringLiteral("withheld"), "choose the withheld file");
    } else if (!withRun) {
        problems.push_back(core::Error{core::ErrorKind::Usage, {}, 0, 0, {}, "choose a scores file, a lists file or both", {}});
    }
    if (withRun && runName.empty())
        problems.push_back(core::Error{core::ErrorKind::Usage, {}, 0, 0, {}, "give the run a name", {}});
    std::optional<core::RatingScale> scale;
    if (m_scale && !m_scale->text().trimmed().isEmpty()) {
        scale = core::parseScale(m_scale->text().trimmed().toStdString());
        if (!scale)
            problems.push_back(core::Error{core::ErrorKind::Usage, {}, 0, 0, m_scale->text().toStdString(),
                                           "the rating scale is not MIN:MAX:STEP", "e.g. 1:5:1"});
    }
    if (!problems.empty()) {
        showErrors(problems);
        return false;
    }
    showErrors({});
    m_totalRows = estimateRows();

    core::ImportRequest importRequest;
    importRequest.workspacePath = text(QStringLiteral("workspace"));
    importRequest.catalogPath = text(QStringLiteral("catalog"));
    importRequest.trainPath = text(QStringLiteral("train"));
    importRequest.withheldPath = text(QStringLiteral("withheld"));
    importRequest.scale = scale;
    core::AddRunRequest runRequest;
    runRequest.workspacePath = importRequest.workspacePath;
    runRequest.name = runName;
    runRequest.scoresPath = text(QStringLiteral("scores"));
    runRequest.listsPath = text(QStringLiteral("lists"));
    const bool newWorkspace = m_mode == Mode::NewWorkspace;

    struct Outcome {
        std::vector<core::Error> errors;
        QStringList notes;
        bool wroteWorkspace = false;
    };
    auto outcome = std::make_shared<Outcome>();
    setRunning(true);
    m_task->start(
        newWorkspace ? tr("Importing") : tr("Adding run"),
        [outcome, importRequest, runRequest, newWorkspace, withRun](const core::Progress& progress) {
            core::Progress importPart = progress;
            if (newWorkspace && withRun)
                importPart.report = [&progress](double f, std::string_view stage) { progress(0.7 * f, stage); };
            if (newWorkspace) {
                auto report = core::importWorkspace(importRequest, importPart);
                if (!report) {
                    outcome->errors = report.errors();
                    return;
                }
                outcome->wroteWorkspace = true;
                for (const auto& n : report->notes)
                    outcome->notes << toQ(n.file + ": " + n.message);
            }
            if (withRun) {
                core::Progress runPart = progress;
                if (newWorkspace)
                    runPart.report = [&progress](double f, std::string_view stage) { progress(0.7 + 0.3 * f, stage); };
                auto report = core::addRun(runRequest, runPart);
                if (!report) {
                    outcome->errors = report.errors();
                    return;
                }
                outcome->wroteWorkspace = true;
                for (const auto& n : report->notes)
                    outcome->notes << toQ(n.file + ": " + n.message);
            }
        },
        [this, outcome, path = QString::fromStdString(importRequest.workspacePath)] {
            setRunning(false);
            if (!outcome->errors.empty()) {
                const bool cancelled = outcome->errors.front().kind == core::ErrorKind::Cancelled;
                showErrors(outcome->errors);
                m_progress->setValue(0);
                m_progress->setFormat(cancelled ? tr("Cancelled — nothing was written") : tr("Stopped — nothing was written"));
                // A new workspace may already exist when only the run failed; say so plainly.
                if (outcome->wroteWorkspace) {
                    m_progress->setFormat(tr("The workspace was created, but the run was not added"));
                    emit imported(path);
                }
                return;
            }
            m_progress->setValue(1000);
            m_progress->setFormat(tr("Done"));
            for (const auto& n : outcome->notes)
                m_errors->addItem(tr("Note: %1").arg(n));
            emit imported(path);
        });
    return true;
}

void ImportDialog::setRunning(bool running)
{
    m_start->setEnabled(!running);
    m_cancel->setEnabled(running);
    for (const auto& f : m_fields)
        f.edit->setEnabled(!running);
}

void ImportDialog::cancel()
{
    m_task->cancel();
}

void ImportDialog::reject()
{
    // Closing while importing cancels first; the task waits in its destructor.
    if (m_task->isRunning()) {
        m_task->cancel();
        m_task->waitForDone();
    }
    QDialog::reject();
}

} // namespace slatewise::ui
