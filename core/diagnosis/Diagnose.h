#pragma once
// One motor, one round: from recordings to the operating point, indicators and findings.
// The workflow layer and the command line call this; it reads no files and knows no database.

#include "core/diagnosis/Finding.h"
#include "core/diagnosis/Indicators.h"
#include "core/diagnosis/Inputs.h"
#include "core/diagnosis/PowerOff.h"
#include "core/diagnosis/Thresholds.h"
#include "core/dsp/Spectrum.h"
#include "core/motor/FaultFrequencies.h"

#include <optional>
#include <string>
#include <vector>

namespace humwise::diagnosis {

struct OperatingPointResult {
    motor::OperatingPoint point;
    std::string lineMethod;  // "current", "voltage", "nameplate"
    std::string speedMethod; // see SpeedEstimation.h
    double speedConfidence = 0;
    std::optional<double> loadPercent;
};

// A spectrum the diagnosis computed, kept for the views and reports (SI units, r.m.s.).
struct ChannelSpectrum {
    std::string channel;    // the input's name (vibration point) or the phase set's name
    std::string kind;       // "velocity", "envelope", "zoom", "current", "voltage"
    dsp::Spectrum spectrum;
    std::string parameters; // e.g. the envelope band
};

struct DiagnosisResult {
    OperatingPointResult operatingPoint;
    IndicatorList indicators;
    std::vector<Finding> findings;      // most severe first
    std::vector<PowerOffLine> powerOff; // when a power-off pair was given
    std::vector<std::string> notes;     // channels skipped and why
    std::vector<ChannelSpectrum> spectra; // filled when keepSpectra is set
};

// Throws std::invalid_argument for an impossible motor (validate() issues) or no usable channel.
DiagnosisResult diagnose(const DiagnosisInput& input, const Thresholds& thresholds = defaultThresholds(), bool keepSpectra = false);

} // namespace humwise::diagnosis
