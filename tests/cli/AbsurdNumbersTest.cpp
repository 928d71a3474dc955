// humwise-cli with absurd numbers in every numeric option: each run must end in an answer or a
// clear error (exit 0, 1 or 2), never a crash, and - in the sanitizer build, whose reports go to
// stderr - never undefined behaviour such as a double converted to an integer it does not fit.
#include "cli/CliRunner.h"
#include "core/io/WavTestWriter.h"
#include "support/TestSupport.h"

#include <gtest/gtest.h>

#include <filesystem>
#include <string>
#include <vector>

namespace humwise::cli {
namespace {

namespace fs = std::filesystem;

const std::vector<std::string> kAbsurd = {"1e300", "-1e300", "1e-300", "0", "-1", "9223372036854775807", "nan"};

fs::path floatWav(const std::string& name, const std::vector<double>& x, std::uint32_t rate) {
    const auto path = test::outputDir() / "cli" / name;
    test::writeBytes(path, test::makeFloatWav(x, rate));
    return path;
}

// 2 s of a 0.5 g 80 Hz sine at 8192 Hz; 4 s of a 10 A 50 Hz current at 5 kHz.
const fs::path& vibrationWav() {
    static const fs::path p = floatWav("absurd-vibration.wav", test::sine(0.5, 80.0, 8192.0, 16384), 8192);
    return p;
}
const fs::path& currentWav() {
    static const fs::path p = floatWav("absurd-current.wav", test::sine(10.0, 50.0, 5000.0, 20000), 5000);
    return p;
}

// Runs every argument list with "{}" replaced by each absurd value.
void expectAnswered(const std::vector<std::vector<std::string>>& templates) {
    for (const auto& t : templates)
        for (const auto& v : kAbsurd) {
            std::vector<std::string> args;
            std::string shown;
            for (auto a : t) {
                if (const auto at = a.find("{}"); at != std::string::npos) a.replace(at, 2, v);
                shown += a + " ";
                args.push_back(a);
            }
            const auto r = test::runCli(args);
            EXPECT_TRUE(r.exitCode >= 0 && r.exitCode <= 2) << shown << "-> exit " << r.exitCode << "\n" << r.err;
            EXPECT_EQ(r.err.find("runtime error:"), std::string::npos) << shown << "\n" << r.err;
            EXPECT_EQ(r.err.find("Sanitizer"), std::string::npos) << shown << "\n" << r.err;
        }
}

TEST(CliAbsurdNumbers, SpectrumOptions) {
    const std::string v = vibrationWav().string();
    std::vector<std::vector<std::string>> t;
    for (const char* option : {"--lines", "--resolution", "--fmax", "--averages", "--overlap", "--input-scale", "--cutoff",
                               "--peaks", "--channel"}) {
        t.push_back({"spectrum", v, option, "{}", "--json"});
        t.push_back({"spectrum", v, "--envelope", "1000:3000", option, "{}"});
    }
    t.push_back({"spectrum", v, "--envelope", "auto", "--fmax", "{}"});
    t.push_back({"spectrum", v, "--zoom", "{}:10"});
    t.push_back({"spectrum", v, "--zoom", "80:{}"});
    t.push_back({"spectrum", v, "--band", "{}:100"});
    t.push_back({"spectrum", v, "--envelope", "{}:3000"});
    t.push_back({"spectrum", v, "--envelope", "1000:{}"});
    t.push_back({"spectrum", v, "--window", "kaiser:{}"});
    t.push_back({"spectrum", currentWav().string(), "--quantity", "current", "--zoom", "50:{}", "--resolution", "{}"});
    expectAnswered(t);
}

TEST(CliAbsurdNumbers, FaultAndDiagnosisOptions) {
    const std::string v = vibrationWav().string(), i = currentWav().string();
    expectAnswered({
        {"faults", "--line-hz", "{}", "--poles", "4", "--slip", "0.02"},
        {"faults", "--line-hz", "50", "--poles", "{}", "--slip", "0.02"},
        {"faults", "--line-hz", "50", "--poles", "4", "--speed-rpm", "{}"},
        {"faults", "--line-hz", "50", "--poles", "4", "--slip", "{}"},
        {"faults", "--line-hz", "50", "--rated-rpm", "{}", "--rotor-bars", "{}", "--slip", "0.02"},
        {"faults", "--line-hz", "50", "--poles", "4", "--slip", "0.02", "--bearing", "n={},d=10,D=50"},
        {"faults", "--line-hz", "50", "--poles", "4", "--slip", "0.02", "--bearing", "n=9,d={},D=50,angle={}"},
        {"faults", "--line-hz", "50", "--poles", "4", "--slip", "0.02", "--bearing-factors", "BPFO={},BPFI=5,BSF=2,FTF=0.4",
         "--vanes", "{}"},
        {"diagnose", v, "--line-hz", "{}", "--poles", "4"},
        {"diagnose", v, "--line-hz", "50", "--poles", "4", "--speed-rpm", "{}", "--machine-group", "{}"},
        {"diagnose", v, "--line-hz", "50", "--poles", "4", "--bearing", "n=9,d={},D={}"},
        {"diagnose", i, "--quantity", "current", "--line-hz", "50", "--poles", "{}", "--rotor-bars", "{}"},
        {"inspect", v, "--channel", "{}"},
    });
}

} // namespace
} // namespace humwise::cli
