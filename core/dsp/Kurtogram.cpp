#include "core/dsp/Kurtogram.h"

#include "core/util/Sums.h"

#include <algorithm>
#include <cmath>
#include <utility>
#include <vector>
#include <stdexcept>

namespace humwise::dsp {
namespace {

// Average power density of the record, unit^2 per Hz, from its one-sided lines.
double averageDensity(const RecordSpectrum& spectrum) {
    // sum |X_k|^2 is the sum of the squares of the lines' real and imaginary parts, which
    // std::complex lays out as an array of doubles ([complex.numbers]); summed in lanes.
    const auto bins = spectrum.bins();
    const double sum = util::deviationSums({reinterpret_cast<const double*>(bins.data()), 2 * bins.size()}, 0.0).squares;
    const double n = static_cast<double>(spectrum.length());
    const double meanSquare = 2.0 * sum / (n * n); // Parseval, one-sided (DC and Nyquist counted twice: negligible)
    return meanSquare / (spectrum.sampleRateHz() / 2.0);
}

} // namespace

Kurtogram fastKurtogram(const RecordSpectrum& spectrum, const KurtogramRequest& r) {
    const double nyquist = spectrum.sampleRateHz() / 2.0;
    int maxLevel = r.maxLevel;
    if (maxLevel < 0) {
        const int fromLength = static_cast<int>(std::floor(std::log2(static_cast<double>(spectrum.length())))) - 7;
        maxLevel = std::max(1, std::min(8, fromLength));
    }
    // The band count (at most 2^28) stays within an int; a deeper level's bands would be 4 lines
    // wide only in a record of more than 2^31 samples (they are skipped below when narrower).
    maxLevel = std::min(maxLevel, 28);
    Kurtogram result;
    result.best.kurtosis = -INFINITY;
    const double df = spectrum.lineSpacingHz();
    const double density = averageDensity(spectrum);
    // The band search compares kurtoses: single precision is plenty (BandSignal.h).
    const SingleLines lines(spectrum);
    // Levels in Antoni's order: 0, 1, 1.6, 2, 2.6, ... (k with 2^k bands, k + log2 3 with 3 * 2^k).
    std::vector<std::pair<double, double>> levels; // (level, band count)
    for (int k = 0; k <= maxLevel; ++k) {
        levels.emplace_back(k, std::pow(2.0, k));
        if (k + std::log2(3.0) <= maxLevel) levels.emplace_back(k + std::log2(3.0), 3.0 * std::pow(2.0, k));
    }
    std::sort(levels.begin(), levels.end());
    for (const auto& [level, bands] : levels) {
        const double width = nyquist / bands;
        if (width < 4 * df) continue; // too few lines for a meaningful statistic
        for (int b = 0; b < static_cast<int>(bands); ++b) {
            KurtogramCell cell;
            cell.level = level;
            cell.loHz = b * width;
            cell.hiHz = (b + 1) * width;
            if (cell.bandwidthHz() < r.minBandwidthHz || cell.loHz < r.minFrequencyHz || cell.hiHz > r.maxFrequencyHz)
                continue;
            // Twice the band's lines: |z|^2 and |z|^4 then keep their full bandwidth.
            const auto widthLines = static_cast<std::size_t>(std::ceil(width / df));
            const BandMoments moments = bandMoments(lines, cell.loHz, cell.hiHz, 2 * widthLines, 0.1);
            cell.kurtosis = moments.kurtosis;
            // z is the amplitude envelope (BandSignal.h), so the band's real signal has mean square <|z|^2> / 2.
            const double bandDensity = 0.5 * moments.meanSquare / cell.bandwidthHz();
            cell.relativeDensityDb = density > 0 && bandDensity > 0 ? 10.0 * std::log10(bandDensity / density) : -INFINITY;
            if (cell.relativeDensityDb < r.minRelativeDensityDb) continue;
            result.cells.push_back(cell);
            if (cell.kurtosis > result.best.kurtosis) result.best = cell;
        }
    }
    if (result.cells.empty())
        throw std::invalid_argument("fastKurtogram: no band satisfies the request (record too short or limits too tight)");
    return result;
}

} // namespace humwise::dsp
