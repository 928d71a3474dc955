// Workbench figures (the GUI issue's targets): opening a motor with 36 rounds of history with all
// its views drawn (target < 150 ms), and redrawing an 800 000-line spectrum (target < 16 ms).
// Builds the history from the sample fleet: its twelve walkdowns imported for three years.
// Usage: bench_workbench [work-folder]   (run with QT_QPA_PLATFORM=offscreen on a headless machine)

#include "app/common/Walkdown.h"
#include "app/gui/MainWindow.h"
#include "app/gui/MotorPage.h"
#include "app/gui/PlantTreePanel.h"
#include "app/gui/PlotStyle.h"
#include "app/gui/StoreSession.h"
#include "core/io/FleetFile.h"
#include "sample_fleet/SampleFleet.h"

#include <qcustomplot.h>

#include <QApplication>
#include <QElapsedTimer>

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <sstream>

namespace fs = std::filesystem;
using namespace humwise;

namespace {

void copyWithYear(const fs::path& from, const fs::path& to, int year) {
    fs::create_directories(to);
    fs::copy(from, to, fs::copy_options::recursive | fs::copy_options::overwrite_existing);
    std::ifstream in(from / "manifest.csv");
    std::stringstream text;
    text << in.rdbuf();
    std::string s = text.str();
    for (std::size_t at = 0; (at = s.find("2026-", at)) != std::string::npos; at += 5) s.replace(at, 4, std::to_string(year));
    std::ofstream(to / "manifest.csv", std::ios::trunc) << s;
}

double median(std::vector<double> v) {
    std::sort(v.begin(), v.end());
    return v[v.size() / 2];
}

} // namespace

int main(int argc, char** argv) {
    QApplication app(argc, argv);
    const fs::path work = argc > 1 ? fs::path(argv[1]) : fs::temp_directory_path() / "humwise-bench-workbench";
    const fs::path db = work / "history.db";
    if (!fs::exists(db)) {
        std::fprintf(stderr, "building 36 rounds of history in %s...\n", work.string().c_str());
        sample::SampleFleetOptions o;
        o.outDir = work / "sample";
        const auto summary = sample::generateSampleFleet(o);
        auto store = storage::FleetStore::open(db);
        {
            storage::Transaction tx(store->database());
            store->saveFleet(io::readFleetFile(summary.fleetFile).value());
            tx.commit();
        }
        for (int year = 2024; year <= 2026; ++year)
            for (std::size_t i = 0; i < 12; ++i) {
                const fs::path copy = work / "copies" / (std::to_string(year) + "-" + std::to_string(i));
                copyWithYear(summary.walkdowns[i], copy, year);
                const auto r = workflow::importWalkdown(*store, copy);
                if (!r) {
                    std::fprintf(stderr, "%s\n", r.error().message.c_str());
                    return 1;
                }
                fs::remove_all(copy);
            }
    }
    gui::StoreSession session;
    if (!session.open(QString::fromStdString(db.string())).isEmpty()) return 1;
    gui::MainWindow window(session);
    window.resize(1440, 900);
    window.show();
    QApplication::processEvents();

    // Opening a motor: every view of the page loads and draws (grab forces the paint).
    std::vector<double> openMs;
    const QStringList motors = window.plantTree()->visibleMotors();
    for (int rep = 0; rep < 11; ++rep) {
        const QString tag = motors[rep % motors.size()];
        QElapsedTimer t;
        t.start();
        window.motorPage()->showMotor(tag);
        QApplication::processEvents();
        (void)window.grab();
        openMs.push_back(static_cast<double>(t.nsecsElapsed()) / 1e6);
    }

    // Redrawing an 800 000-line spectrum in a plot the size of the spectrum view.
    QCustomPlot plot;
    gui::stylePlot(&plot);
    plot.resize(1000, 600);
    QVector<double> x(800000), y(800000);
    for (int i = 0; i < 800000; ++i) {
        x[i] = i * 0.0125;
        y[i] = 0.01 + std::abs(std::sin(i * 0.001)) * 0.1 + (i % 997 == 0 ? 1.0 : 0.0);
    }
    auto* g = plot.addGraph();
    g->setData(x, y, true);
    g->setPen(QPen(gui::traceColour(0), 0));
    g->setAdaptiveSampling(true);
    plot.rescaleAxes();
    plot.replot(QCustomPlot::rpImmediateRefresh);
    std::vector<double> drawMs;
    for (int rep = 0; rep < 30; ++rep) {
        plot.xAxis->setRange(0, 10000 - rep * 10);
        QElapsedTimer t;
        t.start();
        plot.replot(QCustomPlot::rpImmediateRefresh);
        drawMs.push_back(static_cast<double>(t.nsecsElapsed()) / 1e6);
    }
    std::printf("Workbench benchmark: %zu rounds of history, %lld motors\n", session.rounds().size(), static_cast<long long>(motors.size()));
    std::printf("open a motor with all its views drawn: median %.1f ms, max %.1f ms (target < 150 ms)\n", median(openMs),
                *std::max_element(openMs.begin(), openMs.end()));
    std::printf("redraw an 800k-line spectrum: median %.2f ms, max %.2f ms (target < 16 ms)\n", median(drawMs),
                *std::max_element(drawMs.begin(), drawMs.end()));
    return 0;
}
