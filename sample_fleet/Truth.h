#pragma once
// The truth file (truth.json): what was seeded where, for tests only - the diagnosis never
// reads it. Layout:
//   { "format": "humwise-sample-truth", "version": 1, "site", "supply_hz", "rounds": [...],
//     "faults": [ {"fault", "motor", "points", "start_round", "detectable_from", "strength_meaning",
//                  "strength": [13 numbers], "expected_severity": [13 ints], "consequences", "story"} ],
//     "healthy_motors": [...], "bad_recording": {...}, "power_off": {...},
//     "operating_points": [ {"round", "motor", "line_hz", "speed_rpm", "load_percent"} ] }
// Rounds are 1-based; walkdown-13 is generated but not imported by the tests.

#include <filesystem>

namespace humwise::sample {

// Throws std::runtime_error when the file cannot be written.
void writeTruth(const std::filesystem::path& path);

} // namespace humwise::sample
