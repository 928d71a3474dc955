#pragma once
// The smallest and largest finite sample of a record, the sum of the finite samples and how many
// samples are not finite, in one vectorised pass when every sample is finite (the usual case);
// and the sums of powers of the deviations from a centre. Shared by the quality checks and the
// waveform statistics.

#include <cmath>
#include <cstddef>
#include <span>

namespace humwise::dsp {

struct SampleExtent {
    double lo = INFINITY, hi = -INFINITY, sum = 0; // over the finite samples (lo > hi when none)
    std::size_t nonFinite = 0;
};

SampleExtent sampleExtent(std::span<const double> x);

struct CentralPowerSums {
    double m2 = 0, m3 = 0, m4 = 0; // sums of d^2, d^3, d^4 over the finite samples, d = x - about
};

// allFinite (known from sampleExtent: nonFinite == 0) takes four vectorised lanes; otherwise the
// samples that are not finite are skipped one by one.
CentralPowerSums centralPowerSums(std::span<const double> x, double about, bool allFinite);

} // namespace humwise::dsp
