#include "core/dsp/Fft.h"

#include "core/dsp/KeptByLength.h"

#include <fftw3.h>

#include <algorithm>
#include <map>
#include <memory>
#include <mutex>
#include <new>
#include <stdexcept>
#include <string>
#include <tuple>
#include <utility>

namespace humwise::dsp {
namespace {

enum class PlanKind { RealForward, ComplexForward, ComplexBackward };

template <class Real> struct Fftw;

template <> struct Fftw<double> {
    using Complex = fftw_complex;
    static void* malloc(std::size_t bytes) { return fftw_malloc(bytes); }
    static void free(void* p) { fftw_free(p); }
    static void* planR2c(int n, double* in, Complex* out) {
        return fftw_plan_dft_r2c_1d(n, in, out, FFTW_ESTIMATE);
    }
    static void* planC2c(int n, Complex* in, Complex* out, int sign) {
        return fftw_plan_dft_1d(n, in, out, sign, FFTW_ESTIMATE | FFTW_PRESERVE_INPUT);
    }
    static void executeR2c(void* plan, double* in, Complex* out) {
        fftw_execute_dft_r2c(static_cast<fftw_plan>(plan), in, out);
    }
    static void executeC2c(void* plan, Complex* in, Complex* out) {
        fftw_execute_dft(static_cast<fftw_plan>(plan), in, out);
    }
};

template <> struct Fftw<float> {
    using Complex = fftwf_complex;
    static void* malloc(std::size_t bytes) { return fftwf_malloc(bytes); }
    static void free(void* p) { fftwf_free(p); }
    static void* planR2c(int n, float* in, Complex* out) {
        return fftwf_plan_dft_r2c_1d(n, in, out, FFTW_ESTIMATE);
    }
    static void* planC2c(int n, Complex* in, Complex* out, int sign) {
        return fftwf_plan_dft_1d(n, in, out, sign, FFTW_ESTIMATE | FFTW_PRESERVE_INPUT);
    }
    static void executeR2c(void* plan, float* in, Complex* out) {
        fftwf_execute_dft_r2c(static_cast<fftwf_plan>(plan), in, out);
    }
    static void executeC2c(void* plan, Complex* in, Complex* out) {
        fftwf_execute_dft(static_cast<fftwf_plan>(plan), in, out);
    }
};

using PlanKey = std::tuple<std::size_t, PlanKind, bool /*isDouble*/>;

std::mutex& plannerMutex() {
    static std::mutex m;
    return m;
}
// Plans live for the whole process and are destroyed at its exit (so that leak checkers see
// every FFTW allocation returned). No transform may run during static destruction.
struct PlanCache {
    std::map<PlanKey, void*> plans;
    PlanCache() = default;
    PlanCache(const PlanCache&) = delete;
    PlanCache& operator=(const PlanCache&) = delete;
    ~PlanCache() {
        for (const auto& [key, plan] : plans) {
            if (std::get<2>(key)) fftw_destroy_plan(static_cast<fftw_plan>(plan));
            else fftwf_destroy_plan(static_cast<fftwf_plan>(plan));
        }
    }
};

std::map<PlanKey, void*>& planCache() {
    static PlanCache cache;
    return cache.plans;
}

void checkSize(std::size_t n, const char* who) {
    if (n == 0 || n > static_cast<std::size_t>(1) << 30)
        throw std::invalid_argument(std::string(who) + ": transform size must be between 1 and 2^30, got " +
                                    std::to_string(n));
}

// The size, checked before anything is planned or allocated (a transform's plan is made first).
std::size_t checked(std::size_t n, const char* who) {
    checkSize(n, who);
    return n;
}

template <class T>
T* allocate(std::size_t count) {
    using F = Fftw<std::conditional_t<std::is_same_v<T, std::complex<float>> || std::is_same_v<T, float>, float, double>>;
    void* p = F::malloc(sizeof(T) * count);
    if (!p) throw std::bad_alloc();
    return static_cast<T*>(p);
}

template <class Real>
void release(void* p) {
    if (p) Fftw<Real>::free(p);
}

// Plans are made on scratch buffers of the same (FFTW-chosen) alignment as every buffer
// allocated above, which is what FFTW's new-array execute functions require.
template <class Real>
void* cachedPlan(std::size_t n, PlanKind kind) {
    using F = Fftw<Real>;
    const PlanKey key{n, kind, std::is_same_v<Real, double>};
    std::lock_guard lock(plannerMutex());
    auto& cache = planCache();
    if (auto it = cache.find(key); it != cache.end()) return it->second;
    void* plan = nullptr;
    if (kind == PlanKind::RealForward) {
        Real* in = allocate<Real>(n);
        auto* out = allocate<std::complex<Real>>(n / 2 + 1);
        plan = F::planR2c(static_cast<int>(n), in, reinterpret_cast<typename F::Complex*>(out));
        release<Real>(in);
        release<Real>(out);
    } else {
        auto* in = allocate<std::complex<Real>>(n);
        auto* out = allocate<std::complex<Real>>(n);
        plan = F::planC2c(static_cast<int>(n), reinterpret_cast<typename F::Complex*>(in),
                          reinterpret_cast<typename F::Complex*>(out),
                          kind == PlanKind::ComplexForward ? FFTW_FORWARD : FFTW_BACKWARD);
        release<Real>(in);
        release<Real>(out);
    }
    if (!plan) throw std::runtime_error("FFTW could not create a plan of size " + std::to_string(n));
    cache.emplace(key, plan);
    return plan;
}

} // namespace

template <class Real, class In>
detail::FftBuffers<Real, In>::FftBuffers(std::size_t count, std::size_t outCount, void* cached)
    : n(count), in(allocate<In>(count)), plan(cached) {
    try {
        out = allocate<std::complex<Real>>(outCount);
    } catch (...) {
        release<Real>(in);
        throw;
    }
}

template <class Real, class In>
detail::FftBuffers<Real, In>::~FftBuffers() {
    release<Real>(in);
    release<Real>(out);
}

template <class Real, class In>
detail::FftBuffers<Real, In>::FftBuffers(FftBuffers&& other) noexcept
    : n(std::exchange(other.n, 0)), in(std::exchange(other.in, nullptr)), out(std::exchange(other.out, nullptr)),
      plan(std::exchange(other.plan, nullptr)) {}

template <class Real, class In>
detail::FftBuffers<Real, In>& detail::FftBuffers<Real, In>::operator=(FftBuffers&& other) noexcept {
    if (this != &other) {
        release<Real>(in);
        release<Real>(out);
        n = std::exchange(other.n, 0);
        in = std::exchange(other.in, nullptr);
        out = std::exchange(other.out, nullptr);
        plan = std::exchange(other.plan, nullptr);
    }
    return *this;
}

template struct detail::FftBuffers<double, double>;
template struct detail::FftBuffers<float, float>;
template struct detail::FftBuffers<double, std::complex<double>>;
template struct detail::FftBuffers<float, std::complex<float>>;

template <class Real>
RealFft<Real>::RealFft(std::size_t n)
    : m_b(n, n / 2 + 1, cachedPlan<Real>(checked(n, "RealFft"), PlanKind::RealForward)) {}

template <class Real>
void RealFft<Real>::execute() {
    if (!m_b.plan) throw std::logic_error("RealFft::execute on a moved-from object");
    Fftw<Real>::executeR2c(m_b.plan, m_b.in, reinterpret_cast<typename Fftw<Real>::Complex*>(m_b.out));
}

namespace {

template <class Real>
KeptByLength<RealFft<Real>>& keptOnThisThread() {
    thread_local KeptByLength<RealFft<Real>> kept(std::size_t{32} << 20);
    return kept;
}

} // namespace

template <class Real>
RealFft<Real>& keptRealFft(std::size_t n, std::optional<RealFft<Real>>& own) {
    auto& kept = keptOnThisThread<Real>();
    if (auto* fft = kept.find(n)) return *fft;
    checkSize(n, "RealFft");
    const std::size_t bytes = n * sizeof(Real) + (n / 2 + 1) * sizeof(std::complex<Real>);
    if (bytes > kept.budget()) return own.emplace(n);
    return kept.keep(n, std::make_unique<RealFft<Real>>(n), bytes);
}

template <class Real>
std::size_t keptRealFftBytes() {
    return keptOnThisThread<Real>().bytes();
}

template std::size_t keptRealFftBytes<double>();
template std::size_t keptRealFftBytes<float>();
template RealFft<double>& keptRealFft<double>(std::size_t, std::optional<RealFft<double>>&);
template RealFft<float>& keptRealFft<float>(std::size_t, std::optional<RealFft<float>>&);

template <class Real>
ComplexFft<Real>::ComplexFft(std::size_t n, FftDirection direction)
    : m_b(n, n,
          cachedPlan<Real>(checked(n, "ComplexFft"),
                           direction == FftDirection::Forward ? PlanKind::ComplexForward : PlanKind::ComplexBackward)) {}

template <class Real>
void ComplexFft<Real>::execute() {
    if (!m_b.plan) throw std::logic_error("ComplexFft::execute on a moved-from object");
    using C = typename Fftw<Real>::Complex;
    Fftw<Real>::executeC2c(m_b.plan, reinterpret_cast<C*>(m_b.in), reinterpret_cast<C*>(m_b.out));
}

template class RealFft<double>;
template class RealFft<float>;
template class ComplexFft<double>;
template class ComplexFft<float>;

namespace {

bool hasOnlyFactors2357(std::size_t m) {
    for (std::size_t p : {2u, 3u, 5u, 7u})
        while (m % p == 0) m /= p;
    return m == 1;
}

} // namespace

std::size_t nextFastFftSize(std::size_t n, std::size_t multipleOf) {
    const std::size_t step = std::max<std::size_t>(multipleOf, 1);
    if (!hasOnlyFactors2357(step)) throw std::invalid_argument("nextFastFftSize: the multiple must have no prime factor above 7");
    if (n > (std::size_t{1} << 62)) throw std::invalid_argument("nextFastFftSize: the length is beyond any transform");
    for (std::size_t m = std::max<std::size_t>((n + step - 1) / step, 1) * step;; m += step)
        if (hasOnlyFactors2357(m)) return m;
}

std::size_t cachedPlanCount() {
    std::lock_guard lock(plannerMutex());
    return planCache().size();
}

} // namespace humwise::dsp
