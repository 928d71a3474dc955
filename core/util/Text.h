#pragma once
// Small text helpers shared by the readers and the command line (no locale dependence).

#include <chrono>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace humwise::text {

std::string_view trim(std::string_view s);

// The non-blank lines of a text, one at a time, with their 1-based numbers in the text; "\n" and
// "\r\n" both end a line (the '\r' is not part of it).
class LineReader {
public:
    explicit LineReader(std::string_view text) : m_text(text) {}
    // The next line that is not blank and its number; false at the end of the text.
    bool next(std::string_view& line, std::size_t& number);

private:
    std::string_view m_text;
    std::size_t m_pos = 0;
    std::size_t m_number = 0;
};

std::string lower(std::string_view s);
std::vector<std::string_view> split(std::string_view s, char delimiter);

// Whole-string parse, C locale, accepts a leading '+', "nan", "inf". nullopt otherwise.
std::optional<double> parseDouble(std::string_view s);
std::optional<long long> parseInteger(std::string_view s);

// ISO 8601 date-time: YYYY-MM-DD[THH:MM[:SS[.fff]]][Z|+hh:mm|-hh:mm]; no zone means UTC.
std::optional<std::chrono::sys_time<std::chrono::milliseconds>> parseIsoTime(std::string_view s);
std::string formatIsoTime(std::chrono::sys_time<std::chrono::milliseconds> t); // "2026-03-04T10:15:00.000Z"
std::string isoNow(); // formatIsoTime of the system clock now, to the millisecond

} // namespace humwise::text
