#pragma once
// A finding: one fault the rules see on one motor, with the evidence behind it.
//
// Severity levels (Humwise's own names; shown with a text mark so they read without colour):
//   0 steady       nothing to do                          mark "[ ]"
//   1 watch        a change worth following at the next round "[~]"
//   2 plan repair  schedule the work                      "[!]"
//   3 act now      damage is likely soon                  "[!!]"

#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace humwise::diagnosis {

enum class Origin { Electrical, Mechanical, Unknown };

std::string_view originName(Origin o);         // "electrical", "mechanical", "unknown"
std::string_view severityName(int severity);   // "steady", "watch", "plan repair", "act now"
std::string_view severityMark(int severity);   // "[ ]", "[~]", "[!]", "[!!]"

// One measured fact that supports a finding: a spectral line (expected vs measured frequency and
// its amplitude), or a computed value (an overall level, a ratio) with the threshold it was
// compared with and where that threshold comes from.
struct Evidence {
    std::string label;                    // "BPFO (DE) x1", "overall velocity 10-1000 Hz", ...
    std::optional<double> expectedHz;
    std::optional<double> measuredHz;
    double amplitude = 0;                 // in `unit`
    std::string unit;                     // "mm/s", "g", "dB re f", "%", ...
    std::string channel;                  // which recording/point it was seen on
    std::optional<double> threshold;      // the limit it was compared with, in `unit`
    std::string thresholdSource;          // "ISO 20816-3 (from memory, verify)", "common practice", ...
};

struct Finding {
    std::string fault;         // stable id: unbalance, misalignment, looseness, bearing_outer_race, ...
    int severity = 0;          // 0..3
    bool withheld = false;     // the verdict is withheld (see withheldReason)
    std::string withheldReason;
    Origin origin = Origin::Unknown;
    double confidence = 0;     // 0..1
    std::vector<Evidence> evidence;
    std::string explanation;   // plain language: what was seen and why it points to this fault
    std::string action;        // what to do next
    std::string rule;          // rule id and version, e.g. "vib.unbalance/1"
};

} // namespace humwise::diagnosis
