#pragma once
// Reading back what the store keeps, in core's types, for the views and reports: spectra and the
// raw waveform of a recording, and the operating point of a motor in a round.

#include "core/dsp/Spectrum.h"
#include "core/model/Recording.h"
#include "storage/FleetStore.h"

#include <optional>
#include <string>

namespace humwise::workflow {

// The stored spectrum (SI units) or nullopt when that kind was not stored.
std::optional<dsp::Spectrum> storedSpectrum(storage::FleetStore& store, std::int64_t recordingId, const std::string& kind);

struct Waveform {
    double sampleRateHz = 0;
    Quantity quantity = Quantity::Acceleration;
    std::vector<double> samples; // SI
};

// Parses the recording's raw file again (as the import did) and returns its channel.
std::optional<Waveform> storedWaveform(storage::FleetStore& store, const storage::RecordingRow& recording);

std::optional<storage::RoundMotorRow> operatingPoint(storage::FleetStore& store, std::int64_t roundId, const std::string& motorTag);

std::optional<storage::RecordingRow> recordingOf(storage::FleetStore& store, std::int64_t roundId, const std::string& motorTag,
                                                 const std::string& pointName);

} // namespace humwise::workflow
