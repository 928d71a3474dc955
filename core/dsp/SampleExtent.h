#pragma once
// The smallest and largest finite sample of a record, the sum of the finite samples and how many
// samples are not finite, in one vectorised pass when every sample is finite (the usual case).
// Shared by the quality checks and the waveform statistics.

#include <cmath>
#include <cstddef>
#include <span>

namespace humwise::dsp {

struct SampleExtent {
    double lo = INFINITY, hi = -INFINITY, sum = 0; // over the finite samples (lo > hi when none)
    std::size_t nonFinite = 0;
};

SampleExtent sampleExtent(std::span<const double> x);

} // namespace humwise::dsp
