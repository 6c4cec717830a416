// SPDX-License-Identifier: MIT
// The fit and re-rank dialogs on the demo workspace, offscreen, through the same code path as
// their buttons (worker thread, progress, cancel): the run is stored with its settings, the
// live loss chart gets one point per iteration, and cancelling stores nothing.
#include "core/modelsettings.h"
#include "core/reranksettings.h"
#include "core/run.h"
#include "core/sqlitedb.h"
#include "core/workspace.h"
#include "ui/backgroundtask.h"
#include "ui/fitdialog.h"
#include "ui/fitlosschart.h"
#include "ui/rerankdialog.h"

#include <QCryptographicHash>
#include <QDir>
#include <QFile>
#include <QFileInfo>
#include <QLayout>
#include <QSignalSpy>
#include <QStandardPaths>
#include <QTemporaryDir>
#include <QTest>
#include <qcustomplot.h>

#include <cmath>

#include "support/testsupport.h"

using namespace slatewise;
using namespace slatewise::ui;

namespace {

QByteArray sha256(const QString& path)
{
    return QCryptographicHash::hash(test::fileBytes(path), QCryptographicHash::Sha256);
}

/// The stored per-iteration log of a run: (train RMSE, withheld RMSE) by iteration.
std::vector<std::pair<double, double>> fitLog(core::Workspace& ws, std::int64_t runId)
{
    std::vector<std::pair<double, double>> log;
    core::Statement st(ws.db(), "SELECT train_rmse, withheld_rmse FROM fit_log WHERE run_id = ? ORDER BY iteration");
    st.bind(1, runId);
    while (st.step())
        log.emplace_back(st.real(0), st.real(1));
    return log;
}

std::vector<std::string> runNames(const QString& path)
{
    std::vector<std::string> names;
    auto ws = core::Workspace::open(path.toStdString(), true);
    if (!ws)
        return names;
    auto runs = ws->runs();
    if (runs)
        for (const auto& r : *runs)
            names.push_back(r.name);
    return names;
}

} // namespace

class TestFitDialog : public QObject {
    Q_OBJECT
private:
    QTemporaryDir m_dir;
    QString m_demo;
    QString m_firstRun;

    /// Fits through the dialog and waits; returns the stored run's info.
    std::optional<core::RunInfo> fitThrough(FitDialog& dialog);

private slots:
    void initTestCase();
    void fitBias();
    void fitTinyAls();
    void cancelledFitStoresNothing();
    void rerank_data();
    void rerank();
    void cancelledRerankStoresNothing();
};

void TestFitDialog::initTestCase()
{
    test::failOnUnexpectedMessages();
    QStandardPaths::setTestModeEnabled(true);
    QVERIFY(m_dir.isValid());
    m_demo = m_dir.filePath(QStringLiteral("film-club.sqlite"));
    const QString demoError = test::buildDemoWorkspace(m_demo, m_dir.filePath(QStringLiteral("demo-files")));
    QVERIFY2(demoError.isEmpty(), qPrintable(demoError));
    const auto names = runNames(m_demo);
    QVERIFY(!names.empty());
    m_firstRun = QString::fromStdString(names.front());
}

std::optional<core::RunInfo> TestFitDialog::fitThrough(FitDialog& dialog)
{
    QSignalSpy fitted(&dialog, &FitDialog::fitted);
    if (!dialog.startFit())
        return std::nullopt;
    if (!dialog.task()->isRunning()) // the work runs on the worker thread, not inline
        return std::nullopt;
    dialog.task()->waitForDone();
    QTest::qWait(50); // the last queued chart point
    if (fitted.count() != 1) {
        qInfo("fit status: %s", qPrintable(dialog.statusText()));
        return std::nullopt;
    }
    auto ws = core::Workspace::open(m_demo.toStdString(), true);
    if (!ws)
        return std::nullopt;
    auto info = ws->run(dialog.runName().toStdString());
    if (!info)
        return std::nullopt;
    return *info;
}

void TestFitDialog::fitBias()
{
    FitDialog dialog(m_demo);
    dialog.setModel(QStringLiteral("bias"));
    dialog.setRunName(QStringLiteral("gui-bias"));
    dialog.setIterations(6);
    const auto info = fitThrough(dialog);
    QVERIFY2(info.has_value(), qPrintable(dialog.statusText()));
    QVERIFY(info->kind == core::RunKind::Fitted);
    QCOMPARE(info->method, std::string("bias"));
    // The stored settings are exactly what the dialog asked for.
    core::ModelSettings expected;
    expected.kind = core::ModelKind::Bias;
    expected.biasIterations = 6;
    expected.iterations = core::ModelSettings {}.iterations;
    expected.rank = core::ModelSettings {}.rank;
    QCOMPARE(info->settingsJson, expected.toJson());
    QVERIFY(info->scoreCount > 0);
    QVERIFY(info->listUserCount > 0);

    auto ws = core::Workspace::open(m_demo.toStdString(), true);
    QVERIFY(ws.ok());
    const auto log = fitLog(ws.value(), info->id);
    // The alternating updates may stop early at the tolerance; never more than asked.
    QVERIFY(!log.empty());
    QVERIFY(log.size() <= 6);
    // One chart point per stored iteration, with the same values.
    const auto& points = dialog.chart()->iterations();
    QCOMPARE(points.size(), log.size());
    for (std::size_t i = 0; i < log.size(); ++i) {
        QCOMPARE(points[i].iteration, static_cast<int>(i) + 1);
        QCOMPARE(points[i].trainRmse, log[i].first);
    }
    QVERIFY(dialog.statusText().contains(QStringLiteral("gui-bias")));
}

void TestFitDialog::fitTinyAls()
{
    FitDialog dialog(m_demo);
    dialog.resize(720, 640);
    dialog.setModel(QStringLiteral("als"));
    dialog.setRank(4);
    dialog.setIterations(2);
    dialog.setRunName(QStringLiteral("gui-als-r4"));
    const auto info = fitThrough(dialog);
    QVERIFY2(info.has_value(), qPrintable(dialog.statusText()));
    QCOMPARE(info->method, std::string("als"));
    core::ModelSettings expected;
    expected.kind = core::ModelKind::Als;
    expected.rank = 4;
    expected.iterations = 2;
    QCOMPARE(info->settingsJson, expected.toJson());

    auto ws = core::Workspace::open(m_demo.toStdString(), true);
    QVERIFY(ws.ok());
    const auto log = fitLog(ws.value(), info->id);
    QCOMPARE(log.size(), std::size_t(2));
    const auto& points = dialog.chart()->iterations();
    QCOMPARE(points.size(), std::size_t(2));
    // Drawn: one graph point per iteration for train and for withheld RMSE.
    auto* plot = dialog.chart()->plot();
    QVERIFY(plot->graphCount() >= 1);
    QCOMPARE(plot->graph(0)->data()->size(), 2);
    for (std::size_t i = 0; i < log.size(); ++i) {
        QCOMPARE(points[i].trainRmse, log[i].first);
        if (!std::isnan(log[i].second))
            QCOMPARE(points[i].withheldRmse, log[i].second);
    }
    // A picture to look at while developing (SLATEWISE_SHOT_DIR=/some/dir).
    const QString shots = qEnvironmentVariable("SLATEWISE_SHOT_DIR");
    if (!shots.isEmpty()) {
        dialog.layout()->activate();
        QVERIFY(dialog.grab().save(QDir(shots).filePath(QStringLiteral("fit-dialog.png"))));
    }
}

void TestFitDialog::cancelledFitStoresNothing()
{
    const QByteArray before = sha256(m_demo);
    const auto namesBefore = runNames(m_demo);
    FitDialog dialog(m_demo);
    dialog.setModel(QStringLiteral("als"));
    dialog.setRank(16);
    dialog.setIterations(200);
    dialog.setRunName(QStringLiteral("gui-cancelled"));
    QSignalSpy fitted(&dialog, &FitDialog::fitted);
    QVERIFY(dialog.startFit());
    dialog.cancel();
    dialog.task()->waitForDone();
    QCOMPARE(fitted.count(), 0);
    QVERIFY2(dialog.statusText().contains(QStringLiteral("nothing was stored")), qPrintable(dialog.statusText()));
    QCOMPARE(sha256(m_demo), before);
    QCOMPARE(runNames(m_demo), namesBefore);
}

void TestFitDialog::rerank_data()
{
    QTest::addColumn<QString>("method");
    QTest::addColumn<double>("lambda");
    QTest::newRow("mmr") << QStringLiteral("mmr") << 0.4;
    QTest::newRow("series-order") << QStringLiteral("series-order") << -1.0;
    QTest::newRow("burst-damp") << QStringLiteral("burst-damp") << 0.8;
}

void TestFitDialog::rerank()
{
    QFETCH(QString, method);
    QFETCH(double, lambda);
    RerankDialog dialog(m_demo, QStringList { m_firstRun });
    dialog.setParentRun(m_firstRun);
    dialog.setMethod(method);
    if (lambda >= 0)
        dialog.setLambda(lambda);
    const QString name = QStringLiteral("gui-") + method;
    dialog.setRunName(name);
    QSignalSpy reranked(&dialog, &RerankDialog::reranked);
    QVERIFY(dialog.startRerank());
    QVERIFY(dialog.task()->isRunning());
    dialog.task()->waitForDone();
    QVERIFY2(reranked.count() == 1, qPrintable(dialog.statusText()));

    auto ws = core::Workspace::open(m_demo.toStdString(), true);
    QVERIFY(ws.ok());
    const auto info = ws->run(name.toStdString());
    QVERIFY(info.ok());
    QVERIFY(info->kind == core::RunKind::Reranked);
    QCOMPARE(info->parentName, m_firstRun.toStdString());
    QCOMPARE(info->method, method.toStdString());
    auto expected = core::RerankSettings::defaults(*core::rerankMethodFromString(method.toStdString()));
    if (lambda >= 0)
        expected.lambda = lambda;
    QCOMPARE(info->settingsJson, expected.toJson());
    QVERIFY(info->listUserCount > 0);
    QVERIFY(dialog.statusText().contains(name));

    const QString shots = qEnvironmentVariable("SLATEWISE_SHOT_DIR");
    if (!shots.isEmpty()) {
        dialog.layout()->activate();
        QVERIFY(dialog.grab().save(QDir(shots).filePath(QStringLiteral("rerank-dialog-%1.png").arg(method))));
    }
}

void TestFitDialog::cancelledRerankStoresNothing()
{
    const QByteArray before = sha256(m_demo);
    const auto namesBefore = runNames(m_demo);
    RerankDialog dialog(m_demo, QStringList { m_firstRun });
    dialog.setMethod(QStringLiteral("mmr"));
    dialog.setRunName(QStringLiteral("gui-rerank-cancelled"));
    QSignalSpy reranked(&dialog, &RerankDialog::reranked);
    QVERIFY(dialog.startRerank());
    dialog.cancel();
    dialog.task()->waitForDone();
    QCOMPARE(reranked.count(), 0);
    QVERIFY2(dialog.statusText().contains(QStringLiteral("nothing was stored")), qPrintable(dialog.statusText()));
    QCOMPARE(sha256(m_demo), before);
    QCOMPARE(runNames(m_demo), namesBefore);
}

QTEST_MAIN(TestFitDialog)
#include "tst_fitdialog.moc"
