#include "core/dsp/Statistics.h"

#include <algorithm>
#include <cmath>
#include <limits>

namespace humwise::dsp {

WaveformStatistics waveformStatistics(std::span<const double> x) {
    WaveformStatistics s;
    double sum = 0;
    s.minimum = std::numeric_limits<double>::infinity();
    s.maximum = -std::numeric_limits<double>::infinity();
    for (double v : x) {
        if (!std::isfinite(v)) {
            ++s.nonFiniteCount;
            continue;
        }
        ++s.count;
        sum += v;
        s.minimum = std::min(s.minimum, v);
        s.maximum = std::max(s.maximum, v);
    }
    if (s.count == 0) {
        s.minimum = s.maximum = 0;
        return s;
    }
    const double n = static_cast<double>(s.count);
    s.dcOffset = sum / n;
    double m2 = 0, m3 = 0, m4 = 0;
    for (double v : x) {
        if (!std::isfinite(v)) continue;
        const double d = v - s.dcOffset;
        const double d2 = d * d;
        m2 += d2;
        m3 += d2 * d;
        m4 += d2 * d2;
        s.peak = std::max(s.peak, std::abs(d));
    }
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
