#include "core/dsp/Envelope.h"

#include <algorithm>
#include <cmath>
#include <stdexcept>
#include <string>

namespace humwise::dsp {

Result<EnvelopeResult, AnalysisError> envelopeSpectrum(std::span<const double> x, double fs, const EnvelopeRequest& r) {
    using Code = AnalysisError::Code;
    if (!(fs > 0)) return fail(AnalysisError{Code::InvalidRequest, "envelope: sample rate must be > 0"});
    if (x.size() < 256) return fail(AnalysisError{Code::RecordTooShort, "envelope: the record needs at least 256 samples"});
    return envelopeSpectrum(RecordSpectrum(x, fs), r);
}

Result<EnvelopeResult, AnalysisError> envelopeSpectrum(const RecordSpectrum& record, const EnvelopeRequest& r) {
    using Code = AnalysisError::Code;
    const double fs = record.sampleRateHz();
    if (record.length() < 256) return fail(AnalysisError{Code::RecordTooShort, "envelope: the record needs at least 256 samples"});
    EnvelopeResult out;
    if (r.autoBand) {
        try {
            out.kurtogram = fastKurtogram(record, r.kurtogram);
        } catch (const std::invalid_argument& e) {
            return fail(AnalysisError{Code::InvalidRequest, std::string("envelope: ") + e.what()});
        }
        out.bandLowHz = out.kurtogram->best.loHz;
        out.bandHighHz = out.kurtogram->best.hiHz;
    } else {
        out.bandLowHz = r.bandLowHz;
        out.bandHighHz = r.bandHighHz;
    }
    if (!(out.bandHighHz > out.bandLowHz) || out.bandLowHz < 0 || out.bandHighHz > fs / 2)
        return fail(AnalysisError{Code::InvalidRequest, "envelope: the band must satisfy 0 <= low < high <= fs/2"});

    SpectrumRequest sr = r.spectrum;
    const double askedFmax = sr.fmaxHz.value_or(kDefaultEnvelopeFmaxHz);
    if (!(askedFmax > 0) || !std::isfinite(askedFmax))
        return fail(AnalysisError{Code::InvalidRequest, "envelope: fmax must be > 0 Hz"});
    // No envelope line lies above the record's Nyquist frequency (the band is no wider); a larger
    // fmax would only ask for a longer band signal (and, absurdly large, more memory than exists).
    const double fmax = std::min(askedFmax, fs / 2);
    sr.fmaxHz = fmax;
    // The (squared) envelope spans up to the band's width: sample at >= 2 x width and >= 2.56 fmax.
    const double df = record.lineSpacingHz();
    const auto widthLines = static_cast<std::size_t>(std::ceil((out.bandHighHz - out.bandLowHz) / df)) + 1;
    const auto fmaxLines = static_cast<std::size_t>(std::ceil(2.56 * fmax / df));
    BandSignal band;
    try {
        // A length that is a multiple of 8: the envelope's rate is free (its spectrum's lines are
        // set by the resolution below), and a length such as 25 725 = 3 5^2 7^3 made both this
        // transform and the envelope's segments (12 863 = 19 x 677 points) slow to plan and run.
        band = extractBand(record, out.bandLowHz, out.bandHighHz, std::max(2 * widthLines, fmaxLines), 0.1, 8);
    } catch (const std::invalid_argument& e) {
        return fail(AnalysisError{Code::InvalidRequest, std::string("envelope: ") + e.what()});
    }
    out.bandLowHz = band.loHz;
    out.bandHighHz = band.hiHz;
    out.envelopeRateHz = band.sampleRateHz;

    std::vector<double> env(band.samples.size());
    std::transform(band.samples.begin(), band.samples.end(), env.begin(),
                   [&](const std::complex<double>& z) { return r.squared ? std::norm(z) : std::abs(z); });
    if (!sr.lines && !sr.resolutionHz) {
        // About 0.5 Hz lines when the record allows, else one segment of the whole envelope.
        const double wanted = std::max(0.5, band.sampleRateHz / static_cast<double>(env.size()));
        sr.resolutionHz = wanted;
    }
    sr.removeMean = true;
    auto spectrum = averagedSpectrum(env, band.sampleRateHz, sr);
    if (!spectrum) return fail(spectrum.error());
    out.spectrum = std::move(spectrum).value();
    return out;
}

} // namespace humwise::dsp
