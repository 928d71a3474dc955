#pragma once
// Averaged (Welch) spectra with explicit one-sided scaling.
//
// Scaling (Heinzel, Ruediger & Schilling 2002, section 9; REFERENCE.md 1.5). For a segment of
// N samples x[n], window w[n], S1 = sum w, S2 = sum w^2, X[k] = sum x[n] w[n] exp(-j2 pi k n/N),
// and <.> the mean over the averaged segments (linear power averaging):
//   Peak        A_pk[k]  = 2 sqrt(<|X[k]|^2>) / S1          amplitude of a bin-centred sine
//   Rms         A_rms[k] = A_pk[k] / sqrt(2)
//   PeakToPeak  A_pp[k]  = 2 A_pk[k]
//   Psd         P[k]     = 2 <|X[k]|^2> / (fs S2)          unit^2/Hz
// At k = 0 and k = N/2 (even N) the factor 2 is dropped (and Rms = Peak there).
// Frequencies: f[k] = startHz + k * resolutionHz, resolutionHz = fs / N (or fs / Nfft for a
// zero-padded transform). ENBW in Hz = fs S2 / S1^2 (for N samples of data).
// With these definitions Parseval holds: sum_k P[k] * resolutionHz = mean square of x.
// Values are in the SI unit of the input's quantity (see core/model/Units.h).

#include "core/dsp/AnalysisError.h"
#include "core/dsp/Window.h"
#include "core/model/Result.h"
#include "core/model/Units.h"

#include <cstddef>
#include <optional>
#include <span>
#include <string>
#include <string_view>
#include <vector>

namespace humwise::dsp {

enum class SpectrumScale { Peak, Rms, PeakToPeak, Psd };

std::optional<SpectrumScale> parseSpectrumScale(std::string_view text); // "peak", "rms", "pp"/"peak-to-peak", "psd"
std::string_view spectrumScaleName(SpectrumScale scale);

struct Spectrum {
    double sampleRateHz = 0;
    double startHz = 0;          // frequency of values[0]
    double resolutionHz = 0;     // line spacing
    double enbwHz = 0;           // equivalent noise bandwidth of one line
    std::size_t segmentLength = 0; // N samples of data per transform
    std::size_t transformLength = 0; // Nfft >= N (zero-padded when larger)
    std::size_t averages = 0;
    WindowSpec window;
    SpectrumScale scale = SpectrumScale::Rms;
    Quantity quantity = Quantity::Acceleration;
    std::vector<double> values;

    double frequencyHz(std::size_t k) const { return startHz + static_cast<double>(k) * resolutionHz; }
    std::size_t lineCount() const { return values.size(); }
};

struct SpectrumRequest {
    WindowSpec window;                       // Hann by default
    std::optional<std::size_t> lines;        // lines from 0 to fmax; with fmax sets the resolution
    std::optional<double> resolutionHz;      // line spacing (alternative to lines)
    std::optional<double> fmaxHz;            // default fs / 2.56, capped at fs / 2
    std::optional<std::size_t> averages;     // default: as many segments as the record holds
    double overlap = 0.5;                    // fraction of a segment, 0 <= overlap < 1
    SpectrumScale scale = SpectrumScale::Rms;
    bool removeMean = true;                  // subtract each segment's mean before windowing
    Quantity quantity = Quantity::Acceleration;
};

// Default number of lines when neither lines nor resolution is asked for (common practice of
// portable analysers: 3200 lines over fs / 2.56, i.e. an 8192-point transform). When the record
// is shorter, the default shrinks to one segment of the whole record.
inline constexpr std::size_t kDefaultLines = 3200;

[[nodiscard]] Result<Spectrum, AnalysisError> averagedSpectrum(std::span<const double> x, double sampleRateHz,
                                                                const SpectrumRequest& request);

class RecordSpectrum; // BandSignal.h: the DFT of a whole record, mean removed
// The same spectrum, derived from `record` (the transform of `x`) without transforming again when
// the request is one segment of the whole record, mean removed, with a cosine-sum window (its DFT
// has a few lines only: the windowed lines are a short convolution of the record's); otherwise
// computed from `x` as above. Equal to the above to rounding (tests: within 1e-12 of the largest
// line).
[[nodiscard]] Result<Spectrum, AnalysisError> averagedSpectrum(const RecordSpectrum& record, std::span<const double> x,
                                                                const SpectrumRequest& request);

// The same scaling applied to one transform's squared magnitudes (shared with zoom spectra).
// `power[k]` holds <|X[k]|^2>; `isEdge` says whether a line is DC or Nyquist (no factor 2).
double scaleLine(double meanSquaredMagnitude, bool isEdge, SpectrumScale scale, double s1, double s2,
                 double sampleRateHz);

// Mean square (power, unit^2) that one line represents: PS[k] / NENBW, so that summing over
// lines of a band gives the band's mean square whatever the scale.
double lineMeanSquare(const Spectrum& s, std::size_t k);

// RMS in the band [loHz, hiHz] (lines whose frequency lies inside, ends included).
double bandRms(const Spectrum& s, double loHz, double hiHz);

// Converts a spectrum between scales (Peak, Rms, PeakToPeak, Psd) in place.
void rescale(Spectrum& s, SpectrumScale to);

// dB of one value: amplitude scales 20 log10(v / ref); PSD 10 log10(v / ref^2).
double toDb(double value, SpectrumScale scale, double reference);

} // namespace humwise::dsp
