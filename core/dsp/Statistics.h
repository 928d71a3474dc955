#pragma once
// Time-waveform statistics (definitions: REFERENCE.md 8.2; Heinzel et al. 2002 section 6.1).
//
// Conventions, computed over the finite samples only (non-finite ones are counted apart):
//   dcOffset    mean
//   rms         sqrt(mean((x - mean)^2))        the AC RMS: the DC offset is reported apart
//   peak        max |x - mean|
//   peakToPeak  max(x) - min(x)
//   crestFactor peak / rms
//   kurtosis    E[(x - mean)^4] / sigma^4       Pearson's (not excess): Gaussian 3, sine 1.5
//   skewness    E[(x - mean)^3] / sigma^3
// sigma is the population standard deviation (divisor n), equal to rms above.

#include <cstddef>
#include <span>

namespace humwise::dsp {

struct WaveformStatistics {
    std::size_t count = 0;          // finite samples used
    std::size_t nonFiniteCount = 0; // NaN or infinite samples skipped
    double dcOffset = 0;
    double rms = 0;
    double peak = 0;
    double peakToPeak = 0;
    double crestFactor = 0;
    double kurtosis = 0;
    double skewness = 0;
    double minimum = 0;
    double maximum = 0;
};

WaveformStatistics waveformStatistics(std::span<const double> x);

} // namespace humwise::dsp
