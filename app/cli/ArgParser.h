#pragma once
// Command-line options of one command: "--name value", "--name=value" and "--flag".
// Unknown options, missing values and repeated options are usage errors.

#include <map>
#include <optional>
#include <set>
#include <string>
#include <vector>

namespace humwise::cli {

struct OptionSpec {
    std::string name;   // without the dashes
    bool takesValue = true;
    bool repeatable = false; // may be given several times (values(name) lists them)
};

class ParsedArgs {
public:
    ParsedArgs(const std::vector<std::string>& args, const std::vector<OptionSpec>& specs);

    bool has(const std::string& name) const { return m_values.count(name) > 0; }
    std::optional<std::string> value(const std::string& name) const;
    std::vector<std::string> values(const std::string& name) const; // every value of a repeatable option
    const std::vector<std::string>& positional() const { return m_positional; }

    double number(const std::string& name, double fallback) const;          // any finite number
    std::optional<double> number(const std::string& name) const;
    std::optional<long long> integer(const std::string& name) const;         // whole number
    // A whole number that fits an int (counts: poles, bars, vanes); a larger one is refused by
    // name rather than wrapped around into a plausible value.
    std::optional<int> count(const std::string& name) const;

private:
    std::map<std::string, std::string> m_values;
    std::map<std::string, std::vector<std::string>> m_repeated;
    std::vector<std::string> m_positional;
};

// "LO:HI" with two finite numbers, LO < HI; throws UsageError naming the option.
std::pair<double, double> parseRange(const std::string& text, const std::string& option);

} // namespace humwise::cli
