#pragma once
// Signal-quality checks on one channel. Each check is a plain rule with its thresholds here;
// the thresholds are common practice (no published source), chosen so that healthy
// recordings of the open datasets in ../shared/data/recordings raise no flag.
//
//   NonFinite   any NaN or infinite sample
//   FlatLine    peak-to-peak below 1e-12 of the largest |sample| (or exactly 0), or a run of
//               identical samples longer than 10 % of the record (sensor or cable dropout)
//   Clipped     samples at the data's own extreme (or at a known full scale) in at least 3
//               runs of 3 or more identical consecutive samples: a saturated input or ADC
//   BiasDrift   motion quantities only (AC-coupled sensors): the mean of 8 equal blocks
//               wanders by more than 0.5 x the residual RMS, or the DC offset exceeds
//               3 x the residual RMS - the signature of a failing sensor's bias voltage
//   TooShort    fewer samples than `minSamples` (e.g. what the asked resolution needs)

#include "core/model/Units.h"

#include <cstddef>
#include <optional>
#include <span>
#include <string>
#include <string_view>
#include <vector>

namespace humwise::dsp {

enum class QualityFlag { NonFinite, FlatLine, Clipped, BiasDrift, TooShort };

std::string_view qualityFlagName(QualityFlag flag); // "non_finite", "flat_line", ...

struct QualityIssue {
    QualityFlag flag;
    std::string detail;
};

struct QualityRequest {
    Quantity quantity = Quantity::Acceleration;
    std::optional<double> fullScale; // |x| at which the input saturates, when known
    std::size_t minSamples = 0;
    double sampleRateHz = 0;          // for messages only
};

std::vector<QualityIssue> assessQuality(std::span<const double> x, const QualityRequest& request);

} // namespace humwise::dsp
