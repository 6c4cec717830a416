// SPDX-License-Identifier: MIT
#pragma once

#include "ui/runjobdialog.h"

#include <QStringList>

class QComboBox;
class QDoubleSpinBox;
class QLabel;
class QLineEdit;

namespace slatewise::ui {

/// "Re-rank a run (what-if)": the settings of `slatewise rerank` (parent run, method, λ, new
/// name), progress and cancel. The derived run is stored in the workspace with its parent
/// and method (cancel stores nothing) and evaluated like any other run.
class RerankDialog : public RunJobDialog {
    Q_OBJECT
public:
    RerankDialog(const QString& workspacePath, const QStringList& runNames, QWidget* parent = nullptr);
    ~RerankDialog() override;

    /// Chooses the parent run and the method ("mmr", "series-order" or "burst-damp"); the
    /// name and λ follow unless set afterwards.
    void setParentRun(const QString& name);
    void setMethod(const QString& method);
    void setLambda(double lambda);
    void setRunName(const QString& name);
    QString runName() const;

    bool startRerank();

signals:
    /// The derived run `runName` of `parentRun` is stored.
    void reranked(const QString& runName, const QString& parentRun);

private:
    void methodChanged();
    void suggestName();

    QComboBox* m_parent;
    QComboBox* m_method;
    QDoubleSpinBox* m_lambda;
    QLabel* m_lambdaHelp;
    QLineEdit* m_name;
    QLabel* m_explanation;
};

} // namespace slatewise::ui
