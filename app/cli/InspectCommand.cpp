#include "app/cli/InspectCommand.h"

#include "app/cli/RecordingOptions.h"
#include "core/dsp/Quality.h"
#include "core/dsp/Statistics.h"
#include "core/util/JsonWriter.h"
#include "core/util/Text.h"

#include <cstdio>

namespace humwise::cli {
namespace {

struct ChannelReport {
    const Channel* channel;
    Unit unit;
    dsp::WaveformStatistics stats; // in `unit`
    std::vector<dsp::QualityIssue> issues;
};

ChannelReport analyse(const Channel& ch, double fs) {
    ChannelReport r{&ch, defaultDisplayUnit(ch.quantity), dsp::waveformStatistics(ch.samples), {}};
    const double k = 1.0 / toSiFactor(r.unit);
    for (double* v : {&r.stats.dcOffset, &r.stats.rms, &r.stats.peak, &r.stats.peakToPeak, &r.stats.minimum, &r.stats.maximum})
        *v *= k;
    dsp::QualityRequest q;
    q.quantity = ch.quantity;
    q.fullScale = ch.fullScale;
    q.sampleRateHz = fs;
    r.issues = dsp::assessQuality(ch.samples, q);
    return r;
}

void writeJson(std::ostream& out, const Recording& rec, const std::vector<ChannelReport>& reports) {
    json::Writer w(out);
    w.beginObject();
    w.field("file", rec.source);
    w.field("sample_rate_hz", rec.sampleRateHz);
    w.field("frames", rec.frameCount());
    w.field("duration_s", rec.durationSeconds());
    w.key("start_time");
    if (rec.startTime) w.value(text::formatIsoTime(*rec.startTime)); else w.null();
    w.key("channels").beginArray();
    for (std::size_t i = 0; i < reports.size(); ++i) {
        const auto& r = reports[i];
        w.beginObject();
        w.field("index", i + 1);
        w.field("name", r.channel->name);
        w.field("quantity", quantityName(r.channel->quantity));
        w.field("unit", unitSymbol(r.unit));
        w.key("statistics").beginObject();
        w.field("dc_offset", r.stats.dcOffset);
        w.field("rms", r.stats.rms);
        w.field("peak", r.stats.peak);
        w.field("peak_to_peak", r.stats.peakToPeak);
        w.field("crest_factor", r.stats.crestFactor);
        w.field("kurtosis", r.stats.kurtosis);
        w.field("skewness", r.stats.skewness);
        w.field("minimum", r.stats.minimum);
        w.field("maximum", r.stats.maximum);
        w.field("non_finite_samples", r.stats.nonFiniteCount);
        w.endObject();
        w.key("quality").beginArray();
        for (const auto& q : r.issues) {
            w.beginObject();
            w.field("flag", dsp::qualityFlagName(q.flag));
            w.field("detail", q.detail);
            w.endObject();
        }
        w.endArray();
        w.endObject();
    }
    w.endArray();
    w.endObject();
}

void writeText(std::ostream& out, const Recording& rec, const std::vector<ChannelReport>& reports) {
    char buf[512];
    out << "file: " << rec.source << '\n';
    std::snprintf(buf, sizeof buf, "%zu channel(s) at %.6g Hz, %zu frames, %.4f s\n", rec.channels.size(), rec.sampleRateHz,
                  rec.frameCount(), rec.durationSeconds());
    out << buf;
    if (rec.startTime) out << "start: " << text::formatIsoTime(*rec.startTime) << '\n';
    for (std::size_t i = 0; i < reports.size(); ++i) {
        const auto& r = reports[i];
        const auto u = std::string(unitSymbol(r.unit));
        std::snprintf(buf, sizeof buf,
                      "\n[%zu] %s  (%s, %s)\n    rms %.5g  peak %.5g  peak-to-peak %.5g  dc %.5g %s\n"
                      "    crest factor %.3f  kurtosis %.3f (Pearson, normal = 3)  skewness %.3f\n",
                      i + 1, r.channel->name.c_str(), std::string(quantityName(r.channel->quantity)).c_str(), u.c_str(),
                      r.stats.rms, r.stats.peak, r.stats.peakToPeak, r.stats.dcOffset, u.c_str(), r.stats.crestFactor,
                      r.stats.kurtosis, r.stats.skewness);
        out << buf;
        if (r.issues.empty()) out << "    quality: no problem found\n";
        for (const auto& q : r.issues) out << "    quality: " << dsp::qualityFlagName(q.flag) << " - " << q.detail << '\n';
    }
}

} // namespace

int runInspect(const std::vector<std::string>& args, std::ostream& out) {
    auto specs = recordingOptionSpecs();
    specs.push_back({"json", false});
    const ParsedArgs parsed(args, specs);
    const Recording rec = loadRecording(parsed);
    std::vector<ChannelReport> reports;
    for (const auto& ch : rec.channels) reports.push_back(analyse(ch, rec.sampleRateHz));
    if (parsed.has("json")) writeJson(out, rec, reports);
    else writeText(out, rec, reports);
    return 0;
}

} // namespace humwise::cli
