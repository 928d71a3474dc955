#include "app/gui/ScreenshotTour.h"

#include "app/gui/CompareView.h"
#include "app/gui/HelpDialog.h"
#include "app/gui/HistoryView.h"
#include "app/gui/ImportDialog.h"
#include "app/gui/LimitsView.h"
#include "app/gui/MainWindow.h"
#include "app/gui/MotorPage.h"
#include "app/gui/PlantTreePanel.h"
#include "app/gui/SpectrumView.h"
#include "app/gui/VerdictsView.h"
#include "app/gui/WaveformView.h"

#include <QApplication>
#include <QDir>
#include <QTabWidget>

namespace humwise::gui {
namespace {

void settle() {
    for (int i = 0; i < 5; ++i) QApplication::processEvents();
}

bool grab(QWidget& w, const QString& path, QStringList& files) {
    settle();
    const QPixmap pm = w.grab();
    if (pm.isNull() || !pm.save(path)) return false;
    files << path;
    return true;
}

// The motor whose latest round shows a fault starting with `prefix` at the highest severity.
QString motorWith(const StoreSession& session, const std::string& prefix) {
    QString best;
    int severity = 0;
    for (const auto& st : session.status())
        for (const auto& f : st.findings)
            if (f.finding.fault.rfind(prefix, 0) == 0 && !f.finding.withheld && f.finding.severity > severity) {
                severity = f.finding.severity;
                best = QString::fromStdString(st.tag);
            }
    return best;
}

} // namespace

TourResult runScreenshotTour(StoreSession& session, MainWindow& window, const QString& folder, const QString& importFolder) {
    TourResult out;
    if (!QDir().mkpath(folder)) return {{}, QObject::tr("%1: cannot create the folder").arg(folder)};
    const auto path = [&](const char* name) { return QDir(folder).filePath(name); };
    window.resize(1440, 900);
    window.show();
    settle();
    MotorPage* page = window.motorPage();
    PlantTreePanel* tree = window.plantTree();
    if (tree->visibleMotors().isEmpty()) return {{}, QObject::tr("the store holds no motor to show")};
    QString worstMotor = tree->visibleMotors().front();
    int worst = -1;
    for (const auto& st : session.status())
        if (st.worstSeverity > worst) {
            worst = st.worstSeverity;
            worstMotor = QString::fromStdString(st.tag);
        }
    QString bearingMotor = motorWith(session, "bearing_outer");
    if (bearingMotor.isEmpty()) bearingMotor = motorWith(session, "bearing_");
    if (bearingMotor.isEmpty()) bearingMotor = worstMotor;
    QString rotorMotor = motorWith(session, "broken_rotor_bar");
    if (rotorMotor.isEmpty()) rotorMotor = worstMotor;

    tree->selectMotor(worstMotor);
    page->tabs()->setCurrentWidget(page->verdicts());
    if (!grab(window, path("01-fleet-and-verdicts.png"), out.files)) out.error = "01";

    tree->selectMotor(bearingMotor);
    page->tabs()->setCurrentWidget(page->spectrum());
    page->spectrum()->showPoint("DE-H", "velocity");
    if (!grab(window, path("02-spectrum.png"), out.files)) out.error = "02";
    page->spectrum()->showPoint("DE-H", "envelope");
    if (!grab(window, path("03-envelope.png"), out.files)) out.error = "03";

    tree->selectMotor(rotorMotor);
    page->tabs()->setCurrentWidget(page->spectrum());
    page->spectrum()->showPoint("I-A", "zoom");
    if (!grab(window, path("04-current-zoom.png"), out.files)) out.error = "04";

    tree->selectMotor(bearingMotor);
    page->tabs()->setCurrentWidget(page->waveform());
    page->waveform()->showPoint("DE-H");
    if (!grab(window, path("05-waveform.png"), out.files)) out.error = "05";

    page->tabs()->setCurrentWidget(page->compare());
    if (!grab(window, path("06-then-and-now.png"), out.files)) out.error = "06";

    page->tabs()->setCurrentWidget(page->history());
    page->history()->showTrend("DE-H", "velocity_rms");
    if (!grab(window, path("07-history.png"), out.files)) out.error = "07";

    page->tabs()->setCurrentWidget(page->limits());
    if (!grab(window, path("08-limits.png"), out.files)) out.error = "08";

    if (!importFolder.isEmpty()) {
        ImportDialog dialog(session, &window);
        dialog.setFolder(importFolder);
        dialog.resize(1100, 650);
        dialog.show();
        if (!grab(dialog, path("09-import.png"), out.files)) out.error = "09";
    }
    HelpDialog help(&window);
    help.show();
    if (!grab(help, path("10-guide.png"), out.files)) out.error = "10";
    if (!out.error.isEmpty()) out.error = QObject::tr("could not write picture %1 in %2").arg(out.error, folder);
    return out;
}

} // namespace humwise::gui
