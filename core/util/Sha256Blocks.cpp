#include "core/util/Sha256Blocks.h"

#if defined(__x86_64__) || defined(__i386__)
#include <cpuid.h>
#include <immintrin.h>
#define HUMWISE_SHA_X86 1
#endif

#include <stdexcept>

namespace humwise::util::detail {
namespace {

// FIPS 180-4, 4.2.2: the first 32 bits of the fractional parts of the cube roots of the first 64 primes.
alignas(16) constexpr std::uint32_t kK[64] = {
    0x428a2f98, 0x71374491, 0xb5c0fbcf, 0xe9b5dba5, 0x3956c25b, 0x59f111f1, 0x923f82a4, 0xab1c5ed5, 0xd807aa98, 0x12835b01, 0x243185be,
    0x550c7dc3, 0x72be5d74, 0x80deb1fe, 0x9bdc06a7, 0xc19bf174, 0xe49b69c1, 0xefbe4786, 0x0fc19dc6, 0x240ca1cc, 0x2de92c6f, 0x4a7484aa,
    0x5cb0a9dc, 0x76f988da, 0x983e5152, 0xa831c66d, 0xb00327c8, 0xbf597fc7, 0xc6e00bf3, 0xd5a79147, 0x06ca6351, 0x14292967, 0x27b70a85,
    0x2e1b2138, 0x4d2c6dfc, 0x53380d13, 0x650a7354, 0x766a0abb, 0x81c2c92e, 0x92722c85, 0xa2bfe8a1, 0xa81a664b, 0xc24b8b70, 0xc76c51a3,
    0xd192e819, 0xd6990624, 0xf40e3585, 0x106aa070, 0x19a4c116, 0x1e376c08, 0x2748774c, 0x34b0bcb5, 0x391c0cb3, 0x4ed8aa4a, 0x5b9cca4f,
    0x682e6ff3, 0x748f82ee, 0x78a5636f, 0x84c87814, 0x8cc70208, 0x90befffa, 0xa4506ceb, 0xbef9a3f7, 0xc67178f2};

constexpr std::uint32_t rotr(std::uint32_t x, int n) { return (x >> n) | (x << (32 - n)); }

void portableBlock(std::uint32_t state[8], const std::uint8_t* p) {
    std::uint32_t w[64];
    for (int i = 0; i < 16; ++i)
        w[i] = std::uint32_t{p[4 * i]} << 24 | std::uint32_t{p[4 * i + 1]} << 16 | std::uint32_t{p[4 * i + 2]} << 8 | p[4 * i + 3];
    for (int i = 16; i < 64; ++i) {
        const std::uint32_t s0 = rotr(w[i - 15], 7) ^ rotr(w[i - 15], 18) ^ (w[i - 15] >> 3);
        const std::uint32_t s1 = rotr(w[i - 2], 17) ^ rotr(w[i - 2], 19) ^ (w[i - 2] >> 10);
        w[i] = w[i - 16] + s0 + w[i - 7] + s1;
    }
    std::uint32_t a = state[0], b = state[1], c = state[2], d = state[3], e = state[4], f = state[5], g = state[6], h = state[7];
    for (int i = 0; i < 64; ++i) {
        const std::uint32_t s1 = rotr(e, 6) ^ rotr(e, 11) ^ rotr(e, 25);
        const std::uint32_t ch = (e & f) ^ (~e & g);
        const std::uint32_t t1 = h + s1 + ch + kK[i] + w[i];
        const std::uint32_t s0 = rotr(a, 2) ^ rotr(a, 13) ^ rotr(a, 22);
        const std::uint32_t maj = (a & b) ^ (a & c) ^ (b & c);
        const std::uint32_t t2 = s0 + maj;
        h = g;
        g = f;
        f = e;
        e = d + t1;
        d = c;
        c = b;
        b = a;
        a = t1 + t2;
    }
    state[0] += a; state[1] += b; state[2] += c; state[3] += d; state[4] += e; state[5] += f; state[6] += g; state[7] += h;
}

} // namespace

void sha256BlocksPortable(std::uint32_t state[8], const std::uint8_t* data, std::size_t blocks) {
    for (std::size_t i = 0; i < blocks; ++i) portableBlock(state, data + 64 * i);
}

#ifdef HUMWISE_SHA_X86

bool shaExtensionsAvailable() {
    static const bool available = [] {
        unsigned a = 0, b = 0, c = 0, d = 0;
        if (!__get_cpuid(1, &a, &b, &c, &d)) return false;
        const bool ssse3 = (c & (1u << 9)) != 0, sse41 = (c & (1u << 19)) != 0;
        if (!__get_cpuid_count(7, 0, &a, &b, &c, &d)) return false;
        const bool sha = (b & (1u << 29)) != 0; // CPUID.(EAX=7,ECX=0):EBX.SHA[bit 29]
        return ssse3 && sse41 && sha;
    }();
    return available;
}

// The state lives in two registers as (A B E F) and (C D G H), the layout sha256rnds2 works on;
// each step of the loop does four rounds: two sha256rnds2 with the message words plus K.
__attribute__((target("sha,sse4.1,ssse3"))) void sha256BlocksAccelerated(std::uint32_t state[8], const std::uint8_t* data, std::size_t blocks) {
    const __m128i byteSwap = _mm_set_epi64x(0x0c0d0e0f08090a0bLL, 0x0405060700010203LL); // big-endian words
    __m128i tmp = _mm_loadu_si128(reinterpret_cast<const __m128i*>(&state[0]));    // D C B A (lanes 3..0)
    __m128i state1 = _mm_loadu_si128(reinterpret_cast<const __m128i*>(&state[4])); // H G F E
    tmp = _mm_shuffle_epi32(tmp, 0xB1);                                             // C D A B
    state1 = _mm_shuffle_epi32(state1, 0x1B);                                       // E F G H
    __m128i state0 = _mm_alignr_epi8(tmp, state1, 8);                               // A B E F
    state1 = _mm_blend_epi16(state1, tmp, 0xF0);                                    // C D G H
    for (std::size_t blk = 0; blk < blocks; ++blk, data += 64) {
        const __m128i abefSaved = state0, cdghSaved = state1;
        __m128i w[4];
        for (int i = 0; i < 16; ++i) {
            __m128i& wi = w[i & 3];
            if (i < 4) {
                wi = _mm_shuffle_epi8(_mm_loadu_si128(reinterpret_cast<const __m128i*>(data + 16 * i)), byteSwap);
            } else {
                // W[t] for t = 4i..4i+3 from W[t-16] (w[i&3] itself), W[t-15..t-13], W[t-7..t-4], W[t-2..t-1].
                const __m128i prev = w[(i - 1) & 3], prev2 = w[(i - 2) & 3];
                const __m128i s0 = _mm_sha256msg1_epu32(wi, w[(i - 3) & 3]);
                wi = _mm_sha256msg2_epu32(_mm_add_epi32(s0, _mm_alignr_epi8(prev, prev2, 4)), prev);
            }
            __m128i msg = _mm_add_epi32(wi, _mm_load_si128(reinterpret_cast<const __m128i*>(&kK[4 * i])));
            state1 = _mm_sha256rnds2_epu32(state1, state0, msg);
            msg = _mm_shuffle_epi32(msg, 0x0E);
            state0 = _mm_sha256rnds2_epu32(state0, state1, msg);
        }
        state0 = _mm_add_epi32(state0, abefSaved);
        state1 = _mm_add_epi32(state1, cdghSaved);
    }
    tmp = _mm_shuffle_epi32(state0, 0x1B);        // F E B A
    state1 = _mm_shuffle_epi32(state1, 0xB1);     // D C H G
    state0 = _mm_blend_epi16(tmp, state1, 0xF0);  // D C B A
    state1 = _mm_alignr_epi8(state1, tmp, 8);     // H G F E
    _mm_storeu_si128(reinterpret_cast<__m128i*>(&state[0]), state0);
    _mm_storeu_si128(reinterpret_cast<__m128i*>(&state[4]), state1);
}

#else

bool shaExtensionsAvailable() { return false; }

void sha256BlocksAccelerated(std::uint32_t*, const std::uint8_t*, std::size_t) {
    throw std::logic_error("sha256BlocksAccelerated: no SHA extensions on this processor");
}

#endif

} // namespace humwise::util::detail
