#include "core/io/UffTestWriter.h"

#include <cstdint>
#include <cstdio>
#include <cstring>
#include <stdexcept>

namespace humwise::test {
namespace {

const char* kDelimiter = "    -1\n";

template <class... Args>
std::string format(const char* f, Args... args) {
    char buf[256];
    const int n = std::snprintf(buf, sizeof buf, f, args...);
    if (n < 0 || n >= static_cast<int>(sizeof buf)) throw std::invalid_argument("UffTestWriter: field too long");
    return buf;
}

bool isSingle(int dataType) { return dataType == 2 || dataType == 5; }

std::string asciiData(const Uff58Spec& s) {
    const bool single = isSingle(s.dataType);
    const std::size_t perLine = single ? 6 : 4;
    std::string out;
    for (std::size_t i = 0; i < s.values.size(); ++i) {
        out += single ? format("%13.5E", s.values[i]) : format("%20.12E", s.values[i]);
        if ((i + 1) % perLine == 0 || i + 1 == s.values.size()) out += "\n";
    }
    return out;
}

std::string binaryData(const Uff58Spec& s) {
    std::string out;
    for (const double v : s.values) {
        unsigned char b[8];
        std::size_t size = 8;
        if (isSingle(s.dataType)) {
            const float f = static_cast<float>(v);
            std::uint32_t u;
            std::memcpy(&u, &f, 4);
            for (int i = 0; i < 4; ++i) b[i] = static_cast<unsigned char>(u >> (8 * i));
            size = 4;
        } else {
            std::uint64_t u;
            std::memcpy(&u, &v, 8);
            for (int i = 0; i < 8; ++i) b[i] = static_cast<unsigned char>(u >> (8 * i));
        }
        for (std::size_t i = 0; i < size; ++i) out += static_cast<char>(b[s.byteOrder == 2 ? size - 1 - i : i]);
    }
    return out;
}

} // namespace

std::string uffRecord6(const Uff58Spec& s) {
    return format("%5d%10d%5d%10d %10s%10lld%4d %10s%10lld%4d", s.functionType, s.functionId, s.version, s.loadCase,
                  s.responseEntity.c_str(), s.responseNode, s.responseDirection, s.referenceEntity.c_str(), s.referenceNode,
                  s.referenceDirection);
}

std::string uffRecord7(const Uff58Spec& s) {
    const long long count = s.count.value_or(static_cast<long long>(s.values.size()));
    return format("%10d%10lld%10d%13.5E%13.5E%13.5E", s.dataType, count, s.spacing, s.abscissaMinimum, s.increment, s.zValue);
}

std::string uffAxisRecord(const UffAxisSpec& a) {
    return format("%10d%5d%5d%5d %-20s %-20s", a.specificType, a.lengthExponent, a.forceExponent, a.temperatureExponent,
                  a.label.c_str(), a.units.c_str());
}

std::string uff58(const Uff58Spec& s) {
    const std::string block = s.binary ? binaryData(s) : asciiData(s);
    std::string header = "    58";
    if (s.binary)
        header = format("    58b%6d%6d%12d%12lld%6d%6d%12d%12d", s.byteOrder, s.floatFormat, s.textLines,
                        s.byteCount.value_or(static_cast<long long>(block.size())), 0, 0, 0, 0);
    std::vector<std::string> records;
    for (const auto& id : s.ids) records.push_back(format("%-80s", id.c_str()));
    records.push_back(uffRecord6(s));
    records.push_back(uffRecord7(s));
    for (const UffAxisSpec* a : {&s.abscissa, &s.ordinate, &s.denominator, &s.zAxis}) records.push_back(uffAxisRecord(*a));
    for (const auto& [n, text] : s.recordText) records.at(static_cast<std::size_t>(n - 1)) = text;

    std::string out = kDelimiter;
    out += s.headerText.value_or(header) + "\n";
    for (const auto& r : records) out += r + "\n";
    out += block;
    if (s.binary && s.lineBreakAfterBinary) out += "\n";
    if (s.closingDelimiter) out += kDelimiter;
    return out;
}

std::string uffOtherDataset(int number, const std::vector<std::string>& lines) {
    std::string out = kDelimiter + format("%6d", number) + "\n";
    for (const auto& l : lines) out += l + "\n";
    return out + kDelimiter;
}

std::string withCrLf(const std::string& text) {
    std::string out;
    for (const char c : text) {
        if (c == '\n') out += '\r';
        out += c;
    }
    return out;
}

} // namespace humwise::test
