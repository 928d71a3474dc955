#include "core/io/UffReader.h"

#include "core/io/FileBytes.h"
#include "core/util/Text.h"

#include <algorithm>
#include <array>
#include <chrono>
#include <cmath>
#include <cstdint>
#include <cstdio>
#include <cstring>
#include <string_view>

namespace humwise::io {
namespace {

using Code = ReadError::Code;
using TimePoint = std::chrono::sys_time<std::chrono::milliseconds>;

constexpr std::size_t kTextRecords = 11; // records 1..11 before the data
constexpr double kIncrementTolerance = 1e-6;
constexpr double kRateRounding = 1e-5;

// ---------------------------------------------------------------------------------------
// Positions and errors

struct Line {
    std::string_view text;  // without the line break
    std::size_t offset = 0; // byte offset of the first character
    std::size_t number = 0; // 1-based line number
};

// Where an error is reported: the line, or the byte offset once binary data has been seen.
struct Where {
    std::size_t line = 0;
    std::size_t offset = 0;
    bool binary = false;
};

struct Context {
    const std::string& source;
    bool binary = false; // a 58b dataset has been met: positions are byte offsets from here on
    Where at(const Line& l) const { return {l.number, l.offset, binary}; }
    Where atOffset(std::size_t offset) const { return {0, offset, true}; }
};

ReadError error(Code code, const Context& ctx, const Where& w, std::string detail) {
    if (w.binary) return ReadError{code, ctx.source, w.offset, std::nullopt, std::move(detail)};
    return ReadError{code, ctx.source, std::nullopt, w.line, std::move(detail)};
}

// At most 40 characters of file text for a message, non-printable bytes shown as '?'.
std::string quote(std::string_view s) {
    std::string out = "'";
    for (std::size_t i = 0; i < s.size() && i < 40; ++i) {
        const auto c = static_cast<unsigned char>(s[i]);
        out += (c >= 32 && c < 127) ? static_cast<char>(c) : '?';
    }
    return out + (s.size() > 40 ? "...'" : "'");
}

std::string fmt(const char* f, double v) {
    char buf[64];
    std::snprintf(buf, sizeof buf, f, v);
    return buf;
}

class Scanner {
public:
    explicit Scanner(std::string_view data) : m_data(data) {}
    bool atEnd() const { return m_pos >= m_data.size(); }
    std::size_t pos() const { return m_pos; }
    std::size_t remaining() const { return m_data.size() - m_pos; }
    std::size_t nextLineNumber() const { return m_line; }
    std::string_view take(std::size_t n) {
        const std::string_view s = m_data.substr(m_pos, n);
        m_pos += s.size();
        return s;
    }
    std::optional<Line> next() {
        if (atEnd()) return std::nullopt;
        Line l;
        l.offset = m_pos;
        l.number = m_line++;
        const std::size_t end = m_data.find('\n', m_pos);
        const std::size_t stop = end == std::string_view::npos ? m_data.size() : end;
        l.text = m_data.substr(m_pos, stop - m_pos);
        m_pos = end == std::string_view::npos ? m_data.size() : end + 1;
        if (!l.text.empty() && l.text.back() == '\r') l.text.remove_suffix(1);
        return l;
    }
    // Where the file ends, for "the file ends in ..." errors.
    Where endWhere(const Context& ctx) const { return {m_line, m_data.size(), ctx.binary}; }

private:
    std::string_view m_data;
    std::size_t m_pos = 0;
    std::size_t m_line = 1;
};

bool isDelimiter(std::string_view line) { return text::trim(line) == "-1"; }

// ---------------------------------------------------------------------------------------
// Fields

bool isBlank(char c) { return c == ' ' || c == '\t' || c == '\r' || c == '\f' || c == '\v'; }

// Calls f(token) for each whitespace-separated token; stops early when f returns false.
template <class F>
bool forEachToken(std::string_view s, F&& f) {
    std::size_t i = 0;
    while (i < s.size()) {
        while (i < s.size() && isBlank(s[i])) ++i;
        if (i >= s.size()) break;
        std::size_t j = i;
        while (j < s.size() && !isBlank(s[j])) ++j;
        if (!f(s.substr(i, j - i))) return false;
        i = j;
    }
    return true;
}

// A real number, also with a Fortran "D" exponent.
std::optional<double> parseNumber(std::string_view t) {
    if (t.find_first_of("dD") == std::string_view::npos) return text::parseDouble(t);
    if (t.size() > 64) return std::nullopt;
    std::string copy(t);
    for (char& c : copy)
        if (c == 'd' || c == 'D') c = 'E';
    return text::parseDouble(copy);
}

std::string_view column(std::string_view line, std::size_t from, std::size_t width) {
    return from >= line.size() ? std::string_view{} : line.substr(from, width);
}

// Fixed-column fields of records 6 and 8..11.
class Columns {
public:
    Columns(const Context& ctx, const Line& line, int record) : m_ctx(ctx), m_line(line), m_record(record) {}

    // Integer in columns [from, from + width), 0-based; blank reads as 0 unless required.
    std::optional<long long> integer(std::size_t from, std::size_t width, const char* what, bool required = false) {
        const std::string_view f = field(from, width, what, required);
        if (f.empty()) return m_error ? std::nullopt : std::optional<long long>(0);
        if (const auto v = text::parseInteger(f)) return *v;
        fault(Code::BadNumber, from, width, what, quote(f) + " is not an integer");
        return std::nullopt;
    }
    std::optional<double> real(std::size_t from, std::size_t width, const char* what, bool required) {
        const std::string_view f = field(from, width, what, required);
        if (f.empty()) return m_error ? std::nullopt : std::optional<double>(0.0);
        if (const auto v = parseNumber(f)) return *v;
        fault(Code::BadNumber, from, width, what, quote(f) + " is not a number");
        return std::nullopt;
    }
    std::string textField(std::size_t from, std::size_t width) const {
        return std::string(text::trim(column(m_line.text, from, width)));
    }
    const std::optional<ReadError>& firstError() const { return m_error; }

private:
    std::string_view field(std::size_t from, std::size_t width, const char* what, bool required) {
        const std::string_view f = text::trim(column(m_line.text, from, width));
        if (f.empty() && required) fault(Code::BadField, from, width, what, "is blank");
        return f;
    }
    void fault(Code code, std::size_t from, std::size_t width, const char* what, const std::string& problem) {
        if (m_error) return;
        m_error = error(code, m_ctx, m_ctx.at(m_line),
                        "record " + std::to_string(m_record) + ", " + what + " (columns " + std::to_string(from + 1) + "-" +
                            std::to_string(from + width) + "): " + problem);
    }

    const Context& m_ctx;
    const Line& m_line;
    int m_record;
    std::optional<ReadError> m_error;
};

// ---------------------------------------------------------------------------------------
// Records

struct Record6 {
    long long functionType = 0;
    std::string responseEntity;
    long long responseNode = 0;
    long long responseDirection = 0;
};

// 2(I5,I10),2(1X,A10,I10,I4)
Result<Record6, ReadError> parseRecord6(const Context& ctx, const Line& line) {
    Columns c(ctx, line, 6);
    Record6 r;
    r.functionType = c.integer(0, 5, "function type").value_or(0);
    c.integer(5, 10, "function id");
    c.integer(15, 5, "version");
    c.integer(20, 10, "load case");
    r.responseEntity = c.textField(31, 10);
    r.responseNode = c.integer(41, 10, "response node").value_or(0);
    r.responseDirection = c.integer(51, 4, "response direction").value_or(0);
    c.integer(66, 10, "reference node");
    c.integer(76, 4, "reference direction");
    if (c.firstError()) return fail(*c.firstError());
    return r;
}

struct Record7 {
    long long dataType = 0;
    long long count = 0;
    long long spacing = 0;
    double minimum = 0;
    double increment = 0;
};

// 3I10,3E13.5 by columns; the first five fields must not be blank.
std::optional<Record7> fixedRecord7(Columns& c) {
    const auto type = c.integer(0, 10, "ordinate data type", true);
    const auto count = c.integer(10, 10, "number of values", true);
    const auto spacing = c.integer(20, 10, "abscissa spacing", true);
    const auto minimum = c.real(30, 13, "abscissa minimum", true);
    const auto increment = c.real(43, 13, "abscissa increment", true);
    c.real(56, 13, "z-axis value", false);
    if (c.firstError()) return std::nullopt;
    return Record7{*type, *count, *spacing, *minimum, *increment};
}

// The same six fields separated by blanks, for writers that do not keep the widths.
std::optional<Record7> freeRecord7(std::string_view line) {
    std::array<std::string_view, 6> t;
    std::size_t n = 0;
    forEachToken(line, [&](std::string_view token) {
        if (n < t.size()) t[n] = token;
        return ++n <= t.size();
    });
    if (n != t.size()) return std::nullopt;
    const auto type = text::parseInteger(t[0]), count = text::parseInteger(t[1]), spacing = text::parseInteger(t[2]);
    const auto minimum = parseNumber(t[3]), increment = parseNumber(t[4]), z = parseNumber(t[5]);
    if (!type || !count || !spacing || !minimum || !increment || !z) return std::nullopt;
    return Record7{*type, *count, *spacing, *minimum, *increment};
}

// Fixed columns first (a 10-digit count fills its I10 field); when they do not parse,
// whitespace-separated fields; when neither does, the error of the fixed columns.
Result<Record7, ReadError> parseRecord7(const Context& ctx, const Line& line) {
    Columns c(ctx, line, 7);
    if (const auto r = fixedRecord7(c)) return *r;
    if (const auto r = freeRecord7(line.text)) return *r;
    ReadError e = *c.firstError();
    e.detail += "; nor does the line hold six numbers separated by blanks";
    return fail(std::move(e));
}

struct Axis {
    long long specificType = 0;
    std::string label;
    std::string units;
};

// I10,3I5,2(1X,A20)
Result<Axis, ReadError> parseAxis(const Context& ctx, const Line& line, int record) {
    Columns c(ctx, line, record);
    Axis a;
    a.specificType = c.integer(0, 10, "specific data type").value_or(0);
    c.integer(10, 5, "length unit exponent");
    c.integer(15, 5, "force unit exponent");
    c.integer(20, 5, "temperature unit exponent");
    a.label = c.textField(26, 20);
    a.units = c.textField(47, 20);
    if (c.firstError()) return fail(*c.firstError());
    return a;
}

struct BinaryHeader {
    long long byteOrder = 1; // 1 little endian, 2 big endian
    long long byteCount = 0;
};

// The fields after "58b": byte order, floating-point format, ASCII line count, byte count, ...
Result<BinaryHeader, ReadError> parseBinaryHeader(const Context& ctx, const Line& line, std::string_view fields) {
    static const char* names[] = {"byte order", "floating-point format", "number of text lines", "number of bytes"};
    std::array<long long, 4> v{};
    std::size_t n = 0;
    std::optional<ReadError> err;
    forEachToken(fields, [&](std::string_view t) {
        if (n >= 4) return false;
        const auto x = text::parseInteger(t);
        if (!x) err = error(Code::BadNumber, ctx, ctx.at(line), std::string("58b header, ") + names[n] + ": " + quote(t) + " is not an integer");
        else v[n++] = *x;
        return !err;
    });
    if (err) return fail(*err);
    const Where w = ctx.at(line);
    if (n < 4) return fail(error(Code::BadField, ctx, w, "the 58b header line needs byte order, floating-point format, number of text lines and number of bytes"));
    if (v[0] != 1 && v[0] != 2) return fail(error(Code::BadField, ctx, w, "58b byte order " + std::to_string(v[0]) + " (1 little endian, 2 big endian)"));
    if (v[1] != 2) return fail(error(Code::UnsupportedFormat, ctx, w, "58b floating-point format " + std::to_string(v[1]) + " (only 2, IEEE 754, is read)"));
    if (v[2] != static_cast<long long>(kTextRecords))
        return fail(error(Code::BadField, ctx, w, "58b announces " + std::to_string(v[2]) + " text lines, dataset 58 has 11"));
    if (v[3] < 0) return fail(error(Code::BadField, ctx, w, "58b byte count " + std::to_string(v[3]) + " is negative"));
    return BinaryHeader{v[0], v[3]};
}

// ---------------------------------------------------------------------------------------
// Meaning of the values

const char* specificTypeName(long long t) {
    switch (t) {
    case 0: return "unknown";
    case 1: return "general";
    case 2: return "stress";
    case 3: return "strain";
    case 5: return "temperature";
    case 6: return "heat flux";
    case 8: return "displacement";
    case 9: return "reaction force";
    case 11: return "velocity";
    case 12: return "acceleration";
    case 13: return "excitation force";
    case 15: return "pressure";
    case 16: return "mass";
    case 17: return "time";
    case 18: return "frequency";
    case 19: return "rpm";
    default: return "not a Humwise quantity";
    }
}

std::optional<Quantity> quantityOfSpecificType(long long t) {
    switch (t) {
    case 8: return Quantity::Displacement;
    case 11: return Quantity::Velocity;
    case 12: return Quantity::Acceleration;
    default: return std::nullopt;
    }
}

struct Meaning {
    Unit unit = Unit::One;
    double scale = 1.0; // applied to file values before the SI conversion
};

bool noLabel(std::string_view label) { return label.empty() || text::lower(label) == "none"; }

Result<Meaning, ReadError> resolveMeaning(const Context& ctx, const Line& line, const Axis& ordinate, const ChannelSetting& cs) {
    const Where w = ctx.at(line);
    const long long t = ordinate.specificType;
    const std::optional<Quantity> q = quantityOfSpecificType(t);
    if (!q && t != 0 && t != 1)
        return fail(error(Code::UnsupportedFormat, ctx, w,
                          "record 9, specific data type " + std::to_string(t) + " (" + specificTypeName(t) +
                              "): Humwise reads acceleration (12), velocity (11), displacement (8), or unknown/general (0/1) with a units label"));
    std::optional<Unit> unit;
    if (!noLabel(ordinate.units)) {
        std::string label; // Fortran-style "m/s**2" as "m/s^2"
        for (std::size_t i = 0; i < ordinate.units.size(); ++i) {
            const bool power = ordinate.units.compare(i, 2, "**") == 0;
            label += power ? '^' : ordinate.units[i];
            i += power ? 1 : 0;
        }
        unit = parseUnit(label);
        if (!unit) return fail(error(Code::BadField, ctx, w, "record 9, units label " + quote(ordinate.units) + " is not a unit Humwise knows"));
    }
    if (unit) {
        if (q && quantityOf(*unit) != *q)
            return fail(error(Code::BadField, ctx, w,
                              "record 9, specific data type " + std::to_string(t) + " (" + specificTypeName(t) + ") with units label " +
                                  quote(ordinate.units) + " (" + std::string(quantityName(quantityOf(*unit))) + ")"));
        return Meaning{*unit, 1.0};
    }
    if (q && quantityOf(cs.unit) != *q) return Meaning{siUnitOf(*q), 1.0};
    return Meaning{cs.unit, cs.scale};
}

// ---------------------------------------------------------------------------------------
// Record 3: DD-MMM-YY HH:MM:SS

bool digitsAt(std::string_view s, std::size_t at, std::size_t n, int& out) {
    if (at + n > s.size()) return false;
    out = 0;
    for (std::size_t i = at; i < at + n; ++i) {
        if (s[i] < '0' || s[i] > '9') return false;
        out = out * 10 + (s[i] - '0');
    }
    return true;
}

std::optional<TimePoint> parseUffDate(std::string_view s) {
    using namespace std::chrono;
    static const char* months[] = {"jan", "feb", "mar", "apr", "may", "jun", "jul", "aug", "sep", "oct", "nov", "dec"};
    s = text::trim(s);
    const std::size_t dash = s.find('-');
    if (dash != 1 && dash != 2) return std::nullopt;
    int d = 0, y = 0, h = 0, mi = 0, sec = 0;
    if (!digitsAt(s, 0, dash, d) || s.size() < dash + 5 || s[dash + 4] != '-') return std::nullopt;
    const std::string mon = text::lower(s.substr(dash + 1, 3));
    unsigned mo = 0;
    for (unsigned i = 0; i < 12; ++i)
        if (mon == months[i]) mo = i + 1;
    std::size_t at = dash + 5;
    if (digitsAt(s, at, 4, y) && (at + 4 == s.size() || s[at + 4] == ' ')) {
        at += 4;
    } else if (digitsAt(s, at, 2, y)) {
        y += y < 69 ? 2000 : 1900; // POSIX strptime %y
        at += 2;
    } else {
        return std::nullopt;
    }
    while (at < s.size() && s[at] == ' ') ++at;
    if (!digitsAt(s, at, 2, h) || at + 2 >= s.size() || s[at + 2] != ':' || !digitsAt(s, at + 3, 2, mi) || at + 5 >= s.size() ||
        s[at + 5] != ':' || !digitsAt(s, at + 6, 2, sec))
        return std::nullopt;
    if (at + 8 < s.size() && s[at + 8] != ' ') return std::nullopt;
    const year_month_day ymd{year{y}, month{mo}, day{static_cast<unsigned>(d)}};
    if (mo == 0 || !ymd.ok() || h > 23 || mi > 59 || sec > 59) return std::nullopt;
    return TimePoint(sys_days(ymd) + hours(h) + minutes(mi) + seconds(sec));
}

// ---------------------------------------------------------------------------------------
// Data (record 12)

// ASCII values up to the closing -1 line.
Result<std::vector<double>, ReadError> readAsciiValues(Scanner& s, const Context& ctx, const Line& record7, std::size_t count) {
    // Every value takes at least two bytes (a digit and a separator): check before reserving.
    if (count > s.remaining() / 2)
        return fail(error(Code::TruncatedData, ctx, ctx.at(record7),
                          "record 7 announces " + std::to_string(count) + " values, only " + std::to_string(s.remaining()) + " bytes follow"));
    std::vector<double> values;
    values.reserve(count);
    while (const auto line = s.next()) {
        if (isDelimiter(line->text)) {
            if (values.size() < count)
                return fail(error(Code::TruncatedData, ctx, ctx.at(*line),
                                  "the dataset closes after " + std::to_string(values.size()) + " of the " + std::to_string(count) + " values record 7 announces"));
            return values;
        }
        std::optional<ReadError> err;
        forEachToken(line->text, [&](std::string_view t) {
            if (values.size() == count) {
                err = error(Code::BadChunk, ctx, ctx.at(*line), "more values than the " + std::to_string(count) + " record 7 announces (or no closing -1)");
                return false;
            }
            const auto v = parseNumber(t);
            if (!v) err = error(Code::BadNumber, ctx, ctx.at(*line), "data value " + std::to_string(values.size() + 1) + ": " + quote(t) + " is not a number");
            else values.push_back(*v);
            return !err;
        });
        if (err) return fail(*err);
    }
    if (values.size() < count)
        return fail(error(Code::TruncatedData, ctx, s.endWhere(ctx),
                          "the file ends after " + std::to_string(values.size()) + " of the " + std::to_string(count) + " values record 7 announces"));
    return fail(error(Code::BadChunk, ctx, s.endWhere(ctx), "the file ends without the -1 that closes the dataset"));
}

double decodeReal(const char* p, std::size_t size, bool bigEndian) {
    std::array<unsigned char, 8> b{};
    for (std::size_t i = 0; i < size; ++i) b[i] = static_cast<unsigned char>(p[bigEndian ? size - 1 - i : i]);
    std::uint64_t u = 0;
    for (std::size_t i = size; i-- > 0;) u = (u << 8) | b[i];
    if (size == 4) {
        const auto u32 = static_cast<std::uint32_t>(u);
        float f;
        std::memcpy(&f, &u32, 4);
        return f;
    }
    double d;
    std::memcpy(&d, &u, 8);
    return d;
}

// Binary values, then the closing -1 (directly or after one line break).
Result<std::vector<double>, ReadError> readBinaryValues(Scanner& s, const Context& ctx, const Line& header, const BinaryHeader& bh,
                                                        std::size_t count, std::size_t valueSize) {
    const auto needed = static_cast<unsigned long long>(count) * valueSize;
    if (static_cast<unsigned long long>(bh.byteCount) != needed)
        return fail(error(Code::BadField, ctx, ctx.at(header),
                          "58b announces " + std::to_string(bh.byteCount) + " bytes, record 7 needs " + std::to_string(needed) + " (" +
                              std::to_string(count) + " values of " + std::to_string(valueSize) + " bytes)"));
    const std::size_t at = s.pos();
    if (needed > s.remaining())
        return fail(error(Code::TruncatedData, ctx, ctx.atOffset(at),
                          "the binary data needs " + std::to_string(needed) + " bytes, only " + std::to_string(s.remaining()) + " remain"));
    const std::string_view block = s.take(needed);
    std::vector<double> values(count);
    for (std::size_t i = 0; i < count; ++i) values[i] = decodeReal(block.data() + i * valueSize, valueSize, bh.byteOrder == 2);
    auto line = s.next();
    if (line && text::trim(line->text).empty()) line = s.next();
    if (!line || !isDelimiter(line->text))
        return fail(error(Code::BadChunk, ctx, ctx.atOffset(at + needed), "no -1 closes the dataset after its " + std::to_string(needed) + " data bytes"));
    return values;
}

// ---------------------------------------------------------------------------------------
// Dataset 58

struct Dataset {
    UffChannelInfo info;
    Meaning meaning;
    double increment = 0;
    std::vector<double> values;
    Where record7;
};

std::string datasetName(const Line& header, const Context& ctx) {
    return ctx.binary ? "the dataset at byte " + std::to_string(header.offset) : "the dataset at line " + std::to_string(header.number);
}

std::optional<ReadError> checkForm(const Context& ctx, const Line& line6, const Record6& r6, const Line& line7, const Record7& r7) {
    if (r6.functionType != 1) {
        static const char* names[] = {"general", "time response", "auto spectrum", "cross spectrum", "frequency response function", "transmissibility",
                                      "coherence", "auto correlation", "cross correlation", "power spectral density", "energy spectral density",
                                      "probability density function", "spectrum", "cumulative frequency distribution"};
        const std::string name = r6.functionType >= 0 && r6.functionType <= 13 ? names[r6.functionType] : "unknown";
        return error(Code::UnsupportedFormat, ctx, ctx.at(line6),
                     "record 6, function type " + std::to_string(r6.functionType) + " (" + name + "): only 1 (time response) is read");
    }
    if (r6.responseDirection < -6 || r6.responseDirection > 6)
        return error(Code::BadField, ctx, ctx.at(line6), "record 6, response direction " + std::to_string(r6.responseDirection) + " (-6 to 6)");
    const Where w = ctx.at(line7);
    if (r7.dataType == 5 || r7.dataType == 6)
        return error(Code::UnsupportedFormat, ctx, w,
                     std::string("record 7, ordinate data type ") + std::to_string(r7.dataType) + " (complex " + (r7.dataType == 5 ? "single" : "double") +
                         "): only real data (2, 4) is read");
    if (r7.dataType != 2 && r7.dataType != 4)
        return error(Code::BadField, ctx, w, "record 7, ordinate data type " + std::to_string(r7.dataType) + " does not exist (2, 4, 5, 6)");
    if (r7.spacing == 0) return error(Code::UnsupportedFormat, ctx, w, "record 7, uneven abscissa spacing (0): only even spacing (1) is read");
    if (r7.spacing != 1) return error(Code::BadField, ctx, w, "record 7, abscissa spacing " + std::to_string(r7.spacing) + " (0 uneven, 1 even)");
    if (r7.count == 0) return error(Code::NoData, ctx, w, "record 7 announces 0 values");
    if (r7.count < 0 || r7.count > kMaxUffValues)
        return error(Code::BadField, ctx, w, "record 7, " + std::to_string(r7.count) + " values (1 to " + std::to_string(kMaxUffValues) + ")");
    if (!std::isfinite(r7.increment) || !(r7.increment > 0))
        return error(Code::BadField, ctx, w, "record 7, abscissa increment " + fmt("%g", r7.increment) + " s is not a positive time step");
    if (!(1.0 / r7.increment <= kMaxUffSampleRateHz))
        return error(Code::BadField, ctx, w, "record 7, abscissa increment " + fmt("%g", r7.increment) + " s gives a rate above 10 MHz");
    return std::nullopt;
}

Result<Dataset, ReadError> parse58(Scanner& s, Context& ctx, const Line& header, std::optional<BinaryHeader> binary, const ChannelSetting& cs) {
    std::array<Line, kTextRecords> rec;
    for (std::size_t i = 0; i < kTextRecords; ++i) {
        const auto line = s.next();
        if (!line)
            return fail(error(Code::TruncatedHeader, ctx, s.endWhere(ctx),
                              "the file ends before record " + std::to_string(i + 1) + " of " + datasetName(header, ctx) + " (dataset 58)"));
        if (isDelimiter(line->text))
            return fail(error(Code::TruncatedHeader, ctx, ctx.at(*line),
                              "-1 in place of record " + std::to_string(i + 1) + " of " + datasetName(header, ctx) + " (records 1-11 and data are needed)"));
        rec[i] = *line;
    }
    auto r6 = parseRecord6(ctx, rec[5]);
    if (!r6) return fail(r6.error());
    auto r7 = parseRecord7(ctx, rec[6]);
    if (!r7) return fail(r7.error());
    std::array<Axis, 4> axes;
    for (int i = 0; i < 4; ++i) {
        auto a = parseAxis(ctx, rec[7 + i], 8 + i);
        if (!a) return fail(a.error());
        axes[i] = std::move(a).value();
    }
    if (auto e = checkForm(ctx, rec[5], r6.value(), rec[6], r7.value())) return fail(*e);
    auto meaning = resolveMeaning(ctx, rec[8], axes[1], cs);
    if (!meaning) return fail(meaning.error());

    const Record7& f = r7.value();
    const auto count = static_cast<std::size_t>(f.count);
    auto values = binary ? readBinaryValues(s, ctx, header, *binary, count, f.dataType == 2 ? 4 : 8) : readAsciiValues(s, ctx, rec[6], count);
    if (!values) return fail(values.error());

    Dataset d;
    d.info.idText = std::string(text::trim(rec[0].text));
    d.info.responseEntity = r6.value().responseEntity;
    d.info.responseNode = r6.value().responseNode;
    d.info.directionCode = static_cast<int>(r6.value().responseDirection);
    d.info.functionType = static_cast<int>(r6.value().functionType);
    d.info.dataType = static_cast<int>(f.dataType);
    d.info.specificDataType = static_cast<int>(axes[1].specificType);
    d.info.unitsLabel = axes[1].units;
    d.info.abscissaMinimumS = f.minimum;
    d.info.binary = binary.has_value();
    if (const auto t = parseUffDate(rec[2].text)) d.info.timestamp = text::formatIsoTime(*t);
    d.meaning = meaning.value();
    d.increment = f.increment;
    d.values = std::move(values).value();
    d.record7 = ctx.at(rec[6]);
    return d;
}

// ---------------------------------------------------------------------------------------
// File

struct DatasetHeader {
    long long number = 0;
    bool binary = false;
    std::string_view fields; // after the number (and the 'b')
};

Result<DatasetHeader, ReadError> parseDatasetHeader(const Context& ctx, const Line& line) {
    std::string_view t = line.text;
    while (!t.empty() && isBlank(t.front())) t.remove_prefix(1);
    std::size_t n = 0;
    while (n < t.size() && t[n] >= '0' && t[n] <= '9') ++n;
    const auto number = n > 0 && n <= 9 ? text::parseInteger(t.substr(0, n)) : std::nullopt;
    DatasetHeader h;
    h.binary = n < t.size() && (t[n] == 'b' || t[n] == 'B');
    const std::size_t rest = n + (h.binary ? 1 : 0);
    if (!number || (rest < t.size() && !isBlank(t[rest])) || (!h.binary && !text::trim(t.substr(rest)).empty()))
        return fail(error(Code::BadNumber, ctx, ctx.at(line), "expected a dataset number after -1, found " + quote(line.text)));
    h.number = *number;
    h.fields = t.substr(rest);
    return h;
}

std::optional<ReadError> skipDataset(Scanner& s, const Context& ctx, const Line& header, long long number) {
    while (const auto line = s.next())
        if (isDelimiter(line->text)) return std::nullopt;
    return error(Code::BadChunk, ctx, ctx.at(header), "dataset " + std::to_string(number) + " has no closing -1");
}

std::string pointLabel(const UffChannelInfo& info) {
    if (info.responseNode == 0 && info.directionCode == 0) return {};
    return std::to_string(info.responseNode) + uffDirectionLabel(info.directionCode);
}

// Record 1, else "<entity> <node><direction>", else "chN"; duplicates made unique (UffReader.h).
std::vector<std::string> channelNames(const std::vector<UffChannelInfo>& infos) {
    std::vector<std::string> names;
    std::vector<bool> fromId;
    for (std::size_t i = 0; i < infos.size(); ++i) {
        const UffChannelInfo& info = infos[i];
        const std::string point = pointLabel(info);
        fromId.push_back(!noLabel(info.idText));
        if (fromId.back()) names.push_back(info.idText);
        else if (point.empty()) names.push_back("ch" + std::to_string(i + 1));
        else names.push_back(noLabel(info.responseEntity) ? point : info.responseEntity + " " + point);
    }
    const auto repeated = [](const std::vector<std::string>& v, const std::string& n) { return std::count(v.begin(), v.end(), n) > 1; };
    std::vector<std::string> out = names;
    for (std::size_t i = 0; i < names.size(); ++i)
        if (fromId[i] && repeated(names, names[i]) && !pointLabel(infos[i]).empty()) out[i] += " (" + pointLabel(infos[i]) + ")";
    const std::vector<std::string> second = out;
    for (std::size_t i = 0; i < out.size(); ++i)
        if (repeated(second, second[i])) out[i] += " #" + std::to_string(i + 1);
    return out;
}

Result<UffFile, ReadError> assemble(const Context& ctx, std::vector<Dataset>& sets) {
    UffFile file;
    const Dataset& first = sets.front();
    for (const Dataset& d : sets) {
        if (d.values.size() != first.values.size())
            return fail(error(Code::UnsupportedFormat, ctx, d.record7,
                              "record 7, " + std::to_string(d.values.size()) + " values where the first dataset has " + std::to_string(first.values.size()) +
                                  ": datasets of different lengths cannot be channels of one recording"));
        if (std::abs(d.increment - first.increment) > kIncrementTolerance * first.increment)
            return fail(error(Code::UnsupportedFormat, ctx, d.record7,
                              "record 7, abscissa increment " + fmt("%.6g", d.increment) + " s where the first dataset has " + fmt("%.6g", first.increment) +
                                  " s: datasets at different rates cannot be channels of one recording"));
        file.channels.push_back(d.info);
    }
    const double rate = 1.0 / first.increment;
    const double whole = std::round(rate);
    Recording& rec = file.recording;
    rec.sampleRateHz = whole >= 1 && std::abs(rate - whole) <= kRateRounding * rate ? whole : rate;
    rec.source = ctx.source;
    if (first.info.timestamp) rec.startTime = text::parseIsoTime(*first.info.timestamp);
    const auto names = channelNames(file.channels);
    for (std::size_t i = 0; i < sets.size(); ++i) {
        Channel ch;
        ch.name = names[i];
        ch.quantity = quantityOf(sets[i].meaning.unit);
        const double factor = sets[i].meaning.scale * toSiFactor(sets[i].meaning.unit);
        ch.samples = std::move(sets[i].values);
        for (double& v : ch.samples) v *= factor;
        rec.channels.push_back(std::move(ch));
    }
    return file;
}

std::string listNumbers(const std::vector<long long>& numbers) {
    std::string s;
    for (std::size_t i = 0; i < numbers.size() && i < 8; ++i) s += (i ? ", " : "") + std::to_string(numbers[i]);
    return numbers.size() > 8 ? s + ", ..." : s;
}

} // namespace

std::string uffDirectionLabel(int code) {
    static const char* axes[] = {"X", "Y", "Z", "RX", "RY", "RZ"};
    if (code == 0 || code < -6 || code > 6) return {};
    return std::string(code > 0 ? "+" : "-") + axes[std::abs(code) - 1];
}

Result<UffFile, ReadError> parseUff(std::span<const std::byte> bytes, const std::string& source, const UffReadOptions& options) {
    Context ctx{source};
    if (bytes.empty()) return fail(ReadError{Code::Empty, source, {}, {}, "the file is empty"});
    Scanner s(std::string_view(reinterpret_cast<const char*>(bytes.data()), bytes.size()));
    std::vector<Dataset> sets;
    std::vector<long long> others;
    std::optional<Where> firstDataset;
    while (const auto line = s.next()) {
        if (text::trim(line->text).empty()) continue;
        if (!isDelimiter(line->text)) {
            if (!firstDataset) return fail(error(Code::NotRecognised, ctx, ctx.at(*line), "not a universal file: the first line is " + quote(line->text) + ", not -1"));
            return fail(error(Code::BadChunk, ctx, ctx.at(*line), "expected -1 to open the next dataset, found " + quote(line->text)));
        }
        if (!firstDataset) firstDataset = ctx.at(*line);
        const auto headerLine = s.next();
        if (!headerLine) return fail(error(Code::TruncatedHeader, ctx, s.endWhere(ctx), "the file ends after -1, before the dataset number"));
        auto header = parseDatasetHeader(ctx, *headerLine);
        if (!header) return fail(header.error());
        const DatasetHeader& h = header.value();
        if (h.binary) ctx.binary = true; // binary data follows: line numbers end here
        if (h.number != 58) {
            if (std::find(others.begin(), others.end(), h.number) == others.end()) others.push_back(h.number);
            if (auto e = skipDataset(s, ctx, *headerLine, h.number)) return fail(*e);
            continue;
        }
        if (sets.size() == kMaxUffChannels)
            return fail(error(Code::UnsupportedFormat, ctx, ctx.at(*headerLine), "more than " + std::to_string(kMaxUffChannels) + " datasets 58"));
        std::optional<BinaryHeader> binary;
        if (h.binary) {
            auto bh = parseBinaryHeader(ctx, *headerLine, h.fields);
            if (!bh) return fail(bh.error());
            binary = bh.value();
        }
        auto d = parse58(s, ctx, *headerLine, binary, options.channels.forChannel(sets.size()));
        if (!d) return fail(d.error());
        sets.push_back(std::move(d).value());
    }
    if (!firstDataset) return fail(error(Code::NotRecognised, ctx, s.endWhere(ctx), "only blank lines, no universal file dataset"));
    if (sets.empty())
        return fail(error(Code::UnsupportedFormat, ctx, *firstDataset,
                          "no dataset 58 (function at nodal DOF) in the file; it holds dataset" + std::string(others.size() > 1 ? "s " : " ") + listNumbers(others)));
    return assemble(ctx, sets);
}

Result<UffFile, ReadError> readUff(std::istream& in, const std::string& source, const UffReadOptions& options) {
    auto bytes = readAllBytes(in, source);
    if (!bytes) return fail(bytes.error());
    return parseUff(bytes.value(), source, options);
}

Result<UffFile, ReadError> readUffFile(const std::filesystem::path& path, const UffReadOptions& options) {
    auto bytes = readFileBytes(path);
    if (!bytes) return fail(bytes.error());
    return parseUff(bytes.value(), path.string(), options);
}

Result<Recording, ReadError> parseUffRecording(std::span<const std::byte> bytes, const std::string& source, const UffReadOptions& options) {
    auto file = parseUff(bytes, source, options);
    if (!file) return fail(file.error());
    return std::move(file).value().recording;
}

bool looksLikeUff58(std::span<const std::byte> bytes) {
    Scanner s(std::string_view(reinterpret_cast<const char*>(bytes.data()), bytes.size()));
    std::optional<Line> line;
    while ((line = s.next()) && text::trim(line->text).empty()) {}
    if (!line || !isDelimiter(line->text)) return false;
    const auto header = s.next();
    if (!header) return false;
    const std::string source;
    const Context ctx{source};
    const auto h = parseDatasetHeader(ctx, *header);
    return h && h.value().number == 58;
}

} // namespace humwise::io
