// MemoryRelease (app/common/MemoryRelease.h): freed memory goes back to the system when the
// resident size has grown by the budget since the last release, and every 16 motors when the
// resident size cannot be read. The resident size and the release are stand-ins here, so the
// policy is checked exactly; the real ones are checked for what they report.
#include "app/common/MemoryRelease.h"

#include <gtest/gtest.h>

#include <cstdint>
#include <optional>
#include <vector>

namespace humwise::workflow {
namespace {

constexpr std::uint64_t MiB = std::uint64_t{1} << 20;

// A process whose resident size the test sets; a release brings it down to `afterRelease`.
struct FakeProcess {
    std::optional<std::uint64_t> resident = 100 * MiB;
    std::uint64_t afterRelease = 100 * MiB;
    int releases = 0;
    MemoryRelease policy(std::uint64_t budget) {
        return MemoryRelease(
            budget, [this] { return resident; },
            [this] {
                ++releases;
                if (resident) resident = afterRelease;
            });
    }
};

TEST(MemoryRelease, ReleasesOnlyWhenGrownBeyondTheBudgetSinceTheLastRelease) {
    FakeProcess p;
    auto policy = p.policy(32 * MiB);
    p.resident = 132 * MiB; // grown by exactly the budget: not yet
    EXPECT_FALSE(policy.afterMotor());
    p.resident = 132 * MiB + 1;
    EXPECT_TRUE(policy.afterMotor());
    EXPECT_EQ(p.releases, 1);
    // The base is now the size just after the release (110 MiB), not the start's 100 MiB.
    p.afterRelease = 110 * MiB;
    p.resident = 150 * MiB;
    EXPECT_TRUE(policy.afterMotor());
    p.resident = 141 * MiB; // 31 MiB above 110
    EXPECT_FALSE(policy.afterMotor());
    p.resident = 143 * MiB;
    EXPECT_TRUE(policy.afterMotor());
    EXPECT_EQ(p.releases, 3);
}

TEST(MemoryRelease, NeverReleasesWhileTheProcessStaysWithinTheBudget) {
    FakeProcess p;
    auto policy = p.policy(32 * MiB);
    for (int motor = 0; motor < 1000; ++motor) {
        p.resident = 100 * MiB + static_cast<std::uint64_t>(motor % 32) * MiB;
        EXPECT_FALSE(policy.afterMotor()) << "motor " << motor;
    }
    EXPECT_EQ(p.releases, 0);
}

TEST(MemoryRelease, WithoutAResidentSizeReleasesEverySixteenMotors) {
    FakeProcess p;
    p.resident.reset();
    auto policy = p.policy(32 * MiB);
    std::vector<int> releasedAfter;
    for (int motor = 1; motor <= 50; ++motor)
        if (policy.afterMotor()) releasedAfter.push_back(motor);
    EXPECT_EQ(releasedAfter, (std::vector<int>{16, 32, 48}));
}

TEST(MemoryRelease, ResidentSizeOfThisProcessIsPlausible) {
    const auto bytes = residentBytes();
#ifdef __linux__
    ASSERT_TRUE(bytes.has_value()) << "/proc/self/statm unreadable";
    EXPECT_GT(*bytes, 1 * MiB);       // a test binary with its libraries loaded
    EXPECT_LT(*bytes, 16384 * MiB);   // far below this machine's memory
    // Touching 64 MiB of fresh memory shows in the resident size.
    std::vector<char> block(64 * MiB);
    for (std::size_t i = 0; i < block.size(); i += 4096) block[i] = static_cast<char>(i);
    const auto after = residentBytes();
    ASSERT_TRUE(after.has_value());
    EXPECT_GE(*after + 8 * MiB, *bytes + 64 * MiB) << "64 MiB touched, resident size " << *bytes / MiB << " -> " << *after / MiB << " MiB";
    releaseFreedMemory(); // callable at any time
#else
    GTEST_SKIP() << "the resident size is read from /proc/self/statm, which only Linux has";
#endif
}

} // namespace
} // namespace humwise::workflow
