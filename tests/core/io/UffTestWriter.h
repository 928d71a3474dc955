#pragma once
// Test-only writer of universal file datasets 58 and 58b (layout in core/io/UffReader.h):
// well-formed datasets with the Fortran formats of each record, and hooks to break any
// record, the header line, the binary block or the delimiters.

#include <array>
#include <cstddef>
#include <map>
#include <optional>
#include <string>
#include <vector>

namespace humwise::test {

// Records 8..11: I10,3I5,2(1X,A20)
struct UffAxisSpec {
    int specificType = 0;
    int lengthExponent = 0;
    int forceExponent = 0;
    int temperatureExponent = 0;
    std::string label = "NONE";
    std::string units = "NONE";
};

struct Uff58Spec {
    // Records 1..5 (80A1); record 3 holds the date and time.
    std::array<std::string, 5> ids{"Point 1", "NONE", "04-MAR-26 10:15:00", "NONE", "NONE"};
    // Record 6: 2(I5,I10),2(1X,A10,I10,I4)
    int functionType = 1;
    int functionId = 1;
    int version = 0;
    int loadCase = 0;
    std::string responseEntity = "NONE";
    long long responseNode = 1;
    int responseDirection = 3;
    std::string referenceEntity = "NONE";
    long long referenceNode = 0;
    int referenceDirection = 0;
    // Record 7: 3I10,3E13.5; count defaults to values.size()
    int dataType = 2;
    std::optional<long long> count;
    int spacing = 1;
    double abscissaMinimum = 0.0;
    double increment = 1.0 / 25600;
    double zValue = 0.0;
    // Records 8..11
    UffAxisSpec abscissa{17, 0, 0, 0, "Time", "s"};
    UffAxisSpec ordinate{12, 1, 0, 0, "Acceleration", "g"};
    UffAxisSpec denominator{};
    UffAxisSpec zAxis{};
    // Record 12, as stored: ASCII 6E13.5 (types 2, 5) or 4E20.12 (types 4, 6); binary raw
    // IEEE floats (2, 5) or doubles (4, 6) in the chosen byte order.
    std::vector<double> values;

    // 58b: the header-line fields and the block.
    bool binary = false;
    int byteOrder = 1;
    int floatFormat = 2;
    int textLines = 11;
    std::optional<long long> byteCount; // default: the size of the block written
    bool lineBreakAfterBinary = true;   // "\n" between the block and the closing -1

    // Breakage: replace record N (1..11) by this text, or the dataset-number line; leave out
    // the closing -1.
    std::map<int, std::string> recordText;
    std::optional<std::string> headerText;
    bool closingDelimiter = true;
};

// One dataset from its opening "    -1" line to its closing one, lines ending in "\n".
std::string uff58(const Uff58Spec& spec);
// A dataset with another number holding the given text lines.
std::string uffOtherDataset(int number, const std::vector<std::string>& lines);

// The individual records, for tests that rewrite one of them.
std::string uffRecord6(const Uff58Spec& spec);
std::string uffRecord7(const Uff58Spec& spec);
std::string uffAxisRecord(const UffAxisSpec& axis);

// Text with every "\n" turned into "\r\n" (ASCII files only).
std::string withCrLf(const std::string& text);

} // namespace humwise::test
