#include "core/util/JsonReader.h"

#include <charconv>
#include <cmath>

namespace humwise::json {
namespace {

constexpr int kMaxDepth = 64;

class Parser {
public:
    explicit Parser(std::string_view t) : m_text(t) {}

    std::optional<Value> document(ParseError& error) {
        skipSpace();
        auto v = value(0);
        if (v) {
            skipSpace();
            if (m_pos != m_text.size()) fail("text after the end of the document");
        }
        if (m_failed) {
            error = m_error;
            return std::nullopt;
        }
        return v;
    }

private:
    void fail(std::string message) {
        if (m_failed) return;
        m_failed = true;
        std::size_t line = 1, col = 1;
        for (std::size_t i = 0; i < m_pos && i < m_text.size(); ++i) {
            if (m_text[i] == '\n') {
                ++line;
                col = 1;
            } else {
                ++col;
            }
        }
        m_error = {line, col, std::move(message)};
    }
    // The line of m_pos, counted on from where the previous call stopped: the document is scanned
    // once, not once per value (which made a 3 MB fleet file take half a minute to read).
    std::size_t line() {
        if (m_pos < m_linePos) { // only after a failed number; start again
            m_linePos = 0;
            m_line = 1;
        }
        for (; m_linePos < m_pos && m_linePos < m_text.size(); ++m_linePos) m_line += m_text[m_linePos] == '\n';
        return m_line;
    }
    void skipSpace() {
        while (m_pos < m_text.size() && (m_text[m_pos] == ' ' || m_text[m_pos] == '\t' || m_text[m_pos] == '\n' || m_text[m_pos] == '\r')) ++m_pos;
    }
    bool consume(std::string_view word) {
        if (m_text.substr(m_pos, word.size()) == word) {
            m_pos += word.size();
            return true;
        }
        return false;
    }

    std::optional<Value> value(int depth) {
        if (depth > kMaxDepth) {
            fail("nested deeper than 64 levels");
            return std::nullopt;
        }
        if (m_pos >= m_text.size()) {
            fail("unexpected end of the document");
            return std::nullopt;
        }
        const std::size_t l = line();
        const char c = m_text[m_pos];
        if (c == '{') return object(depth, l);
        if (c == '[') return array(depth, l);
        if (c == '"') {
            auto s = string();
            if (!s) return std::nullopt;
            return Value::makeString(std::move(*s), l);
        }
        if (consume("true")) return Value::makeBool(true, l);
        if (consume("false")) return Value::makeBool(false, l);
        if (consume("null")) return Value::makeNull(l);
        if (c == '-' || (c >= '0' && c <= '9')) return number(l);
        fail(std::string("unexpected character '") + c + "'");
        return std::nullopt;
    }

    std::optional<Value> number(std::size_t l) {
        const std::size_t start = m_pos;
        if (m_text[m_pos] == '-') ++m_pos;
        while (m_pos < m_text.size() && std::string_view("0123456789.eE+-").find(m_text[m_pos]) != std::string_view::npos) ++m_pos;
        double v = 0;
        const auto [ptr, ec] = std::from_chars(m_text.data() + start, m_text.data() + m_pos, v);
        if (ec != std::errc() || ptr != m_text.data() + m_pos || !std::isfinite(v)) {
            m_pos = start;
            fail("malformed number");
            return std::nullopt;
        }
        return Value::makeNumber(v, l);
    }

    std::optional<std::string> string() {
        ++m_pos; // opening quote
        std::string out;
        while (m_pos < m_text.size()) {
            const char c = m_text[m_pos++];
            if (c == '"') return out;
            if (static_cast<unsigned char>(c) < 0x20) {
                fail("control character inside a string");
                return std::nullopt;
            }
            if (c != '\\') {
                out += c;
                continue;
            }
            if (m_pos >= m_text.size()) break;
            const char e = m_text[m_pos++];
            switch (e) {
            case '"': out += '"'; break;
            case '\\': out += '\\'; break;
            case '/': out += '/'; break;
            case 'b': out += '\b'; break;
            case 'f': out += '\f'; break;
            case 'n': out += '\n'; break;
            case 'r': out += '\r'; break;
            case 't': out += '\t'; break;
            case 'u': {
                if (m_pos + 4 > m_text.size()) {
                    fail("short \\u escape");
                    return std::nullopt;
                }
                unsigned cp = 0;
                const auto [ptr, ec] = std::from_chars(m_text.data() + m_pos, m_text.data() + m_pos + 4, cp, 16);
                if (ec != std::errc() || ptr != m_text.data() + m_pos + 4) {
                    fail("bad \\u escape");
                    return std::nullopt;
                }
                m_pos += 4;
                // UTF-8 encode (surrogate pairs are kept as two 3-byte sequences: enough for our files).
                if (cp < 0x80) {
                    out += static_cast<char>(cp);
                } else if (cp < 0x800) {
                    out += static_cast<char>(0xC0 | (cp >> 6));
                    out += static_cast<char>(0x80 | (cp & 0x3F));
                } else {
                    out += static_cast<char>(0xE0 | (cp >> 12));
                    out += static_cast<char>(0x80 | ((cp >> 6) & 0x3F));
                    out += static_cast<char>(0x80 | (cp & 0x3F));
                }
                break;
            }
            default: fail(std::string("unknown escape \\") + e); return std::nullopt;
            }
        }
        fail("unterminated string");
        return std::nullopt;
    }

    std::optional<Value> array(int depth, std::size_t l) {
        ++m_pos;
        std::vector<Value> items;
        skipSpace();
        if (m_pos < m_text.size() && m_text[m_pos] == ']') {
            ++m_pos;
            return Value::makeArray(std::move(items), l);
        }
        for (;;) {
            skipSpace();
            auto v = value(depth + 1);
            if (!v) return std::nullopt;
            items.push_back(std::move(*v));
            skipSpace();
            if (m_pos < m_text.size() && m_text[m_pos] == ',') {
                ++m_pos;
                continue;
            }
            if (m_pos < m_text.size() && m_text[m_pos] == ']') {
                ++m_pos;
                return Value::makeArray(std::move(items), l);
            }
            fail("expected ',' or ']' in an array");
            return std::nullopt;
        }
    }

    std::optional<Value> object(int depth, std::size_t l) {
        ++m_pos;
        std::vector<std::pair<std::string, Value>> members;
        skipSpace();
        if (m_pos < m_text.size() && m_text[m_pos] == '}') {
            ++m_pos;
            return Value::makeObject(std::move(members), l);
        }
        for (;;) {
            skipSpace();
            if (m_pos >= m_text.size() || m_text[m_pos] != '"') {
                fail("expected a member name in quotes");
                return std::nullopt;
            }
            auto key = string();
            if (!key) return std::nullopt;
            for (const auto& [k, v] : members)
                if (k == *key) {
                    fail("member '" + *key + "' appears twice");
                    return std::nullopt;
                }
            skipSpace();
            if (m_pos >= m_text.size() || m_text[m_pos] != ':') {
                fail("expected ':' after a member name");
                return std::nullopt;
            }
            ++m_pos;
            skipSpace();
            auto v = value(depth + 1);
            if (!v) return std::nullopt;
            members.emplace_back(std::move(*key), std::move(*v));
            skipSpace();
            if (m_pos < m_text.size() && m_text[m_pos] == ',') {
                ++m_pos;
                continue;
            }
            if (m_pos < m_text.size() && m_text[m_pos] == '}') {
                ++m_pos;
                return Value::makeObject(std::move(members), l);
            }
            fail("expected ',' or '}' in an object");
            return std::nullopt;
        }
    }

    std::string_view m_text;
    std::size_t m_pos = 0;
    std::size_t m_linePos = 0, m_line = 1; // line() has counted the newlines before m_linePos
    bool m_failed = false;
    ParseError m_error;
};

} // namespace

const Value* Value::find(std::string_view key) const {
    for (const auto& [k, v] : m_members)
        if (k == key) return &v;
    return nullptr;
}

Value Value::makeNull(std::size_t l) { Value v; v.m_line = l; return v; }
Value Value::makeBool(bool b, std::size_t l) { Value v; v.m_type = Type::Bool; v.m_bool = b; v.m_line = l; return v; }
Value Value::makeNumber(double d, std::size_t l) { Value v; v.m_type = Type::Number; v.m_number = d; v.m_line = l; return v; }
Value Value::makeString(std::string s, std::size_t l) { Value v; v.m_type = Type::String; v.m_string = std::move(s); v.m_line = l; return v; }
Value Value::makeArray(std::vector<Value> a, std::size_t l) { Value v; v.m_type = Type::Array; v.m_items = std::move(a); v.m_line = l; return v; }
Value Value::makeObject(std::vector<std::pair<std::string, Value>> o, std::size_t l) {
    Value v;
    v.m_type = Type::Object;
    v.m_members = std::move(o);
    v.m_line = l;
    return v;
}

std::optional<Value> parse(std::string_view text, ParseError& error) { return Parser(text).document(error); }

} // namespace humwise::json
