// The screenshot tour, run as the user runs it (humwise --db ... --screenshot-tour DIR, offscreen):
// it exits 0 and every picture it writes shows something - not one flat colour.
#include "GuiTestSupport.h"
#include "cli/CliRunner.h"
#include "core/io/FleetFile.h"
#include "support/TestSupport.h"
#include "workflow/FixtureFleet.h"

#include <gtest/gtest.h>

#include <QImage>

#include <fstream>
#include <set>
#include <sys/wait.h>

namespace humwise::gui {
namespace {

namespace fs = std::filesystem;

// Runs the workbench binary; returns its exit status and what it printed.
std::pair<int, std::string> runWorkbench(const std::vector<std::string>& args) {
    std::string cmd = std::string("QT_QPA_PLATFORM=offscreen '") + HUMWISE_GUI + "'";
    for (const auto& a : args) cmd += " '" + a + "'";
    cmd += " 2>&1";
    std::string out;
    FILE* p = popen(cmd.c_str(), "r");
    if (!p) return {-1, {}};
    char buf[4096];
    while (std::size_t n = fread(buf, 1, sizeof buf, p)) out.append(buf, n);
    const int status = pclose(p);
    return {WIFEXITED(status) ? WEXITSTATUS(status) : -1, out};
}

TEST(ScreenshotTour, EveryViewIsPicturedAndNoneIsBlank) {
    const fs::path dir = test::freshFolder("tour");
    std::ofstream(dir / "fleet.json") << io::writeFleet(test::smallFleet());
    const fs::path db = dir / "fleet.db";
    ASSERT_EQ(test::runCli({"fleet", "import", (dir / "fleet.json").string(), "--db", db.string()}).exitCode, 0);
    for (int month = 3; month <= 5; ++month) {
        test::WalkdownSpec spec;
        spec.roundStart = "2026-0" + std::to_string(month) + "-02T08:00:00Z";
        spec.oneXmmsP1 = 0.6 + month;
        spec.seed = static_cast<std::uint64_t>(month);
        const auto walk = dir / std::filesystem::path("w").concat(std::to_string(month));
        test::writeWalkdown(walk, spec);
        const auto r = test::runCli({"import", walk.string(), "--db", db.string()});
        ASSERT_EQ(r.exitCode, 0) << r.err;
    }
    const auto [status, output] = runWorkbench({"--db", db.string(), "--screenshot-tour", (dir / "pictures").string()});
    ASSERT_EQ(status, 0) << output;
    std::size_t pictures = 0;
    for (const auto& entry : fs::directory_iterator(dir / "pictures")) {
        QImage img(QString::fromStdString(entry.path().string()));
        ASSERT_FALSE(img.isNull()) << entry.path();
        EXPECT_GE(img.width(), 600) << entry.path();
        // Not blank: many distinct colours, and a fair share of pixels away from the background.
        std::set<QRgb> colours;
        std::size_t inked = 0;
        const QRgb background = img.pixel(img.width() - 2, img.height() - 2);
        for (int y = 0; y < img.height(); y += 3)
            for (int x = 0; x < img.width(); x += 3) {
                colours.insert(img.pixel(x, y));
                inked += img.pixel(x, y) != background;
            }
        EXPECT_GT(colours.size(), 20u) << entry.path();
        EXPECT_GT(inked, 500u) << entry.path();
        ++pictures;
    }
    EXPECT_GE(pictures, 9u);
}

} // namespace
} // namespace humwise::gui
