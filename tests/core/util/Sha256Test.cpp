// SHA-256 against the example messages of FIPS 180-2 (Appendix B: "abc", the 448-bit two-block
// message, one million 'a') and the empty message (digests also checked with Python's hashlib);
// the portable and the accelerated (SHA-NI) compression functions agree on random data; the
// result does not depend on how the input is split into update() calls.
#include "core/util/Sha256.h"
#include "core/util/Sha256Blocks.h"

#include <gtest/gtest.h>

#include <random>
#include <string>
#include <vector>

namespace humwise::util {
namespace {

TEST(Sha256, Fips180ExampleMessages) {
    EXPECT_EQ(sha256Hex(std::string_view("abc")), "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
    EXPECT_EQ(sha256Hex(std::string_view("")), "e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855");
    EXPECT_EQ(sha256Hex(std::string_view("abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq")),
              "248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1");
    EXPECT_EQ(sha256Hex(std::string(1000000, 'a')), "cdc76e5c9914fb9281a1c7e284d73e67f1809a48a497200e046d39ccc7112cd0");
}

TEST(Sha256, SplittingTheInputChangesNothing) {
    std::mt19937 rng(5);
    std::string text(10007, '\0');
    for (char& c : text) c = static_cast<char>(rng());
    const std::string whole = sha256Hex(text);
    for (std::size_t piece : {1u, 3u, 63u, 64u, 65u, 1000u}) {
        Sha256 h;
        for (std::size_t at = 0; at < text.size(); at += piece) h.update(std::string_view(text).substr(at, piece));
        EXPECT_EQ(h.finishHex(), whole) << "pieces of " << piece;
    }
}

TEST(Sha256, AcceleratedAndPortableCompressionAgree) {
    if (!detail::shaExtensionsAvailable()) GTEST_SKIP() << "this processor has no SHA extensions; only the portable code runs here";
    std::mt19937_64 rng(11);
    for (std::size_t blocks : {1u, 2u, 7u, 64u, 1000u}) {
        std::vector<std::uint8_t> data(64 * blocks);
        for (auto& b : data) b = static_cast<std::uint8_t>(rng());
        std::uint32_t a[8], p[8];
        for (int i = 0; i < 8; ++i) a[i] = p[i] = static_cast<std::uint32_t>(rng());
        detail::sha256BlocksAccelerated(a, data.data(), blocks);
        detail::sha256BlocksPortable(p, data.data(), blocks);
        for (int i = 0; i < 8; ++i) EXPECT_EQ(a[i], p[i]) << blocks << " block(s), word " << i;
    }
}

} // namespace
} // namespace humwise::util
