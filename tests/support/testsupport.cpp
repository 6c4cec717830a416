// SPDX-License-Identifier: MIT
#include "support/testsupport.h"

#include <QDir>
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

} // namespace slatewise::test
