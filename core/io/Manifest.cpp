#include "core/io/Manifest.h"

#include "core/util/Text.h"

#include <algorithm>
#include <cmath>
#include <map>

namespace humwise::io {
namespace {

using Code = ReadError::Code;

ReadError at(Code code, const std::string& source, std::size_t line, std::string detail) {
    return ReadError{code, source, std::nullopt, line, std::move(detail)};
}

const std::vector<std::string>& knownColumns() {
    static const std::vector<std::string> c{"file", "channel", "motor", "point", "quantity", "unit", "sensitivity", "time", "speed_rpm", "load_percent"};
    return c;
}

} // namespace

Result<Manifest, ReadError> parseManifest(std::string_view text, const std::string& source) {
    if (text.size() >= 3 && text.substr(0, 3) == "\xEF\xBB\xBF") text.remove_prefix(3);
    if (text::trim(text).empty()) return fail(ReadError{Code::Empty, source, {}, {}, "the manifest is empty"});
    if (text.find('\0') != std::string_view::npos) return fail(ReadError{Code::NotRecognised, source, {}, {}, "binary data in the manifest"});
    Manifest m;
    bool haveStart = false;
    std::map<std::string, std::size_t> column; // name -> index
    std::size_t headerLine = 0, lineNo = 0;
    char delimiter = ',';
    text::LineReader lines(text);
    std::string_view line;
    while (lines.next(line, lineNo)) {
        if (line.front() == '#') {
            if (headerLine) continue;
            const std::string_view body = text::trim(line.substr(1));
            const auto sep = body.find(':');
            if (sep == std::string_view::npos) continue;
            const std::string key = text::lower(text::trim(body.substr(0, sep)));
            const std::string value(text::trim(body.substr(sep + 1)));
            if (key == "round_start") {
                const auto t = text::parseIsoTime(value);
                if (!t) return fail(at(Code::BadField, source, lineNo, "round_start '" + value + "' is not an ISO 8601 date-time"));
                m.roundStart = *t;
                haveStart = true;
            } else if (key == "route") {
                m.route = value;
            } else if (key == "technician") {
                m.technician = value;
            } else if (key == "notes") {
                m.notes = value;
            }
            continue;
        }
        if (!headerLine) {
            headerLine = lineNo;
            delimiter = line.find(';') != std::string_view::npos && line.find(',') == std::string_view::npos ? ';' : ',';
            const auto names = text::split(line, delimiter);
            for (std::size_t i = 0; i < names.size(); ++i) {
                const std::string n = text::lower(text::trim(names[i]));
                if (std::find(knownColumns().begin(), knownColumns().end(), n) == knownColumns().end())
                    return fail(at(Code::BadHeader, source, lineNo, "unknown column '" + n + "' (columns: file, channel, motor, point, quantity, unit, sensitivity, time, speed_rpm, load_percent)"));
                if (column.count(n)) return fail(at(Code::BadHeader, source, lineNo, "column '" + n + "' appears twice"));
                column[n] = i;
            }
            for (const char* required : {"file", "motor", "point"})
                if (!column.count(required)) return fail(at(Code::BadHeader, source, lineNo, std::string("the manifest needs a '") + required + "' column"));
            continue;
        }
        const auto fields = text::split(line, delimiter);
        if (fields.size() != column.size())
            return fail(at(Code::WrongColumnCount, source, lineNo, std::to_string(fields.size()) + " fields, the header has " + std::to_string(column.size())));
        const auto get = [&](const char* name) -> std::string {
            const auto it = column.find(name);
            return it == column.end() ? std::string() : std::string(text::trim(fields[it->second]));
        };
        const auto number = [&](const char* name) -> Result<std::optional<double>, ReadError> {
            const std::string v = get(name);
            if (v.empty()) return std::optional<double>{};
            const auto d = text::parseDouble(v);
            if (!d || !std::isfinite(*d)) return fail(at(Code::BadNumber, source, lineNo, std::string(name) + " '" + v + "' is not a number"));
            return std::optional<double>{*d};
        };
        ManifestEntry e;
        e.line = lineNo;
        e.file = get("file");
        e.motorTag = get("motor");
        e.pointName = get("point");
        if (e.file.empty() || e.motorTag.empty() || e.pointName.empty())
            return fail(at(Code::BadField, source, lineNo, "file, motor and point must not be empty"));
        if (const std::string c = get("channel"); !c.empty()) {
            const auto n = text::parseInteger(c);
            if (!n || *n < 1 || *n > 1024) return fail(at(Code::BadField, source, lineNo, "channel '" + c + "' is not a channel number from 1"));
            e.channel = static_cast<int>(*n);
        }
        if (const std::string q = get("quantity"); !q.empty()) {
            e.quantity = parseQuantity(q);
            if (!e.quantity || *e.quantity == Quantity::Dimensionless) return fail(at(Code::BadField, source, lineNo, "quantity '" + q + "' is not known"));
        }
        if (const std::string u = get("unit"); !u.empty()) {
            e.unit = parseUnit(u);
            if (!e.unit) return fail(at(Code::BadField, source, lineNo, "unit '" + u + "' is not known"));
        }
        auto sens = number("sensitivity");
        if (!sens) return fail(sens.error());
        e.sensitivity = sens.value();
        if (e.sensitivity && !(*e.sensitivity > 0)) return fail(at(Code::BadField, source, lineNo, "sensitivity must be > 0"));
        if (const std::string t = get("time"); !t.empty()) {
            e.time = text::parseIsoTime(t);
            if (!e.time) return fail(at(Code::BadField, source, lineNo, "time '" + t + "' is not an ISO 8601 date-time"));
        }
        auto speed = number("speed_rpm");
        if (!speed) return fail(speed.error());
        e.speedRpm = speed.value();
        auto load = number("load_percent");
        if (!load) return fail(load.error());
        e.loadPercent = load.value();
        m.entries.push_back(std::move(e));
    }
    if (!headerLine) return fail(ReadError{Code::BadHeader, source, {}, {}, "no header line (file,channel,motor,point,...)"});
    if (m.entries.empty()) return fail(at(Code::NoData, source, headerLine, "the manifest lists no recording"));
    if (!haveStart) return fail(ReadError{Code::BadHeader, source, {}, 1, "the manifest needs a '# round_start: YYYY-MM-DDTHH:MM:SSZ' line"});
    return m;
}

} // namespace humwise::io
