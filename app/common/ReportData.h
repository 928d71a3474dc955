#pragma once
// What a finding sheet and a route summary say, assembled from the store as plain data (no Qt);
// app/report draws it. CSV exports of a round's findings and indicators and of a trend.

#include "storage/FleetStore.h"

#include <optional>
#include <string>
#include <vector>

namespace humwise::workflow {

// The usual cautions for work on live electrical equipment (README, help and every sheet).
extern const char* const kSafetyCaution;

struct PlotMarker {
    std::string label;
    double x = 0;
};

struct SpectrumPanel {
    std::string title;
    std::string unit;
    std::vector<double> hz, values;
    std::vector<PlotMarker> markers; // the evidencing lines
    bool logarithmic = false;
};

struct TrendPanel {
    std::string title;
    std::string unit;
    std::vector<double> days;   // days since 1970-01-01
    std::vector<double> values;
    std::optional<double> alert, alarm;
    std::string limitSource;
    std::optional<double> crossingDay;
    std::string model;          // how the crossing was projected
};

struct SeverityChange {
    std::string fault;
    std::optional<int> before; // severity in the previous round, when the fault was there
    int now = 0;
};

struct MotorSheet {
    std::string site, area, tag, description;
    std::vector<std::pair<std::string, std::string>> nameplate; // label, value
    std::string roundStart, technician, previousRoundStart;
    std::string operatingPoint;                 // "1484.6 r/min, supply 50.02 Hz, load about 80 %"
    std::vector<storage::FindingRow> findings;  // most severe first
    std::vector<SpectrumPanel> spectra;
    std::vector<TrendPanel> trends;
    std::vector<SeverityChange> changes;
    std::string isoZone;                        // "zone B: 2.02 mm/s ... (ISO 20816-3 group 2 rigid ...)"
    std::string comment;
    std::vector<std::string> flaggedData;
    int worstSeverity = 0;
};

struct RouteRow {
    std::string tag, area, description;
    int worstSeverity = -1;
    std::string change;
    std::vector<std::string> faults; // "bearing_outer_race (act now)"
    std::vector<std::string> flagged;
    bool measured = true;
};

struct RouteSummary {
    std::string site, roundStart, technician, route;
    std::vector<RouteRow> rows; // most severe first
};

// Throws storage::StorageException (unknown motor, no round).
MotorSheet buildMotorSheet(storage::FleetStore& store, const std::string& tag, std::int64_t roundId, const std::string& comment = {});
RouteSummary buildRouteSummary(storage::FleetStore& store, std::int64_t roundId);

std::string findingsCsv(storage::FleetStore& store, std::int64_t roundId);
std::string indicatorsCsv(storage::FleetStore& store, std::int64_t roundId);
std::string trendCsv(const std::vector<storage::TrendPoint>& points);

} // namespace humwise::workflow
