#include "core/io/CsvReader.h"

#include "core/io/FileBytes.h"
#include "core/util/Text.h"

#include <algorithm>
#include <cmath>
#include <cstdio>

namespace humwise::io {
namespace {

using Code = ReadError::Code;

ReadError lineError(Code code, const std::string& source, std::size_t line, std::string detail) {
    return ReadError{code, source, std::nullopt, line, std::move(detail)};
}

struct Column {
    std::string name;
    std::optional<Unit> unit;
    bool isTime = false;
    double timeFactor = 1.0; // to seconds
};

Column parseColumnLabel(std::string_view label) {
    label = text::trim(label);
    if (label.size() >= 2 && label.front() == '"' && label.back() == '"') label = label.substr(1, label.size() - 2);
    Column c;
    std::string_view unitText;
    for (auto [open, close] : {std::pair{'[', ']'}, std::pair{'(', ')'}}) {
        const auto o = label.rfind(open);
        if (o != std::string_view::npos && !label.empty() && label.back() == close) {
            unitText = label.substr(o + 1, label.size() - o - 2);
            label = text::trim(label.substr(0, o));
            break;
        }
    }
    c.name = std::string(label);
    const std::string lname = text::lower(label);
    const std::string lunit = text::lower(text::trim(unitText));
    if (lunit == "s" || lunit == "ms" ||
        ((lname == "time" || lname == "t" || lname == "time_s" || lname == "timestamp") && lunit.empty())) {
        c.isTime = true;
        c.timeFactor = lunit == "ms" ? 1e-3 : 1.0;
    } else if (!unitText.empty()) {
        c.unit = parseUnit(unitText);
    }
    return c;
}

char detectDelimiter(std::string_view header) {
    const auto count = [&](char d) { return std::count(header.begin(), header.end(), d); };
    const long commas = count(','), semis = count(';'), tabs = count('\t');
    if (tabs > commas && tabs > semis) return '\t';
    if (semis > commas) return ';';
    return ',';
}

std::string fmt(const char* f, double a, double b = 0) {
    char buf[160];
    std::snprintf(buf, sizeof buf, f, a, b);
    return buf;
}

} // namespace

Result<Recording, ReadError> parseCsv(std::string_view text, const std::string& source, const CsvReadOptions& options) {
    if (text.empty()) return fail(ReadError{Code::Empty, source, {}, {}, "the file is empty"});
    if (text.find('\0') != std::string_view::npos)
        return fail(ReadError{Code::NotRecognised, source, {}, {}, "binary data (NUL bytes) in a CSV file"});
    if (text.size() >= 3 && text.substr(0, 3) == "\xEF\xBB\xBF") text.remove_prefix(3); // UTF-8 BOM

    std::optional<double> metaRate;
    std::optional<std::chrono::sys_time<std::chrono::milliseconds>> startTime;
    std::vector<Column> columns;
    char delimiter = ',';
    std::vector<std::vector<double>> data;
    std::vector<std::size_t> rowLines; // file line of each data row, for messages
    std::size_t lineNo = 0, headerLine = 0;
    text::LineReader lines(text);
    std::string_view line;
    while (lines.next(line, lineNo)) {
        if (line.front() == '#') {
            if (!columns.empty()) continue;
            std::string_view body = text::trim(line.substr(1));
            const auto sep = body.find_first_of(":=");
            if (sep == std::string_view::npos) continue;
            const std::string key = text::lower(text::trim(body.substr(0, sep)));
            const std::string_view value = text::trim(body.substr(sep + 1));
            if (key == "sample_rate_hz") {
                metaRate = text::parseDouble(value);
                if (!metaRate || !(*metaRate > 0) || *metaRate > 10e6)
                    return fail(lineError(Code::BadField, source, lineNo, "sample_rate_hz '" + std::string(value) + "' is not a plausible rate"));
            } else if (key == "start_time") {
                startTime = text::parseIsoTime(value);
                if (!startTime)
                    return fail(lineError(Code::BadField, source, lineNo, "start_time '" + std::string(value) + "' is not an ISO 8601 date-time"));
            }
            continue;
        }
        if (columns.empty()) {
            headerLine = lineNo;
            delimiter = detectDelimiter(line);
            const auto labels = text::split(line, delimiter);
            if (labels.size() > kMaxCsvColumns)
                return fail(lineError(Code::BadHeader, source, lineNo, std::to_string(labels.size()) + " columns (at most " + std::to_string(kMaxCsvColumns) + ")"));
            for (const auto& l : labels) {
                Column c = parseColumnLabel(l);
                if (c.name.empty() && !c.isTime)
                    return fail(lineError(Code::BadHeader, source, lineNo, "column " + std::to_string(columns.size() + 1) + " has no name"));
                if (text::parseDouble(c.name) && !c.isTime)
                    return fail(lineError(Code::BadHeader, source, lineNo, "the first line is data, not a header with column names"));
                if (!c.isTime && !c.unit && !text::trim(l).empty() && (l.find('[') != std::string_view::npos || l.find('(') != std::string_view::npos))
                    return fail(lineError(Code::BadHeader, source, lineNo, "unknown unit in column '" + std::string(text::trim(l)) + "'"));
                columns.push_back(std::move(c));
            }
            if (std::count_if(columns.begin(), columns.end(), [](const Column& c) { return c.isTime; }) > 1)
                return fail(lineError(Code::BadHeader, source, lineNo, "more than one time column"));
            data.resize(columns.size());
            continue;
        }
        const auto fields = text::split(line, delimiter);
        if (fields.size() != columns.size())
            return fail(lineError(Code::WrongColumnCount, source, lineNo, std::to_string(fields.size()) + " fields, the header has " + std::to_string(columns.size())));
        for (std::size_t i = 0; i < fields.size(); ++i) {
            std::string_view field = text::trim(fields[i]);
            if (field.size() >= 2 && field.front() == '"' && field.back() == '"') field = field.substr(1, field.size() - 2);
            const auto v = text::parseDouble(field);
            if (!v)
                return fail(lineError(Code::BadNumber, source, lineNo, "column " + std::to_string(i + 1) + " ('" + columns[i].name + "'): '" + std::string(field.substr(0, 40)) + "' is not a number"));
            data[i].push_back(*v);
        }
        rowLines.push_back(lineNo);
    }
    if (columns.empty()) return fail(ReadError{Code::BadHeader, source, {}, {}, "no header line with column names"});
    const auto timeIt = std::find_if(columns.begin(), columns.end(), [](const Column& c) { return c.isTime; });
    const std::size_t dataColumns = columns.size() - (timeIt != columns.end() ? 1 : 0);
    if (dataColumns == 0) return fail(lineError(Code::BadHeader, source, headerLine, "no data column besides time"));
    const std::size_t rows = data.front().size();
    if (rows == 0) return fail(lineError(Code::NoData, source, headerLine, "a header but no data rows"));

    double rate = 0;
    if (timeIt != columns.end()) {
        const std::size_t ti = static_cast<std::size_t>(timeIt - columns.begin());
        const auto& t = data[ti];
        if (rows < 2) return fail(lineError(Code::NoData, source, headerLine, "one row is not enough to know the sample rate"));
        for (std::size_t i = 0; i < rows; ++i)
            if (!std::isfinite(t[i])) return fail(lineError(Code::BadNumber, source, rowLines[i], "the time column holds NaN or infinity"));
        const double step = (t.back() - t.front()) / static_cast<double>(rows - 1);
        if (!(step > 0)) {
            std::size_t first = 1;
            while (first + 1 < rows && t[first] > t[first - 1]) ++first;
            return fail(lineError(Code::NonUniformTime, source, rowLines[first], "time does not increase"));
        }
        for (std::size_t i = 1; i < rows; ++i) {
            const double d = t[i] - t[i - 1];
            if (!(d > 0) || std::abs(d - step) > 0.5 * step)
                return fail(lineError(Code::NonUniformTime, source, rowLines[i],
                                      fmt("time step %.6g s where the mean step is %.6g s (gap, jump or not increasing)", d * timeIt->timeFactor, step * timeIt->timeFactor)));
        }
        rate = 1.0 / (step * timeIt->timeFactor);
        const std::optional<double> declared = metaRate ? metaRate : options.sampleRateHz;
        if (declared && std::abs(*declared - rate) > 0.01 * *declared)
            return fail(lineError(Code::NonUniformTime, source, headerLine, fmt("the time column gives %.6g Hz, the declared rate is %.6g Hz", rate, *declared)));
    } else if (metaRate) {
        rate = *metaRate;
    } else if (options.sampleRateHz && *options.sampleRateHz > 0) {
        rate = *options.sampleRateHz;
    } else {
        return fail(lineError(Code::BadHeader, source, headerLine, "no time column and no sample rate (add '# sample_rate_hz: ...' or declare the rate)"));
    }
    if (!(rate > 0) || !std::isfinite(rate) || rate > 10e6)
        return fail(lineError(Code::BadField, source, headerLine, fmt("sample rate %.6g Hz is not plausible", rate)));

    Recording rec;
    rec.sampleRateHz = rate;
    rec.source = source;
    rec.startTime = startTime;
    std::size_t dataIndex = 0;
    for (std::size_t i = 0; i < columns.size(); ++i) {
        if (columns[i].isTime) continue;
        const ChannelSetting& cs = options.channels.forChannel(dataIndex++);
        const Unit unit = columns[i].unit.value_or(cs.unit);
        Channel ch;
        ch.name = columns[i].name;
        ch.quantity = quantityOf(unit);
        const double factor = (columns[i].unit ? 1.0 : cs.scale) * toSiFactor(unit);
        ch.samples = std::move(data[i]);
        for (double& v : ch.samples) v *= factor;
        rec.channels.push_back(std::move(ch));
    }
    return rec;
}

Result<Recording, ReadError> readCsv(std::istream& in, const std::string& source, const CsvReadOptions& options) {
    auto bytes = readAllBytes(in, source);
    if (!bytes) return fail(bytes.error());
    const auto& b = bytes.value();
    return parseCsv(std::string_view(reinterpret_cast<const char*>(b.data()), b.size()), source, options);
}

Result<Recording, ReadError> readCsvFile(const std::filesystem::path& path, const CsvReadOptions& options) {
    auto bytes = readFileBytes(path);
    if (!bytes) return fail(bytes.error());
    const auto& b = bytes.value();
    return parseCsv(std::string_view(reinterpret_cast<const char*>(b.data()), b.size()), path.string(), options);
}

} // namespace humwise::io
