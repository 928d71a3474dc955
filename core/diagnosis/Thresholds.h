#pragma once
// Every threshold the diagnosis rules compare with, as plain data with the source it comes from.
// Markers as in REFERENCE.md: "published", "common practice (no source)", "from memory (verify)".
// A site may replace any value; the rules only read this struct.

#include "core/motor/Motor.h"

#include <string>

namespace humwise::diagnosis {

// Three limits that split a value into severities 0..3 (value >= watch -> 1, >= plan -> 2,
// >= act -> 3); for "dB below the supply line" the comparison is reversed (see rising).
struct SeverityLimits {
    double watch = 0;
    double plan = 0;
    double act = 0;
    bool rising = true;  // true: larger is worse; false: smaller is worse
    std::string source;

    int severityOf(double value) const;
};

// ISO 20816-3 / ISO 10816-1 zone boundaries, velocity r.m.s. in mm/s; a value on a boundary
// belongs to the lower zone (project convention, REFERENCE.md 2.1 advice).
struct ZoneBoundaries {
    double ab = 0, bc = 0, cd = 0;
    std::string source;
    char zoneOf(double mmPerSecond) const; // 'A'..'D'
};

ZoneBoundaries zoneBoundaries(const motor::SeverityClass& cls);

struct Thresholds {
    // Overall velocity zone -> severity: A and B 0, C 2, D 3 (project convention on ISO 20816-3's
    // zone meanings: C "not acceptable for long-term continuous operation", D "may cause damage").
    // Vibration components (1X, 2X, 2LF, ...) are graded against the same boundaries:
    // below A/B 0, A/B..B/C 1, B/C..C/D 2, above C/D 3 (common practice (no source)).

    // Pattern ratios (REFERENCE.md 9 signatures; numbers common practice (no source)).
    double unbalanceMinShareOf1X = 0.5;      // (1X)^2 / (band mean square) on the worst radial channel
    double unbalanceMax2XTo1X = 0.5;
    double misalignmentMin2XTo1X = 0.5;      // radial 2X / 1X: parallel (offset) misalignment
    double misalignmentMinAxialToRadial = 0.5; // axial 1X / radial 1X: angular misalignment
    int loosenessMinHarmonics = 4;           // harmonics 2X..10X above 20 % of 1X, or half orders
    double loosenessMinHarmonicTo1X = 0.2;
    double loosenessMinHalfOrderTo1X = 0.1;
    std::string patternSource = "common practice (no source): signature ratios after REFERENCE.md 9";

    // Rolling-element bearings, envelope spectrum: a defect line counts when it stands this many
    // times above the local floor (median of +-25 lines), within +-2 % of its kinematic frequency
    // (Randall & Antoni 2011: real lines differ 1-2 % from kinematic ones; from memory (verify)).
    double bearingTolerance = 0.02;
    SeverityLimits bearingProminence{4.0, 8.0, 16.0, true,
                                     "common practice (no source): envelope line 12/18/24 dB above the local floor"};
    int bearingPlanHarmonics = 2; // fundamental plus this many harmonics lift the stage by one

    // 2 x line frequency in vibration, velocity mm/s r.m.s.: graded on the zone boundaries.

    // Broken rotor bars: mean of the two (1 -+ 2s) f sidebands in dB below f (Thomson & Fenger 2001
    // table as REFERENCE.md 4.1: 48-54 moderate, 42-48 crack developing, 36-42 two bars, < 36
    // multiple bars; from memory (verify), secondary published confirmation).
    SeverityLimits brokenBarDb{48.0, 42.0, 36.0, false, "Thomson & Fenger 2001 sideband table (REFERENCE.md 4.1; from memory, verify)"};
    double brokenBarMinLoadPercent = 50.0;
    std::string brokenBarLoadSource =
        "common practice (no source): 50 % load floor; a published application note asks >= 75 % (REFERENCE.md 4.1)";

    // Eccentricity sidebands f +- fr in current, dB below f (common practice (no source)).
    SeverityLimits eccentricityDb{50.0, 40.0, 30.0, false, "common practice (no source)"};

    // Stator winding: negative/positive sequence current ratio (common practice (no source); the
    // ITSC dataset shows 0.037 healthy and 0.139 with a 40 % inter-turn short, SOURCES.md).
    SeverityLimits negativeSequenceRatio{0.06, 0.10, 0.20, true, "common practice (no source); ITSC dataset 0.037 healthy / 0.139 shorted"};

    // Current unbalance, NEMA max-deviation formula on the three phase currents, %.
    SeverityLimits currentUnbalancePercent{5.0, 10.0, 20.0, true,
                                           "common practice (no source): investigate above 5 %, act above 10 % (REFERENCE.md 6.4)"};
    // Voltage unbalance, NEMA MG-1 %: 1 % recommended limit at terminals (published, secondary),
    // 2 % derating 0.95, 5 % operation not recommended (published, REFERENCE.md 6.1, 6.3).
    SeverityLimits voltageUnbalancePercent{1.0, 2.0, 5.0, true, "NEMA MG-1 (REFERENCE.md 6.1-6.3)"};
    // Voltage THD, %: IEEE 519-2014 limit 8 % at <= 1 kV (published, secondary); 5 % for 1-69 kV.
    SeverityLimits voltageThdPercent{5.0, 8.0, 12.0, true, "IEEE 519-2014 Table 1 (REFERENCE.md 6.5)"};

    // Electrical vs mechanical by cutting the supply: a line that drops by at least this many dB
    // within the first second after power-off is electrical (REFERENCE.md 9, common practice).
    double powerOffElectricalDropDb = 20.0;
    double powerOffMechanicalMaxDropDb = 10.0;
};

const Thresholds& defaultThresholds();

} // namespace humwise::diagnosis
