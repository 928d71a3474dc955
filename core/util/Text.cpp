#include "core/util/Text.h"

#include <algorithm>
#include <cctype>
#include <charconv>
#include <cstdio>

namespace humwise::text {

bool LineReader::next(std::string_view& line, std::size_t& number) {
    while (m_pos < m_text.size()) {
        std::size_t end = m_text.find('\n', m_pos);
        if (end == std::string_view::npos) end = m_text.size();
        line = m_text.substr(m_pos, end - m_pos);
        m_pos = end + 1;
        ++m_number;
        if (!line.empty() && line.back() == '\r') line.remove_suffix(1);
        if (trim(line).empty()) continue;
        number = m_number;
        return true;
    }
    return false;
}

std::string_view trim(std::string_view s) {
    while (!s.empty() && std::isspace(static_cast<unsigned char>(s.front()))) s.remove_prefix(1);
    while (!s.empty() && std::isspace(static_cast<unsigned char>(s.back()))) s.remove_suffix(1);
    return s;
}

std::string lower(std::string_view s) {
    std::string out(s);
    std::transform(out.begin(), out.end(), out.begin(), [](unsigned char c) { return static_cast<char>(std::tolower(c)); });
    return out;
}

std::vector<std::string_view> split(std::string_view s, char delimiter) {
    std::vector<std::string_view> parts;
    std::size_t start = 0;
    for (;;) {
        const std::size_t pos = s.find(delimiter, start);
        if (pos == std::string_view::npos) {
            parts.push_back(s.substr(start));
            return parts;
        }
        parts.push_back(s.substr(start, pos - start));
        start = pos + 1;
    }
}

std::optional<double> parseDouble(std::string_view s) {
    s = trim(s);
    if (!s.empty() && s.front() == '+') s.remove_prefix(1);
    if (s.empty()) return std::nullopt;
    double v = 0;
    const auto [ptr, ec] = std::from_chars(s.data(), s.data() + s.size(), v);
    if (ec != std::errc() || ptr != s.data() + s.size()) return std::nullopt;
    return v;
}

std::optional<long long> parseInteger(std::string_view s) {
    s = trim(s);
    if (!s.empty() && s.front() == '+') s.remove_prefix(1);
    if (s.empty()) return std::nullopt;
    long long v = 0;
    const auto [ptr, ec] = std::from_chars(s.data(), s.data() + s.size(), v);
    if (ec != std::errc() || ptr != s.data() + s.size()) return std::nullopt;
    return v;
}

namespace {
bool digits(std::string_view s, std::size_t at, std::size_t count, int& out) {
    if (at + count > s.size()) return false;
    out = 0;
    for (std::size_t i = at; i < at + count; ++i) {
        if (!std::isdigit(static_cast<unsigned char>(s[i]))) return false;
        out = out * 10 + (s[i] - '0');
    }
    return true;
}
} // namespace

std::optional<std::chrono::sys_time<std::chrono::milliseconds>> parseIsoTime(std::string_view s) {
    using namespace std::chrono;
    s = trim(s);
    int y, mo, d, h = 0, mi = 0, sec = 0, ms = 0;
    if (!digits(s, 0, 4, y) || s.size() < 10 || s[4] != '-' || !digits(s, 5, 2, mo) || s[7] != '-' || !digits(s, 8, 2, d))
        return std::nullopt;
    std::size_t at = 10;
    if (at < s.size() && (s[at] == 'T' || s[at] == ' ')) {
        if (!digits(s, at + 1, 2, h) || at + 3 >= s.size() || s[at + 3] != ':' || !digits(s, at + 4, 2, mi)) return std::nullopt;
        at += 6;
        if (at < s.size() && s[at] == ':') {
            if (!digits(s, at + 1, 2, sec)) return std::nullopt;
            at += 3;
            if (at < s.size() && s[at] == '.') {
                ++at;
                int scale = 100;
                while (at < s.size() && std::isdigit(static_cast<unsigned char>(s[at]))) {
                    ms += (s[at] - '0') * scale;
                    scale /= 10;
                    ++at;
                }
            }
        }
    }
    minutes offset{0};
    if (at < s.size()) {
        if (s[at] == 'Z' && at + 1 == s.size()) {
            ++at;
        } else if ((s[at] == '+' || s[at] == '-') && at + 6 == s.size() && s[at + 3] == ':') {
            int oh, om;
            if (!digits(s, at + 1, 2, oh) || !digits(s, at + 4, 2, om)) return std::nullopt;
            offset = minutes((s[at] == '-' ? -1 : 1) * (oh * 60 + om));
            at += 6;
        } else {
            return std::nullopt;
        }
    }
    const year_month_day ymd{year{y}, month{static_cast<unsigned>(mo)}, day{static_cast<unsigned>(d)}};
    if (!ymd.ok() || h > 23 || mi > 59 || sec > 60) return std::nullopt;
    return sys_days(ymd) + hours(h) + minutes(mi) + seconds(sec) + milliseconds(ms) - offset;
}

std::string formatIsoTime(std::chrono::sys_time<std::chrono::milliseconds> t) {
    using namespace std::chrono;
    const auto days = floor<std::chrono::days>(t);
    const year_month_day ymd{days};
    const hh_mm_ss<milliseconds> hms{t - days};
    char buf[40];
    std::snprintf(buf, sizeof buf, "%04d-%02u-%02uT%02d:%02d:%02d.%03dZ", static_cast<int>(ymd.year()),
                  static_cast<unsigned>(ymd.month()), static_cast<unsigned>(ymd.day()), static_cast<int>(hms.hours().count()),
                  static_cast<int>(hms.minutes().count()), static_cast<int>(hms.seconds().count()),
                  static_cast<int>(hms.subseconds().count()));
    return buf;
}

std::string isoNow() { return formatIsoTime(std::chrono::floor<std::chrono::milliseconds>(std::chrono::system_clock::now())); }

} // namespace humwise::text
