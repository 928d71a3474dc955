#include "app/cli/SpectrumCommand.h"

#include "app/cli/CliError.h"
#include "app/cli/RecordingOptions.h"
#include "core/dsp/Envelope.h"
#include "core/dsp/Integration.h"
#include "core/dsp/Peaks.h"
#include "core/dsp/Quality.h"
#include "core/dsp/Spectrum.h"
#include "core/dsp/Zoom.h"
#include "core/util/JsonWriter.h"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <optional>

namespace humwise::cli {
namespace {

enum class Kind { Averaged, Envelope, Zoom };

struct Computed {
    Kind kind = Kind::Averaged;
    dsp::Spectrum spectrum;          // SI units
    std::optional<dsp::EnvelopeResult> envelope;
    bool squaredEnvelope = false;
};

dsp::SpectrumRequest spectrumRequest(const ParsedArgs& a, Quantity quantity) {
    dsp::SpectrumRequest r;
    if (const auto w = a.value("window")) {
        const auto spec = dsp::parseWindowSpec(*w);
        if (!spec) throw UsageError("--window must be rect, hann, hamming, blackman-harris, kaiser:BETA or flattop, got '" + *w + "'");
        r.window = *spec;
    }
    if (a.has("lines") && a.has("resolution")) throw UsageError("give either --lines or --resolution, not both");
    if (const auto l = a.integer("lines")) {
        if (*l < 1 || *l > (1 << 24)) throw UsageError("--lines must be between 1 and 16777216");
        r.lines = static_cast<std::size_t>(*l);
    }
    if (const auto res = a.number("resolution")) {
        if (!(*res > 0)) throw UsageError("--resolution must be > 0 Hz");
        r.resolutionHz = res;
    }
    if (const auto f = a.number("fmax")) {
        if (!(*f > 0)) throw UsageError("--fmax must be > 0 Hz");
        r.fmaxHz = f;
    }
    if (const auto n = a.integer("averages")) {
        if (*n < 1 || *n > 100000) throw UsageError("--averages must be between 1 and 100000");
        r.averages = static_cast<std::size_t>(*n);
    }
    r.overlap = a.number("overlap", 0.5);
    if (!(r.overlap >= 0 && r.overlap < 1)) throw UsageError("--overlap must be in [0, 1)");
    if (const auto s = a.value("scale")) {
        const auto scale = dsp::parseSpectrumScale(*s);
        if (!scale) throw UsageError("--scale must be peak, rms, pp or psd, got '" + *s + "'");
        r.scale = *scale;
    }
    r.quantity = quantity;
    return r;
}

Computed compute(const ParsedArgs& a, const Channel& ch, double fs) {
    const dsp::SpectrumRequest request = spectrumRequest(a, ch.quantity);
    if (a.has("zoom") && a.has("envelope")) throw UsageError("--zoom and --envelope cannot be combined");
    Computed c;
    if (const auto z = a.value("zoom")) {
        const auto [centre, span] = parseRange(*z, "zoom");
        if (!(span > 0)) throw UsageError("--zoom CENTRE:SPAN needs a span > 0 Hz");
        dsp::ZoomRequest zr;
        zr.centreHz = centre;
        zr.spanHz = span;
        zr.resolutionHz = request.resolutionHz;
        if (a.has("window")) zr.window = request.window;
        zr.scale = request.scale;
        zr.quantity = ch.quantity;
        auto s = dsp::zoomSpectrum(ch.samples, fs, zr);
        if (!s) throw ProcessingError(s.error().message);
        c.kind = Kind::Zoom;
        c.spectrum = std::move(s).value();
        return c;
    }
    if (const auto e = a.value("envelope")) {
        dsp::EnvelopeRequest er;
        if (*e == "auto") {
            er.autoBand = true;
            const double fmax = request.fmaxHz.value_or(dsp::kDefaultEnvelopeFmaxHz);
            er.kurtogram.minBandwidthHz = fmax; // room for the envelope lines up to fmax
        } else {
            const auto [lo, hi] = parseRange(*e, "envelope");
            if (!(lo >= 0 && hi > lo)) throw UsageError("--envelope LO:HI needs 0 <= LO < HI");
            er.bandLowHz = lo;
            er.bandHighHz = hi;
        }
        er.squared = a.has("envelope-squared");
        er.spectrum = request;
        auto r = dsp::envelopeSpectrum(ch.samples, fs, er);
        if (!r) throw ProcessingError(r.error().message);
        c.kind = Kind::Envelope;
        c.squaredEnvelope = er.squared;
        c.envelope = std::move(r).value();
        c.spectrum = c.envelope->spectrum;
        return c;
    }
    auto s = dsp::averagedSpectrum(ch.samples, fs, request);
    if (!s) throw ProcessingError(s.error().message);
    c.spectrum = std::move(s).value();
    return c;
}

const char* kindName(Kind k) {
    switch (k) {
    case Kind::Averaged: return "averaged";
    case Kind::Envelope: return "envelope";
    case Kind::Zoom: return "zoom";
    }
    return "?";
}

} // namespace

int runSpectrum(const std::vector<std::string>& args, std::ostream& out) {
    auto specs = recordingOptionSpecs();
    for (const char* name : {"window", "lines", "resolution", "fmax", "averages", "overlap", "scale", "as", "unit", "zoom",
                             "envelope", "peaks", "band", "cutoff"})
        specs.push_back({name});
    for (const char* flag : {"full", "json", "csv", "envelope-squared", "db"}) specs.push_back({flag, false});
    const ParsedArgs a(args, specs);
    if (a.has("json") && a.has("csv")) throw UsageError("give either --json or --csv, not both");
    if (a.has("envelope-squared") && !a.has("envelope")) throw UsageError("--envelope-squared goes with --envelope");
    if (a.has("db") && a.has("envelope-squared")) throw UsageError("--db does not apply to a squared envelope");
    if (a.has("db") && a.has("unit")) throw UsageError("--db and --unit exclude each other (dB use the ISO 1683 reference)");
    const long long peakCount = a.integer("peaks").value_or(10);
    if (peakCount < 0 || peakCount > 10000) throw UsageError("--peaks must be between 0 and 10000");
    const double cutoff = a.number("cutoff", dsp::kDefaultIntegrationCutoffHz);
    if (!(cutoff >= 0)) throw UsageError("--cutoff must be >= 0 Hz");

    const Recording rec = loadRecording(a);
    const std::size_t index = selectedChannel(a, rec);
    const Channel& ch = rec.channels[index];

    Quantity target = ch.quantity;
    if (const auto as = a.value("as")) {
        const auto q = parseQuantity(*as);
        if (!q || (*q != Quantity::Acceleration && *q != Quantity::Velocity && *q != Quantity::Displacement))
            throw UsageError("--as must be acceleration, velocity or displacement, got '" + *as + "'");
        if (ch.quantity != Quantity::Acceleration && ch.quantity != Quantity::Velocity && ch.quantity != Quantity::Displacement)
            throw UsageError("--as converts vibration only; channel " + std::to_string(index + 1) + " is " + std::string(quantityName(ch.quantity)));
        if (a.has("envelope") && *q != ch.quantity) throw UsageError("--as cannot be used with --envelope (the envelope keeps the input's quantity)");
        target = *q;
    }
    const Unit unit = displayUnit(a, target);

    Computed c = compute(a, ch, rec.sampleRateHz);
    dsp::Spectrum& s = c.spectrum;
    // Peaks are found and interpolated on the spectrum as measured, then converted line by line
    // (Integration.h explains why), and finally put in the display unit with the spectrum.
    dsp::PeakRequest pr;
    pr.maxPeaks = static_cast<std::size_t>(peakCount) * 2; // some may fall below the cut-off
    auto peaks = dsp::findPeaks(s, pr);
    if (target != s.quantity) {
        for (auto& p : peaks) p.amplitude = dsp::convertLine(p.amplitude, p.frequencyHz, s.quantity, target, s.scale, cutoff);
        std::erase_if(peaks, [](const dsp::Peak& p) { return p.amplitude <= 0; });
        std::sort(peaks.begin(), peaks.end(), [](const dsp::Peak& x, const dsp::Peak& y) { return x.amplitude > y.amplitude; });
        dsp::convertSpectrum(s, target, cutoff);
    }
    if (peaks.size() > static_cast<std::size_t>(peakCount)) peaks.resize(static_cast<std::size_t>(peakCount));

    // Overall level in the band, from the SI spectrum.
    std::pair<double, double> band{s.frequencyHz(0) + (c.kind == Kind::Zoom ? 0.0 : s.resolutionHz), s.frequencyHz(s.lineCount() - 1)};
    if (c.kind == Kind::Averaged && (target == Quantity::Velocity || target == Quantity::Displacement))
        band = {10.0, std::min(1000.0, band.second)}; // ISO 20816-3 band for machines above 600 r/min
    if (const auto b = a.value("band")) {
        band = parseRange(*b, "band");
        if (!(band.second > band.first)) throw UsageError("--band LO:HI needs LO < HI");
    }
    const double overallSi = dsp::bandRms(s, band.first, band.second);

    // Display: dB re the ISO 1683 reference of the quantity (Units.h), or the display unit, in
    // which amplitudes scale by 1/factor and squared envelopes and PSD by its powers.
    std::string unitLabel(unitSymbol(unit));
    if (a.has("db")) {
        const double ref = levelReference(target);
        for (double& v : s.values) v = dsp::toDb(v, s.scale, ref);
        for (auto& p : peaks) p.amplitude = dsp::toDb(p.amplitude, s.scale, ref);
        char label[64];
        std::snprintf(label, sizeof label, "dB re %g %s%s", ref, std::string(unitSymbol(siUnitOf(target))).c_str(),
                      s.scale == dsp::SpectrumScale::Psd ? " per Hz" : "");
        unitLabel = label;
    } else {
        const double perUnit = 1.0 / toSiFactor(unit);
        const int power = (c.squaredEnvelope ? 2 : 1) * (s.scale == dsp::SpectrumScale::Psd ? 2 : 1);
        const double k = std::pow(perUnit, power);
        for (double& v : s.values) v *= k;
        for (auto& p : peaks) p.amplitude *= k;
        if (c.squaredEnvelope) unitLabel += "^2";
        if (s.scale == dsp::SpectrumScale::Psd) unitLabel = "(" + unitLabel + ")^2/Hz";
    }
    const double overall = overallSi * std::pow(1.0 / toSiFactor(unit), c.squaredEnvelope ? 2 : 1);

    if (a.has("csv")) {
        out << "frequency_hz,amplitude\n";
        char buf[64];
        for (std::size_t i = 0; i < s.lineCount(); ++i) {
            std::snprintf(buf, sizeof buf, "%.6f,%.9g\n", s.frequencyHz(i), s.values[i]);
            out << buf;
        }
        return 0;
    }
    if (a.has("json")) {
        json::Writer w(out);
        w.beginObject();
        w.field("file", rec.source);
        w.field("channel", index + 1);
        w.field("channel_name", ch.name);
        w.field("kind", kindName(c.kind));
        w.field("quantity", quantityName(target));
        w.field("sample_rate_hz", rec.sampleRateHz);
        w.field("resolution_hz", s.resolutionHz);
        w.field("enbw_hz", s.enbwHz);
        w.field("lines", s.lineCount());
        w.field("start_hz", s.startHz);
        w.field("segment_length", s.segmentLength);
        w.field("window", dsp::windowName(s.window));
        w.field("scale", dsp::spectrumScaleName(s.scale));
        w.field("unit", unitLabel);
        w.field("averages", s.averages);
        if (c.envelope) {
            w.key("envelope").beginObject();
            w.key("band_hz").beginArray().value(c.envelope->bandLowHz).value(c.envelope->bandHighHz).endArray();
            w.field("squared", c.squaredEnvelope);
            w.field("envelope_rate_hz", c.envelope->envelopeRateHz);
            w.field("band_choice", c.envelope->kurtogram ? "kurtogram" : "given");
            if (c.envelope->kurtogram) {
                w.field("kurtogram_level", c.envelope->kurtogram->best.level);
                w.field("spectral_kurtosis", c.envelope->kurtogram->best.kurtosis);
            }
            w.endObject();
        }
        w.key("peaks").beginArray();
        for (const auto& p : peaks) {
            w.beginObject();
            w.field("frequency_hz", p.frequencyHz);
            w.field("amplitude", p.amplitude);
            w.endObject();
        }
        w.endArray();
        w.key("overall").beginObject();
        w.field("rms", overall);
        w.key("band_hz").beginArray().value(band.first).value(band.second).endArray();
        w.endObject();
        if (a.has("full")) {
            std::vector<double> f(s.lineCount());
            for (std::size_t i = 0; i < f.size(); ++i) f[i] = s.frequencyHz(i);
            w.key("frequency_hz").numbers(f);
            w.key("amplitude").numbers(s.values);
        }
        w.endObject();
        return 0;
    }
    char buf[512];
    std::snprintf(buf, sizeof buf, "%s spectrum of %s, channel %zu '%s' (%s)\n", kindName(c.kind), rec.source.c_str(), index + 1,
                  ch.name.c_str(), std::string(quantityName(target)).c_str());
    out << buf;
    std::snprintf(buf, sizeof buf, "window %s, %zu lines from %.6g Hz, %.6g Hz apart (ENBW %.4g Hz), %zu average(s), scale %s [%s]\n",
                  dsp::windowName(s.window).c_str(), s.lineCount(), s.startHz, s.resolutionHz, s.enbwHz, s.averages,
                  std::string(dsp::spectrumScaleName(s.scale)).c_str(), unitLabel.c_str());
    out << buf;
    if (c.envelope) {
        std::snprintf(buf, sizeof buf, "envelope band %.6g - %.6g Hz (%s)%s\n", c.envelope->bandLowHz, c.envelope->bandHighHz,
                      c.envelope->kurtogram ? "chosen by spectral kurtosis" : "as given", c.squaredEnvelope ? ", squared" : "");
        out << buf;
    }
    std::snprintf(buf, sizeof buf, "overall %.5g %s rms in %.6g - %.6g Hz\n", overall,
                  (std::string(unitSymbol(unit)) + (c.squaredEnvelope ? "^2" : "")).c_str(), band.first, band.second);
    out << buf;
    if (!peaks.empty()) out << "\n  frequency (Hz)    amplitude\n";
    for (const auto& p : peaks) {
        std::snprintf(buf, sizeof buf, "  %14.4f    %.5g\n", p.frequencyHz, p.amplitude);
        out << buf;
    }
    return 0;
}

} // namespace humwise::cli
