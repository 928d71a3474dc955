// Signal-quality rules (thresholds: common practice, see Quality.h). Real healthy recordings
// from the open datasets in ../shared must raise no flag.
#include "core/dsp/Quality.h"
#include "core/io/WavReader.h"
#include "support/TestSupport.h"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <limits>

namespace humwise::dsp {
namespace {

bool has(const std::vector<QualityIssue>& issues, QualityFlag f) {
    return std::any_of(issues.begin(), issues.end(), [&](const QualityIssue& i) { return i.flag == f; });
}

std::vector<double> healthy() {
    auto x = test::sine(1.0, 29.95, 25600.0, 25600 * 2);
    test::add(x, test::gaussianNoise(0.2, x.size(), 4));
    return x;
}

TEST(Quality, HealthySignalHasNoIssue) { EXPECT_TRUE(assessQuality(healthy(), {}).empty()); }

TEST(Quality, ClippingIsFlagged) {
    auto x = healthy();
    for (double& v : x) v = std::clamp(v, -0.9, 0.9);
    const auto issues = assessQuality(x, {});
    EXPECT_TRUE(has(issues, QualityFlag::Clipped));
    // With a known full scale the clip level need not be the data's own extreme.
    auto y = healthy();
    for (double& v : y) v = std::clamp(v, -2.0, 0.8);
    QualityRequest r;
    r.fullScale = 0.8;
    EXPECT_TRUE(has(assessQuality(y, r), QualityFlag::Clipped));
}

TEST(Quality, FlatLineAndDropout) {
    EXPECT_TRUE(has(assessQuality(std::vector<double>(1000, 0.0), {}), QualityFlag::FlatLine));
    auto x = healthy();
    std::fill(x.begin() + 1000, x.begin() + 1000 + static_cast<std::ptrdiff_t>(x.size() / 5), 0.0);
    EXPECT_TRUE(has(assessQuality(x, {}), QualityFlag::FlatLine));
}

TEST(Quality, NonFiniteSamples) {
    auto x = healthy();
    x[17] = std::numeric_limits<double>::quiet_NaN();
    EXPECT_TRUE(has(assessQuality(x, {}), QualityFlag::NonFinite));
}

TEST(Quality, BiasDriftOnMotionChannelsOnly) {
    auto x = healthy();
    for (std::size_t i = 0; i < x.size(); ++i) x[i] += 3.0 * static_cast<double>(i) / static_cast<double>(x.size());
    EXPECT_TRUE(has(assessQuality(x, {}), QualityFlag::BiasDrift));
    QualityRequest current;
    current.quantity = Quantity::Current;
    EXPECT_FALSE(has(assessQuality(x, current), QualityFlag::BiasDrift));
    auto offset = healthy();
    for (double& v : offset) v += 10.0;
    EXPECT_TRUE(has(assessQuality(offset, {}), QualityFlag::BiasDrift));
}

TEST(Quality, TooShort) {
    QualityRequest r;
    r.minSamples = 1'000'000;
    r.sampleRateHz = 25600;
    EXPECT_TRUE(has(assessQuality(healthy(), r), QualityFlag::TooShort));
}

// Open datasets (../shared/data/recordings/SOURCES.md): CWRU record 97 (healthy baseline) and the
// IMS test-1 healthy snapshot; every channel is a good recording.
TEST(Quality, RealHealthyRecordingsRaiseNoFlag) {
    for (const char* name : {"cwru_097_normal_0hp_48k.wav", "ims_test1_2003-10-22_120624_healthy.wav"}) {
        HUMWISE_REQUIRE_SHARED_RECORDING(path, name);
        const auto rec = io::readWavFile(path);
        ASSERT_TRUE(rec.ok()) << rec.error().message();
        for (const auto& ch : rec.value().channels) {
            const auto issues = assessQuality(ch.samples, {});
            EXPECT_TRUE(issues.empty()) << name << " " << ch.name << ": " << (issues.empty() ? "" : issues[0].detail);
        }
    }
}

} // namespace
} // namespace humwise::dsp
