#pragma once
// Band-limited analytic signals cut from the spectrum of a whole record.
//
// Method (Randall & Antoni 2011, "Rolling element bearing diagnostics - A tutorial", MSSP 25,
// step 5 of their procedure; REFERENCE.md 8.1): transform the whole record once, keep the
// one-sided lines of the band [lo, hi] (cosine-tapered over 10 % of the band at each edge),
// shift them down to start at 0 Hz and inverse-transform a short length M. The result is the
// analytic band signal, demodulated by lo and decimated to M fs / N without aliasing.
// Scaling: z[m] = (2 / N) sum_i T_i X[k_lo + i] exp(+j 2 pi i m / M) (1 / N for the DC and
// Nyquist lines, as in Marple's analytic signal), so |z| of
// A cos(2 pi f t + phi) with f inside the band is A (its amplitude envelope).

#include <complex>
#include <cstddef>
#include <span>
#include <vector>

namespace humwise::dsp {

class RecordSpectrum {
public:
    // Mean removed; the transform length is the record length.
    RecordSpectrum(std::span<const double> x, double sampleRateHz);

    std::size_t length() const { return m_n; }
    double sampleRateHz() const { return m_fs; }
    double lineSpacingHz() const { return m_fs / static_cast<double>(m_n); }
    std::span<const std::complex<double>> bins() const { return m_bins; }

private:
    std::size_t m_n = 0;
    double m_fs = 0;
    std::vector<std::complex<double>> m_bins; // n/2 + 1 one-sided lines
};

struct BandSignal {
    std::vector<std::complex<double>> samples;
    double sampleRateHz = 0;
    double loHz = 0; // band actually used (rounded to lines)
    double hiHz = 0;
};

// Cuts [loHz, hiHz] out of `spectrum`; the output has at least `minLength` samples (more if the
// band needs them) and a length FFTW transforms fast, a multiple of `lengthMultiple` (Fft.h,
// nextFastFftSize: 8 avoids lengths such as 5^2 7^3 that FFTW transforms at half the speed).
// taperFraction in [0, 0.5].
BandSignal extractBand(const RecordSpectrum& spectrum, double loHz, double hiHz, std::size_t minLength = 0,
                       double taperFraction = 0.1, std::size_t lengthMultiple = 1);

// The moments of the band's complex envelope z (as extractBand would give it), computed where the
// inverse transform leaves it, without copying the signal out: what a kurtogram needs per band.
struct BandMoments {
    double meanSquare = 0; // <|z|^2>
    double kurtosis = 0;   // <|z|^4> / <|z|^2>^2 - 2 : 0 for Gaussian noise, -1 for a steady tone, large for impacts
};
// Single precision runs the inverse transform in float (FFTW's single-precision plans: about half
// the time and memory traffic); the moments are still summed in double. Enough for comparing
// bands by their kurtosis (float keeps 6-7 significant digits; the kurtogram needs 3).
enum class Precision { Double, Single };
BandMoments bandMoments(const RecordSpectrum& spectrum, double loHz, double hiHz, std::size_t minLength = 0, double taperFraction = 0.1,
                        Precision precision = Precision::Double);

// The record's lines narrowed to single precision once, already scaled by 2/N: for many
// single-precision band cuts of one record (the kurtogram's hundreds), each then copies half the
// bytes and scales nothing (bandMoments(spectrum, ..., Precision::Single) makes one per call).
class SingleLines {
public:
    explicit SingleLines(const RecordSpectrum& spectrum);

private:
    friend BandMoments bandMoments(const SingleLines&, double, double, std::size_t, double);
    std::vector<std::complex<float>> m_lines;
    std::size_t m_recordLength = 0;
    double m_lineSpacingHz = 0;
};
BandMoments bandMoments(const SingleLines& lines, double loHz, double hiHz, std::size_t minLength = 0, double taperFraction = 0.1);

} // namespace humwise::dsp
