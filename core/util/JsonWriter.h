#pragma once
// A small streaming JSON writer (no parsing). Numbers use the shortest round-trip form;
// non-finite numbers are written as null, which JSON requires.

#include <ostream>
#include <span>
#include <string>
#include <string_view>
#include <vector>

namespace humwise::json {

class Writer {
public:
    explicit Writer(std::ostream& out, bool pretty = true) : m_out(out), m_pretty(pretty) {}

    Writer& beginObject();
    Writer& endObject();
    Writer& beginArray();
    Writer& endArray();
    Writer& key(std::string_view k);
    Writer& value(std::string_view s);
    Writer& value(const char* s) { return value(std::string_view(s)); }
    Writer& value(double v);
    Writer& value(long long v);
    Writer& value(std::size_t v) { return value(static_cast<long long>(v)); }
    Writer& value(int v) { return value(static_cast<long long>(v)); }
    Writer& value(bool v);
    Writer& null();
    Writer& numbers(std::span<const double> values); // a compact array

    template <class T>
    Writer& field(std::string_view k, const T& v) { key(k); return value(v); }

private:
    void separator();
    void newline();
    std::ostream& m_out;
    bool m_pretty;
    std::vector<bool> m_hasItems; // per open container
    bool m_afterKey = false;
};

std::string escape(std::string_view s);
std::string number(double v); // shortest round-trip, "null" when not finite

} // namespace humwise::json
