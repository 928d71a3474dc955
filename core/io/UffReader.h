#pragma once
// Universal File reader for dataset 58 ("function at nodal DOF"), ASCII and binary (58b).
//
// Format: I-DEAS Universal File Format, dataset 58, as documented by the format's public
// description and by open-source readers (e.g. pyuff). In our own words:
//
// A universal file is a sequence of datasets. Each dataset starts with a line holding -1
// right-aligned in six columns ("    -1") and ends with the same line. The line after the
// opening -1 holds the dataset number in six columns: "    58" for ASCII; for binary
// "    58b" followed, in the same line, by the byte order (1 little endian, 2 big endian),
// the floating-point format (2 = IEEE 754), the number of text lines that follow (11) and
// the number of data bytes; a few further fields follow that this reader ignores.
//
//   record  Fortran format              content
//   1..5    80A1                        free text: 1 = description / point id, 2 = name,
//                                       3 = date and time "DD-MMM-YY HH:MM:SS" when present,
//                                       4 and 5 = free text
//   6       2(I5,I10),2(1X,A10,I10,I4)  function type (1 time response, 2 auto spectrum,
//                                       3 cross spectrum, 4 frequency response function, ...),
//                                       function id, version, load case; response entity name,
//                                       response node, response direction; reference entity
//                                       name, reference node, reference direction. Directions:
//                                       0 scalar, 1..3 = +X +Y +Z, 4..6 = +RX +RY +RZ, negative
//                                       for the opposite sense
//   7       3I10,3E13.5                 ordinate data type (2 real single, 4 real double,
//                                       5 complex single, 6 complex double), number of values,
//                                       abscissa spacing (1 even, 0 uneven), abscissa minimum,
//                                       abscissa increment, z-axis value
//   8..11   I10,3I5,2(1X,A20)           characteristics of the abscissa (8), the ordinate or its
//                                       numerator (9), the ordinate denominator (10) and the
//                                       z axis (11): specific data type (0 unknown, 1 general,
//                                       2 stress, 3 strain, 5 temperature, 6 heat flux,
//                                       8 displacement, 9 reaction force, 11 velocity,
//                                       12 acceleration, 13 excitation force, 15 pressure,
//                                       16 mass, 17 time, 18 frequency, 19 rpm, ...), length,
//                                       force and temperature unit exponents, axis label,
//                                       axis units label
//   12      ASCII: real single even     6E13.5 per line; real double even 4E20.12 per line;
//                                       uneven spacing: (abscissa, ordinate) pairs; complex:
//                                       (real, imaginary) pairs
//           binary: the number of data bytes announced in the header line, raw IEEE 754
//                                       values (4 bytes single, 8 double) in the stated byte
//                                       order, starting right after the line break of record 11
//
// What Humwise reads: datasets 58 and 58b with function type 1 (time response), even abscissa
// spacing and real single or double ordinates. Every such dataset is one channel; all of them
// must have the same number of values and the same increment (within 1e-6 relative), and
// become the channels of one Recording, in file order (at most kMaxUffChannels). Datasets
// with other numbers are skipped (their text up to the closing -1); a file without any
// dataset 58 is refused.
//
// Parsing rules:
// - Records 6 to 11 are read by their fixed columns; a blank integer field reads as 0, a
//   blank real as 0 (Fortran convention), except the first five fields of record 7, which
//   must be there. When the columns of record 7 do not parse, six numbers separated by
//   blanks are accepted instead (writers that do not keep the widths). The 58b header
//   fields and the ASCII data are read as numbers separated by blanks: E13.5 and E20.12
//   leave a blank before every value whose exponent has two digits, and other widths work
//   too. A Fortran "D" exponent is accepted. Lines may end in LF or CR LF; blank lines are
//   allowed between datasets, not inside one.
// - After a binary block the closing -1 may follow directly or after one line break.
// - Sample rate = 1 / abscissa increment (seconds). Record 7 holds the increment as E13.5,
//   six significant digits, so 1/12000 s reads back as 12000.005 Hz: a rate within 1e-5
//   relative of a whole number of hertz is rounded to it (common practice).
// - The abscissa minimum is reported (UffChannelInfo) but not checked; records 8, 10 and 11
//   and all unit exponents are read for syntax only.
// - Quantity and unit come from record 9: specific data type 12 acceleration, 11 velocity,
//   8 displacement, and the units label, parsed with parseUnit ("g", "m/s^2", "m/s**2",
//   "mm/s", "m/s", "m", "um", "A", "V", ...; "NONE" and blank mean no label).
//     type 8/11/12 + label       the label's unit; it must be of that quantity
//     type 8/11/12, no label     the caller's unit (and scale) for the channel when it is of
//                                that quantity, otherwise the SI unit of the quantity
//     type 0/1 + label           the label's unit (current "A" and voltage "V" come this way)
//     type 0/1, no label         the caller's unit and scale (ChannelSettings, by channel index)
//     any other type             refused (force, pressure, ... have no Humwise quantity)
//   A units label Humwise does not know is refused: guessing could be wrong by 1000x.
//   When the unit comes from the file the caller's scale is not applied (as for CSV columns
//   with a unit). Samples are converted to SI (Units.h).
// - Channel name: record 1 unless blank or "NONE", else "<entity> <node><direction>"
//   (entity left out when blank or "NONE"), e.g. "12+Z"; "chN" (N = channel number) when
//   record 1, node and direction are all empty. A record-1 name that occurs twice gets
//   " (<node><direction>)" appended, then " #N" if still not unique.
// - Record 3 is parsed as "DD-MMM-YY HH:MM:SS" (a four-digit year is accepted; two-digit
//   years 00-68 are 2000-2068, 69-99 are 1969-1999, the POSIX strptime convention) and taken
//   as UTC; anything else there is free text and gives no timestamp. Recording::startTime is
//   the first dataset's timestamp.
//
// Errors: a ReadError naming the file and the line (ASCII) or, from the first binary dataset
// (58b or any other "b" dataset) on, the byte offset (line numbers mean little past binary
// data). Refused, with their codes:
//   Empty              an empty file
//   NotRecognised      a first non-blank line that is not -1, or only blank lines
//   BadChunk           a missing -1 between or after datasets; more values than announced
//   BadNumber          a field or value that is not a number
//   TruncatedHeader    the file or the dataset ends inside records 1..11
//   UnsupportedFormat  function types other than 1, complex data, uneven spacing, floating-
//                      point formats other than IEEE, specific data types without a Humwise
//                      quantity, datasets of different lengths or increments, more than
//                      kMaxUffChannels datasets 58, no dataset 58 at all
//   BadField           impossible values: a 58b header line with missing fields, a byte
//                      order other than 1 or 2, a text-line count other than 11, a blank
//                      field of record 7, data type or spacing
//                      codes that do not exist, a direction beyond +-6, a negative count or
//                      more than kMaxUffValues, an increment that is not > 0 or gives more
//                      than kMaxUffSampleRateHz, a 58b byte count that does not match the
//                      values, an unknown units label or one of another quantity
//   NoData             record 7 announces 0 values
//   TruncatedData      fewer values or bytes than announced, counts beyond the bytes present
// Never trusts a count: each is checked against the bytes actually present before anything
// is allocated from it, so garbage gives an error, never a crash, a hang or a huge allocation.
//
// Thread safety: the functions are reentrant; they share no state.

#include "core/io/ChannelSetting.h"
#include "core/io/ReadError.h"
#include "core/model/Recording.h"
#include "core/model/Result.h"

#include <cstddef>
#include <filesystem>
#include <istream>
#include <optional>
#include <span>
#include <string>
#include <vector>

namespace humwise::io {

inline constexpr long long kMaxUffValues = 1'000'000'000;
inline constexpr double kMaxUffSampleRateHz = 10e6;
inline constexpr std::size_t kMaxUffChannels = 1024;

struct UffReadOptions {
    // Meaning of the values of datasets whose record 9 gives no unit (by channel index, i.e.
    // the index of the dataset among the datasets 58 of the file).
    ChannelSettings channels;
};

// What a dataset says about its channel besides the samples (one per Recording channel).
struct UffChannelInfo {
    std::string idText;                   // record 1, trimmed
    std::string responseEntity;           // record 6, trimmed
    long long responseNode = 0;           // record 6
    int directionCode = 0;                // record 6 response direction, -6..6 (see uffDirectionLabel)
    int functionType = 0;                 // record 6 (1 = time response for every channel read)
    int dataType = 0;                     // record 7: 2 real single, 4 real double
    int specificDataType = 0;             // record 9 (12 acceleration, 11 velocity, 8 displacement, ...)
    std::string unitsLabel;               // record 9, trimmed
    double abscissaMinimumS = 0.0;        // record 7
    bool binary = false;                  // dataset 58b
    std::optional<std::string> timestamp; // record 3 as ISO 8601 UTC, "2026-03-04T10:15:00.000Z"
};

struct UffFile {
    Recording recording;
    std::vector<UffChannelInfo> channels; // same order as recording.channels
};

[[nodiscard]] Result<UffFile, ReadError> parseUff(std::span<const std::byte> bytes, const std::string& source,
                                                  const UffReadOptions& options = {});
[[nodiscard]] Result<UffFile, ReadError> readUff(std::istream& in, const std::string& source,
                                                 const UffReadOptions& options = {});
[[nodiscard]] Result<UffFile, ReadError> readUffFile(const std::filesystem::path& path,
                                                     const UffReadOptions& options = {});
// parseUff(...).recording, for callers that need only the samples (RecordingReader).
[[nodiscard]] Result<Recording, ReadError> parseUffRecording(std::span<const std::byte> bytes, const std::string& source,
                                                             const UffReadOptions& options = {});

// True when the first non-blank line is -1 and the next line holds dataset number 58 or 58b.
bool looksLikeUff58(std::span<const std::byte> bytes);

// "+X", "-Y", "+RZ", ... for direction codes -6..6; "" for 0 (scalar) and codes out of range.
std::string uffDirectionLabel(int code);

} // namespace humwise::io
