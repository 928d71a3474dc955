#pragma once
// Spectral kurtosis over the band grid of the fast kurtogram.
//
// Band grid: J. Antoni, "Fast computation of the kurtogram for the detection of transient
// faults", MSSP 21(1), 2007: level k splits [0, fs/2] into 2^k bands of width fs / 2^(k+1);
// the 1/3-binary levels k + log2(3) split it into 3 * 2^k bands of width fs / (3 * 2^(k+1)).
// Levels run 0, 1, 1.6, 2, 2.6, ... up to maxLevel (Antoni's code caps it near log2(N) - 7).
// Band filtering here is done in the frequency domain (BandSignal.h: the band's lines of the
// whole-record DFT) rather than by Antoni's quasi-analytic FIR tree; the grid and the
// statistic are his. Statistic: kurtosis of the complex envelope z of each band,
//     SK = <|z|^4> / <|z|^2>^2 - 2       (Gaussian noise -> 0, a pure tone -> -1)
// (Antoni 2006, MSSP 20(2); REFERENCE.md 8.1, marked "from memory (verify)" there).

#include "core/dsp/BandSignal.h"

#include <limits>
#include <vector>

namespace humwise::dsp {

struct KurtogramCell {
    double level = 0;
    double loHz = 0;
    double hiHz = 0;
    double kurtosis = 0;
    double relativeDensityDb = 0; // band power density re the record's average, dB
    double centreHz() const { return 0.5 * (loHz + hiHz); }
    double bandwidthHz() const { return hiHz - loHz; }
};

struct KurtogramRequest {
    int maxLevel = -1;             // -1: min(8, floor(log2(N)) - 7), at least 1
    double minBandwidthHz = 0;     // skip bands narrower than this (envelope needs room for its lines)
    double minFrequencyHz = 0;     // skip bands starting below this
    double maxFrequencyHz = std::numeric_limits<double>::infinity(); // skip bands ending above this
    // Skip bands whose power density lies more than this many dB below the record's average
    // density: a band that carries no signal (e.g. above the anti-alias filter, where only
    // quantisation remains) can show a large kurtosis that means nothing (common practice).
    double minRelativeDensityDb = -40.0;
};

struct Kurtogram {
    std::vector<KurtogramCell> cells;
    KurtogramCell best; // the cell with the largest kurtosis among those allowed
};

Kurtogram fastKurtogram(const RecordSpectrum& spectrum, const KurtogramRequest& request = {});

} // namespace humwise::dsp
