#pragma once
// A small strict JSON reader for checking the CLI's --json output (RFC 8259 syntax; numbers
// as double). Test-only: errors throw std::runtime_error with the byte offset.

#include <cstddef>
#include <string>
#include <string_view>
#include <vector>

namespace humwise::test::json {

class Value {
public:
    enum class Type { Null, Bool, Number, String, Array, Object };

    Type type() const { return m_type; }
    bool isNull() const { return m_type == Type::Null; }

    double number() const;
    const std::string& string() const;
    bool boolean() const;
    // Arrays
    std::size_t size() const;
    const Value& at(std::size_t i) const;
    std::vector<double> numbers() const; // an array of numbers
    // Objects (throw when the key is absent)
    bool has(std::string_view key) const;
    const Value& operator[](std::string_view key) const;
    const Value& operator[](const char* key) const { return (*this)[std::string_view(key)]; }

private:
    friend class Parser;
    Type m_type = Type::Null;
    bool m_bool = false;
    double m_number = 0;
    std::string m_string;
    std::vector<Value> m_items;      // array items or object values
    std::vector<std::string> m_keys; // object keys, parallel to m_items
};

// The whole text must be one JSON value (surrounding whitespace allowed).
Value parse(std::string_view text);

} // namespace humwise::test::json
