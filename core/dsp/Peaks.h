#pragma once
// Peak detection on a spectrum, with the frequency and amplitude of tones that fall between
// lines recovered by interpolation.
//
// Estimator: window-matched two-line ratio. For the highest line k of a peak and its larger
// neighbour k+s (s = +-1), with amplitudes A_k >= A_{k+s}, the offset d in [0, 0.5] solves
//     A_{k+s} / A_k = |W(1 - d)| / |W(d)|
// where W is the exact DTFT of the spectrum's window (closed form for cosine-sum windows, the
// numerical DTFT for Kaiser). Then f = f_k + s d df and A = A_k / |W(d)|. For the Hann window
// this is Grandke's estimator, d = (2r - 1) / (r + 1) (T. Grandke, "Interpolation algorithms
// for discrete Fourier transforms of weighted signals", IEEE Trans. Instrum. Meas. 32(2), 1983).
// For a zero-padded transform the offset is scaled by N / Nfft. PSD lines are converted to
// amplitudes (square root) for the ratio, and the corrected value is returned in the
// spectrum's own scale.

#include "core/dsp/Spectrum.h"

#include <cstddef>
#include <limits>
#include <vector>

namespace humwise::dsp {

struct Peak {
    double frequencyHz = 0;
    double amplitude = 0;  // interpolated, in the spectrum's scale and unit
    std::size_t line = 0;  // index of the highest line
    double prominence = 0; // amplitude / local floor (median of the neighbourhood), >= 0
};

struct PeakRequest {
    std::size_t maxPeaks = 10;
    double minFrequencyHz = 0;
    double maxFrequencyHz = std::numeric_limits<double>::infinity();
    double minProminence = 0;       // keep peaks whose amplitude / local floor >= this
    std::size_t floorHalfWidth = 25; // lines each side for the local-floor median
};

// Local maxima whose interpolated frequency lies in [minFrequencyHz, maxFrequencyHz], strongest
// first (by interpolated amplitude).
std::vector<Peak> findPeaks(const Spectrum& s, const PeakRequest& request = {});

// Interpolated frequency and amplitude of the local maximum at `line` (which must be a
// line index of `s`).
Peak interpolatePeak(const Spectrum& s, std::size_t line);

// Median of the lines within +-halfWidth of `line`, excluding +-3 lines around it (in the
// spectrum's scale): the local noise floor.
double localFloor(const Spectrum& s, std::size_t line, std::size_t halfWidth);

// The window's normalised DTFT magnitude |W(d)| / |W(0)| at an offset of d lines of a
// length-n transform; exact for cosine-sum windows.
double windowKernel(const WindowSpec& spec, std::size_t n, double offsetLines);

} // namespace humwise::dsp
