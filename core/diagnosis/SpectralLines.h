#pragma once
// Reading a spectrum at an expected line: the strongest local maximum within a tolerance of the
// expected frequency (interpolated, Peaks.h), its prominence over the local floor, or - when no
// peak is there - the spectrum's value at the expected frequency as an upper bound.

#include "core/dsp/Spectrum.h"

namespace humwise::diagnosis {

struct LineReading {
    double expectedHz = 0;
    double measuredHz = 0;   // = expectedHz when not found
    double amplitude = 0;    // spectrum's scale and unit; the value at expectedHz when not found
    double prominence = 0;   // amplitude / local floor (0 when not found)
    bool found = false;      // a peak with prominence >= minProminence within tolerance
};

LineReading readLine(const dsp::Spectrum& s, double expectedHz, double toleranceHz, double minProminence = 3.0);

// Tolerance for a line whose frequency is known from the measured operating point: 1.5 lines or
// 0.2 % of the frequency, whichever is larger (common practice).
double lineTolerance(const dsp::Spectrum& s, double frequencyHz);

} // namespace humwise::diagnosis
