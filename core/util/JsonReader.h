#pragma once
// A small JSON parser (RFC 8259) for Humwise's own files (the fleet definition). Values keep
// object members in file order. Depth and size are bounded; errors name the line and column.

#include <cstddef>
#include <map>
#include <memory>
#include <optional>
#include <string>
#include <string_view>
#include <utility>
#include <vector>

namespace humwise::json {

class Value {
public:
    enum class Type { Null, Bool, Number, String, Array, Object };

    Type type() const { return m_type; }
    bool isNull() const { return m_type == Type::Null; }
    bool isNumber() const { return m_type == Type::Number; }
    bool isString() const { return m_type == Type::String; }
    bool isArray() const { return m_type == Type::Array; }
    bool isObject() const { return m_type == Type::Object; }
    bool isBool() const { return m_type == Type::Bool; }

    double number() const { return m_number; }
    bool boolean() const { return m_bool; }
    const std::string& string() const { return m_string; }
    const std::vector<Value>& items() const { return m_items; }
    const std::vector<std::pair<std::string, Value>>& members() const { return m_members; }
    const Value* find(std::string_view key) const; // nullptr when absent
    std::size_t line() const { return m_line; }     // where the value starts, 1-based

    static Value makeNull(std::size_t line);
    static Value makeBool(bool v, std::size_t line);
    static Value makeNumber(double v, std::size_t line);
    static Value makeString(std::string v, std::size_t line);
    static Value makeArray(std::vector<Value> v, std::size_t line);
    static Value makeObject(std::vector<std::pair<std::string, Value>> v, std::size_t line);

private:
    Type m_type = Type::Null;
    double m_number = 0;
    bool m_bool = false;
    std::string m_string;
    std::vector<Value> m_items;
    std::vector<std::pair<std::string, Value>> m_members;
    std::size_t m_line = 0;
};

struct ParseError {
    std::size_t line = 0;
    std::size_t column = 0;
    std::string message;
};

// Parses a whole document; on failure fills `error` and returns nullopt.
std::optional<Value> parse(std::string_view text, ParseError& error);

} // namespace humwise::json
