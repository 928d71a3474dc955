#include "app/common/MotorAnalysis.h"

#include <stdexcept>

namespace humwise::workflow {
namespace {

using namespace diagnosis;

std::optional<Location> locationOf(const std::string& s) {
    if (s == "DE") return Location::DriveEnd;
    if (s == "NDE") return Location::NonDriveEnd;
    return std::nullopt;
}

std::optional<Direction> directionOf(const std::string& s) {
    if (s == "H") return Direction::Horizontal;
    if (s == "V") return Direction::Vertical;
    if (s == "A") return Direction::Axial;
    return std::nullopt;
}

// Collects the phases of one quantity in A, B, C (or AB, BC, CA) order, moving their samples in;
// all must share rate and length.
template <class Input>
std::optional<Input> phaseSet(const fleet::MotorDefinition& m, std::vector<PointRecording>& recs, Quantity q, std::vector<std::string>& notes) {
    static const std::vector<std::string> phaseOrder{"A", "B", "C", "AB", "BC", "CA"};
    std::vector<PointRecording*> chosen;
    std::string first;
    for (const auto& phase : phaseOrder)
        for (auto& r : recs) {
            const auto* p = m.point(r.pointName);
            if (!p || p->quantity != q || p->phase != phase || !r.usable) continue;
            if (!chosen.empty() && (r.sampleRateHz != chosen.front()->sampleRateHz || r.samples.size() != chosen.front()->samples.size())) {
                notes.push_back(r.pointName + " was not recorded together with " + chosen.front()->pointName + " (rate or length differ): left out of the phase set");
                continue;
            }
            chosen.push_back(&r);
        }
    if (chosen.empty()) return std::nullopt;
    Input in;
    in.name = chosen.front()->pointName;
    in.sampleRateHz = chosen.front()->sampleRateHz;
    for (auto* r : chosen) in.phases.push_back(std::move(r->samples));
    if constexpr (std::is_same_v<Input, VoltageInput>) in.lineToLine = m.point(chosen.front()->pointName)->phase.size() == 2;
    return in;
}

std::vector<float> toFloats(const std::vector<double>& v, double scale) {
    std::vector<float> out(v.size());
    for (std::size_t i = 0; i < v.size(); ++i) out[i] = static_cast<float>(v[i] * scale);
    return out;
}

} // namespace

MotorAnalysis analyseMotor(const fleet::MotorDefinition& m, std::vector<PointRecording>& recs) {
    MotorAnalysis out;
    out.motorTag = m.motor.tag;
    DiagnosisInput in;
    in.motor = m.motor;
    for (auto& r : recs) {
        const auto* p = m.point(r.pointName);
        if (!p) continue;
        if (!in.measuredSpeedRpm && r.speedRpm) in.measuredSpeedRpm = r.speedRpm;
        if (!r.usable) {
            out.notes.push_back(r.pointName + " left out of the diagnosis: its recording is flagged as bad data");
            continue;
        }
        const auto loc = locationOf(p->location);
        const auto dir = directionOf(p->direction);
        if ((p->quantity == Quantity::Acceleration || p->quantity == Quantity::Velocity) && loc && dir) {
            VibrationInput v;
            v.name = r.pointName;
            v.location = *loc;
            v.direction = *dir;
            v.quantity = r.quantity;
            v.sampleRateHz = r.sampleRateHz;
            v.samples = std::move(r.samples);
            in.vibration.push_back(std::move(v));
        }
    }
    in.current = phaseSet<CurrentInput>(m, recs, Quantity::Current, out.notes);
    in.voltage = phaseSet<VoltageInput>(m, recs, Quantity::Voltage, out.notes);
    out.result = diagnose(in, defaultThresholds(), true);
    for (const auto& n : out.result.notes) out.notes.push_back(n);
    return out;
}

void storeAnalysis(storage::FleetStore& store, std::int64_t roundId, const MotorAnalysis& a, const std::vector<PointRecording>& recs) {
    const auto& op = a.result.operatingPoint;
    storage::RoundMotorRow row;
    row.roundId = roundId;
    row.motorTag = a.motorTag;
    row.lineHz = op.point.lineHz;
    row.lineMethod = op.lineMethod;
    row.speedRpm = op.point.speedRpm();
    row.speedMethod = op.speedMethod;
    row.speedConfidence = op.speedConfidence;
    row.slip = op.point.slip();
    row.loadPercent = op.loadPercent;
    row.analysisVersion = kAnalysisVersion;
    for (const auto& n : a.notes) row.notes += (row.notes.empty() ? "" : "\n") + n;
    store.insertRoundMotor(row);
    for (const auto& i : a.result.indicators.all()) {
        const auto dot = i.name.find('.');
        storage::IndicatorRow ind;
        ind.motorTag = a.motorTag;
        ind.name = dot == std::string::npos ? i.name : i.name.substr(0, dot);
        ind.pointName = dot == std::string::npos ? std::string() : i.name.substr(dot + 1);
        ind.value = i.value;
        ind.unit = i.unit;
        store.insertIndicator(roundId, ind);
    }
    for (const auto& f : a.result.findings) store.insertFinding(roundId, a.motorTag, f);
    for (const auto& s : a.result.spectra) {
        const PointRecording* rec = nullptr;
        for (const auto& r : recs)
            if (r.pointName == s.channel) rec = &r;
        if (!rec) continue;
        storage::SpectrumRow spectrumRow;
        spectrumRow.recordingId = rec->recordingId;
        spectrumRow.kind = s.kind;
        spectrumRow.quantity = std::string(quantityName(s.spectrum.quantity));
        const bool squared = s.kind == "envelope";
        spectrumRow.unit = std::string(unitSymbol(siUnitOf(s.spectrum.quantity))) + (squared ? "^2" : "");
        spectrumRow.scale = std::string(dsp::spectrumScaleName(s.spectrum.scale));
        spectrumRow.window = dsp::windowName(s.spectrum.window);
        spectrumRow.startHz = s.spectrum.startHz;
        spectrumRow.resolutionHz = s.spectrum.resolutionHz;
        spectrumRow.enbwHz = s.spectrum.enbwHz;
        spectrumRow.averages = static_cast<int>(s.spectrum.averages);
        spectrumRow.sampleRateHz = s.spectrum.sampleRateHz;
        spectrumRow.segmentLength = static_cast<std::int64_t>(s.spectrum.segmentLength);
        spectrumRow.transformLength = static_cast<std::int64_t>(s.spectrum.transformLength);
        spectrumRow.parameters = s.parameters;
        spectrumRow.analysisVersion = kAnalysisVersion;
        spectrumRow.values = toFloats(s.spectrum.values, 1.0);
        store.insertSpectrum(spectrumRow);
    }
}

} // namespace humwise::workflow
