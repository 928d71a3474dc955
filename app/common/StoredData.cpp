#include "app/common/StoredData.h"

#include "core/io/RecordingReader.h"


namespace humwise::workflow {

std::optional<dsp::Spectrum> storedSpectrum(storage::FleetStore& store, std::int64_t recordingId, const std::string& kind) {
    const auto row = store.spectrum(recordingId, kind);
    if (!row) return std::nullopt;
    dsp::Spectrum s;
    s.startHz = row->startHz;
    s.resolutionHz = row->resolutionHz;
    s.enbwHz = row->enbwHz;
    s.averages = static_cast<std::size_t>(row->averages);
    s.scale = dsp::parseSpectrumScale(row->scale).value_or(dsp::SpectrumScale::Rms);
    s.quantity = parseQuantity(row->quantity).value_or(Quantity::Velocity);
    s.window = dsp::parseWindowSpec(row->window).value_or(dsp::WindowSpec{});
    s.values.assign(row->values.begin(), row->values.end());
    s.sampleRateHz = row->sampleRateHz;
    s.segmentLength = static_cast<std::size_t>(row->segmentLength);
    s.transformLength = static_cast<std::size_t>(row->transformLength);
    if (s.segmentLength == 0) {
        // Rows from schema version 2 lack the lengths. The window's kernel hardly depends on N when
        // N is large, so an unpadded 4096-point transform serves for interpolation.
        s.segmentLength = s.transformLength = 4096;
        s.sampleRateHz = 4096 * s.resolutionHz;
    }
    return s;
}

std::optional<Waveform> storedWaveform(storage::FleetStore& store, const storage::RecordingRow& r) {
    const auto bytes = store.sourceFile(r.fileHash);
    io::RecordingReadOptions o;
    o.channels.perChannel.resize(static_cast<std::size_t>(r.channelIndex + 1));
    const Unit unit = parseUnit(r.unit).value_or(Unit::G);
    for (auto& c : o.channels.perChannel) c.unit = unit;
    o.channels.perChannel.back().scale = 1.0 / r.sensitivity;
    o.channels.defaults.unit = unit;
    auto rec = io::parseRecordingBytes(bytes, r.fileName, o);
    if (!rec || static_cast<std::size_t>(r.channelIndex) >= rec.value().recording.channels.size()) return std::nullopt;
    auto& ch = rec.value().recording.channels[static_cast<std::size_t>(r.channelIndex)];
    return Waveform{rec.value().recording.sampleRateHz, ch.quantity, std::move(ch.samples)};
}

std::optional<storage::RoundMotorRow> operatingPoint(storage::FleetStore& store, std::int64_t roundId, const std::string& motorTag) {
    for (auto& r : store.roundMotors(roundId))
        if (r.motorTag == motorTag) return r;
    return std::nullopt;
}

std::optional<storage::RecordingRow> recordingOf(storage::FleetStore& store, std::int64_t roundId, const std::string& motorTag, const std::string& pointName) {
    for (auto& r : store.recordings(roundId))
        if (r.motorTag == motorTag && r.pointName == pointName) return r;
    return std::nullopt;
}

} // namespace humwise::workflow
