// The workbench driven through its real widgets (offscreen): a walkdown imported through the
// import dialog's code path, a motor opened, units switched and fault-line overlays toggled -
// and what is plotted compared with the core's and the store's own numbers.
#include "GuiTestSupport.h"
#include "app/common/StoredData.h"
#include "app/gui/CompareView.h"
#include "app/gui/HistoryView.h"
#include "app/gui/ImportDialog.h"
#include "app/gui/LimitsView.h"
#include "app/gui/MainWindow.h"
#include "app/gui/MotorPage.h"
#include "app/gui/PlantTreePanel.h"
#include "app/gui/SpectrumView.h"
#include "app/gui/VerdictsView.h"
#include "app/gui/WaveformView.h"
#include "core/io/FleetFile.h"
#include "support/TestSupport.h"
#include "workflow/FixtureFleet.h"

#include <gtest/gtest.h>

#include <QProgressBar>
#include <QSignalSpy>
#include <QUndoStack>
#include <QTabWidget>
#include <QTableWidget>
#include <QTreeWidget>

#include <unistd.h>

#include <cmath>
#include <numbers>

namespace humwise::gui {
namespace {

namespace fs = std::filesystem;

class Workbench : public ::testing::Test {
protected:
    static void SetUpTestSuite() {
        test::guiApp();
        // One folder per process: ctest runs the tests of this suite as separate processes, in parallel.
        dir = test::freshFolder("gui-" + std::to_string(::getpid()));
        {
            auto store = storage::FleetStore::open(dir / "fleet.db");
            storage::Transaction tx(store->database());
            store->saveFleet(test::smallFleet());
            tx.commit();
        }
        session = new StoreSession;
        ASSERT_TRUE(session->open(QString::fromStdString((dir / "fleet.db").string())).isEmpty());
        // Two rounds, imported through the dialog (worker thread, progress, summary).
        for (int month = 3; month <= 4; ++month) {
            test::WalkdownSpec spec;
            spec.roundStart = "2026-0" + std::to_string(month) + "-02T08:00:00Z";
            spec.oneXmmsP1 = month == 4 ? 3.5 : 0.6;
            spec.seed = static_cast<std::uint64_t>(month);
            const auto folder = dir / ("walkdown-" + std::to_string(month));
            test::writeWalkdown(folder, spec);
            ImportDialog dialog(*session);
            dialog.setFolder(QString::fromStdString(folder.string()));
            ASSERT_EQ(dialog.preview()->rowCount(), 12);
            QSignalSpy done(&dialog, &ImportDialog::importFinished);
            dialog.startImport();
            // The session lets go of the store while the import runs, so that the import has it
            // to itself and writes the round through a rollback journal (storage/Database.h).
            EXPECT_FALSE(session->isOpen());
            ASSERT_TRUE(done.wait(120000));
            ASSERT_TRUE(done.takeFirst().at(0).toBool()) << dialog.summary().toStdString();
            EXPECT_EQ(dialog.progressBar()->value(), dialog.progressBar()->maximum());
            ASSERT_TRUE(session->isOpen()) << dialog.summary().toStdString();
            EXPECT_EQ(session->rounds().size(), static_cast<std::size_t>(month - 2));
            EXPECT_TRUE(dialog.lastImportWentThroughJournal()) << "the round went through the write-ahead log";
        }
    }
    static void TearDownTestSuite() {
        delete session;
        session = nullptr;
    }
    static inline StoreSession* session = nullptr;
    static inline fs::path dir;
};

// A store that cannot be reopened after an import (here: moved away meanwhile) leaves the
// session closed with nothing loaded, so that no view or action reaches for a store that is not
// there; an empty store is not created in its place.
TEST(StoreSessionResume, FailingReopenLeavesTheSessionClosedAndEmpty) {
    test::guiApp();
    const auto dir = test::freshFolder("gui-resume-" + std::to_string(::getpid()));
    const auto db = dir / "fleet.db";
    {
        auto store = storage::FleetStore::open(db);
        storage::Transaction tx(store->database());
        store->saveFleet(test::smallFleet());
        tx.commit();
    }
    StoreSession session;
    ASSERT_TRUE(session.open(QString::fromStdString(db.string())).isEmpty());
    ASSERT_FALSE(session.fleet().motors.empty());
    session.suspend();
    EXPECT_FALSE(session.isOpen());
    fs::rename(db, dir / "moved.db");
    QSignalSpy changed(&session, &StoreSession::changed);
    const QString failure = session.resume();
    EXPECT_FALSE(failure.isEmpty());
    EXPECT_FALSE(session.isOpen());
    EXPECT_TRUE(session.fleet().motors.empty());
    EXPECT_TRUE(session.rounds().empty());
    EXPECT_TRUE(session.status().empty());
    EXPECT_EQ(changed.count(), 1);
    EXPECT_FALSE(fs::exists(db)) << "an empty store was created in place of the one moved away";
    // The views and actions see no store: nothing dereferences it.
    MainWindow window(session);
    EXPECT_TRUE(window.plantTree()->visibleMotors().isEmpty());
}

TEST_F(Workbench, ImportedRoundsShowInThePlantTree) {
    ASSERT_EQ(session->rounds().size(), 2u);
    MainWindow window(*session);
    const auto motors = window.plantTree()->visibleMotors();
    EXPECT_EQ(motors, (QStringList{"P-1", "P-2"}));
    // P-1 was driven into unbalance in April: the tree says so with text, not colour alone.
    bool p1 = false;
    for (QTreeWidgetItemIterator it(window.plantTree()->tree()); *it; ++it)
        if ((*it)->data(0, Qt::UserRole).toString() == "P-1") {
            p1 = true;
            EXPECT_TRUE((*it)->text(1).contains("plan repair")) << (*it)->text(1).toStdString();
            EXPECT_TRUE((*it)->text(2).contains("unbalance")) << (*it)->text(2).toStdString();
        }
    EXPECT_TRUE(p1);
    window.plantTree()->setFilter(PlantTreePanel::Filter::NeedsAttention);
    EXPECT_EQ(window.plantTree()->visibleMotors(), QStringList{"P-1"});
}

TEST_F(Workbench, OpeningAMotorShowsItsFindingsAndEvidenceOpensTheSpectrum) {
    MainWindow window(*session);
    window.plantTree()->selectMotor("P-1");
    MotorPage* page = window.motorPage();
    ASSERT_EQ(page->motor(), "P-1");
    QTreeWidget* findings = page->verdicts()->findingsTree();
    ASSERT_GT(findings->topLevelItemCount(), 0);
    EXPECT_EQ(findings->topLevelItem(0)->text(0), "unbalance");
    // Evidence of the unbalance: its 1X line. Activating it opens the spectrum there.
    QTreeWidgetItem* evidence = findings->topLevelItem(0)->child(0);
    ASSERT_TRUE(evidence->data(0, Qt::UserRole + 1).isValid());
    const double hz = evidence->data(0, Qt::UserRole + 2).toDouble();
    emit findings->itemActivated(evidence, 0);
    EXPECT_EQ(page->tabs()->currentWidget(), page->spectrum());
    ASSERT_TRUE(page->spectrum()->highlightedHz().has_value());
    EXPECT_DOUBLE_EQ(*page->spectrum()->highlightedHz(), hz);
    EXPECT_EQ(page->spectrum()->currentPoint(), "DE-H");
}

TEST_F(Workbench, SpectrumUnitsMatchTheStoredSpectrum) {
    MainWindow window(*session);
    window.plantTree()->selectMotor("P-1");
    SpectrumView* view = window.motorPage()->spectrum();
    ASSERT_TRUE(view->showPoint("DE-H", "velocity"));
    auto& store = session->store();
    const auto latest = session->rounds().back().id;
    const auto rec = workflow::recordingOf(store, latest, "P-1", "DE-H");
    const auto stored = workflow::storedSpectrum(store, rec->id, "velocity");
    ASSERT_TRUE(stored.has_value());
    const double f = 100.0;
    const auto k = static_cast<std::size_t>(std::llround((f - stored->startHz) / stored->resolutionHz));
    const double si = stored->values[k]; // m/s rms
    const double hz = stored->frequencyHz(k);
    EXPECT_NEAR(*view->valueAtHz(hz), si * 1000.0, 1e-6 * si * 1000.0 + 1e-12); // mm/s
    view->setImperial(true);
    EXPECT_NEAR(*view->valueAtHz(hz), si / 0.0254, 1e-6 * si / 0.0254 + 1e-12); // in/s (1 in = 25.4 mm exactly)
    EXPECT_TRUE(view->unitLabel().startsWith("in/s"));
    view->setQuantity(Quantity::Acceleration);
    EXPECT_NEAR(*view->valueAtHz(hz), si * 2 * std::numbers::pi * hz / 9.80665, 1e-6 * si * 2 * std::numbers::pi * hz / 9.80665); // g
    view->setImperial(false);
    view->setQuantity(Quantity::Displacement);
    EXPECT_NEAR(*view->valueAtHz(hz), si / (2 * std::numbers::pi * hz) * 1e6, 1e-6 * si / (2 * std::numbers::pi * hz) * 1e6); // um
}

TEST_F(Workbench, FaultLineOverlaysSitWhereTheCoreComputesThem) {
    MainWindow window(*session);
    window.plantTree()->selectMotor("P-1");
    SpectrumView* view = window.motorPage()->spectrum();
    ASSERT_TRUE(view->showPoint("DE-H", "velocity"));
    const auto op = workflow::operatingPoint(session->store(), session->rounds().back().id, "P-1");
    ASSERT_TRUE(op.has_value());
    const auto line = motor::faultLines(session->fleet().motor("P-1")->motor, motor::OperatingPoint{op->lineHz, op->speedRpm / 60.0, 4});
    const auto find = [&](const QString& id) -> std::optional<double> {
        for (const auto& m : view->overlayMarkers())
            if (m.label == id) return m.x;
        return std::nullopt;
    };
    for (const auto& l : line)
        if (l.id == "1X" || l.id == "2LF" || l.id == "BPFO_DE_1") {
            const auto x = find(QString::fromStdString(l.id));
            ASSERT_TRUE(x.has_value()) << l.id;
            EXPECT_DOUBLE_EQ(*x, l.frequencyHz) << l.id;
        }
    view->setOverlay(Overlay::Shaft, false);
    EXPECT_FALSE(find("1X").has_value());
    view->setOverlay(Overlay::Shaft, true);
    view->setOrders(true);
    ASSERT_TRUE(find("1X").has_value());
    EXPECT_NEAR(*find("1X"), 1.0, 1e-12);
    view->setOverlaysVisible(false);
    EXPECT_TRUE(view->overlayMarkers().empty());
    view->setOverlaysVisible(true);
    view->setOrders(false);
    view->setHarmonicCursor(24.6);
    ASSERT_EQ(view->cursorLines().size(), 10u);
    EXPECT_NEAR(view->cursorLines()[2], 3 * 24.6, 1e-12);
}

TEST_F(Workbench, WaveformCompareHistoryAndLimits) {
    MainWindow window(*session);
    window.plantTree()->selectMotor("P-1");
    MotorPage* page = window.motorPage();
    ASSERT_TRUE(page->waveform()->showPoint("DE-H"));
    EXPECT_GT(page->waveform()->statistics().rms, 0.0);
    EXPECT_GT(page->waveform()->statistics().kurtosis, 1.0);

    const auto [a, b] = page->compare()->rounds();
    EXPECT_NE(a, b); // default: the latest against an earlier round
    ASSERT_TRUE(page->compare()->compare("DE-H", "velocity", session->rounds().front().id, session->rounds().back().id));
    bool oneXGrew = false;
    for (const auto& c : page->compare()->comparison().changes) oneXGrew |= std::abs(c.order - 1.0) < 0.02 && c.changeDb > 10;
    EXPECT_TRUE(oneXGrew); // 0.6 -> 3.5 mm/s at 1X is +15 dB

    ASSERT_TRUE(page->history()->showTrend("DE-H", "velocity_rms"));
    EXPECT_EQ(page->history()->trendPoints().size(), 2u);
    EXPECT_EQ(page->history()->cascadeTraces(), 2);
    EXPECT_TRUE(page->history()->limits().alarm.has_value());

    LimitsView* limits = page->limits();
    ASSERT_GT(limits->table()->rowCount(), 0);
    limits->table()->item(0, 4)->setText("7.5");
    limits->table()->item(0, 3)->setText("4.5");
    EXPECT_TRUE(limits->saveRow(0).startsWith("Stored")) << limits->saveRow(0).toStdString();
    EXPECT_FALSE(session->store().alarmLimits("P-1").empty());
    limits->table()->item(0, 3)->setText("9");
    EXPECT_FALSE(limits->saveRow(0).startsWith("Stored")); // alert above alarm is refused
}

TEST_F(Workbench, NameplateEditsAreValidatedAndUndoable) {
    MainWindow window(*session);
    window.plantTree()->selectMotor("P-2");
    VerdictsView* v = window.motorPage()->verdicts();
    motor::Nameplate n = session->fleet().motor("P-2")->motor.nameplate;
    const double before = n.ratedSpeedRpm;
    n.ratedSpeedRpm = 1600; // above the 4-pole synchronous speed at 50 Hz
    EXPECT_TRUE(v->applyNameplate(n).contains("not below the synchronous speed"));
    EXPECT_DOUBLE_EQ(session->fleet().motor("P-2")->motor.nameplate.ratedSpeedRpm, before);
    n.ratedSpeedRpm = 1465;
    v->applyNameplate(n);
    EXPECT_DOUBLE_EQ(session->fleet().motor("P-2")->motor.nameplate.ratedSpeedRpm, 1465);
    v->undoStack()->undo();
    EXPECT_DOUBLE_EQ(session->fleet().motor("P-2")->motor.nameplate.ratedSpeedRpm, before);
    v->undoStack()->redo();
    EXPECT_DOUBLE_EQ(session->fleet().motor("P-2")->motor.nameplate.ratedSpeedRpm, 1465);
    v->undoStack()->undo();
}

TEST_F(Workbench, KeyboardMovesBetweenMotors) {
    MainWindow window(*session);
    window.plantTree()->selectMotor("P-1");
    window.plantTree()->selectNext(+1);
    EXPECT_EQ(window.motorPage()->motor(), "P-2");
    window.plantTree()->selectNext(+1);
    EXPECT_EQ(window.motorPage()->motor(), "P-1");
}

} // namespace
} // namespace humwise::gui

namespace humwise::gui {
namespace {

// Regression: a zoomed current spectrum left on screen, then another motor chosen, made the
// view convert the current spectrum as vibration (and the program stop).
TEST_F(Workbench, SwitchingMotorsAfterACurrentZoomShowsTheNewMotorsVibration) {
    MainWindow window(*session);
    window.plantTree()->selectMotor("P-1");
    SpectrumView* view = window.motorPage()->spectrum();
    ASSERT_TRUE(view->showPoint("I-A", "zoom"));
    EXPECT_TRUE(view->unitLabel().startsWith("A"));
    window.plantTree()->selectMotor("P-2");
    EXPECT_EQ(view->currentKind(), "velocity");
    ASSERT_NE(view->displayed(), nullptr);
    EXPECT_EQ(view->displayed()->quantity, Quantity::Velocity);
}

} // namespace
} // namespace humwise::gui
