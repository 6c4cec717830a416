// SPDX-License-Identifier: MIT
// The metric and warning registries are the vocabulary shared by JSON, CSV, the
// workspace and the GUI; a gap or a duplicate there would silently mislabel results.
#include "core/evalsettings.h"
#include "core/metric.h"
#include "core/warning.h"

#include <QTest>

#include <set>
#include <string>

using namespace slatewise::core;

class TestRegistry : public QObject {
    Q_OBJECT
private slots:
    void metricsAreInEnumOrderWithUniqueKeys()
    {
        std::set<std::string_view> keys;
        for (std::size_t i = 0; i < kMetricCount; ++i) {
            const auto& info = allMetrics()[i];
            QCOMPARE(static_cast<std::size_t>(info.metric), i);
            QVERIFY2(keys.insert(info.key).second, info.key.data());
            QCOMPARE(metricFromKey(info.key), std::optional<Metric>(info.metric));
        }
        QCOMPARE(metricFromKey("map"), std::optional<Metric>(Metric::Ap));
        QCOMPARE(metricFromKey("nonsense"), std::optional<Metric>());
    }
    void warningsAreInEnumOrderWithUniqueKeys()
    {
        std::set<std::string_view> keys;
        for (std::size_t i = 0; i < kWarningCodeCount; ++i) {
            const auto& info = allWarnings()[i];
            QCOMPARE(static_cast<std::size_t>(info.code), i);
            QVERIFY(keys.insert(info.key).second);
            QCOMPARE(warningFromKey(info.key), std::optional<WarningCode>(info.code));
        }
    }
    void settingsRoundTripThroughJson()
    {
        EvalSettings s;
        s.k = 7;
        s.relevantAt = 3.5;
        s.warn.coldTrain = 9;
        std::string error;
        const EvalSettings back = EvalSettings::fromJson(s.toJson(), &error);
        QVERIFY(error.empty());
        QCOMPARE(back.k, 7);
        QCOMPARE(back.relevantAt, 3.5);
        QCOMPARE(back.warn.coldTrain, 9);
        QCOMPARE(back.toJson(), s.toJson());
        EvalSettings::fromJson(R"({"k":"ten"})", &error);
        QCOMPARE(QString::fromStdString(error), QStringLiteral("setting 'k' has the wrong type"));
    }
};

QTEST_GUILESS_MAIN(TestRegistry)
#include "tst_registry.moc"
