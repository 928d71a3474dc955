#include "core/dsp/Statistics.h"

#include "core/dsp/SampleExtent.h"

#include <algorithm>
#include <cmath>

namespace humwise::dsp {

WaveformStatistics waveformStatistics(std::span<const double> x) {
    WaveformStatistics s;
    const SampleExtent e = sampleExtent(x);
    s.nonFiniteCount = e.nonFinite;
    s.count = x.size() - e.nonFinite;
    if (s.count == 0) return s;
    s.minimum = e.lo;
    s.maximum = e.hi;
    const double n = static_cast<double>(s.count);
    s.dcOffset = e.sum / n;
    // max |x - mean| sits at an extreme (rounding is monotonic, so this is exact).
    s.peak = std::max(s.maximum - s.dcOffset, s.dcOffset - s.minimum);
    auto [m2, m3, m4] = centralPowerSums(x, s.dcOffset, e.nonFinite == 0);
    m2 /= n;
    m3 /= n;
    m4 /= n;
    s.rms = std::sqrt(m2);
    s.peakToPeak = s.maximum - s.minimum;
    if (m2 > 0) {
        s.crestFactor = s.peak / s.rms;
        s.kurtosis = m4 / (m2 * m2);
        s.skewness = m3 / (m2 * s.rms);
    }
    return s;
}

} // namespace humwise::dsp
