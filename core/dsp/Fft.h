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
#include <span>

namespace humwise::dsp {

// Real input of length n -> n/2+1 complex bins (forward).
template <class Real>
class RealFft {
public:
    explicit RealFft(std::size_t n);
    ~RealFft();
    RealFft(const RealFft&) = delete;
    RealFft& operator=(const RealFft&) = delete;
    RealFft(RealFft&& other) noexcept;
    RealFft& operator=(RealFft&& other) noexcept;

    std::size_t size() const { return m_n; }
    std::size_t binCount() const { return m_n / 2 + 1; }
    std::span<Real> input() { return {m_in, m_n}; }
    std::span<const std::complex<Real>> output() const { return {m_out, binCount()}; }
    std::span<std::complex<Real>> output() { return {m_out, binCount()}; }
    void execute();

private:
    std::size_t m_n = 0;
    Real* m_in = nullptr;
    std::complex<Real>* m_out = nullptr;
    void* m_plan = nullptr; // owned by the process-wide cache
};

enum class FftDirection { Forward, Backward };

// Complex, in place, length n.
template <class Real>
class ComplexFft {
public:
    ComplexFft(std::size_t n, FftDirection direction);
    ~ComplexFft();
    ComplexFft(const ComplexFft&) = delete;
    ComplexFft& operator=(const ComplexFft&) = delete;
    ComplexFft(ComplexFft&& other) noexcept;
    ComplexFft& operator=(ComplexFft&& other) noexcept;

    std::size_t size() const { return m_n; }
    std::span<std::complex<Real>> data() { return {m_data, m_n}; }
    void execute();

private:
    std::size_t m_n = 0;
    std::complex<Real>* m_data = nullptr;
    void* m_plan = nullptr;
};

// The smallest n' >= n whose only prime factors are 2, 3, 5 and 7 (sizes FFTW handles fast).
std::size_t nextFastFftSize(std::size_t n);

// Number of distinct plans cached so far (for tests of the cache).
std::size_t cachedPlanCount();

} // namespace humwise::dsp
