#pragma once
// Importing a walkdown from the workbench: choose (or drop) a folder, check it - which file goes
// to which motor and point, and what is wrong with each bad one - then import it off the GUI
// thread with a progress bar and a cancel button, and read the summary of what was stored.

#include "app/common/Walkdown.h"
#include "app/gui/StoreSession.h"

#include <QDialog>

#include <atomic>
#include <optional>

class QLineEdit;
class QTableWidget;
class QProgressBar;
class QPushButton;
class QCheckBox;
class QLabel;
class QThread;

namespace humwise::gui {

class ImportDialog : public QDialog {
    Q_OBJECT
public:
    ImportDialog(StoreSession& session, QWidget* parent = nullptr);
    ~ImportDialog() override;

    void setFolder(const QString& folder);
    // Dry run on this thread (fast: reads and checks the files); fills the preview.
    bool check();
    // Starts the import in a worker thread; importFinished tells the end.
    void startImport();
    void cancel();
    bool running() const { return m_thread != nullptr; }
    QTableWidget* preview() const { return m_preview; }
    QString summary() const;
    QProgressBar* progressBar() const { return m_progress; }
    QCheckBox* skipBadBox() const { return m_skipBad; }
    // Whether the last import that stored a round wrote it through the rollback journal (the
    // store had no other connection: StoreSession::suspend), not the write-ahead log.
    bool lastImportWentThroughJournal() const { return m_throughJournal; }

signals:
    void importFinished(bool ok, const QString& summary);

private:
    void showReport(const workflow::ImportReport& r);
    void finish(bool ok, const QString& text);
    StoreSession& m_session;
    QLineEdit* m_folder;
    QCheckBox* m_skipBad;
    QTableWidget* m_preview;
    QProgressBar* m_progress;
    QPushButton *m_check, *m_import, *m_cancel;
    QLabel* m_summary;
    QThread* m_thread = nullptr;
    std::atomic<bool> m_cancelled{false};
    std::atomic<bool> m_throughJournal{false};
};

} // namespace humwise::gui
