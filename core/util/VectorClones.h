#pragma once
// HUMWISE_VECTOR_CLONES, written before a function whose hot loop vectorises: GCC compiles the
// function twice, for the baseline x86-64 (SSE2) and for x86-64-v3 (AVX2 and FMA), and the
// loader picks one from the processor it runs on (function multi-versioning through an ifunc).
// Elsewhere it expands to nothing. The two versions may differ in the last bits of a result
// (x86-64-v3 fuses a * b + c into one rounding); callers must not need bit-identical results
// across machines.

#if defined(__GNUC__) && !defined(__clang__) && defined(__x86_64__) && defined(__linux__)
#define HUMWISE_VECTOR_CLONES __attribute__((target_clones("arch=x86-64-v3", "default")))
#else
#define HUMWISE_VECTOR_CLONES
#endif
