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

namespace humwise::dsp {

struct ZoomRequest {
    double centreHz = 50.0;
    double spanHz = 10.0;
    std::optional<double> resolutionHz; // default: fs / N
    WindowSpec window{WindowKind::BlackmanHarris};
    SpectrumScale scale = SpectrumScale::Rms;
    Quantity quantity = Quantity::Current;
};

[[nodiscard]] Result<Spectrum, AnalysisError> zoomSpectrum(std::span<const double> x, double sampleRateHz,
                                                            const ZoomRequest& request);

} // namespace humwise::dsp
