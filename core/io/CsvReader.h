#pragma once
// CSV recordings.
//
// Layout (documented for users in README.md, "CSV recordings"):
//   # sample_rate_hz: 25600            optional metadata lines "# key: value" (or "key = value")
//   # start_time: 2026-03-04T10:15:00Z  other "#" lines are comments
//   time [s],DE-H [g],DE-V [mm/s]       header: one name per column, unit in [] or ()
//   0.0,0.012,0.31
//   ...
// - Delimiter: ',' or ';' or tab, detected from the header line. Decimal point '.'.
// - Time: a column named time / t / time_s / timestamp, or with unit s or ms. Its step must
//   be positive and within +-50 % of the mean step (gaps and jumps are errors); the rate is
//   (rows - 1) / (t_last - t_first). Without a time column the rate comes from the
//   sample_rate_hz metadata or from the caller; with both, they must agree within 1 %.
// - Units: any unit Units.h parses; columns without a unit take the caller's defaults.
// - Values: "nan" and "inf" are read (and later flagged by the quality checks); anything
//   else that is not a number is an error naming the line and column.

#include "core/io/ChannelSetting.h"
#include "core/io/ReadError.h"
#include "core/model/Recording.h"
#include "core/model/Result.h"

#include <filesystem>
#include <istream>
#include <optional>
#include <string>
#include <string_view>

namespace humwise::io {

struct CsvReadOptions {
    std::optional<double> sampleRateHz; // declared rate when the file has no time column or metadata
    ChannelSettings channels;           // defaults for columns without a unit (by data column index)
};

inline constexpr std::size_t kMaxCsvColumns = 1024;

[[nodiscard]] Result<Recording, ReadError> parseCsv(std::string_view text, const std::string& source,
                                                    const CsvReadOptions& options = {});
[[nodiscard]] Result<Recording, ReadError> readCsv(std::istream& in, const std::string& source,
                                                   const CsvReadOptions& options = {});
[[nodiscard]] Result<Recording, ReadError> readCsvFile(const std::filesystem::path& path,
                                                       const CsvReadOptions& options = {});

} // namespace humwise::io
