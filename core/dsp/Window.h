#pragma once
// DFT windows.
//
// Definitions (Harris 1978, "On the use of windows for harmonic analysis with the discrete
// Fourier transform", Proc. IEEE 66(1); Heinzel, Ruediger & Schilling 2002, "Spectrum and
// spectral density estimation by the DFT", MPI Hannover; REFERENCE.md section 1), with
// x = 2 pi n / N:
//   rectangular      1
//   Hann             0.5 - 0.5 cos(x)
//   Hamming          0.54 - 0.46 cos(x)
//   Blackman-Harris  0.35875 - 0.48829 cos(x) + 0.14128 cos(2x) - 0.01168 cos(3x)   (4-term, -92 dB)
//   Kaiser(beta)     I0(beta sqrt(1 - (2n/N - 1)^2)) / I0(beta)          (beta = pi * Harris's alpha)
//   flat-top         Heinzel HFT95: 1 - 1.9383379 cos(x) + 1.3045202 cos(2x) - 0.4028270 cos(3x)
//                                   + 0.0350665 cos(4x)   (PSLL -95.0 dB, NENBW 3.8112 bins,
//                                   amplitude flatness +0.0044 dB; Heinzel et al. 2002 Table 2)
//
// Symmetry: Periodic ("DFT-even", the default, what spectra use: the symmetric window of
// length N+1 with its last sample dropped) or Symmetric (denominator N-1, for filter design).
// Every window is normalised to a peak value of 1 (the flat-top's coefficients sum to 4.68 and
// are divided by that); spectra use the window sums S1 and S2, so the normalisation cancels.

#include <cstddef>
#include <memory>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace humwise::dsp {

enum class WindowKind { Rectangular, Hann, Hamming, BlackmanHarris, Kaiser, FlatTop };
enum class WindowSymmetry { Periodic, Symmetric };

struct WindowSpec {
    WindowKind kind = WindowKind::Hann;
    double kaiserBeta = 9.42477796076938; // 3 pi, Harris alpha = 3; used only for Kaiser
};

// Parses "rect", "rectangular", "hann", "hanning", "hamming", "blackman-harris", "kaiser:BETA",
// "flattop" / "flat-top" / "hft95". Returns nullopt for anything else.
std::optional<WindowSpec> parseWindowSpec(std::string_view text);
std::string windowName(const WindowSpec& spec); // "hann", "kaiser:9.425", ...

std::vector<double> makeWindow(const WindowSpec& spec, std::size_t n,
                               WindowSymmetry symmetry = WindowSymmetry::Periodic);

// A window and its sums S1 = sum w[n], S2 = sum w[n]^2 (the scaling sums of Heinzel, Ruediger and
// Schilling, "Spectrum and spectral density estimation by the DFT", 2002).
struct SummedWindow {
    std::shared_ptr<const std::vector<double>> samples;
    double s1 = 0, s2 = 0;
};

// The same window from a small process-wide cache (thread-safe), for hot paths that ask for the
// same window again and again (every spectrum of a route uses a handful of lengths), with its
// sums computed once (for a zoom's 200 000-point window, two passes per record otherwise).
SummedWindow cachedWindow(const WindowSpec& spec, std::size_t n);

// Modified Bessel function of the first kind, order 0 (power series; relative error < 1e-15
// for the arguments windows use).
double besselI0(double x);

// Magnitude of the window's DTFT at `offsetBins` (in bins of a length-N transform, N = w.size()),
// normalised to 1 at zero offset: |sum w[n] exp(-j 2 pi d n / N)| / sum w[n].
double windowResponse(const std::vector<double>& w, double offsetBins);

struct WindowMetrics {
    double coherentGain = 0;       // S1 / N
    double nenbwBins = 0;          // N S2 / S1^2
    double scallopingLossDb = 0;   // -20 log10 |W(0.5)| / |W(0)|
    double highestSidelobeDb = 0;  // max sidelobe, dB re main lobe peak (negative)
    double halfPowerWidthBins = 0; // full width at -3.0 dB (Heinzel's convention)
};

// Computed from the window samples; the sidelobe search zero-pads `padFactor` times.
WindowMetrics computeWindowMetrics(const std::vector<double>& w, std::size_t padFactor = 64);

} // namespace humwise::dsp
