#pragma once
// The fleet file: Humwise's own JSON description of a site, its motors, points and routes.
// Layout (documented for users in README.md, "Fleet file"):
//   { "format": "humwise-fleet", "version": 1,
//     "site": {"name": ..., "description": ...}, "areas": [...],
//     "motors": [ {"tag", "area", "description", "nameplate": {...}, "bearings": {"de": {...}, "nde": {...}},
//                  "driven": {...}, "severity": {...}, "points": [ {...}, ... ]} ],
//     "routes": [ {"name", "description", "points": ["TAG/POINT", ...]} ] }
// Writing is canonical (fixed member order, shortest round-trip numbers, optional members only
// when present), so reading a file and writing it again gives the same bytes.

#include "core/fleet/Fleet.h"
#include "core/io/ReadError.h"
#include "core/model/Result.h"

#include <filesystem>
#include <string>
#include <string_view>

namespace humwise::io {

[[nodiscard]] Result<fleet::Fleet, ReadError> parseFleet(std::string_view text, const std::string& source);
[[nodiscard]] Result<fleet::Fleet, ReadError> readFleetFile(const std::filesystem::path& path);
std::string writeFleet(const fleet::Fleet& fleet);

} // namespace humwise::io
