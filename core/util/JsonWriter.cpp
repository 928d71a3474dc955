#include "core/util/JsonWriter.h"

#include <charconv>
#include <cmath>
#include <cstdio>

namespace humwise::json {

std::string escape(std::string_view s) {
    std::string out;
    out.reserve(s.size() + 2);
    for (unsigned char c : s) {
        switch (c) {
        case '"': out += "\\\""; break;
        case '\\': out += "\\\\"; break;
        case '\n': out += "\\n"; break;
        case '\r': out += "\\r"; break;
        case '\t': out += "\\t"; break;
        default:
            if (c < 0x20) {
                char buf[8];
                std::snprintf(buf, sizeof buf, "\\u%04x", c);
                out += buf;
            } else {
                out += static_cast<char>(c);
            }
        }
    }
    return out;
}

std::string number(double v) {
    if (!std::isfinite(v)) return "null";
    char buf[32];
    const auto [ptr, ec] = std::to_chars(buf, buf + sizeof buf, v);
    return ec == std::errc() ? std::string(buf, ptr) : "null";
}

void Writer::newline() {
    if (!m_pretty) return;
    m_out << '\n';
    for (std::size_t i = 0; i < m_hasItems.size(); ++i) m_out << "  ";
}

void Writer::separator() {
    if (m_afterKey) {
        m_afterKey = false;
        return;
    }
    if (!m_hasItems.empty()) {
        if (m_hasItems.back()) m_out << ',';
        m_hasItems.back() = true;
        newline();
    }
}

Writer& Writer::beginObject() {
    separator();
    m_out << '{';
    m_hasItems.push_back(false);
    return *this;
}

Writer& Writer::endObject() {
    const bool had = m_hasItems.back();
    m_hasItems.pop_back();
    if (had) newline();
    m_out << '}';
    if (m_hasItems.empty() && m_pretty) m_out << '\n';
    return *this;
}

Writer& Writer::beginArray() {
    separator();
    m_out << '[';
    m_hasItems.push_back(false);
    return *this;
}

Writer& Writer::endArray() {
    const bool had = m_hasItems.back();
    m_hasItems.pop_back();
    if (had) newline();
    m_out << ']';
    return *this;
}

Writer& Writer::key(std::string_view k) {
    separator();
    m_out << '"' << escape(k) << "\":" << (m_pretty ? " " : "");
    m_afterKey = true;
    return *this;
}

Writer& Writer::value(std::string_view s) {
    separator();
    m_out << '"' << escape(s) << '"';
    return *this;
}

Writer& Writer::value(double v) {
    separator();
    m_out << number(v);
    return *this;
}

Writer& Writer::value(long long v) {
    separator();
    m_out << v;
    return *this;
}

Writer& Writer::value(bool v) {
    separator();
    m_out << (v ? "true" : "false");
    return *this;
}

Writer& Writer::null() {
    separator();
    m_out << "null";
    return *this;
}

Writer& Writer::numbers(std::span<const double> values) {
    separator();
    m_out << '[';
    for (std::size_t i = 0; i < values.size(); ++i) {
        if (i) m_out << ',';
        m_out << number(values[i]);
    }
    m_out << ']';
    return *this;
}

} // namespace humwise::json
