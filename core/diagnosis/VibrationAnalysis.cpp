#include "core/diagnosis/VibrationAnalysis.h"

#include "core/dsp/Integration.h"

#include <algorithm>
#include <cmath>
#include <optional>
#include <stdexcept>

namespace humwise::diagnosis {

std::string VibrationProducts::label() const {
    if (!input) return "?";
    return input->name.empty() ? std::string(locationName(input->location)) + "-" + directionName(input->direction) : input->name;
}

namespace {

// Envelope settings shared by the automatic band and a band given by the caller.
dsp::EnvelopeRequest envelopeRequest(double envelopeFmaxHz, double fs) {
    dsp::EnvelopeRequest e;
    e.kurtogram.minBandwidthHz = envelopeFmaxHz;
    // Bands reaching down among the running-speed harmonics and 2x line frequency would
    // demodulate their beats (e.g. 2f - 1X) into false bearing lines; bearing resonances lie
    // higher (Randall & Antoni 2011 remove the discrete part first; keeping the band above
    // twice the envelope's fmax is this project's simpler guard, common practice).
    e.kurtogram.minFrequencyHz = 2.0 * envelopeFmaxHz;
    e.kurtogram.maxFrequencyHz = fs / 2.0;
    e.squared = true;
    e.spectrum.fmaxHz = envelopeFmaxHz;
    e.spectrum.scale = dsp::SpectrumScale::Rms;
    return e;
}

} // namespace

VibrationProducts analyseVibration(const VibrationInput& in, double envelopeFmaxHz, bool slowMachine) {
    if (in.quantity != Quantity::Acceleration && in.quantity != Quantity::Velocity)
        throw std::invalid_argument("vibration channel '" + in.name + "' must be acceleration or velocity");
    const double fs = in.sampleRateHz;
    if (!(fs > 0) || in.samples.size() < static_cast<std::size_t>(fs * 0.5))
        throw std::invalid_argument("vibration channel '" + in.name + "' is shorter than 0.5 s");
    VibrationProducts p;
    p.input = &in;
    p.statistics = dsp::waveformStatistics(in.samples);

    dsp::SpectrumRequest r;
    r.window = {dsp::WindowKind::Hann};
    r.resolutionHz = std::max(0.25, fs / static_cast<double>(in.samples.size()));
    r.fmaxHz = std::min(fs / 2.56, 2000.0);
    r.scale = dsp::SpectrumScale::Rms;
    r.quantity = in.quantity;
    // The envelope's band search needs the whole record's transform; when the spectrum is one
    // segment of the whole record (a route's 4 s at 0.25 Hz lines), it is derived from it too.
    const bool wantsEnvelope = in.quantity == Quantity::Acceleration && fs / 2 > 2 * envelopeFmaxHz;
    std::optional<dsp::RecordSpectrum> record;
    if (wantsEnvelope) record.emplace(in.samples, fs);
    auto s = record ? dsp::averagedSpectrum(*record, in.samples, r) : dsp::averagedSpectrum(in.samples, fs, r);
    if (!s.ok()) throw std::invalid_argument("vibration channel '" + in.name + "': " + s.error().message);
    p.velocity = std::move(s).value();
    dsp::convertSpectrum(p.velocity, Quantity::Velocity, 2.0);
    p.isoBandLowHz = slowMachine ? 2.0 : 10.0;
    p.isoBandHighHz = std::min(1000.0, p.velocity.frequencyHz(p.velocity.lineCount() - 1));
    p.overallVelocityRms = dsp::bandRms(p.velocity, p.isoBandLowHz, p.isoBandHighHz);

    if (wantsEnvelope) {
        dsp::EnvelopeRequest e = envelopeRequest(envelopeFmaxHz, fs);
        e.autoBand = true;
        auto env = dsp::envelopeSpectrum(*record, e);
        if (env.ok()) p.envelope = std::move(env).value();
    }
    return p;
}

std::optional<dsp::EnvelopeResult> envelopeInBand(const VibrationInput& in, double envelopeFmaxHz, double bandLowHz, double bandHighHz) {
    dsp::EnvelopeRequest e = envelopeRequest(envelopeFmaxHz, in.sampleRateHz);
    e.bandLowHz = bandLowHz;
    e.bandHighHz = bandHighHz;
    auto env = dsp::envelopeSpectrum(in.samples, in.sampleRateHz, e);
    if (!env.ok()) return std::nullopt;
    return std::move(env).value();
}

} // namespace humwise::diagnosis
