// Outside cross-check of core/dsp against scipy.signal and scipy.stats.
//
// Oracle: Debian bookworm python3-scipy 1.10.1 / python3-numpy 1.24.2 under /usr/bin/python3
// (HUMWISE_PYTHON; REFERENCE.md section 12). At test time the test runs
// tests/reference/scipy_reference.py, which writes the input signals and scipy's results to a
// plain-text file in test::outputDir(); every comparison below analyses exactly the samples
// scipy analysed. If the interpreter or scipy is missing the tests are skipped with a message;
// if the script itself fails they fail.
//
// Tolerances. Measured on this machine: windows differ by <= 6e-17 absolute (a few ulp of the
// peak), spectra by <= 1.2e-12 relative (a DC line after mean removal; ~1e-14 elsewhere),
// envelopes by <= 6e-15 relative - the rounding of two FFT libraries (FFTW here, pocketfft in
// scipy). The tolerances leave >= 100x margin (windows; >= 1e4 for the rest) for other
// platforms and are still far below any modelling error (a wrong factor, line or window
// coefficient shows at 1e-8 or more):
//   windows      1e-9 relative + 1e-14 absolute (peak = 1)
//   spectra      1e-9 relative + 1e-13 x the largest line (power) / 1e-7 x largest (amplitude)
//   envelopes    1e-9 x the largest envelope value
//   statistics   1e-10 relative (kurtosis, rms, ...), 1e-10 absolute for the skewness
// Set HUMWISE_SCIPY_VERBOSE=1 to print the worst difference of every comparison.
#include "core/dsp/BandSignal.h"
#include "core/dsp/Spectrum.h"
#include "core/dsp/Statistics.h"
#include "core/dsp/Window.h"
#include "support/TestSupport.h"

#include <gtest/gtest.h>

#include <algorithm>
#include <charconv>
#include <cmath>
#include <complex>
#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <iostream>
#include <map>
#include <random>
#include <sstream>
#include <stdexcept>
#include <string>
#include <string_view>
#include <vector>

namespace humwise {
namespace {

namespace fs = std::filesystem;
using Values = std::vector<double>;

// ---- running the script and reading its output ------------------------------------------------

struct Reference {
    enum class Status { Ready, Unavailable, Failed };
    Status status = Status::Failed;
    std::string message;
    std::string scipyVersion;
    std::map<std::string, Values, std::less<>> records;
};

std::string readText(const fs::path& p) {
    std::ifstream in(p, std::ios::binary);
    std::ostringstream ss;
    ss << in.rdbuf();
    return ss.str();
}

// "path" for the shell (built with append: GCC 12 warns falsely on "\"" + s + "\"").
std::string quoted(const fs::path& p) {
    std::string s(1, '"');
    s.append(p.string());
    s.push_back('"');
    return s;
}

// Parses "NAME COUNT V1 ... VCOUNT" lines; '#' starts a comment line.
bool parseReference(const std::string& text, Reference& r) {
    std::size_t pos = 0;
    std::size_t lineNo = 0;
    while (pos < text.size()) {
        std::size_t end = text.find('\n', pos);
        if (end == std::string::npos) end = text.size();
        const std::string_view line(text.data() + pos, end - pos);
        pos = end + 1;
        ++lineNo;
        if (line.empty() || line.front() == '#') continue;
        const char* p = line.data();
        const char* const last = line.data() + line.size();
        auto token = [&]() {
            while (p < last && *p == ' ') ++p;
            const char* b = p;
            while (p < last && *p != ' ') ++p;
            return std::string_view(b, static_cast<std::size_t>(p - b));
        };
        const std::string name(token());
        const std::string_view countText = token();
        std::size_t count = 0;
        if (std::from_chars(countText.data(), countText.data() + countText.size(), count).ec != std::errc()) {
            r.message = "scipy reference line " + std::to_string(lineNo) + ": bad count";
            return false;
        }
        Values v(count);
        for (std::size_t i = 0; i < count; ++i) {
            const std::string_view t = token();
            const auto res = std::from_chars(t.data(), t.data() + t.size(), v[i]);
            if (t.empty() || res.ec != std::errc() || res.ptr != t.data() + t.size()) {
                r.message = "scipy reference line " + std::to_string(lineNo) + " (" + name + "): bad value #" +
                            std::to_string(i);
                return false;
            }
        }
        if (!token().empty()) {
            r.message = "scipy reference line " + std::to_string(lineNo) + " (" + name + "): more values than the count";
            return false;
        }
        r.records.emplace(name, std::move(v));
    }
    return true;
}

Reference generateReference() {
    Reference r;
    const fs::path python = HUMWISE_PYTHON;
    const fs::path script = test::testsDir() / "reference" / "scipy_reference.py";
    std::error_code ec;
    if (python.empty() || !fs::exists(python, ec)) {
        r.status = Reference::Status::Unavailable;
        r.message = "python interpreter '" + python.string() +
                    "' (HUMWISE_PYTHON) not found; install Debian python3-scipy or set HUMWISE_PYTHON";
        return r;
    }
    // A per-process file name: ctest may run several of these tests at the same time.
    const auto tag = std::to_string(std::random_device{}());
    const fs::path dir = test::outputDir();
    fs::create_directories(dir, ec);
    const fs::path out = dir / ("scipy_reference_" + tag + ".txt");
    const fs::path log = dir / ("scipy_reference_" + tag + ".log");

    const std::string probe = quoted(python) + " -c \"import numpy, scipy.signal, scipy.stats\" > " + quoted(log) + " 2>&1";
    if (std::system(probe.c_str()) != 0) {
        r.status = Reference::Status::Unavailable;
        r.message = python.string() + " cannot import numpy/scipy (install Debian python3-scipy): " + readText(log);
        fs::remove(log, ec);
        return r;
    }
    const std::string run = quoted(python) + " " + quoted(script) + " " + quoted(out) + " > " + quoted(log) + " 2>&1";
    if (std::system(run.c_str()) != 0) {
        r.status = Reference::Status::Failed;
        r.message = "running " + script.string() + " failed: " + readText(log);
        return r;
    }
    fs::remove(log, ec);
    const std::string text = readText(out);
    if (!parseReference(text, r)) {
        r.status = Reference::Status::Failed;
        return r;
    }
    // Keep the last file for inspection under a stable name.
    fs::rename(out, dir / "scipy_reference.txt", ec);
    if (ec) fs::remove(out, ec);
    r.status = Reference::Status::Ready;
    return r;
}

const Reference& reference() {
    static const Reference r = generateReference();
    return r;
}

bool verbose() {
    const char* v = std::getenv("HUMWISE_SCIPY_VERBOSE");
    return v && *v && std::string_view(v) != "0";
}

std::vector<std::string> split(std::string_view s, char sep) {
    std::vector<std::string> parts;
    std::size_t b = 0;
    while (true) {
        const std::size_t e = s.find(sep, b);
        parts.emplace_back(s.substr(b, e == std::string_view::npos ? std::string_view::npos : e - b));
        if (e == std::string_view::npos) break;
        b = e + 1;
    }
    return parts;
}

std::size_t toSize(const std::string& s) {
    std::size_t v = 0;
    const auto res = std::from_chars(s.data(), s.data() + s.size(), v);
    if (res.ec != std::errc() || res.ptr != s.data() + s.size()) throw std::invalid_argument("not a count: " + s);
    return v;
}

// |actual[i] - expected[i]| <= rel |expected[i]| + absTol for every i; reports the worst line.
::testing::AssertionResult allClose(const std::string& what, const Values& actual, const Values& expected, double rel,
                                    double absTol) {
    if (actual.size() != expected.size())
        return ::testing::AssertionFailure() << what << ": " << actual.size() << " values, scipy has " << expected.size();
    if (expected.empty()) return ::testing::AssertionFailure() << what << ": nothing to compare";
    double worst = -1, worstRel = 0;
    std::size_t at = 0;
    for (std::size_t i = 0; i < expected.size(); ++i) {
        const double diff = std::abs(actual[i] - expected[i]);
        const double ratio = diff / (rel * std::abs(expected[i]) + absTol);
        if (!(ratio <= worst) || std::isnan(ratio)) { // NaN counts as worst
            worst = std::isnan(ratio) ? INFINITY : ratio;
            at = i;
            worstRel = expected[i] != 0 ? diff / std::abs(expected[i]) : diff;
        }
    }
    char buf[320];
    std::snprintf(buf, sizeof buf, "%s: worst at [%zu]: ours %.17g, reference %.17g (relative difference %.3g, %.3g of the tolerance)",
                  what.c_str(), at, actual[at], expected[at], worstRel, worst);
    if (verbose()) std::cout << "  " << buf << '\n';
    if (worst <= 1.0) return ::testing::AssertionSuccess();
    return ::testing::AssertionFailure() << buf;
}

double maxAbs(const Values& v) {
    double m = 0;
    for (double x : v) m = std::max(m, std::abs(x));
    return m;
}


const Values& record(const std::string& name) {
    const auto& records = reference().records;
    const auto it = records.find(name);
    if (it == records.end()) throw std::out_of_range("scipy reference has no record '" + name + "'");
    return it->second;
}

// Names (without the prefix) of the records starting with `prefix`, in sorted order.
std::vector<std::string> names(const std::string& prefix) {
    std::vector<std::string> out;
    for (const auto& [name, values] : reference().records)
        if (name.rfind(prefix, 0) == 0) out.push_back(name.substr(prefix.size()));
    return out;
}

double sampleRate(const std::string& signalId) { return record("fs/" + signalId).at(0); }

dsp::WindowSpec windowSpec(const std::string& scipyName) {
    const auto spec = dsp::parseWindowSpec(scipyName);
    if (!spec) throw std::invalid_argument("parseWindowSpec refuses '" + scipyName + "'");
    return *spec;
}

class ScipyCrossCheck : public ::testing::Test {
protected:
    void SetUp() override {
        const Reference& r = reference();
        if (r.status == Reference::Status::Unavailable) GTEST_SKIP() << r.message;
        ASSERT_EQ(r.status, Reference::Status::Ready) << r.message;
    }
};

// ---- windows ------------------------------------------------------------------------------------

// Normalisation: ours are scaled to a peak of exactly 1. scipy's periodic hann, hamming,
// blackmanharris and kaiser peak at exactly 1 only for even N (sample N/2 sits on the centre of
// the N+1-point symmetric window); for odd N their largest sample is 1 - O(1/N^2) (e.g.
// 0.99999985 for hann at N = 4093). Symmetric windows of even N never reach 1. And
// general_cosine(HFT95) peaks at 4.68, the sum of its coefficients. So scipy's window is divided
// by its own maximum before comparing (spectra use S1 and S2, where the scale cancels).
// Tolerance: 1e-9 relative plus 1e-14 absolute. The absolute part is needed next to the ends of
// cosine-sum windows, where a - b cos(x) cancels: both sides then carry ~1e-16 absolute rounding
// on values as small as 2.5e-8 (hann, N = 20000, n = 1).
void compareWindows(const std::string& prefix, dsp::WindowSymmetry symmetry, std::size_t expectedRecords) {
    const auto cases = names(prefix);
    EXPECT_EQ(cases.size(), expectedRecords) << "unexpected number of " << prefix << " records from the script";
    for (const std::string& c : cases) {
        const auto parts = split(c, '/');
        ASSERT_EQ(parts.size(), 2u) << c;
        const dsp::WindowSpec spec = windowSpec(parts[0]);
        if (parts[0].rfind("kaiser:", 0) == 0) {
            ASSERT_EQ(spec.kind, dsp::WindowKind::Kaiser) << c;
            EXPECT_EQ(spec.kaiserBeta, std::stod(parts[0].substr(7))) << c;
        }
        const std::size_t n = toSize(parts[1]);
        Values expected = record(prefix + c);
        ASSERT_EQ(expected.size(), n) << c;
        const double peak = *std::max_element(expected.begin(), expected.end());
        ASSERT_GT(peak, 0.0) << c;
        for (double& v : expected) v /= peak;

        const Values ours = dsp::makeWindow(spec, n, symmetry);
        ASSERT_EQ(ours.size(), n) << c;
        EXPECT_EQ(*std::max_element(ours.begin(), ours.end()), 1.0) << c << ": our window is not normalised to peak 1";
        EXPECT_TRUE(allClose(prefix + c, ours, expected, 1e-9, 1e-14));
    }
}

// Source: scipy.signal.get_window(name, N, fftbins=True) (scipy 1.10.1, Debian bookworm) for
// boxcar, hann, hamming, blackmanharris and ('kaiser', beta) with beta = 0, 2pi, 2.5pi, 3pi, 3.5pi,
// 8.6, 14, 30; for the flat-top scipy.signal.windows.general_cosine(N, [1, 1.9383379, 1.3045202,
// 0.4028270, 0.0350665], sym=False), the HFT95 coefficients of Heinzel, Ruediger & Schilling 2002,
// Table 2. N = 1, 2, 3, 7, 8, 1000, 1024, 4093 (prime), 4096, 4097, 8191 (prime), 20000.
TEST_F(ScipyCrossCheck, PeriodicWindowsMatchGetWindowFftbinsTrue) {
    compareWindows("window/", dsp::WindowSymmetry::Periodic, 12 * 13);
}

// Source: as above with fftbins=False / sym=True (scipy 1.10.1), N = 3, 4, 8, 1000, 1001, 4093.
TEST_F(ScipyCrossCheck, SymmetricWindowsMatchGetWindowFftbinsFalse) {
    compareWindows("windowsym/", dsp::WindowSymmetry::Symmetric, 6 * 13);
}

// ---- spectra ------------------------------------------------------------------------------------

// Our request equivalent to scipy.signal.welch(x, fs, window, nperseg, noverlap,
// detrend='constant', average='mean', return_onesided=True):
//  * segment length: chooseSegmentLength returns llround(fs / resolutionHz), which is exactly
//    nperseg for resolutionHz = fs / nperseg;
//  * fmaxHz = fs / 2: our default fmax is fs / 2.56; at fs / 2 we keep lines 0..floor(nperseg/2),
//    all of scipy's one-sided lines;
//  * step: ours is llround(nperseg (1 - overlap)), = nperseg - noverlap for
//    overlap = noverlap / nperseg (scipy's step); both average every segment that fits,
//    1 + (N - nperseg) / step of them (the checked `averages` confirms it);
//  * removeMean = scipy's detrend='constant' (each segment's mean) or detrend=False.
dsp::Spectrum ourSpectrum(const Values& x, double fs, const dsp::WindowSpec& window, std::size_t nperseg,
                          std::size_t noverlap, dsp::SpectrumScale scale, bool removeMean = true) {
    dsp::SpectrumRequest r;
    r.window = window;
    r.resolutionHz = fs / static_cast<double>(nperseg);
    r.fmaxHz = fs / 2.0;
    r.overlap = static_cast<double>(noverlap) / static_cast<double>(nperseg);
    r.scale = scale;
    r.removeMean = removeMean;
    auto result = dsp::averagedSpectrum(x, fs, r);
    if (!result) throw std::runtime_error("averagedSpectrum: " + result.error().message);
    return std::move(result).value();
}

// Compares our Psd, Rms and Peak spectra (and Psd rescaled to Rms) with scipy's
// scaling='density' (PSD) and scaling='spectrum' (PS = rms^2 per line) results.
//   Psd  = density                      1e-9 relative + 1e-13 x the largest line
//   Rms  = sqrt(spectrum)               1e-9 relative + 1e-7 x the largest line (sqrt of the above)
//   Peak = sqrt(2 spectrum), sqrt(spectrum) at DC and (even N) Nyquist, as Rms
// The absolute floor only matters at DC after mean removal with a rectangular window, where
// both sides hold rounding noise (~1e-34 V^2/Hz).
void compareSpectra(const std::string& label, const Values& x, double fs, const dsp::WindowSpec& window,
                    std::size_t nperseg, std::size_t noverlap, bool removeMean, const Values& density,
                    const Values* spectrum, std::size_t expectedAverages) {
    using dsp::SpectrumScale;
    const std::size_t lines = nperseg / 2 + 1;
    ASSERT_EQ(density.size(), lines) << label;

    const dsp::Spectrum psd = ourSpectrum(x, fs, window, nperseg, noverlap, SpectrumScale::Psd, removeMean);
    EXPECT_EQ(psd.segmentLength, nperseg) << label;
    EXPECT_EQ(psd.transformLength, nperseg) << label;
    EXPECT_EQ(psd.averages, expectedAverages) << label;
    EXPECT_DOUBLE_EQ(psd.resolutionHz, fs / static_cast<double>(nperseg)) << label;
    EXPECT_EQ(psd.startHz, 0.0) << label;
    EXPECT_TRUE(allClose(label + " psd", psd.values, density, 1e-9, 1e-13 * maxAbs(density)));
    if (!spectrum) return;

    ASSERT_EQ(spectrum->size(), lines) << label;
    Values rmsExpected(lines), peakExpected(lines);
    for (std::size_t k = 0; k < lines; ++k) {
        const bool edge = k == 0 || (nperseg % 2 == 0 && k == nperseg / 2);
        rmsExpected[k] = std::sqrt((*spectrum)[k]);
        peakExpected[k] = std::sqrt((edge ? 1.0 : 2.0) * (*spectrum)[k]);
    }
    const double floor = 1e-7 * maxAbs(rmsExpected);
    const dsp::Spectrum rms = ourSpectrum(x, fs, window, nperseg, noverlap, SpectrumScale::Rms, removeMean);
    EXPECT_TRUE(allClose(label + " rms", rms.values, rmsExpected, 1e-9, floor));
    const dsp::Spectrum peak = ourSpectrum(x, fs, window, nperseg, noverlap, SpectrumScale::Peak, removeMean);
    EXPECT_TRUE(allClose(label + " peak", peak.values, peakExpected, 1e-9, floor));
    dsp::Spectrum converted = psd;
    dsp::rescale(converted, SpectrumScale::Rms);
    EXPECT_TRUE(allClose(label + " psd->rms", converted.values, rmsExpected, 1e-9, floor));
    // ENBW (Hz) = fs S2 / S1^2 = PS / PSD on any line (line 1 is never an edge line).
    EXPECT_NEAR(psd.enbwHz, (*spectrum)[1] / density[1], 1e-12 * psd.enbwHz) << label;
}

// Source: scipy.signal.welch (scipy 1.10.1, Debian bookworm), scaling='density' and 'spectrum',
// detrend='constant', average='mean', on DC + two tones + Gaussian noise (fs 2560 Hz) of 1000,
// 1024, 4093, 4097, 8191 and 20000 samples; windows hann, hamming, blackmanharris, boxcar,
// kaiser(3 pi), kaiser(14) and HFT95 (general_cosine, Heinzel et al. 2002); nperseg even, odd and
// prime (257, 999, 1001, 4093, 8191), overlaps 0 %, 25 %, 33 %, ~50 %, 75 %, with and without
// left-over samples at the end of the record.
TEST_F(ScipyCrossCheck, WelchDensityAndSpectrumMatchAveragedSpectrum) {
    const auto cases = names("welchinfo/");
    EXPECT_EQ(cases.size(), 13u) << "unexpected number of welch cases from the script";
    for (const std::string& c : cases) {
        SCOPED_TRACE("welch " + c);
        const auto parts = split(c, '/');
        ASSERT_EQ(parts.size(), 4u);
        const std::string& sid = parts[0];
        const std::size_t nperseg = toSize(parts[2]), noverlap = toSize(parts[3]);
        const Values& info = record("welchinfo/" + c); // line spacing, segments, lines
        ASSERT_EQ(info.size(), 3u);
        ASSERT_EQ(static_cast<std::size_t>(info[2]), nperseg / 2 + 1);
        const double fs = sampleRate(sid);
        EXPECT_DOUBLE_EQ(fs / static_cast<double>(nperseg), info[0]);
        compareSpectra("welch " + c, record("signal/" + sid), fs, windowSpec(parts[1]), nperseg, noverlap, true,
                       record("welch/" + c + "/density"), &record("welch/" + c + "/spectrum"),
                       static_cast<std::size_t>(info[1]));
    }
}

// Source: scipy.signal.periodogram (scipy 1.10.1, Debian bookworm), window boxcar and hann,
// scaling 'density' and 'spectrum', detrend='constant', and boxcar/density with detrend=False, on
// the same records (1000, 1024, 4093, 4097, 8191, 20000 samples): one segment of the whole record.
TEST_F(ScipyCrossCheck, PeriodogramMatchesSingleSegmentSpectrum) {
    const auto signals = names("signal/mix");
    EXPECT_EQ(signals.size(), 6u);
    for (const std::string& suffix : signals) {
        const std::string sid = "mix" + suffix;
        SCOPED_TRACE("periodogram " + sid);
        const Values& x = record("signal/" + sid);
        const double fs = sampleRate(sid);
        for (const std::string w : {"boxcar", "hann"}) {
            const std::string key = "periodogram/" + sid + "/" + w;
            compareSpectra(key, x, fs, windowSpec(w), x.size(), 0, true, record(key + "/density"), &record(key + "/spectrum"), 1);
        }
        // detrend=False, rectangular: the DC line keeps the mean, and Parseval holds exactly:
        // sum(PSD) df = mean(x^2) (REFERENCE.md 1.5), for scipy and for us.
        const std::string key = "periodogram/" + sid + "/boxcar/density/nodetrend";
        const Values& density = record(key);
        compareSpectra(key, x, fs, windowSpec("boxcar"), x.size(), 0, false, density, nullptr, 1);
        const dsp::Spectrum ours = ourSpectrum(x, fs, windowSpec("boxcar"), x.size(), 0, dsp::SpectrumScale::Psd, false);
        double meanSquare = 0, oursSum = 0, scipySum = 0;
        for (double v : x) meanSquare += v * v;
        meanSquare /= static_cast<double>(x.size());
        for (double v : ours.values) oursSum += v;
        for (double v : density) scipySum += v;
        const double df = fs / static_cast<double>(x.size());
        EXPECT_NEAR(oursSum * df, meanSquare, 1e-12 * meanSquare);
        EXPECT_NEAR(scipySum * df, meanSquare, 1e-12 * meanSquare);
    }
}

// ---- statistics ---------------------------------------------------------------------------------

// Source: scipy.stats.kurtosis(x, fisher=False) (Pearson, biased, = m4 / m2^2) and
// scipy.stats.skew(x) (biased, m3 / m2^1.5), numpy.mean, numpy.std (ddof 0), numpy.ptp
// (scipy 1.10.1 / numpy 1.24.2, Debian bookworm) on Gaussian, sine (kurtosis 1.5), impulsive,
// exponential and mixed records of 4093, 8191 and 20000 samples.
TEST_F(ScipyCrossCheck, WaveformStatisticsMatchScipyStats) {
    const auto cases = names("stats/");
    EXPECT_EQ(cases.size(), 6u);
    for (const std::string& sid : cases) {
        SCOPED_TRACE("stats " + sid);
        const Values& e = record("stats/" + sid); // kurtosis, skew, mean, std, max|x - mean|, ptp
        ASSERT_EQ(e.size(), 6u);
        const Values& x = record("signal/" + sid);
        const dsp::WaveformStatistics s = dsp::waveformStatistics(x);
        EXPECT_EQ(s.count, x.size());
        EXPECT_EQ(s.nonFiniteCount, 0u);
        EXPECT_NEAR(s.kurtosis, e[0], 1e-10 * e[0]);
        EXPECT_NEAR(s.skewness, e[1], 1e-10 * std::max(1.0, std::abs(e[1])));
        EXPECT_NEAR(s.dcOffset, e[2], 1e-12 * e[3]); // relative to the spread: the mean may be ~0
        EXPECT_NEAR(s.rms, e[3], 1e-10 * e[3]);
        EXPECT_NEAR(s.peak, e[4], 1e-10 * e[4]);
        EXPECT_NEAR(s.peakToPeak, e[5], 1e-12 * e[5]);
        EXPECT_NEAR(s.crestFactor, e[4] / e[3], 1e-10 * e[4] / e[3]);
    }
    // REFERENCE.md 8.2: a sine over whole periods has Pearson kurtosis 1.5 and skewness 0.
    EXPECT_NEAR(record("stats/stat-sine").at(0), 1.5, 1e-12);
    EXPECT_NEAR(dsp::waveformStatistics(record("signal/stat-sine")).kurtosis, 1.5, 1e-12);
}

// ---- Hilbert envelope ---------------------------------------------------------------------------

// Our envelope of the whole band: extractBand(RecordSpectrum(x, fs), 0, hi, N, taper 0). With
// lo = 0 there is no frequency shift, and with minLength = N and an FFTW-fast N the output has N
// samples at fs: z[m] = (2/N) sum_{k=0}^{kh} X[k] exp(+j 2 pi k m / N) with X the FFT of x - mean.
// scipy.signal.hilbert computes ifft(fft(x) h), h = 1 at DC, 2 on 0 < k < N/2, 1 at k = N/2
// (even N), 0 for negative frequencies. Both are FFT-based over the same N points (the analytic
// signal of the periodic extension), so there are no edge effects to exclude: they agree at every
// sample when the line sets agree, i.e. for odd N (no Nyquist line) and, for even N, when the
// Nyquist line is not in the band. The DC line is ~0 after mean removal on both sides.
// When N is not FFTW-fast, extractBand pads the inverse transform to M = nextFastFftSize(N): z is
// the analytic signal resampled to M points, which scipy.signal.resample(hilbert(x), M) computes
// the same way (zero-padding the spectrum, times M / N) for odd N.
// Tolerance: 1e-9 x the envelope's maximum at every sample (measured ~1e-15).
void compareEnvelope(const std::string& key, bool expectReal) {
    const auto parts = split(key, '/'); // am<N>/<band>/<M>
    ASSERT_EQ(parts.size(), 3u) << key;
    const std::string& sid = parts[0];
    const Values& x = record("signal/" + sid);
    const double fs = sampleRate(sid);
    const std::size_t n = x.size(), m = toSize(parts[2]);
    const Values& expected = record("hilbert/" + key);
    ASSERT_EQ(expected.size(), m) << key;

    const dsp::RecordSpectrum whole(x, fs);
    const double df = whole.lineSpacingHz();
    // "full": up to fs/2 (kh = floor(N/2)); "belownyq": half a line below, kh = N/2 - 1.
    const double hi = parts[1] == "full" ? fs / 2.0 : fs / 2.0 - df / 2.0;
    const dsp::BandSignal band = dsp::extractBand(whole, 0.0, hi, n, 0.0);
    ASSERT_EQ(band.samples.size(), m) << key;
    EXPECT_EQ(band.loHz, 0.0) << key;
    EXPECT_DOUBLE_EQ(band.sampleRateHz, static_cast<double>(m) * df) << key;
    Values ours(m);
    for (std::size_t i = 0; i < m; ++i) ours[i] = std::abs(band.samples[i]);
    EXPECT_TRUE(allClose("|z| " + key, ours, expected, 0.0, 1e-9 * maxAbs(expected)));

    if (expectReal) {
        // Re z = x - mean: the analytic signal's real part is the signal (scipy-independent check).
        double mean = 0;
        for (double v : x) mean += v;
        mean /= static_cast<double>(n);
        Values re(n), xc(n);
        for (std::size_t i = 0; i < n; ++i) {
            re[i] = band.samples[i].real();
            xc[i] = x[i] - mean;
        }
        EXPECT_TRUE(allClose("Re z " + key, re, xc, 0.0, 1e-9 * maxAbs(xc)));
    }
}

// Source: |scipy.signal.hilbert(x - mean)| (scipy 1.10.1, Debian bookworm; Marple 1999) and
// |scipy.signal.resample(hilbert(x - mean), M)|, for an AM carrier plus noise at fs = 10 N Hz:
// N = 1125, 2401, 3375 (odd and fast), 4093 (prime), 4097 (odd, padded to 4096 / 4116); and, for
// the even N = 1000, 1024, 20000, the record with its Nyquist line removed (band up to fs/2 minus
// half a line).
TEST_F(ScipyCrossCheck, AnalyticSignalEnvelopeMatchesHilbert) {
    std::size_t compared = 0;
    for (const std::string& key : names("hilbert/")) {
        const auto parts = split(key, '/');
        ASSERT_EQ(parts.size(), 3u) << key;
        const std::size_t n = record("signal/" + parts[0]).size();
        if (parts[1] == "full" && n % 2 == 0) continue; // the Nyquist case: see the next test
        SCOPED_TRACE("hilbert " + key);
        // Re z = x - mean only when z covers the whole record (not padded, Nyquist line kept).
        compareEnvelope(key, parts[1] == "full" && n == toSize(parts[2]));
        ++compared;
    }
    EXPECT_EQ(compared, 8u) << "unexpected number of Hilbert cases from the script";
}

// Source: |scipy.signal.hilbert(x - mean)| (scipy 1.10.1, Debian bookworm) for even N = 1000,
// 1024, 20000 with the band running up to fs/2, i.e. including the Nyquist line.
TEST_F(ScipyCrossCheck, AnalyticSignalEnvelopeWithNyquistLineMatchesHilbert) {
    // Regression: extractBand once weighted the Nyquist line by 2/N instead of 1/N.
    std::size_t compared = 0;
    for (const std::string& key : names("hilbert/")) {
        const auto parts = split(key, '/');
        ASSERT_EQ(parts.size(), 3u) << key;
        if (parts[1] != "full" || record("signal/" + parts[0]).size() % 2 != 0) continue;
        SCOPED_TRACE("hilbert " + key);
        compareEnvelope(key, true);
        ++compared;
    }
    EXPECT_EQ(compared, 3u) << "unexpected number of even-length Hilbert cases from the script";
}

// ---- REFERENCE.md 1.5 check values --------------------------------------------------------------

// Source: REFERENCE.md 1.5 (Heinzel et al. 2002 section 9 scaling; numbers computed there with
// scipy 1.10.1), recomputed by tests/reference/scipy_reference.py with scipy.signal.periodogram:
// fs = 1024 Hz, N = 1024, x = 2 sin(2 pi f t), f = 100 Hz (bin-centred) and 100.5 Hz (between
// lines). Per window: PS and PSD at 100 Hz, the peak-line amplitude sqrt(2 max PS), and the
// band power sum(PSD df) over lines 95..105. Ours go through averagedSpectrum (one segment) and
// bandRms; against scipy 1e-9 relative, against the sheet's 4 printed decimals 5e-5.
// HFT95 is not in the sheet's 1.5 (its flat-top there is scipy's `flattop`); for it the sheet
// gives NENBW 3.8112 bins (1.3, Heinzel Table 2), so PSD = 2 / 3.8112 at df = 1 Hz, and a
// flatness of +0.0044/-0.0039 dB for the between-lines amplitude.
TEST_F(ScipyCrossCheck, Reference15CheckValues) {
    using dsp::SpectrumScale;
    const double fs = 1024.0;
    const std::size_t n = 1024;
    struct Printed { double ps100, psd100, peakAmp, band; }; // NaN: not printed in the sheet
    const double nan = std::nan("");
    const std::map<std::string, std::map<std::string, Printed>> sheet = {
        {"bin", {{"boxcar", {2.0, 2.0, 2.0, 2.0}}, {"hann", {2.0, 1.3333, 2.0, 2.0}}, {"hft95", {2.0, 2.0 / 3.8112, 2.0, 2.0}}}},
        {"offbin", {{"boxcar", {nan, nan, 1.2760, 1.9264}}, {"hann", {nan, nan, 1.6977, 2.0000}}, {"hft95", {nan, nan, nan, 2.0000}}}},
    };
    std::size_t compared = 0;
    const std::pair<std::string, double> tones[] = {{"bin", 100.0}, {"offbin", 100.5}};
    for (const auto& [label, f0] : tones) {
        // Same samples as the script's 2 sin(2 pi f0 n / fs) up to rounding (~1e-15).
        const Values x = test::sine(2.0, f0, fs, n);
        for (const std::string w : {"boxcar", "hann", "hft95"}) {
            SCOPED_TRACE(label + " " + w);
            const Values& e = record("ref15/" + label + "/" + w);
            ASSERT_EQ(e.size(), 4u);
            const dsp::Spectrum rms = ourSpectrum(x, fs, windowSpec(w), n, 0, SpectrumScale::Rms);
            const dsp::Spectrum psd = ourSpectrum(x, fs, windowSpec(w), n, 0, SpectrumScale::Psd);
            const dsp::Spectrum peak = ourSpectrum(x, fs, windowSpec(w), n, 0, SpectrumScale::Peak);
            ASSERT_EQ(psd.values.size(), n / 2 + 1);
            EXPECT_DOUBLE_EQ(psd.frequencyHz(100), 100.0);
            const double ps100 = rms.values[100] * rms.values[100];
            const double peakAmp = *std::max_element(peak.values.begin(), peak.values.end());
            const double bandPower = std::pow(dsp::bandRms(rms, 95.0, 105.0), 2.0);
            double psdSum = 0;
            for (std::size_t k = 95; k <= 105; ++k) psdSum += psd.values[k] * psd.resolutionHz;

            EXPECT_NEAR(ps100, e[0], 1e-9 * e[0]);
            EXPECT_NEAR(psd.values[100], e[1], 1e-9 * e[1]);
            EXPECT_NEAR(peakAmp, e[2], 1e-9 * e[2]);
            EXPECT_NEAR(bandPower, e[3], 1e-9 * e[3]);
            EXPECT_NEAR(psdSum, e[3], 1e-9 * e[3]);

            const Printed& p = sheet.at(label).at(w);
            if (!std::isnan(p.ps100)) { EXPECT_NEAR(ps100, p.ps100, 5e-5); }
            if (!std::isnan(p.psd100)) { EXPECT_NEAR(psd.values[100], p.psd100, 5e-5); }
            if (!std::isnan(p.peakAmp)) { EXPECT_NEAR(peakAmp, p.peakAmp, 5e-5); }
            EXPECT_NEAR(bandPower, p.band, 5e-5);
            if (w == "hft95" && label == "offbin") {
                // Flatness: the amplitude between lines is within +0.0044 / -0.0039 dB of 2.
                EXPECT_LE(20.0 * std::log10(peakAmp / 2.0), 0.0044 + 1e-4);
                EXPECT_GE(20.0 * std::log10(peakAmp / 2.0), -0.0039 - 1e-4);
            }
            ++compared;
        }
    }
    EXPECT_EQ(compared, 6u);
}

TEST_F(ScipyCrossCheck, ReferenceFileNamesItsScipyVersion) {
    const Values& v = record("meta/versions");
    ASSERT_EQ(v.size(), 3u);
    // Informational: the values above were produced by this scipy; the comments cite 1.10.1.
    RecordProperty("scipy_version", std::to_string(static_cast<int>(v[0])) + "." + std::to_string(static_cast<int>(v[1])) +
                                        "." + std::to_string(static_cast<int>(v[2])));
    EXPECT_GE(v[0] * 100 + v[1], 110.0) << "scipy older than 1.10";
}

} // namespace
} // namespace humwise
