// humwise: the workbench. Opens the fleet store given with --db, or the sample fleet (built on the
// first run from the generated walkdowns through the ordinary import). --screenshot-tour DIR
// visits every view, writes one PNG each into DIR and exits.

#include "app/common/SampleDatabase.h"
#include "app/gui/MainWindow.h"
#include "app/gui/ScreenshotTour.h"
#include "app/gui/StoreSession.h"

#include <QApplication>
#include <QCommandLineParser>
#include <QDir>
#include <QMessageBox>
#include <QProgressDialog>

#include <iostream>

int main(int argc, char** argv) {
    QApplication app(argc, argv);
    QApplication::setApplicationName("Humwise");
    QApplication::setOrganizationName("Humwise");
    QCommandLineParser parser;
    parser.setApplicationDescription("Condition-monitoring workbench for three-phase induction motors");
    parser.addHelpOption();
    QCommandLineOption db("db", "Fleet store to open (default: the sample fleet).", "PATH");
    QCommandLineOption tour("screenshot-tour", "Write one PNG per view into DIR and exit.", "DIR");
    parser.addOptions({db, tour});
    parser.process(app);
    const bool touring = parser.isSet(tour);

    QString path = parser.value(db);
    QString importFolder;
    if (path.isEmpty()) {
        const auto folder = humwise::workflow::defaultSampleFolder();
        const auto sampleDb = folder / "fleet.db";
        importFolder = QString::fromStdString((folder / "walkdown-13").string());
        if (!std::filesystem::exists(sampleDb)) {
            std::cerr << "humwise: building the sample fleet in " << folder.string() << " (first run)...\n";
            try {
                humwise::workflow::buildSampleDatabase(folder, sampleDb, [](const humwise::workflow::ImportProgress& p) {
                    std::cerr << "  " << p.stage << '\n';
                    return true;
                });
            } catch (const std::exception& e) {
                std::cerr << "humwise: " << e.what() << '\n';
                if (!touring) QMessageBox::critical(nullptr, "Humwise", QString::fromStdString(e.what()));
                return 1;
            }
        }
        path = QString::fromStdString(sampleDb.string());
    }
    humwise::gui::StoreSession session;
    if (const QString error = session.open(path); !error.isEmpty()) {
        std::cerr << "humwise: " << error.toStdString() << '\n';
        if (!touring) QMessageBox::critical(nullptr, "Humwise", error);
        return 1;
    }
    humwise::gui::MainWindow window(session);
    window.setDefaultImportFolder(importFolder);
    if (touring) {
        const auto r = humwise::gui::runScreenshotTour(session, window, parser.value(tour), importFolder);
        for (const auto& f : r.files) std::cout << f.toStdString() << '\n';
        if (!r.error.isEmpty()) {
            std::cerr << "humwise: " << r.error.toStdString() << '\n';
            return 1;
        }
        return 0;
    }
    window.show();
    return QApplication::exec();
}
