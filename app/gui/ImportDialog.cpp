#include "app/gui/ImportDialog.h"

#include <QCheckBox>
#include <QFileDialog>
#include <QHBoxLayout>
#include <QHeaderView>
#include <QLabel>
#include <QLineEdit>
#include <QProgressBar>
#include <QPushButton>
#include <QTableWidget>
#include <QThread>
#include <QVBoxLayout>

namespace humwise::gui {

ImportDialog::ImportDialog(StoreSession& session, QWidget* parent) : QDialog(parent), m_session(session) {
    setWindowTitle(tr("Import a walkdown"));
    m_folder = new QLineEdit;
    auto* browse = new QPushButton(tr("Choose folder..."));
    m_skipBad = new QCheckBox(tr("import the good files when some are bad"));
    m_preview = new QTableWidget(0, 4);
    m_preview->setHorizontalHeaderLabels({tr("File"), tr("Goes to"), tr("How"), tr("Problem")});
    m_preview->horizontalHeader()->setStretchLastSection(true);
    m_progress = new QProgressBar;
    m_progress->setRange(0, 1);
    m_progress->setValue(0);
    m_check = new QPushButton(tr("Check"));
    m_import = new QPushButton(tr("Import"));
    m_cancel = new QPushButton(tr("Cancel import"));
    m_cancel->setEnabled(false);
    m_summary = new QLabel;
    m_summary->setWordWrap(true);
    auto* top = new QHBoxLayout;
    top->addWidget(m_folder, 1);
    top->addWidget(browse);
    auto* buttons = new QHBoxLayout;
    buttons->addWidget(m_skipBad);
    buttons->addStretch();
    buttons->addWidget(m_check);
    buttons->addWidget(m_import);
    buttons->addWidget(m_cancel);
    auto* layout = new QVBoxLayout(this);
    layout->addLayout(top);
    layout->addWidget(m_preview, 1);
    layout->addWidget(m_progress);
    layout->addLayout(buttons);
    layout->addWidget(m_summary);
    resize(900, 560);
    connect(browse, &QPushButton::clicked, this, [this] {
        const QString d = QFileDialog::getExistingDirectory(this, tr("Walkdown folder"), m_folder->text());
        if (!d.isEmpty()) setFolder(d);
    });
    connect(m_check, &QPushButton::clicked, this, [this] { check(); });
    connect(m_import, &QPushButton::clicked, this, [this] { startImport(); });
    connect(m_cancel, &QPushButton::clicked, this, [this] { cancel(); });
}

ImportDialog::~ImportDialog() {
    if (m_thread) {
        m_cancelled = true;
        m_thread->wait();
        delete m_thread;
        m_session.resume(); // closed while the import ran; an error leaves it closed, as at start
    }
}

void ImportDialog::setFolder(const QString& folder) {
    m_folder->setText(folder);
    check();
}

QString ImportDialog::summary() const { return m_summary->text(); }

void ImportDialog::showReport(const workflow::ImportReport& r) {
    m_preview->setRowCount(0);
    const auto add = [&](const QString& file, const QString& to, const QString& how, const QString& problem) {
        const int row = m_preview->rowCount();
        m_preview->insertRow(row);
        m_preview->setItem(row, 0, new QTableWidgetItem(file));
        m_preview->setItem(row, 1, new QTableWidgetItem(to));
        m_preview->setItem(row, 2, new QTableWidgetItem(how));
        m_preview->setItem(row, 3, new QTableWidgetItem(problem));
    };
    for (const auto& m : r.matched) {
        QString problem;
        for (const auto& f : r.flagged)
            if (f.file == m.file) problem = tr("flagged: %1 (stored, left out of the diagnosis)").arg(QString::fromStdString(f.reason));
        add(QString::fromStdString(m.file) + (m.channel > 1 ? tr(" channel %1").arg(m.channel) : QString()),
            QString::fromStdString(m.motorTag + " / " + m.pointName), QString::fromStdString(m.how), problem);
    }
    for (const auto& b : r.bad) add(QString::fromStdString(b.file), "-", tr("not imported"), QString::fromStdString(b.kind + ": " + b.reason));
    for (const auto& u : r.unmatched) add(QString::fromStdString(u), "-", tr("unmatched"), tr("not in the manifest and no motor/point of that name"));
}

bool ImportDialog::check() {
    if (!m_session.isOpen()) return false;
    workflow::ImportOptions o;
    o.dryRun = true;
    o.skipBad = true; // show everything that would import
    const auto r = workflow::importWalkdown(m_session.store(), m_folder->text().toStdString(), o);
    if (!r) {
        showReport(r.error().report);
        m_summary->setText(QString::fromStdString(r.error().message));
        return false;
    }
    showReport(r.value());
    m_summary->setText(tr("%1 recording(s) will be imported, %2 bad file(s), %3 flagged, %4 unmatched; round of %5.")
                           .arg(r.value().matched.size()).arg(r.value().bad.size()).arg(r.value().flagged.size()).arg(r.value().unmatched.size())
                           .arg(QString::fromStdString(r.value().roundStart)));
    return r.value().bad.empty();
}

void ImportDialog::startImport() {
    if (m_thread || !m_session.isOpen()) return;
    m_cancelled = false;
    m_check->setEnabled(false);
    m_import->setEnabled(false);
    m_cancel->setEnabled(true);
    const std::string db = m_session.path().toStdString(), folder = m_folder->text().toStdString();
    const bool skipBad = m_skipBad->isChecked();
    m_session.suspend(); // the import may then have the store to itself (StoreSession.h)
    m_thread = QThread::create([this, db, folder, skipBad] {
        // The worker's own connection: SQLite connections are not shared between threads here.
        bool ok = false;
        QString text;
        try {
            auto store = storage::FleetStore::open(db, false);
            workflow::ImportOptions o;
            o.skipBad = skipBad;
            o.progress = [this](const workflow::ImportProgress& p) {
                QMetaObject::invokeMethod(this, [this, p] {
                    m_progress->setRange(0, static_cast<int>(p.total));
                    m_progress->setValue(static_cast<int>(p.done));
                    m_progress->setFormat(QString::fromStdString(p.stage) + "  %v/%m");
                }, Qt::QueuedConnection);
                return !m_cancelled.load();
            };
            const auto r = workflow::importWalkdown(*store, folder, o);
            if (r) {
                ok = true;
                m_throughJournal = r.value().throughJournal;
                text = tr("Stored round %1 of %2: %3 recording(s), %4 motor(s) analysed, %5 finding(s); %6 skipped, %7 flagged.")
                           .arg(*r.value().roundId).arg(QString::fromStdString(r.value().roundStart)).arg(r.value().matched.size())
                           .arg(r.value().motorsAnalysed).arg(r.value().findings).arg(r.value().bad.size()).arg(r.value().flagged.size());
            } else {
                text = QString::fromStdString(r.error().message);
            }
        } catch (const storage::StorageException& e) {
            text = QString::fromStdString(e.error.message);
        }
        QMetaObject::invokeMethod(this, [this, ok, text] { finish(ok, text); }, Qt::QueuedConnection);
    });
    m_thread->start();
}

void ImportDialog::cancel() { m_cancelled = true; }

void ImportDialog::finish(bool ok, const QString& text) {
    if (m_thread) {
        m_thread->wait();
        delete m_thread;
        m_thread = nullptr;
    }
    m_check->setEnabled(true);
    m_import->setEnabled(true);
    m_cancel->setEnabled(false);
    const QString reopened = m_session.resume();
    m_summary->setText(reopened.isEmpty() ? text : text + "\n" + reopened);
    emit importFinished(ok, text);
}

} // namespace humwise::gui
