#include "support/TestSupport.h"

#include <cmath>
#include <numbers>
#include <random>
#include <stdexcept>

namespace humwise::test {

std::vector<double> sine(double amplitude, double f, double fs, std::size_t count, double phase) {
    std::vector<double> x(count);
    for (std::size_t n = 0; n < count; ++n)
        x[n] = amplitude * std::sin(2.0 * std::numbers::pi * f * static_cast<double>(n) / fs + phase);
    return x;
}

std::vector<double> gaussianNoise(double sigma, std::size_t count, std::uint64_t seed) {
    std::mt19937_64 rng(seed);
    std::normal_distribution<double> dist(0.0, sigma);
    std::vector<double> x(count);
    for (double& v : x) v = dist(rng);
    return x;
}

void add(std::vector<double>& a, const std::vector<double>& b) {
    if (a.size() != b.size()) throw std::invalid_argument("add: sizes differ");
    for (std::size_t i = 0; i < a.size(); ++i) a[i] += b[i];
}

std::optional<std::filesystem::path> sharedDir() {
    std::filesystem::path p = HUMWISE_SHARED_DIR;
    if (const char* env = std::getenv("HUMWISE_SHARED_DIR")) p = env;
    std::error_code ec;
    if (std::filesystem::is_directory(p / "data" / "recordings", ec)) return p;
    return std::nullopt;
}

std::optional<std::filesystem::path> sharedRecording(const std::string& name) {
    const auto dir = sharedDir();
    if (!dir) return std::nullopt;
    const auto p = *dir / "data" / "recordings" / name;
    std::error_code ec;
    if (!std::filesystem::exists(p, ec)) return std::nullopt;
    return p;
}

std::filesystem::path outputDir() { return HUMWISE_TEST_OUTPUT_DIR; }
std::filesystem::path testsDir() { return HUMWISE_TESTS_DIR; }


} // namespace humwise::test
