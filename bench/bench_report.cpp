// The round report for 50 motors (the reports issue's target: under 10 s): the route summary and
// a finding sheet for every motor, each assembled from the store and drawn to PDF. The 50-motor
// store is the sample fleet's last walkdown repeated for copies of its motors.
// Usage: bench_report [work-folder]   (QT_QPA_PLATFORM=offscreen on a headless machine)

#include "app/common/ReportData.h"
#include "app/common/Walkdown.h"
#include "app/report/ReportRenderer.h"
#include "core/io/FleetFile.h"
#include "sample_fleet/SampleFleet.h"

#include <QGuiApplication>

#include <chrono>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <sstream>

namespace fs = std::filesystem;
using namespace humwise;
using Clock = std::chrono::steady_clock;

int main(int argc, char** argv) {
    QGuiApplication app(argc, argv);
    const fs::path work = argc > 1 ? fs::path(argv[1]) : fs::temp_directory_path() / "humwise-bench-report";
    const fs::path db = work / "fifty.db";
    if (!fs::exists(db)) {
        std::fprintf(stderr, "building a 50-motor store in %s...\n", work.string().c_str());
        sample::SampleFleetOptions o;
        o.outDir = work / "sample";
        const auto summary = sample::generateSampleFleet(o);
        const auto base = io::readFleetFile(summary.fleetFile).value();
        fleet::Fleet fifty = base;
        fifty.motors.clear();
        fifty.routes.clear();
        const fs::path walk = work / "walkdown-50";
        fs::create_directories(walk);
        std::ifstream in(summary.walkdowns[11] / "manifest.csv");
        std::string manifest, line, header;
        while (std::getline(in, line)) {
            if (line.rfind("#", 0) == 0 || header.empty()) {
                manifest += line + "\n";
                if (line.rfind("#", 0) != 0) header = line;
            }
        }
        for (int copy = 0; copy < 5 && fifty.motors.size() < 50; ++copy)
            for (const auto& m : base.motors) {
                if (fifty.motors.size() >= 50) break;
                auto c = m;
                c.motor.tag = m.motor.tag + "-" + static_cast<char>('A' + copy);
                fifty.motors.push_back(c);
                std::ifstream again(summary.walkdowns[11] / "manifest.csv");
                while (std::getline(again, line)) {
                    const auto comma = line.find(',');
                    if (line.rfind("#", 0) == 0 || line == header || comma == std::string::npos) continue;
                    std::stringstream fields(line);
                    std::string file, channel, motor, rest;
                    std::getline(fields, file, ',');
                    std::getline(fields, channel, ',');
                    std::getline(fields, motor, ',');
                    std::getline(fields, rest);
                    if (motor != m.motor.tag) continue;
                    const fs::path target = fs::path(c.motor.tag) / fs::path(file).filename();
                    fs::create_directories(walk / c.motor.tag);
                    fs::copy_file(summary.walkdowns[11] / file, walk / target, fs::copy_options::overwrite_existing);
                    manifest += target.string() + "," + channel + "," + c.motor.tag + "," + rest + "\n";
                }
            }
        std::ofstream(walk / "manifest.csv") << manifest;
        auto store = storage::FleetStore::open(db);
        {
            storage::Transaction tx(store->database());
            store->saveFleet(fifty);
            tx.commit();
        }
        workflow::ImportOptions io;
        io.skipBad = true;
        const auto r = workflow::importWalkdown(*store, walk, io);
        if (!r) {
            std::fprintf(stderr, "%s\n", r.error().message.c_str());
            return 1;
        }
    }
    auto store = storage::FleetStore::open(db, false);
    const auto round = store->rounds().back().id;
    const auto motors = store->loadFleet().motors;
    const auto t0 = Clock::now();
    const auto summary = workflow::buildRouteSummary(*store, round);
    const auto s = report::writeRouteSummaryPdf(summary, QString::fromStdString((work / "route-summary.pdf").string()), report::Paper::A4);
    std::vector<workflow::MotorSheet> sheets;
    for (const auto& m : motors) sheets.push_back(workflow::buildMotorSheet(*store, m.motor.tag, round));
    const auto r = report::writeMotorSheetsPdf(sheets, QString::fromStdString((work / "finding-sheets.pdf").string()), report::Paper::A4);
    const double seconds = std::chrono::duration<double>(Clock::now() - t0).count();
    std::printf("Report benchmark: round of %zu motors: route summary (%d pages) and %zu finding sheets (%d pages) in %.2f s (target < 10 s)\n",
                motors.size(), s.pages, sheets.size(), r.pages, seconds);
    return s.error.isEmpty() && r.error.isEmpty() ? 0 : 1;
}
