#pragma once
// Thin, thread-safe wrappers around FFTW3 (double and float). No FFTW type appears here.
//
// - Plans are cached per (size, kind, precision) for the life of the process and created
//   under one planner mutex (FFTW's planner is not thread-safe; executing a plan is).
// - Each wrapper object owns its own SIMD-aligned buffers and executes the shared plan on
//   them with FFTW's new-array interface, so different threads use different objects and
//   never share buffers. An object itself is not thread-safe.
// - Plans use FFTW_ESTIMATE: deterministic, no timing-dependent algorithm choice.
// - Transforms are unnormalised, FFTW's convention:
//   forward  X[k] = sum_n x[n] exp(-j 2 pi k n / N)
//   backward x[n] = sum_k X[k] exp(+j 2 pi k n / N)   (a forward-backward pair scales by N)

#include <complex>
#include <cstddef>
#include <optional>
#include <span>

namespace humwise::dsp {

namespace detail {
// A transform's input (n values) and output (outCount complex values) in FFTW's aligned memory,
// and the cached plan that runs on them. Move-only; a moved-from one holds nothing (size 0, no
// plan) and its owner refuses to execute.
template <class Real, class In>
struct FftBuffers {
    FftBuffers(std::size_t n, std::size_t outCount, void* plan);
    ~FftBuffers();
    FftBuffers(const FftBuffers&) = delete;
    FftBuffers& operator=(const FftBuffers&) = delete;
    FftBuffers(FftBuffers&& other) noexcept;
    FftBuffers& operator=(FftBuffers&& other) noexcept;

    std::size_t n = 0;
    In* in = nullptr;
    std::complex<Real>* out = nullptr;
    void* plan = nullptr; // owned by the process-wide cache
};
} // namespace detail

// Real input of length n -> n/2+1 complex bins (forward).
template <class Real>
class RealFft {
public:
    explicit RealFft(std::size_t n);

    std::size_t size() const { return m_b.n; }
    std::size_t binCount() const { return m_b.n / 2 + 1; }
    std::span<Real> input() { return {m_b.in, m_b.n}; }
    std::span<const std::complex<Real>> output() const { return {m_b.out, binCount()}; }
    std::span<std::complex<Real>> output() { return {m_b.out, binCount()}; }
    void execute();

private:
    detail::FftBuffers<Real, Real> m_b;
};

// A forward real transform of length n kept for the calling thread and reused: the analysis
// transforms records of the same few lengths motor after motor, and a fresh transform's buffers
// (megabytes for a record) cost page faults every time and cut the heap into pieces that the
// next motor's buffers do not fit (bench/README.md, memory). At most 32 MiB are kept per thread:
// all are dropped when a new length would exceed that. A transform larger than that alone is
// not kept: it is made in `own`, and goes with it. The reference is valid until this thread's
// next call (or `own`'s end): fill, execute and read the transform without asking for another in
// between. Its input holds whatever the last use left.
template <class Real>
RealFft<Real>& keptRealFft(std::size_t n, std::optional<RealFft<Real>>& own);
// The bytes of buffers the calling thread keeps that way (for tests of the bound).
template <class Real>
std::size_t keptRealFftBytes();

enum class FftDirection { Forward, Backward };

// Complex, out of place, length n. The input is kept (FFTW_PRESERVE_INPUT): a caller that
// rewrites only part of it before the next execute() finds the rest as it left it. Out of place
// because FFTW is faster so: 3.9 against 6.3 ns per point for a single-precision backward
// transform of 12 800 points, 4.6 against 5.4 for 8640 (FFTW 3.3.10, FFTW_ESTIMATE, measured
// 2026-12-03 on the benchmark machine, bench/README.md).
template <class Real>
class ComplexFft {
public:
    ComplexFft(std::size_t n, FftDirection direction);

    std::size_t size() const { return m_b.n; }
    std::span<std::complex<Real>> input() { return {m_b.in, m_b.n}; }
    std::span<const std::complex<Real>> output() const { return {m_b.out, m_b.n}; }
    std::span<std::complex<Real>> output() { return {m_b.out, m_b.n}; }
    void execute();

private:
    detail::FftBuffers<Real, std::complex<Real>> m_b;
};

// The smallest n' >= n whose only prime factors are 2, 3, 5 and 7 (sizes FFTW handles fast) and
// that is a multiple of `multipleOf` (itself made of those factors; 0 is taken as 1). Where the
// length is free, a multiple of 8 is faster still: over 300 lengths drawn from 1000-60 000, FFTW's
// single-precision complex transform took 5.2 ns per asked point with multiples of 8 against 6.5
// with any such size (double: 8.8 against 9.3); odd sizes such as 8575 = 5^2 7^3 take twice as
// long per point as 8640 = 2^6 3^3 5 (measured 2026-12-03, bench/README.md).
std::size_t nextFastFftSize(std::size_t n, std::size_t multipleOf = 1);

// Number of distinct plans cached so far (for tests of the cache).
std::size_t cachedPlanCount();

} // namespace humwise::dsp
