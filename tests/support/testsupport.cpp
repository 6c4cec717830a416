// SPDX-License-Identifier: MIT
#include "support/testsupport.h"

#include <QDir>
#include <QElapsedTimer>
#include <QFile>
#include <QProcess>
#include <QTest>

#include <cstdlib>

namespace slatewise::test {

QString testDataPath(const QString& relative)
{
    return QDir(QStringLiteral(SLATEWISE_TEST_DATA_DIR)).filePath(relative);
}

std::string testData(const std::string& relative)
{
    return testDataPath(QString::fromStdString(relative)).toStdString();
}

namespace {
QtMessageHandler g_previous = nullptr;

void failingHandler(QtMsgType type, const QMessageLogContext& context, const QString& message)
{
    if (g_previous)
        g_previous(type, context, message);
    if (type == QtWarningMsg || type == QtCriticalMsg || type == QtFatalMsg) {
        // QTest routes ignored messages before they reach us, so anything here was unexpected.
        QTest::qFail(qPrintable(QStringLiteral("unexpected message: ") + message), context.file ? context.file : "",
            context.line);
    }
}
} // namespace

void failOnUnexpectedMessages()
{
    g_previous = qInstallMessageHandler(failingHandler);
}

CliRun runCli(const QStringList& args, int timeoutMs)
{
    QProcess process;
    process.start(QStringLiteral(SLATEWISE_CLI), args);
    CliRun run;
    if (!process.waitForFinished(timeoutMs)) {
        process.kill();
        process.waitForFinished();
        run.err = QStringLiteral("timed out");
        return run;
    }
    run.exitCode = process.exitStatus() == QProcess::NormalExit ? process.exitCode() : -1;
    run.out = QString::fromUtf8(process.readAllStandardOutput());
    run.err = QString::fromUtf8(process.readAllStandardError());
    return run;
}

QByteArray fileBytes(const QString& path)
{
    QFile f(path);
    if (!f.open(QIODevice::ReadOnly))
        return {};
    return f.readAll();
}

QString buildDemoWorkspace(const QString& path, const QString& scratchDir)
{
    auto demo = runCli({ QStringLiteral("demo"), path, QStringLiteral("--quiet") });
    if (demo.exitCode != 0) {
        // Without committed demo files, regenerate them first (the same seeded generator).
        const auto data
            = runCli({ QStringLiteral("demo-data"), QStringLiteral("--out"), scratchDir, QStringLiteral("--quiet") });
        if (data.exitCode != 0)
            return data.err.isEmpty() ? QStringLiteral("demo-data failed") : data.err;
        demo
            = runCli({ QStringLiteral("demo"), path, QStringLiteral("--from"), scratchDir, QStringLiteral("--quiet") });
    }
    if (demo.exitCode != 0)
        return demo.err.isEmpty() ? QStringLiteral("demo failed") : demo.err;
    return {};
}

bool waitFor(const std::function<bool()>& done, int timeoutMs)
{
    QElapsedTimer clock;
    clock.start();
    while (!done()) {
        if (clock.elapsed() > timeoutMs)
            return false;
        QTest::qWait(20);
    }
    return true;
}

int pdfPageCount(const QByteArray& pdf)
{
    int count = 0;
    for (const QByteArray& needle : { QByteArray("/Type /Page"), QByteArray("/Type/Page") }) {
        qsizetype from = 0;
        while ((from = pdf.indexOf(needle, from)) >= 0) {
            from += needle.size();
            if (from < pdf.size() && pdf[from] != 's')
                ++count;
        }
    }
    return count;
}

} // namespace slatewise::test
