#include "app/cli/ArgParser.h"

#include "app/cli/CliError.h"
#include "core/util/Text.h"

#include <cmath>
#include <limits>

namespace humwise::cli {

ParsedArgs::ParsedArgs(const std::vector<std::string>& args, const std::vector<OptionSpec>& specs) {
    for (std::size_t i = 0; i < args.size(); ++i) {
        const std::string& a = args[i];
        if (a.size() < 3 || a.rfind("--", 0) != 0) {
            if (a.size() > 1 && a[0] == '-' && !text::parseDouble(a)) throw UsageError("unknown option '" + a + "'");
            m_positional.push_back(a);
            continue;
        }
        std::string name = a.substr(2);
        std::optional<std::string> inlineValue;
        if (const auto eq = name.find('='); eq != std::string::npos) {
            inlineValue = name.substr(eq + 1);
            name = name.substr(0, eq);
        }
        const OptionSpec* spec = nullptr;
        for (const auto& s : specs)
            if (s.name == name) spec = &s;
        if (!spec) throw UsageError("unknown option '--" + name + "'");
        if (m_values.count(name) && !spec->repeatable) throw UsageError("option '--" + name + "' is given more than once");
        if (!spec->takesValue) {
            if (inlineValue) throw UsageError("option '--" + name + "' takes no value");
            m_values[name] = "";
            continue;
        }
        if (!inlineValue && i + 1 >= args.size()) throw UsageError("option '--" + name + "' needs a value");
        const std::string v = inlineValue ? *inlineValue : args[++i];
        m_values[name] = v;
        m_repeated[name].push_back(v);
    }
}

std::optional<std::string> ParsedArgs::value(const std::string& name) const {
    const auto it = m_values.find(name);
    if (it == m_values.end()) return std::nullopt;
    return it->second;
}

std::vector<std::string> ParsedArgs::values(const std::string& name) const {
    const auto it = m_repeated.find(name);
    return it == m_repeated.end() ? std::vector<std::string>{} : it->second;
}

std::optional<double> ParsedArgs::number(const std::string& name) const {
    const auto v = value(name);
    if (!v) return std::nullopt;
    const auto d = text::parseDouble(*v);
    if (!d || !std::isfinite(*d)) throw UsageError("option '--" + name + "' needs a number, got '" + *v + "'");
    return d;
}

double ParsedArgs::number(const std::string& name, double fallback) const { return number(name).value_or(fallback); }

std::optional<long long> ParsedArgs::integer(const std::string& name) const {
    const auto v = value(name);
    if (!v) return std::nullopt;
    const auto d = text::parseInteger(*v);
    if (!d) throw UsageError("option '--" + name + "' needs a whole number, got '" + *v + "'");
    return d;
}

std::optional<int> ParsedArgs::count(const std::string& name) const {
    const auto v = integer(name);
    if (!v) return std::nullopt;
    if (*v < std::numeric_limits<int>::min() || *v > std::numeric_limits<int>::max())
        throw UsageError("option '--" + name + "' is far too large: " + std::to_string(*v));
    return static_cast<int>(*v);
}

std::pair<double, double> parseRange(const std::string& t, const std::string& option) {
    const auto colon = t.find(':');
    if (colon == std::string::npos) throw UsageError("option '--" + option + "' needs LO:HI, got '" + t + "'");
    const auto lo = text::parseDouble(t.substr(0, colon));
    const auto hi = text::parseDouble(t.substr(colon + 1));
    if (!lo || !hi || !std::isfinite(*lo) || !std::isfinite(*hi))
        throw UsageError("option '--" + option + "' needs two numbers LO:HI, got '" + t + "'");
    return {*lo, *hi};
}

} // namespace humwise::cli
