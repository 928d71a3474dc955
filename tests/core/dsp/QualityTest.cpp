// Signal-quality rules (thresholds: common practice, see Quality.h). Real healthy recordings
// from the open datasets in ../shared must raise no flag.
#include "core/dsp/Quality.h"
#include "core/io/WavReader.h"
#include "support/TestSupport.h"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <limits>
#include <random>
#include <string>

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

std::string detailOf(const std::vector<QualityIssue>& issues, QualityFlag f) {
    for (const auto& i : issues)
        if (i.flag == f) return i.detail;
    return "";
}

// The run counting skips 64-sample chunks with nothing to look at (Quality.cpp): runs placed
// across chunk edges, at the very start and end, and a NaN in a chunk of its own must be
// counted exactly as the rule says.
TEST(Quality, RunsAcrossChunkEdgesAreCountedExactly) {
    auto x = healthy();
    const double limit = 5.0; // above every healthy sample (sigma about 0.75)
    // Chunks are [1, 65), [65, 129), [129, 193), ...: the run at 126 ends with its chunk, the
    // next chunk has nothing to look at, the run at 193 starts the one after: two runs, not one.
    const std::size_t clipAt[] = {0, 62, 126, 193, 1000, x.size() - 3};
    for (std::size_t at : clipAt)
        for (std::size_t k = 0; k < 3; ++k) x[at + k] = (k % 2 ? -limit : limit); // |x| at the limit
    x[300] = limit; // two in a row are not a run of 3
    x[301] = limit;
    x[5000] = std::numeric_limits<double>::quiet_NaN();
    for (std::size_t i = 20000; i < 25000; ++i) x[i] = 0.25; // 5000 identical samples over chunk edges
    const auto issues = assessQuality(x, {});
    EXPECT_EQ(detailOf(issues, QualityFlag::Clipped), "6 runs of 3 or more samples sit at the limit 5") << ::testing::PrintToString(issues.size());
    EXPECT_EQ(detailOf(issues, QualityFlag::NonFinite), "1 of 51200 samples are NaN or infinite");
    // 5000 of 51199 finite samples is under 10 %: no flat-line flag, until the run is longer.
    EXPECT_FALSE(has(issues, QualityFlag::FlatLine));
    for (std::size_t i = 25000; i < 25130; ++i) x[i] = 0.25;
    EXPECT_EQ(detailOf(assessQuality(x, {}), QualityFlag::FlatLine), "5130 identical consecutive samples (10.0 % of the record)");
}

// On a motion channel the record's extent is combined from the drift check's eight blocks and
// the few samples after them (Quality.cpp): a non-finite sample and the record's extreme in that
// tail count.
TEST(Quality, TheTailAfterTheDriftBlocksCounts) {
    auto x = healthy();
    x.resize(x.size() + 5, 0.1); // 51205 samples: blocks of 6400, a tail of 5
    x.back() = std::numeric_limits<double>::infinity();
    const auto issues = assessQuality(x, {});
    EXPECT_EQ(detailOf(issues, QualityFlag::NonFinite), "1 of 51205 samples are NaN or infinite");
    // Clipped at 0.9 in the blocks, but the record's extreme is a spike of 5 in the tail: the
    // runs at 0.9 are not at the limit.
    auto y = healthy();
    for (double& v : y) v = std::clamp(v, -0.9, 0.9);
    y.insert(y.end(), {0.1, 5.0, 0.1, 0.1, 0.1});
    EXPECT_FALSE(has(assessQuality(y, {}), QualityFlag::Clipped));
    y.resize(y.size() - 5);
    EXPECT_TRUE(has(assessQuality(y, {}), QualityFlag::Clipped));
}

// The runs read plainly, sample by sample, as Quality.h states the rules: the checks read the
// record once in pieces (8 drift blocks on motion channels, 16 384 samples otherwise) and skip
// 64-sample chunks with nothing to look at. Runs and non-finite samples placed across every
// piece edge must give the same counts.
struct PlainRuns {
    std::size_t longestConstant = 0, atLevel = 0;
};

PlainRuns plainRuns(const std::vector<double>& x, double level) {
    PlainRuns r;
    r.longestConstant = x.empty() ? 0 : 1;
    std::size_t constant = 1, atLevel = 0;
    for (std::size_t i = 0; i < x.size(); ++i) {
        const bool finite = std::isfinite(x[i]);
        if (i > 0) {
            constant = finite && x[i] == x[i - 1] ? constant + 1 : 1;
            r.longestConstant = std::max(r.longestConstant, constant);
        }
        if (finite && std::abs(std::abs(x[i]) - level) <= level * 1e-9) {
            ++atLevel;
        } else {
            if (atLevel >= 3) ++r.atLevel;
            atLevel = 0;
        }
    }
    if (atLevel >= 3) ++r.atLevel;
    return r;
}

TEST(Quality, RunsAcrossPieceEdgesMatchAPlainReading) {
    std::mt19937 random(11);
    for (const std::size_t n : {std::size_t{5000}, std::size_t{16384 * 2 + 7}, std::size_t{51203}, std::size_t{100000}}) {
        for (const Quantity q : {Quantity::Acceleration, Quantity::Current}) {
            auto x = test::gaussianNoise(0.3, n, static_cast<unsigned>(n));
            const double limit = 4.0;
            // Edges: of the drift blocks (n / 8), of the 16 384-sample pieces, of the 64-sample chunks.
            std::vector<std::size_t> edges;
            for (std::size_t b = 1; b < 8; ++b) edges.push_back(b * (n / 8));
            for (std::size_t at = 16384; at < n; at += 16384) edges.push_back(at);
            edges.push_back(65);
            edges.push_back(n - 2);
            std::size_t k = 0;
            for (const std::size_t edge : edges) {
                const std::size_t start = edge - std::min<std::size_t>(edge, random() % 4);
                const std::size_t length = 2 + random() % 4; // some runs of 2: not counted
                for (std::size_t i = start; i < std::min(n, start + length); ++i) x[i] = (k % 3 == 0) ? -limit : limit;
                const std::size_t flat = std::min(n - 1, edge + 40);
                for (std::size_t i = flat; i < std::min(n, flat + 30 + k); ++i) x[i] = 0.125; // constant runs over chunk edges
                if (k % 4 == 1) x[std::min(n - 1, edge + 1)] = std::numeric_limits<double>::quiet_NaN();
                ++k;
            }
            QualityRequest r;
            r.quantity = q;
            const auto plain = plainRuns(x, limit);
            const auto issues = assessQuality(x, r);
            const std::string clipped = detailOf(issues, QualityFlag::Clipped);
            if (plain.atLevel >= 3)
                EXPECT_EQ(clipped, std::to_string(plain.atLevel) + " runs of 3 or more samples sit at the limit 4") << n;
            else
                EXPECT_EQ(clipped, "") << n;
            // A constant run long enough to flag, straddling the middle drift block edge.
            auto y = x;
            const std::size_t run = n / 9;
            for (std::size_t i = n / 2 - run / 2; i < n / 2 - run / 2 + run; ++i) y[i] = -0.5;
            const auto yPlain = plainRuns(y, limit);
            const std::string flat = detailOf(assessQuality(y, r), QualityFlag::FlatLine);
            EXPECT_EQ(flat.substr(0, flat.find(' ')), std::to_string(yPlain.longestConstant)) << n << " " << flat;
        }
    }
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
