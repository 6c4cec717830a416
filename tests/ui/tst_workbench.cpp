// SPDX-License-Identifier: MIT
// The workbench end to end, offscreen: open a demo workspace, take the worst-served user into
// the inspector and check its two lists and warnings against `slatewise explain`; cancel an
// import and an added run and check that nothing was written.
#include "core/evaluation.h"
#include "core/syntheticdata.h"
#include "ui/backgroundtask.h"
#include "ui/comparescreen.h"
#include "ui/comparisonmodel.h"
#include "ui/importdialog.h"
#include "ui/inspectorlistmodel.h"
#include "ui/inspectorscreen.h"
#include "ui/mainwindow.h"
#include "ui/userbrowsermodel.h"
#include "ui/userinspection.h"
#include "ui/usersscreen.h"
#include "ui/withheldmodel.h"
#include "ui/workspacedocument.h"

#include <QCryptographicHash>
#include <QDir>
#include <QElapsedTimer>
#include <QFileInfo>
#include <QSignalSpy>
#include <QStandardPaths>
#include <QTemporaryDir>
#include <QTest>

#include <cmath>
#include <functional>

#include "support/testsupport.h"

using namespace slatewise;

namespace {
QByteArray sha256(const QString& path)
{
    return QCryptographicHash::hash(test::fileBytes(path), QCryptographicHash::Sha256);
}

} // namespace

class TestWorkbench : public QObject {
    Q_OBJECT
private:
    QTemporaryDir m_dir;
    QString m_demo;

private slots:
    void initTestCase();
    void worstUserMatchesExplain();
    void comparisonScreenFills();
    void cancelledImportWritesNothing();
    void cancelledAddRunLeavesWorkspaceUnchanged();
};

void TestWorkbench::initTestCase()
{
    test::failOnUnexpectedMessages();
    QStandardPaths::setTestModeEnabled(true); // QSettings go to a test location
    QVERIFY(m_dir.isValid());
    m_demo = m_dir.filePath(QStringLiteral("film-club.sqlite"));
    const QString demoError = test::buildDemoWorkspace(m_demo, m_dir.filePath(QStringLiteral("demo-files")));
    QVERIFY2(demoError.isEmpty(), qPrintable(demoError));
    QVERIFY(QFileInfo::exists(m_demo));
}

void TestWorkbench::worstUserMatchesExplain()
{
    ui::MainWindow window;
    window.resize(1400, 900);
    QVERIFY(window.openWorkspace(m_demo));
    auto* document = window.document();
    QVERIFY(test::waitFor([&] { return !document->task()->isRunning() && document->isFullyLoaded(); }));
    QVERIFY(document->runNames().size() >= 2);

    const QString run = document->runNames().front();
    window.users()->setRun(run);
    window.users()->sortWorstFirst(core::Metric::Ndcg);
    const auto worst = window.users()->firstUser();
    QVERIFY(worst.has_value());
    // Worst first: nobody has a lower NDCG than the first user.
    const auto* eval = window.users()->model()->evaluation();
    const int worstRow = window.users()->model()->rowOfUser(*worst);
    const double worstNdcg = eval->users.value(core::Metric::Ndcg, static_cast<std::size_t>(worstRow));
    for (std::size_t r = 0; r < eval->users.size(); ++r) {
        const double v = eval->users.value(core::Metric::Ndcg, r);
        QVERIFY(std::isnan(v) || v >= worstNdcg);
    }

    window.openUser(run, *worst, true);
    auto* inspector = window.inspector();
    QVERIFY(inspector->inspection());
    const QString userId = document->userIdOf(*worst);
    const auto explain = test::runCli(
        { QStringLiteral("explain"), m_demo, QStringLiteral("--run"), run, QStringLiteral("--user"), userId });
    QVERIFY2(explain.exitCode == 0, qPrintable(explain.err));
    const QString text = explain.out;

    // The run's list: every title the inspector shows, in the same order, appears in explain.
    auto* list = inspector->listModel();
    QVERIFY(list->rowCount() > 0);
    qsizetype position = 0;
    for (int r = 0; r < list->rowCount(); ++r) {
        const QString title = list->data(list->index(r, ui::InspectorListModel::Title)).toString();
        const qsizetype at = text.indexOf(title, position);
        QVERIFY2(at >= 0,
            qPrintable(QStringLiteral("list title '%1' (rank %2) not found in order in explain output")
                           .arg(title)
                           .arg(r + 1)));
        position = at + title.size();
    }
    // The withheld favourites: each relevant withheld title appears in explain.
    auto* withheld = inspector->withheldModel();
    int favourites = 0;
    for (int r = 0; r < withheld->rowCount(); ++r) {
        if (!withheld->data(withheld->index(r, 0), ui::WithheldModel::RelevantRole).toBool())
            continue;
        const QString title = withheld->data(withheld->index(r, ui::WithheldModel::Title)).toString();
        QVERIFY2(text.contains(title),
            qPrintable(QStringLiteral("withheld favourite '%1' missing from explain").arg(title)));
        ++favourites;
    }
    // Every warning sentence appears verbatim, and explain has no sentence the inspector lacks.
    const auto& warnings = inspector->inspection()->warnings;
    for (const auto& w : warnings)
        QVERIFY2(text.contains(QString::fromStdString(w.message)), w.message.c_str());
    QCOMPARE(inspector->warningTexts().size(), std::max<qsizetype>(1, static_cast<qsizetype>(warnings.size())));
    qInfo("worst user %s: %d list rows, %d favourites, %d warnings", qPrintable(userId), list->rowCount(), favourites,
        static_cast<int>(warnings.size()));

    // Stepping to the next user follows the browse order.
    const auto next = window.users()->neighbour(*worst, +1);
    QVERIFY(next.has_value());
    QVERIFY(*next != *worst);
}

void TestWorkbench::comparisonScreenFills()
{
    ui::MainWindow window;
    QVERIFY(window.openWorkspace(m_demo));
    auto* document = window.document();
    QVERIFY(test::waitFor([&] { return !document->task()->isRunning() && document->isFullyLoaded(); }));
    const QStringList runs = document->runNames();
    QSignalSpy ready(window.compare(), &ui::CompareScreen::comparisonReady);
    QVERIFY(window.compare()->compare(runs[0], runs[1]));
    QVERIFY(test::waitFor([&] { return !document->task()->isRunning(); }));
    QCOMPARE(ready.count(), 1);
    QVERIFY(window.compare()->comparison());
    QVERIFY(window.compare()->comparisonModel()->rowCount() > 0);
    // Every row states its verdict in words.
    for (int r = 0; r < window.compare()->comparisonModel()->rowCount(); ++r)
        QVERIFY(!window.compare()
                     ->comparisonModel()
                     ->data(window.compare()->comparisonModel()->index(r, ui::ComparisonModel::Verdict))
                     .toString()
                     .isEmpty());
}

void TestWorkbench::cancelledImportWritesNothing()
{
    const QString files = m_dir.filePath(QStringLiteral("big"));
    QVERIFY(QDir().mkpath(files));
    core::SyntheticSpec spec;
    spec.users = 40000;
    spec.items = 4000;
    spec.trainPerUser = 40;
    spec.withheldPerUser = 5;
    spec.listLength = 50;
    QVERIFY(core::writeSyntheticFiles(spec, files.toStdString()).ok());
    const QString target = m_dir.filePath(QStringLiteral("cancelled.sqlite"));

    ui::ImportDialog dialog(ui::ImportDialog::Mode::NewWorkspace, target);
    dialog.setFile(QStringLiteral("catalog"), QDir(files).filePath(QStringLiteral("catalog.csv")));
    dialog.setFile(QStringLiteral("train"), QDir(files).filePath(QStringLiteral("train.csv")));
    dialog.setFile(QStringLiteral("withheld"), QDir(files).filePath(QStringLiteral("withheld.csv")));
    QVERIFY(dialog.startImport());
    QSignalSpy imported(&dialog, &ui::ImportDialog::imported);
    dialog.cancel();
    QVERIFY(test::waitFor([&] { return !dialog.isRunning(); }));
    QCOMPARE(imported.count(), 0);
    QVERIFY2(!QFileInfo::exists(target), "a cancelled import left a workspace behind");
    // Nothing else was left in the directory either (no temporary files).
    const auto leftovers = QDir(m_dir.path()).entryList({ QStringLiteral("cancelled*") }, QDir::Files);
    QVERIFY2(leftovers.isEmpty(), qPrintable(leftovers.join(QLatin1Char(','))));
}

void TestWorkbench::cancelledAddRunLeavesWorkspaceUnchanged()
{
    const QString files = m_dir.filePath(QStringLiteral("runfiles"));
    QVERIFY(QDir().mkpath(files));
    core::SyntheticSpec spec;
    spec.users = 30000;
    spec.items = 3000;
    spec.trainPerUser = 4;
    spec.withheldPerUser = 3;
    spec.listLength = 100;
    QVERIFY(core::writeSyntheticFiles(spec, files.toStdString()).ok());
    const QString ws = m_dir.filePath(QStringLiteral("addrun.sqlite"));
    const auto made = test::runCli({ QStringLiteral("import"), ws, QStringLiteral("--catalog"),
        QDir(files).filePath(QStringLiteral("catalog.csv")), QStringLiteral("--train"),
        QDir(files).filePath(QStringLiteral("train.csv")), QStringLiteral("--test"),
        QDir(files).filePath(QStringLiteral("withheld.csv")), QStringLiteral("--quiet") });
    QVERIFY2(made.exitCode == 0, qPrintable(made.err));
    const QByteArray before = sha256(ws);

    ui::ImportDialog dialog(ui::ImportDialog::Mode::AddRun, ws);
    dialog.setRunName(QStringLiteral("big-lists"));
    dialog.setFile(QStringLiteral("scores"), QDir(files).filePath(QStringLiteral("scores.csv")));
    dialog.setFile(QStringLiteral("lists"), QDir(files).filePath(QStringLiteral("lists.csv")));
    QVERIFY(dialog.startImport());
    // Cancel once the work is under way, not before it starts.
    QVERIFY(test::waitFor([&] { return !dialog.isRunning() || dialog.task()->rate(1.0, 1.0) > 0; }, 60000));
    dialog.cancel();
    QVERIFY(test::waitFor([&] { return !dialog.isRunning(); }));
    QCOMPARE(sha256(ws), before);
    QVERIFY2(dialog.errorLines().join(QLatin1Char('\n')).contains(QStringLiteral("cancel"), Qt::CaseInsensitive),
        qPrintable(dialog.errorLines().join(QLatin1Char('\n'))));
}

QTEST_MAIN(TestWorkbench)
#include "tst_workbench.moc"
