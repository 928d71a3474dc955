#include "core/diagnosis/SpectralLines.h"

#include "core/dsp/Peaks.h"

#include <algorithm>
#include <cmath>

namespace humwise::diagnosis {

LineReading readLine(const dsp::Spectrum& s, double expectedHz, double tol, double minProminence) {
    LineReading r;
    r.expectedHz = r.measuredHz = expectedHz;
    if (s.values.empty() || expectedHz < s.startHz || expectedHz > s.frequencyHz(s.lineCount() - 1)) return r;
    dsp::PeakRequest q;
    q.maxPeaks = 3;
    q.minFrequencyHz = expectedHz - tol;
    q.maxFrequencyHz = expectedHz + tol;
    q.minProminence = minProminence;
    const auto peaks = dsp::findPeaks(s, q);
    if (!peaks.empty()) {
        const auto& p = peaks.front();
        r.measuredHz = p.frequencyHz;
        r.amplitude = p.amplitude;
        r.prominence = p.prominence;
        r.found = true;
        return r;
    }
    const auto k = static_cast<std::size_t>(std::llround((expectedHz - s.startHz) / s.resolutionHz));
    r.amplitude = s.values[std::min(k, s.lineCount() - 1)];
    return r;
}

double lineTolerance(const dsp::Spectrum& s, double f) { return std::max(1.5 * s.resolutionHz, 0.002 * f); }

} // namespace humwise::diagnosis
