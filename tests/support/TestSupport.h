#pragma once
// Helpers shared by the test suites: generated signals with known answers and the location of
// ../shared (REFERENCE.md and the open-dataset recordings).

#include <cstdint>
#include <filesystem>
#include <optional>
#include <string>
#include <vector>

namespace humwise::test {

// A x sin(2 pi f n / fs + phase), n = 0..count-1.
std::vector<double> sine(double amplitude, double frequencyHz, double sampleRateHz, std::size_t count, double phase = 0.0);
// Gaussian white noise, deterministic for a seed.
std::vector<double> gaussianNoise(double sigma, std::size_t count, std::uint64_t seed);
// a += b, element-wise (sizes must match).
void add(std::vector<double>& a, const std::vector<double>& b);

// ../shared (HUMWISE_SHARED_DIR at configure time), or nullopt when it is not there.
std::optional<std::filesystem::path> sharedDir();
// ../shared/data/recordings/NAME, or nullopt.
std::optional<std::filesystem::path> sharedRecording(const std::string& name);
// A folder for files the tests write (inside the build tree).
std::filesystem::path outputDir();
// The tests/ source folder (fixtures, reference scripts).
std::filesystem::path testsDir();

} // namespace humwise::test

// Skips the current test with a message when ../shared is absent.
#define HUMWISE_REQUIRE_SHARED_RECORDING(var, name)                                                            \
    const auto var##_opt = ::humwise::test::sharedRecording(name);                                             \
    if (!var##_opt) GTEST_SKIP() << "../shared/data/recordings/" << name << " not found (set HUMWISE_SHARED_DIR)"; \
    const std::filesystem::path var = *var##_opt
