// SPDX-License-Identifier: MIT
#pragma once

#include <QString>

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

} // namespace slatewise::test
