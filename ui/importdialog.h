// SPDX-License-Identifier: MIT
#pragma once

#include <QDialog>

#include <vector>

class QDialogButtonBox;
class QLabel;
class QLineEdit;
class QListWidget;
class QProgressBar;
class QPushButton;
class QTableWidget;

namespace slatewise::core {
struct Error;
}

namespace slatewise::ui {

class BackgroundTask;

/// The guided import: build a new workspace from catalog, train and withheld files (and,
/// optionally, a first run's scores and lists), or add a run to an open workspace. Shows the
/// first rows and how each column will be read, lists validation errors (file, line, column,
/// message) so they can be copied, reports progress with rows per second, and can be
/// cancelled; on cancel or error nothing is written (core imports are transactional).
class ImportDialog : public QDialog {
    Q_OBJECT
public:
    enum class Mode { NewWorkspace, AddRun };

    ImportDialog(Mode mode, const QString& workspacePath, QWidget* parent = nullptr);
    ~ImportDialog() override;

    Mode mode() const { return m_mode; }
    /// Field access for tests and scripted use.
    void setFile(const QString& role, const QString& path);
    void setRunName(const QString& name);
    /// Starts the import; false when a field is missing (errors are listed).
    bool startImport();
    void cancel();
    bool isRunning() const;
    BackgroundTask* task() const { return m_task; }
    /// Error lines as shown ("train.csv:12:3: rating is not a number ...").
    QStringList errorLines() const;
    /// Shows the first rows of the file in `role`'s field.
    void preview(const QString& role);
    QTableWidget* previewTable() const { return m_previewTable; }

signals:
    /// The workspace at `path` was created or changed.
    void imported(const QString& path);

protected:
    void reject() override;

private:
    struct Field {
        QString role;
        QLineEdit* edit = nullptr;
    };
    QLineEdit* field(const QString& role) const;
    void browse(const QString& role);
    void showErrors(const std::vector<core::Error>& errors);
    void setRunning(bool running);
    double estimateRows() const;

    Mode m_mode;
    std::vector<Field> m_fields;
    QLineEdit* m_runName = nullptr;
    QLineEdit* m_scale = nullptr;
    QLabel* m_previewCaption;
    QTableWidget* m_previewTable;
    QListWidget* m_errors;
    QPushButton* m_copy;
    QProgressBar* m_progress;
    QLabel* m_rate;
    QPushButton* m_start;
    QPushButton* m_cancel;
    QDialogButtonBox* m_buttons;
    BackgroundTask* m_task;
    double m_totalRows = 0;
};

} // namespace slatewise::ui
