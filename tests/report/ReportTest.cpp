// Finding sheets and route summaries rendered for a small store and checked with poppler (Debian
// poppler-utils): page size (pdfinfo), real text with the motor tag, every finding's label and the
// safety caution (pdftotext), plots present as vector paths (pdftocairo -svg), no blank pages
// (pdftoppm); CSV exports. Runs the real humwise-cli.
#include "cli/CliRunner.h"
#include "core/io/FleetFile.h"
#include "storage/FleetStore.h"
#include "support/TestSupport.h"
#include "workflow/FixtureFleet.h"

#include <gtest/gtest.h>

#include <cstdio>
#include <fstream>
#include <sstream>
#include <unistd.h>

namespace humwise::test {
namespace {

namespace fs = std::filesystem;

std::string shell(const std::string& cmd) {
    std::string out;
    FILE* p = popen((cmd + " 2>/dev/null").c_str(), "r");
    if (!p) return out;
    char buf[4096];
    while (std::size_t n = fread(buf, 1, sizeof buf, p)) out.append(buf, n);
    pclose(p);
    return out;
}

// Text with every run of white space (line breaks from wrapping) made one space.
std::string words(const std::string& text) {
    std::string out;
    for (char c : text) {
        const bool space = c == ' ' || c == '\n' || c == '\t' || c == '\r' || c == '\f';
        if (space && (out.empty() || out.back() == ' ')) continue;
        out += space ? ' ' : c;
    }
    return out;
}

bool havePoppler() { return !shell("command -v pdfinfo pdftotext pdftocairo pdftoppm").empty(); }

class Reports : public ::testing::Test {
protected:
    static void SetUpTestSuite() {
        dir = freshFolder("report-" + std::to_string(::getpid()));
        std::ofstream(dir / "fleet.json") << io::writeFleet(smallFleet());
        db = dir / "fleet.db";
        ASSERT_EQ(runCli({"fleet", "import", (dir / "fleet.json").string(), "--db", db.string()}).exitCode, 0);
        for (int month = 3; month <= 5; ++month) {
            WalkdownSpec spec;
            spec.roundStart = "2026-0" + std::to_string(month) + "-02T08:00:00Z";
            spec.oneXmmsP1 = 0.6 + 1.4 * (month - 3);
            spec.seed = static_cast<std::uint64_t>(10 + month);
            const auto walk = dir / std::filesystem::path("w").concat(std::to_string(month));
            writeWalkdown(walk, spec);
            const auto r = runCli({"import", walk.string(), "--db", db.string()});
            ASSERT_EQ(r.exitCode, 0) << r.err;
        }
    }
    static inline fs::path dir, db;
};

// The value pdfinfo prints after "key:" (spaces trimmed), or "" when it prints no such line.
std::string pdfinfoField(const fs::path& pdf, const std::string& key) {
    std::istringstream info(shell("pdfinfo '" + pdf.string() + "'"));
    for (std::string line; std::getline(info, line);)
        if (line.rfind(key + ":", 0) == 0) {
            const auto start = line.find_first_not_of(' ', key.size() + 1);
            return start == std::string::npos ? "" : line.substr(start);
        }
    return "";
}

int pages(const fs::path& pdf) {
    const std::string v = pdfinfoField(pdf, "Pages");
    return v.empty() ? -1 : std::stoi(v);
}

// "595.276 x 841.89" of "Page size:      595.276 x 841.89 pts (A4)".
std::string pageSize(const fs::path& pdf) {
    const std::string v = pdfinfoField(pdf, "Page size");
    return v.substr(0, v.find(" pts"));
}

// Number of drawn paths in the SVG poppler makes of a page: vector plots add hundreds.
std::size_t svgPaths(const fs::path& pdf, int page) {
    const fs::path svg = pdf.string() + ".p" + std::to_string(page) + ".svg";
    shell("pdftocairo -svg -f " + std::to_string(page) + " -l " + std::to_string(page) + " '" + pdf.string() + "' '" + svg.string() + "'");
    std::ifstream in(svg);
    std::stringstream s;
    s << in.rdbuf();
    const std::string text = s.str();
    std::size_t n = 0;
    for (std::size_t at = 0; (at = text.find("<path", at)) != std::string::npos; ++at) ++n;
    return n;
}

// A page is blank when its rendering at 20 dpi is (nearly) all white.
bool blankPage(const fs::path& pdf, int page) {
    const fs::path prefix = pdf.string() + ".ppm" + std::to_string(page);
    shell("pdftoppm -r 20 -gray -f " + std::to_string(page) + " -l " + std::to_string(page) + " -singlefile '" + pdf.string() + "' '" + prefix.string() + "'");
    std::ifstream in(prefix.string() + ".pgm", std::ios::binary);
    std::string magic;
    int w = 0, h = 0, max = 0;
    in >> magic >> w >> h >> max;
    in.get();
    std::size_t dark = 0;
    for (int i = 0; i < w * h; ++i) dark += in.get() < 200;
    return dark < 50;
}

TEST_F(Reports, FindingSheetHasTheTextPlotsAndCautions) {
    if (!havePoppler()) GTEST_SKIP() << "poppler-utils (pdfinfo, pdftotext, pdftocairo, pdftoppm) not installed";
    for (const auto& [paper, size] : {std::pair{"a4", "595 x 842"}, std::pair{"letter", "612 x 792"}}) {
        const fs::path pdf = dir / (std::string("P-1-") + paper + ".pdf");
        const auto r = runCli({"report", "--motor", "P-1", "--out", pdf.string(), "--paper", paper, "--db", db.string(), "--comment", "grease checked"});
        ASSERT_EQ(r.exitCode, 0) << r.err;
        EXPECT_EQ(pageSize(pdf), size) << paper;
        const int n = pages(pdf);
        ASSERT_GE(n, 1);
        const std::string text = words(shell("pdftotext '" + pdf.string() + "' -"));
        EXPECT_NE(text.find("P-1"), std::string::npos);
        EXPECT_NE(text.find("unbalance"), std::string::npos) << text;
        EXPECT_NE(text.find("iso_zone"), std::string::npos);
        EXPECT_NE(text.find("grease checked"), std::string::npos);
        EXPECT_NE(text.find("can kill"), std::string::npos);
        EXPECT_NE(text.find("qualified persons"), std::string::npos);
        EXPECT_NE(text.find("Since the previous round"), std::string::npos);
        EXPECT_GT(svgPaths(pdf, 1), 20u); // the spectrum and trend plots are vector paths
        for (int p = 1; p <= n; ++p) EXPECT_FALSE(blankPage(pdf, p)) << "page " << p;
    }
}

TEST_F(Reports, RouteSummaryRanksEveryMotor) {
    if (!havePoppler()) GTEST_SKIP() << "poppler-utils not installed";
    const fs::path pdf = dir / "route.pdf";
    const auto r = runCli({"report", "--round", "latest", "--out", pdf.string(), "--db", db.string()});
    ASSERT_EQ(r.exitCode, 0) << r.err;
    const std::string text = words(shell("pdftotext '" + pdf.string() + "' -"));
    const auto p1 = text.find("P-1"), p2 = text.find("P-2");
    ASSERT_NE(p1, std::string::npos);
    ASSERT_NE(p2, std::string::npos);
    EXPECT_LT(p1, p2); // P-1 (plan repair) ranks above P-2 (steady)
    EXPECT_NE(text.find("can kill"), std::string::npos);
    EXPECT_NE(text.find("Since the last round"), std::string::npos);
    for (int p = 1; p <= pages(pdf); ++p) EXPECT_FALSE(blankPage(pdf, p)) << "page " << p;
}

TEST_F(Reports, CsvExportsOfFindingsIndicatorsAndATrend) {
    const fs::path f = dir / "findings.csv", i = dir / "indicators.csv", t = dir / "trend.csv";
    ASSERT_EQ(runCli({"export", "--round", "latest", "--what", "findings", "--out", f.string(), "--db", db.string()}).exitCode, 0);
    ASSERT_EQ(runCli({"export", "--round", "latest", "--what", "indicators", "--out", i.string(), "--db", db.string()}).exitCode, 0);
    ASSERT_EQ(runCli({"export", "--trend", "--motor", "P-1", "--point", "DE-H", "--indicator", "velocity_rms", "--out", t.string(), "--db", db.string()}).exitCode, 0);
    std::ifstream fin(f), iin(i), tin(t);
    std::string header, line;
    std::getline(fin, header);
    EXPECT_EQ(header.rfind("round_start,motor,fault,severity", 0), 0u);
    bool unbalance = false;
    while (std::getline(fin, line)) unbalance |= line.find(",P-1,unbalance,") != std::string::npos;
    EXPECT_TRUE(unbalance);
    std::getline(iin, header);
    EXPECT_EQ(header, "round_start,motor,point,indicator,value,unit");
    std::size_t rows = 0;
    while (std::getline(tin, line)) ++rows;
    EXPECT_EQ(rows, 4u); // header + three rounds
    const auto bad = runCli({"export", "--round", "latest", "--what", "spectra", "--out", f.string(), "--db", db.string()});
    EXPECT_EQ(bad.exitCode, 2);
    const auto noMotor = runCli({"report", "--motor", "X-9", "--out", (dir / "x.pdf").string(), "--db", db.string()});
    EXPECT_EQ(noMotor.exitCode, 2);
    EXPECT_FALSE(fs::exists(dir / "x.pdf"));
}

} // namespace
} // namespace humwise::test
