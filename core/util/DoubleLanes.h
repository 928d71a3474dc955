#pragma once
// Four doubles in one GCC vector: one AVX register in the x86-64-v3 clone of a function marked
// HUMWISE_VECTOR_CLONES (VectorClones.h), two SSE registers in the baseline one. GCC and clang
// both compile the arithmetic, comparisons and ?: on such vectors lane by lane.

#include <cstddef>
#include <cstring>

namespace humwise::util {

using DoubleLanes = double __attribute__((vector_size(32)));

// By reference: a 32-byte vector passed or returned by value would change the calling convention
// between the clones (GCC's -Wpsabi).
inline void loadLanes(DoubleLanes& v, const double* p) { std::memcpy(&v, p, sizeof v); }
inline void storeLanes(double* p, const DoubleLanes& v) { std::memcpy(p, &v, sizeof v); }

// Long reductions keep this many vectors of partial results: each vector's additions (or minima)
// form one chain of dependent operations, a vector per adder latency (about 4 cycles); four
// chains in flight reach the adders' throughput. One vector ran at a sample per cycle.
inline constexpr std::size_t kReductionVectors = 4;
inline constexpr std::size_t kReductionWidth = 4 * kReductionVectors; // doubles per step

// The sum of all lanes of the kReductionVectors vectors, added pairwise.
inline double sumOfLanes(const DoubleLanes (&v)[kReductionVectors]) {
    const DoubleLanes s = (v[0] + v[1]) + (v[2] + v[3]);
    return (s[0] + s[1]) + (s[2] + s[3]);
}

} // namespace humwise::util
