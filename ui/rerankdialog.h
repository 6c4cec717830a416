// SPDX-License-Identifier: MIT
#pragma once

#include <QDialog>
#include <QStringList>

class QComboBox;
class QDoubleSpinBox;
class QLabel;
class QLineEdit;
class QProgressBar;
class QPushButton;

namespace slatewise::ui {

class BackgroundTask;

/// "Re-rank a run (what-if)": the settings of `slatewise rerank` (parent run, method, λ, new
/// name), progress and cancel. The derived run is stored in the workspace with its parent
/// and method (cancel stores nothing) and evaluated like any other run.
class RerankDialog : public QDialog {
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
    QString statusText() const;

    bool startRerank();
    void cancel();
    BackgroundTask* task() const { return m_task; }

signals:
    /// The derived run `runName` of `parentRun` is stored.
    void reranked(const QString& runName, const QString& parentRun);

protected:
    void reject() override;

private:
    void methodChanged();
    void suggestName();

    QString m_path;
    QComboBox* m_parent;
    QComboBox* m_method;
    QDoubleSpinBox* m_lambda;
    QLabel* m_lambdaHelp;
    QLineEdit* m_name;
    QLabel* m_explanation;
    QProgressBar* m_progress;
    QLabel* m_status;
    QPushButton* m_start;
    QPushButton* m_cancel;
    BackgroundTask* m_task;
};

} // namespace slatewise::ui
