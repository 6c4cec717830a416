// SPDX-License-Identifier: MIT
#pragma once

#include <QByteArray>
#include <QString>

#include <functional>
#include <string>
#include <vector>

namespace slatewise::test {

/// Absolute path of a file under tests/data (found through a compile definition).
QString testDataPath(const QString& relative);
std::string testData(const std::string& relative);

/// Installs a Qt message handler that fails the running test on any warning or critical
/// message not announced with QTest::ignoreMessage. Call from initTestCase().
void failOnUnexpectedMessages();

/// Result of running the slatewise command line.
struct CliRun {
    int exitCode = -1;
    QString out;
    QString err;
};
/// Runs the built `slatewise` binary with `args` (found through a compile definition).
CliRun runCli(const QStringList& args, int timeoutMs = 600000);

/// SHA-256-free byte comparison helper: the whole file's bytes ("" when missing).
QByteArray fileBytes(const QString& path);

/// Builds the film-club demo workspace at `path` with `slatewise demo` (regenerating the demo
/// files into `scratchDir` first when the committed ones are missing). Empty on success,
/// otherwise the command's error output.
QString buildDemoWorkspace(const QString& path, const QString& scratchDir);

/// Processes events until `done()` holds; false after `timeoutMs`.
bool waitFor(const std::function<bool()>& done, int timeoutMs = 300000);

/// Page objects in a PDF: "/Type /Page" or "/Type/Page", but not the "/Pages" tree node
/// (ISO 32000-1, section 7.7.3).
int pdfPageCount(const QByteArray& pdf);

} // namespace slatewise::test
