#pragma once
// Zoom spectrum: fine resolution in a narrow band, for motor-current work (broken-bar sidebands
// a fraction of a hertz from the supply line; REFERENCE.md 4.1).
//
// Method: one long transform. The whole record (N samples, mean removed) is windowed and
// transformed with Nfft >= N points (zero-padded up to fs / resolutionHz when a finer line
// spacing is asked), and only the lines of [centre - span/2, centre + span/2] are kept. The
// true resolution is set by the record length: ENBW = NENBW fs / N (0.01 Hz lines need 100 s;
// zero padding interpolates between them). Scaling as in Spectrum.h with S1, S2 of the
// N-point window. The default window is the 4-term Blackman-Harris (-92 dB sidelobes), which
// keeps a component 60 dB down measurable 5 lines from a strong one.

#include "core/dsp/AnalysisError.h"
#include "core/dsp/Spectrum.h"
#include "core/model/Result.h"

#include <optional>
#include <span>
#include <vector>

namespace humwise::dsp {

struct ZoomRequest {
    double centreHz = 50.0;
    double spanHz = 10.0;
    std::optional<double> resolutionHz; // default: fs / N
    WindowSpec window{WindowKind::BlackmanHarris};
    SpectrumScale scale = SpectrumScale::Rms;
    Quantity quantity = Quantity::Current;
};

// The record's windowed transform (as zoomSpectrum makes it), kept so that several bands can be
// cut from one transform: the supply-frequency search and the current analysis zoom on the same
// phase. Holds |X[k]|^2 of the one-sided lines (8 bytes a line).
class ZoomTransform {
public:
    [[nodiscard]] static Result<ZoomTransform, AnalysisError> of(std::span<const double> x, double sampleRateHz,
                                                                 std::optional<double> resolutionHz = std::nullopt,
                                                                 const WindowSpec& window = WindowSpec{WindowKind::BlackmanHarris});
    // The lines of [centre - span/2, centre + span/2]: what zoomSpectrum gives for the same request.
    [[nodiscard]] Result<Spectrum, AnalysisError> band(double centreHz, double spanHz, SpectrumScale scale = SpectrumScale::Rms,
                                                       Quantity quantity = Quantity::Current) const;
    double sampleRateHz() const { return m_fs; }
    std::size_t recordLength() const { return m_n; }
    const WindowSpec& window() const { return m_window; }

private:
    double m_fs = 0, m_s1 = 0, m_s2 = 0;
    std::size_t m_n = 0, m_nfft = 0;
    WindowSpec m_window;
    std::vector<double> m_power;
};

[[nodiscard]] Result<Spectrum, AnalysisError> zoomSpectrum(std::span<const double> x, double sampleRateHz,
                                                            const ZoomRequest& request);

} // namespace humwise::dsp
