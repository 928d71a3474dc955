#pragma once
// SHA-256 (FIPS 180-4), for content-addressing raw recordings and identifying walkdowns. Uses the
// processor's SHA extensions when it has them (core/util/Sha256Blocks.h).

#include <array>
#include <cstddef>
#include <cstdint>
#include <span>
#include <string>
#include <string_view>

namespace humwise::util {

class Sha256 {
public:
    Sha256();
    void update(std::span<const std::byte> data);
    void update(std::string_view text);
    std::array<std::uint8_t, 32> finish();
    std::string finishHex();

private:
    void blocks(const std::uint8_t* p, std::size_t count);
    std::array<std::uint32_t, 8> m_h;
    std::array<std::uint8_t, 64> m_buffer{};
    std::size_t m_used = 0;
    std::uint64_t m_bits = 0;
};

std::string sha256Hex(std::span<const std::byte> data);
std::string sha256Hex(std::string_view text);

} // namespace humwise::util
