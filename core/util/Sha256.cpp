#include "core/util/Sha256.h"

#include "core/util/Sha256Blocks.h"

#include <cstring>

namespace humwise::util {
namespace {

// The accelerated compression function when the processor has it (core/util/Sha256Blocks.h).
using BlocksFn = void (*)(std::uint32_t*, const std::uint8_t*, std::size_t);
BlocksFn compression() {
    static const BlocksFn fn = detail::shaExtensionsAvailable() ? detail::sha256BlocksAccelerated : detail::sha256BlocksPortable;
    return fn;
}

} // namespace

Sha256::Sha256() : m_h{0x6a09e667, 0xbb67ae85, 0x3c6ef372, 0xa54ff53a, 0x510e527f, 0x9b05688c, 0x1f83d9ab, 0x5be0cd19} {}

void Sha256::blocks(const std::uint8_t* p, std::size_t count) { compression()(m_h.data(), p, count); }

void Sha256::update(std::span<const std::byte> data) {
    const auto* p = reinterpret_cast<const std::uint8_t*>(data.data());
    std::size_t n = data.size();
    m_bits += static_cast<std::uint64_t>(n) * 8;
    if (m_used) {
        const std::size_t take = std::min(n, 64 - m_used);
        std::memcpy(m_buffer.data() + m_used, p, take);
        m_used += take;
        p += take;
        n -= take;
        if (m_used == 64) {
            blocks(m_buffer.data(), 1);
            m_used = 0;
        }
    }
    if (n >= 64) {
        blocks(p, n / 64);
        p += n / 64 * 64;
        n %= 64;
    }
    if (n) {
        std::memcpy(m_buffer.data(), p, n);
        m_used = n;
    }
}

void Sha256::update(std::string_view text) { update(std::as_bytes(std::span(text.data(), text.size()))); }

std::array<std::uint8_t, 32> Sha256::finish() {
    const std::uint64_t bits = m_bits;
    const std::uint8_t pad = 0x80;
    update(std::as_bytes(std::span(&pad, 1)));
    const std::uint8_t zero = 0;
    while (m_used != 56) update(std::as_bytes(std::span(&zero, 1)));
    std::uint8_t len[8];
    for (int i = 0; i < 8; ++i) len[i] = static_cast<std::uint8_t>(bits >> (56 - 8 * i));
    update(std::as_bytes(std::span(len, 8)));
    std::array<std::uint8_t, 32> out;
    for (int i = 0; i < 8; ++i)
        for (int j = 0; j < 4; ++j) out[4 * i + j] = static_cast<std::uint8_t>(m_h[i] >> (24 - 8 * j));
    return out;
}

std::string Sha256::finishHex() {
    static const char* digits = "0123456789abcdef";
    std::string s;
    for (auto b : finish()) {
        s += digits[b >> 4];
        s += digits[b & 15];
    }
    return s;
}

std::string sha256Hex(std::span<const std::byte> data) {
    Sha256 h;
    h.update(data);
    return h.finishHex();
}

std::string sha256Hex(std::string_view text) {
    Sha256 h;
    h.update(text);
    return h.finishHex();
}

} // namespace humwise::util
