#pragma once
// The workbench window. It only coordinates: the plant tree chooses the motor, the motor page
// shows it, dialogs import and explain; every piece of work happens in those classes or in the
// workflow layer below.

#include "app/common/ReportData.h"
#include "app/gui/StoreSession.h"

#include <QMainWindow>

class QLabel;

namespace humwise::gui {

class PlantTreePanel;
class MotorPage;

class MainWindow : public QMainWindow {
    Q_OBJECT
public:
    explicit MainWindow(StoreSession& session, QWidget* parent = nullptr);

    PlantTreePanel* plantTree() const { return m_tree; }
    MotorPage* motorPage() const { return m_page; }
    void openDatabase(const QString& path);
    void showImportDialog(const QString& folder = {});
    void reanalyseAll();
    void setDefaultImportFolder(const QString& folder) { m_defaultImport = folder; }

protected:
    void dragEnterEvent(QDragEnterEvent* e) override;
    void dropEvent(QDropEvent* e) override;
    void closeEvent(QCloseEvent* e) override;

private:
    void buildMenus();
    std::optional<workflow::MotorSheet> currentSheet();
    void saveFindingSheet();
    void previewFindingSheet();
    void saveRouteSummary();
    void rememberDatabase(const QString& path);
    void updateTitle();
    StoreSession& m_session;
    PlantTreePanel* m_tree;
    MotorPage* m_page;
    QLabel* m_status;
    QString m_defaultImport;
};

} // namespace humwise::gui
