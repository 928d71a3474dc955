// Lint: Humwise makes no network access at all. Two independent checks:
//  1. the sources (app/, core/, storage/, sample_fleet/) and every CMakeLists.txt name no
//     networking API: no socket headers (sys/socket.h, netinet/, arpa/inet.h, netdb.h), no Qt
//     Network classes or module, no libcurl, no URL opened from the program;
//  2. the built programs (humwise-cli, and humwise when the GUI is built) load no networking
//     library (Qt6Network, libcurl, libssl, libnghttp2, libssh), as `ldd` lists them.
// The scanner is checked first on snippets that must and must not be reported.
#include <gtest/gtest.h>

#include <algorithm>
#include <array>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <iterator>
#include <string>
#include <string_view>
#include <vector>

namespace humwise::lint {
namespace {

namespace fs = std::filesystem;
const fs::path kRoot = HUMWISE_SOURCE_DIR;

constexpr std::array<std::string_view, 15> kSourceMarks = {
    "<sys/socket.h>", "<netinet/", "<arpa/inet.h>", "<netdb.h>", "QNetworkAccessManager", "QNetworkRequest", "QTcpSocket", "QUdpSocket",
    "QSslSocket", "<QtNetwork", "Qt6::Network", "curl_easy_", "<curl/", "QDesktopServices::openUrl", "getaddrinfo"};
constexpr std::array<std::string_view, 5> kLibraryMarks = {"Qt6Network", "libcurl", "libssl", "libnghttp2", "libssh"};

// Every networking mark in `text`, as "mark (line N)".
std::vector<std::string> networkMarks(std::string_view text) {
    std::vector<std::string> out;
    for (const auto mark : kSourceMarks)
        for (auto at = text.find(mark); at != std::string_view::npos; at = text.find(mark, at + 1)) {
            const auto line = 1 + std::count(text.begin(), text.begin() + static_cast<std::ptrdiff_t>(at), '\n');
            out.push_back(std::string(mark) + " (line " + std::to_string(line) + ")");
        }
    return out;
}

std::string readFile(const fs::path& p) {
    std::ifstream in(p, std::ios::binary);
    return {std::istreambuf_iterator<char>(in), std::istreambuf_iterator<char>()};
}

bool scanned(const fs::path& p) {
    const auto ext = p.extension().string();
    return ext == ".cpp" || ext == ".h" || p.filename() == "CMakeLists.txt";
}

TEST(NetworkLintScanner, ReportsNetworkingAndLeavesOrdinaryCodeAlone) {
    EXPECT_EQ(networkMarks("#include <sys/socket.h>\nint x;").size(), 1u);
    EXPECT_EQ(networkMarks("auto* m = new QNetworkAccessManager(this);").size(), 1u);
    EXPECT_EQ(networkMarks("target_link_libraries(x Qt6::Network)").size(), 1u);
    EXPECT_EQ(networkMarks("\n\nQDesktopServices::openUrl(u);").front(), "QDesktopServices::openUrl (line 3)");
    EXPECT_TRUE(networkMarks("connect(button, &QPushButton::clicked, this, f); // Qt signals, not sockets").empty());
    EXPECT_TRUE(networkMarks("#include <QFile>\n#include <sqlite3.h>").empty());
}

TEST(NetworkLint, NoSourceNamesANetworkingApi) {
    std::vector<std::string> findings;
    std::size_t files = 0;
    for (const char* top : {"app", "core", "storage", "sample_fleet", "bench"}) {
        if (!fs::is_directory(kRoot / top)) continue;
        for (const auto& e : fs::recursive_directory_iterator(kRoot / top)) {
            if (!e.is_regular_file() || !scanned(e.path())) continue;
            for (const auto& m : networkMarks(readFile(e.path()))) findings.push_back(e.path().lexically_relative(kRoot).string() + ": " + m);
            ++files;
        }
    }
    for (const auto& m : networkMarks(readFile(kRoot / "CMakeLists.txt"))) findings.push_back("CMakeLists.txt: " + m);
    EXPECT_TRUE(findings.empty()) << findings.front();
    EXPECT_GE(files, 80u); // the tree was really read
}

// The shared libraries `ldd` lists for a program; empty when ldd cannot be run.
std::string librariesOf(const std::string& program) {
    std::string out;
    FILE* p = ::popen(("ldd '" + program + "' 2>/dev/null").c_str(), "r");
    if (!p) return out;
    char buf[512];
    while (std::fgets(buf, sizeof buf, p)) out += buf;
    ::pclose(p);
    return out;
}

TEST(NetworkLint, TheProgramsLoadNoNetworkingLibrary) {
    std::vector<std::string> programs = {HUMWISE_CLI};
#ifdef HUMWISE_GUI
    programs.push_back(HUMWISE_GUI);
#endif
    for (const auto& program : programs) {
        const std::string libs = librariesOf(program);
        if (libs.find("libc.so") == std::string::npos) GTEST_SKIP() << "ldd could not list the libraries of " << program << " (no ldd here?)";
        for (const auto mark : kLibraryMarks) EXPECT_EQ(libs.find(mark), std::string::npos) << program << " loads " << mark << ":\n" << libs;
    }
}

} // namespace
} // namespace humwise::lint
