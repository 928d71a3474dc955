// Reading whole files and streams (core/io/FileBytes.h): the bytes come back exactly, whether the
// size is known ahead (files: one read into one allocation) or not (streams), and whether the
// stream holds more or less than announced; every failure names the file and the problem.
#include "core/io/FileBytes.h"
#include "support/TestSupport.h"

#include <gtest/gtest.h>

#include <fstream>
#include <sstream>
#include <string>
#include <vector>

namespace humwise::io {
namespace {

std::vector<std::byte> pattern(std::size_t n) {
    std::vector<std::byte> v(n);
    for (std::size_t i = 0; i < n; ++i) v[i] = static_cast<std::byte>((i * 131 + i / 977) & 0xff);
    return v;
}

std::filesystem::path writeFile(const std::string& name, const std::vector<std::byte>& bytes) {
    const auto path = test::outputDir() / name;
    std::ofstream f(path, std::ios::binary | std::ios::trunc);
    f.write(reinterpret_cast<const char*>(bytes.data()), static_cast<std::streamsize>(bytes.size()));
    return path;
}

TEST(FileBytes, FilesOfEverySizeComeBackExactly) {
    for (std::size_t n : {std::size_t{0}, std::size_t{1}, std::size_t{65535}, std::size_t{65536}, std::size_t{200001}}) {
        const auto bytes = pattern(n);
        const auto r = readFileBytes(writeFile("file-bytes-" + std::to_string(n) + ".bin", bytes));
        ASSERT_TRUE(r) << r.error().message();
        EXPECT_EQ(r.value(), bytes) << n << " bytes";
    }
}

TEST(FileBytes, StreamsHoldingMoreOrLessThanAnnouncedComeBackWhole) {
    const auto bytes = pattern(150000);
    const std::string text(reinterpret_cast<const char*>(bytes.data()), bytes.size());
    for (std::uint64_t announced : {std::uint64_t{0}, std::uint64_t{1000}, std::uint64_t{150000}, std::uint64_t{400000}}) {
        std::istringstream in(text);
        const auto r = readAllBytes(in, "stream", kMaxInputBytes, announced);
        ASSERT_TRUE(r) << r.error().message();
        EXPECT_EQ(r.value(), bytes) << "announced " << announced;
    }
}

TEST(FileBytes, FailuresNameTheFileAndTheProblem) {
    const auto big = writeFile("file-bytes-big.bin", pattern(5000));
    const auto tooLarge = readFileBytes(big, 4096);
    ASSERT_FALSE(tooLarge);
    EXPECT_EQ(tooLarge.error().code, ReadError::Code::TooLarge);
    EXPECT_NE(tooLarge.error().message().find("file-bytes-big.bin"), std::string::npos) << tooLarge.error().message();
    std::istringstream in(std::string(5000, 'x'));
    EXPECT_EQ(readAllBytes(in, "stream", 4096, 5000).error().code, ReadError::Code::TooLarge); // announced above the limit

    const auto missing = readFileBytes(test::outputDir() / "no-such-file.bin");
    ASSERT_FALSE(missing);
    EXPECT_EQ(missing.error().code, ReadError::Code::CannotOpen);
    EXPECT_NE(missing.error().message().find("no-such-file.bin"), std::string::npos);
    const auto folder = readFileBytes(test::outputDir());
    ASSERT_FALSE(folder);
    EXPECT_NE(folder.error().message().find("folder"), std::string::npos) << folder.error().message();
}

} // namespace
} // namespace humwise::io
