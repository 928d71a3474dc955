#include "cli/MiniJson.h"

#include <charconv>
#include <stdexcept>

namespace humwise::test::json {

class Parser {
public:
    explicit Parser(std::string_view text) : m_text(text) {}

    Value document() {
        Value v = value(0);
        skipSpace();
        if (m_at != m_text.size()) fail("text after the JSON value");
        return v;
    }

private:
    [[noreturn]] void fail(const std::string& what) const {
        throw std::runtime_error("JSON: " + what + " at byte " + std::to_string(m_at));
    }

    void skipSpace() {
        while (m_at < m_text.size() && (m_text[m_at] == ' ' || m_text[m_at] == '\n' || m_text[m_at] == '\r' || m_text[m_at] == '\t'))
            ++m_at;
    }

    char peek() {
        skipSpace();
        if (m_at >= m_text.size()) fail("unexpected end");
        return m_text[m_at];
    }

    void expect(char c) {
        if (peek() != c) fail(std::string("expected '") + c + "'");
        ++m_at;
    }

    void literal(std::string_view word) {
        if (m_text.substr(m_at, word.size()) != word) fail("bad literal");
        m_at += word.size();
    }

    Value value(int depth) {
        if (depth > 64) fail("nesting too deep");
        Value v;
        switch (peek()) {
        case '{': {
            v.m_type = Value::Type::Object;
            ++m_at;
            if (peek() == '}') { ++m_at; return v; }
            for (;;) {
                if (peek() != '"') fail("expected a key");
                v.m_keys.push_back(string());
                expect(':');
                v.m_items.push_back(value(depth + 1));
                if (peek() == ',') { ++m_at; continue; }
                expect('}');
                return v;
            }
        }
        case '[': {
            v.m_type = Value::Type::Array;
            ++m_at;
            if (peek() == ']') { ++m_at; return v; }
            for (;;) {
                v.m_items.push_back(value(depth + 1));
                if (peek() == ',') { ++m_at; continue; }
                expect(']');
                return v;
            }
        }
        case '"':
            v.m_type = Value::Type::String;
            v.m_string = string();
            return v;
        case 't': literal("true"); v.m_type = Value::Type::Bool; v.m_bool = true; return v;
        case 'f': literal("false"); v.m_type = Value::Type::Bool; return v;
        case 'n': literal("null"); return v;
        default: v.m_type = Value::Type::Number; v.m_number = number(); return v;
        }
    }

    std::string string() {
        expect('"');
        std::string s;
        while (m_at < m_text.size()) {
            const char c = m_text[m_at++];
            if (c == '"') return s;
            if (static_cast<unsigned char>(c) < 0x20) fail("control character in a string");
            if (c != '\\') { s += c; continue; }
            if (m_at >= m_text.size()) break;
            const char e = m_text[m_at++];
            switch (e) {
            case '"': case '\\': case '/': s += e; break;
            case 'b': s += '\b'; break;
            case 'f': s += '\f'; break;
            case 'n': s += '\n'; break;
            case 'r': s += '\r'; break;
            case 't': s += '\t'; break;
            case 'u': {
                unsigned code = 0;
                if (m_at + 4 > m_text.size()) fail("short \\u escape");
                const auto [p, ec] = std::from_chars(m_text.data() + m_at, m_text.data() + m_at + 4, code, 16);
                if (ec != std::errc() || p != m_text.data() + m_at + 4) fail("bad \\u escape");
                m_at += 4;
                s += code < 0x80 ? static_cast<char>(code) : '?'; // enough for checking
                break;
            }
            default: fail("bad escape");
            }
        }
        fail("unterminated string");
    }

    double number() {
        const std::size_t start = m_at;
        if (m_at < m_text.size() && m_text[m_at] == '-') ++m_at;
        const auto digits = [&] {
            const std::size_t from = m_at;
            while (m_at < m_text.size() && m_text[m_at] >= '0' && m_text[m_at] <= '9') ++m_at;
            if (m_at == from) fail("expected a digit");
        };
        if (m_at < m_text.size() && m_text[m_at] == '0') ++m_at; else digits();
        if (m_at < m_text.size() && m_text[m_at] == '.') { ++m_at; digits(); }
        if (m_at < m_text.size() && (m_text[m_at] == 'e' || m_text[m_at] == 'E')) {
            ++m_at;
            if (m_at < m_text.size() && (m_text[m_at] == '+' || m_text[m_at] == '-')) ++m_at;
            digits();
        }
        double v = 0;
        const auto [p, ec] = std::from_chars(m_text.data() + start, m_text.data() + m_at, v);
        if (ec != std::errc() || p != m_text.data() + m_at) fail("bad number");
        return v;
    }

    std::string_view m_text;
    std::size_t m_at = 0;
};

namespace {
[[noreturn]] void wrongType(const char* wanted) { throw std::runtime_error(std::string("JSON value is not ") + wanted); }
} // namespace

double Value::number() const {
    if (m_type != Type::Number) wrongType("a number");
    return m_number;
}

const std::string& Value::string() const {
    if (m_type != Type::String) wrongType("a string");
    return m_string;
}

bool Value::boolean() const {
    if (m_type != Type::Bool) wrongType("a boolean");
    return m_bool;
}

std::size_t Value::size() const {
    if (m_type != Type::Array && m_type != Type::Object) wrongType("an array or object");
    return m_items.size();
}

const Value& Value::at(std::size_t i) const {
    if (m_type != Type::Array) wrongType("an array");
    if (i >= m_items.size()) throw std::runtime_error("JSON array index " + std::to_string(i) + " out of range");
    return m_items[i];
}

std::vector<double> Value::numbers() const {
    if (m_type != Type::Array) wrongType("an array");
    std::vector<double> out;
    for (const auto& v : m_items) out.push_back(v.number());
    return out;
}

bool Value::has(std::string_view key) const {
    if (m_type != Type::Object) wrongType("an object");
    for (const auto& k : m_keys)
        if (k == key) return true;
    return false;
}

const Value& Value::operator[](std::string_view key) const {
    if (m_type != Type::Object) wrongType("an object");
    for (std::size_t i = 0; i < m_keys.size(); ++i)
        if (m_keys[i] == key) return m_items[i];
    throw std::runtime_error("JSON object has no key '" + std::string(key) + "'");
}

Value parse(std::string_view text) { return Parser(text).document(); }

} // namespace humwise::test::json
