#pragma once
// Comparing two spectra of one point from different rounds, order-normalised: each spectrum's
// frequency axis is divided by the shaft frequency of its round, so a line that follows the
// speed (1X, bearing lines) stays at the same order when the speed moved a little between
// rounds. Lines of B (the newer round) are matched to A at the same order (within 1.5 lines of
// A's resolution, in orders); a line "appeared" when A shows no peak there, and "grew" when it
// rose by at least growDb.

#include "core/dsp/Spectrum.h"

#include <vector>

namespace humwise::dsp {

struct LineChange {
    double order = 0;        // of the line in B
    double frequencyHzA = 0; // where A was read (order x A's shaft frequency)
    double frequencyHzB = 0;
    double amplitudeA = 0;   // A's peak there, or A's value at that order when it has none
    double amplitudeB = 0;
    double changeDb = 0;     // 20 log10(B / A)
    bool appeared = false;
};

struct CompareOptions {
    double growDb = 6.0;
    std::size_t maxLines = 20;  // strongest lines of B examined
    double minProminence = 3.0; // a line of B must stand this far above its floor
};

struct SpectrumComparison {
    std::vector<double> orders;       // common grid
    std::vector<double> a, b;         // both spectra on it (linear interpolation)
    std::vector<double> differenceDb; // 20 log10(b / a), floored at 1e-12 of the largest value
    std::vector<LineChange> changes;  // appeared or grew, largest change first
};

// Both spectra must use the same scale and quantity; throws std::invalid_argument otherwise.
SpectrumComparison compareSpectra(const Spectrum& a, double shaftHzA, const Spectrum& b, double shaftHzB, const CompareOptions& options = {});

} // namespace humwise::dsp
