#include "app/gui/MainWindow.h"

#include "app/gui/HelpDialog.h"
#include "app/gui/ImportDialog.h"
#include "app/gui/MotorPage.h"
#include "app/gui/PlantTreePanel.h"
#include "app/gui/SpectrumView.h"
#include "app/report/ReportRenderer.h"
#include "core/util/Text.h"

#include <QInputDialog>
#include <QPrintPreviewDialog>
#include <QPainter>
#include <QPrinter>

#include <QAction>
#include <QCloseEvent>
#include <QDockWidget>
#include <QEventLoop>
#include <QDragEnterEvent>
#include <QFileDialog>
#include <QFileInfo>
#include <QLabel>
#include <QMenuBar>
#include <QMessageBox>
#include <QMimeData>
#include <QProgressDialog>
#include <QSettings>
#include <QStatusBar>
#include <QThread>

namespace humwise::gui {

MainWindow::MainWindow(StoreSession& session, QWidget* parent) : QMainWindow(parent), m_session(session) {
    m_tree = new PlantTreePanel(session);
    m_page = new MotorPage(session);
    auto* dock = new QDockWidget(tr("Plant"), this);
    dock->setObjectName("plant");
    dock->setWidget(m_tree);
    dock->setFeatures(QDockWidget::DockWidgetMovable);
    m_tree->setMinimumWidth(430);
    addDockWidget(Qt::LeftDockWidgetArea, dock);
    setCentralWidget(m_page);
    m_status = new QLabel;
    statusBar()->addWidget(m_status, 1);
    setAcceptDrops(true);
    buildMenus();
    connect(m_tree, &PlantTreePanel::motorSelected, m_page, &MotorPage::showMotor);
    connect(&m_session, &StoreSession::changed, this, &MainWindow::updateTitle);
    QSettings settings;
    restoreGeometry(settings.value("window/geometry").toByteArray());
    if (settings.value("units/imperial", false).toBool()) m_page->spectrum()->setImperial(true);
    resize(size().expandedTo(QSize(1280, 800)));
    updateTitle();
}

void MainWindow::buildMenus() {
    QMenu* file = menuBar()->addMenu(tr("&File"));
    file->addAction(tr("&Open fleet store..."), this, [this] {
        const QString p = QFileDialog::getOpenFileName(this, tr("Fleet store"), {}, tr("Humwise stores (*.db);;All files (*)"));
        if (!p.isEmpty()) openDatabase(p);
    });
    QMenu* recent = file->addMenu(tr("Recent stores"));
    connect(recent, &QMenu::aboutToShow, this, [this, recent] {
        recent->clear();
        for (const QString& p : QSettings().value("stores/recent").toStringList()) recent->addAction(p, this, [this, p] { openDatabase(p); });
    });
    QAction* import = file->addAction(tr("&Import walkdown..."), this, [this] { showImportDialog(); });
    import->setShortcut(QKeySequence(Qt::CTRL | Qt::Key_I));
    file->addAction(tr("&Re-analyse every round"), this, &MainWindow::reanalyseAll);
    file->addSeparator();
    file->addAction(tr("Finding sheet as &PDF..."), QKeySequence(Qt::CTRL | Qt::Key_P), this, [this] { saveFindingSheet(); });
    file->addAction(tr("Finding sheet print pre&view..."), this, [this] { previewFindingSheet(); });
    file->addAction(tr("Route &summary as PDF..."), this, [this] { saveRouteSummary(); });
    file->addSeparator();
    file->addAction(tr("&Quit"), QKeySequence::Quit, this, &QWidget::close);

    QMenu* view = menuBar()->addMenu(tr("&View"));
    view->addAction(tr("Next motor"), QKeySequence(Qt::ALT | Qt::Key_Down), this, [this] { m_tree->selectNext(+1); });
    view->addAction(tr("Previous motor"), QKeySequence(Qt::ALT | Qt::Key_Up), this, [this] { m_tree->selectNext(-1); });
    view->addAction(tr("Next point"), QKeySequence(Qt::Key_F6), this, [this] { m_page->spectrum()->nextPoint(); });
    QAction* overlays = view->addAction(tr("Fault lines on the spectrum"));
    overlays->setCheckable(true);
    overlays->setChecked(true);
    overlays->setShortcut(QKeySequence(Qt::CTRL | Qt::Key_L));
    connect(overlays, &QAction::toggled, this, [this](bool on) { m_page->spectrum()->setOverlaysVisible(on); });
    QAction* imperial = view->addAction(tr("Imperial units"));
    imperial->setCheckable(true);
    imperial->setChecked(QSettings().value("units/imperial", false).toBool());
    connect(imperial, &QAction::toggled, this, [this](bool on) {
        QSettings().setValue("units/imperial", on);
        m_page->spectrum()->setImperial(on);
    });
    QMenu* filter = view->addMenu(tr("Show in the plant tree"));
    filter->addAction(tr("All motors"), this, [this] { m_tree->setFilter(PlantTreePanel::Filter::All); });
    filter->addAction(tr("Needs attention"), this, [this] { m_tree->setFilter(PlantTreePanel::Filter::NeedsAttention); });
    filter->addAction(tr("New or worse since last round"), this, [this] { m_tree->setFilter(PlantTreePanel::Filter::NewFindings); });

    QMenu* help = menuBar()->addMenu(tr("&Help"));
    help->addAction(tr("&Guide and safety"), QKeySequence::HelpContents, this, [this] { HelpDialog(this).exec(); });
}

void MainWindow::updateTitle() {
    setWindowTitle(tr("Humwise - %1").arg(QFileInfo(m_session.path()).fileName()));
    int attention = 0;
    for (const auto& s : m_session.status()) attention += s.worstSeverity >= 1;
    m_status->setText(tr("%1 motors, %2 rounds, %3 need attention - %4")
                          .arg(m_session.fleet().motors.size()).arg(m_session.rounds().size()).arg(attention).arg(m_session.path()));
}

void MainWindow::rememberDatabase(const QString& path) {
    QSettings s;
    QStringList recent = s.value("stores/recent").toStringList();
    recent.removeAll(path);
    recent.prepend(path);
    while (recent.size() > 8) recent.removeLast();
    s.setValue("stores/recent", recent);
}

void MainWindow::openDatabase(const QString& path) {
    const QString error = m_session.open(path);
    if (!error.isEmpty()) {
        QMessageBox::warning(this, tr("Fleet store"), error);
        return;
    }
    rememberDatabase(path);
}

void MainWindow::showImportDialog(const QString& folder) {
    ImportDialog dialog(m_session, this);
    if (!folder.isEmpty()) dialog.setFolder(folder);
    else if (!m_defaultImport.isEmpty()) dialog.setFolder(m_defaultImport);
    dialog.exec();
}

void MainWindow::reanalyseAll() {
    QProgressDialog progress(tr("Re-analysing every round..."), tr("Cancel"), 0, 1, this);
    progress.setWindowModality(Qt::WindowModal);
    std::atomic<bool> cancelled{false};
    QString result;
    const std::string db = m_session.path().toStdString();
    QThread* worker = QThread::create([&] {
        try {
            auto store = storage::FleetStore::open(db, false);
            const auto r = workflow::reanalyseAll(*store, [&](const workflow::ImportProgress& p) {
                QMetaObject::invokeMethod(&progress, [&progress, p] {
                    progress.setMaximum(static_cast<int>(p.total));
                    progress.setValue(static_cast<int>(p.done));
                    progress.setLabelText(QString::fromStdString(p.stage));
                });
                return !cancelled.load();
            });
            result = r ? tr("Re-analysed %1 round(s).").arg(r.value().rounds) : QString::fromStdString(r.error().message);
        } catch (const storage::StorageException& e) {
            result = QString::fromStdString(e.error.message);
        }
    });
    connect(&progress, &QProgressDialog::canceled, this, [&] { cancelled = true; });
    QEventLoop loop;
    connect(worker, &QThread::finished, &loop, &QEventLoop::quit);
    worker->start();
    loop.exec();
    delete worker;
    progress.close();
    m_session.reload();
    statusBar()->showMessage(result, 8000);
}

std::optional<workflow::MotorSheet> MainWindow::currentSheet() {
    const QString tag = m_page->motor();
    const auto* st = m_session.statusOf(tag.toStdString());
    if (tag.isEmpty() || !st || !st->roundId || !m_session.isOpen()) {
        QMessageBox::information(this, tr("Finding sheet"), tr("Choose a motor with an analysed round first."));
        return std::nullopt;
    }
    bool ok = false;
    const QString comment = QInputDialog::getMultiLineText(this, tr("Finding sheet"), tr("Analyst's comment for %1:").arg(tag), {}, &ok);
    if (!ok) return std::nullopt;
    try {
        return workflow::buildMotorSheet(m_session.store(), tag.toStdString(), *st->roundId, comment.toStdString());
    } catch (const storage::StorageException& e) {
        QMessageBox::warning(this, tr("Finding sheet"), QString::fromStdString(e.error.message));
        return std::nullopt;
    }
}

void MainWindow::saveFindingSheet() {
    const auto sheet = currentSheet();
    if (!sheet) return;
    const QString path = QFileDialog::getSaveFileName(this, tr("Save finding sheet"), QString::fromStdString(sheet->tag) + ".pdf", tr("PDF files (*.pdf)"));
    if (path.isEmpty()) return;
    const bool letter = QLocale().measurementSystem() == QLocale::ImperialUSSystem; // US Letter where paper is Letter
    const auto r = report::writeMotorSheetPdf(*sheet, path, letter ? report::Paper::Letter : report::Paper::A4);
    statusBar()->showMessage(r.error.isEmpty() ? tr("Saved %1 (%2 pages)").arg(path).arg(r.pages) : r.error, 8000);
}

void MainWindow::previewFindingSheet() {
    const auto sheet = currentSheet();
    if (!sheet) return;
    QPrinter printer(QPrinter::HighResolution);
    printer.setResolution(96);
    QPrintPreviewDialog preview(&printer, this);
    connect(&preview, &QPrintPreviewDialog::paintRequested, this, [&](QPrinter* p) {
        QPainter painter(p);
        report::paintMotorSheet(*p, painter, *sheet);
    });
    preview.exec();
}

void MainWindow::saveRouteSummary() {
    if (!m_session.isOpen() || m_session.rounds().empty()) return;
    const QString path = QFileDialog::getSaveFileName(this, tr("Save route summary"), "route-summary.pdf", tr("PDF files (*.pdf)"));
    if (path.isEmpty()) return;
    try {
        const auto r = report::writeRouteSummaryPdf(workflow::buildRouteSummary(m_session.store(), m_session.rounds().back().id), path, report::Paper::A4);
        statusBar()->showMessage(r.error.isEmpty() ? tr("Saved %1").arg(path) : r.error, 8000);
    } catch (const storage::StorageException& e) {
        QMessageBox::warning(this, tr("Route summary"), QString::fromStdString(e.error.message));
    }
}

void MainWindow::dragEnterEvent(QDragEnterEvent* e) {
    if (e->mimeData()->hasUrls() && QFileInfo(e->mimeData()->urls().front().toLocalFile()).isDir()) e->acceptProposedAction();
}

void MainWindow::dropEvent(QDropEvent* e) { showImportDialog(e->mimeData()->urls().front().toLocalFile()); }

void MainWindow::closeEvent(QCloseEvent* e) {
    QSettings().setValue("window/geometry", saveGeometry());
    QMainWindow::closeEvent(e);
}

} // namespace humwise::gui
