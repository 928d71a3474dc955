#pragma once
// What Humwise knows of one induction motor: nameplate, bearings, driven machine and its
// vibration-severity classification. Plain data; validate() says what is impossible.
//
// Lengths of bearing geometry may be in any one unit (mm or in), as long as the element and
// pitch diameters share it: only their ratio matters.

#include <optional>
#include <string>
#include <string_view>
#include <variant>
#include <vector>

namespace humwise::motor {

enum class DriveKind { DirectOnLine, VariableFrequency };

struct Nameplate {
    double ratedPowerKw = 0;
    double ratedVoltageV = 0;
    double ratedCurrentA = 0;
    double supplyHz = 50;        // rated supply frequency
    double ratedSpeedRpm = 0;    // full-load speed
    std::optional<int> poles;    // derived from the rated speed when absent
    DriveKind drive = DriveKind::DirectOnLine;
    std::optional<int> rotorBars;
    std::optional<int> statorSlots;
};

// Rolling-element bearing by geometry (Randall & Antoni 2011 kinematics; REFERENCE.md 3.1).
struct BearingGeometry {
    int rollingElements = 0;
    double elementDiameter = 0;  // d
    double pitchDiameter = 0;    // D, same unit as d
    double contactAngleDeg = 0;
};

// Defect frequencies as multiples of shaft frequency, as bearing makers and datasets publish
// them. bsf is the ball spin frequency (single: one revolution of the element); a defect on an
// element repeats at 2 x bsf.
struct BearingFactors {
    double bpfo = 0;
    double bpfi = 0;
    double bsf = 0;
    double ftf = 0;
};

struct Bearing {
    std::string designation;
    std::variant<BearingGeometry, BearingFactors> data;
};

enum class DrivenKind { None, CentrifugalPump, Fan, Blower, Compressor, Conveyor, Other };

// The kind's name in the fleet file and the store ("centrifugal-pump", ...), and back; nullopt
// for a name that is none of them.
const char* drivenKindName(DrivenKind kind);
std::optional<DrivenKind> drivenKindFromName(std::string_view name);

struct DrivenMachine {
    DrivenKind kind = DrivenKind::None;
    std::optional<int> vanesOrBlades;  // pump impeller vanes, fan blades
    double speedRatio = 1.0;           // driven shaft speed / motor shaft speed (1 for a coupling)
};

enum class SupportClass { Rigid, Flexible };

// ISO 20816-3 group (1: > 300 kW or shaft height >= 315 mm; 2: 15-300 kW) and support, or for
// machines up to 15 kW the ISO 10816-1 class (I-IV).
struct SeverityClass {
    enum class Standard { Iso20816_3, Iso10816_1 };
    Standard standard = Standard::Iso20816_3;
    int group = 2;                        // ISO 20816-3: 1 or 2
    SupportClass support = SupportClass::Rigid;
    int iso10816Class = 1;                // ISO 10816-1: 1 (I) to 4 (IV)
};

struct Motor {
    std::string tag;
    Nameplate nameplate;
    std::optional<Bearing> driveEndBearing;
    std::optional<Bearing> nonDriveEndBearing;
    DrivenMachine driven;
    SeverityClass severity;
};

struct ValidationIssue {
    std::string field;   // "nameplate.rated_speed_rpm", "bearing_de.element_diameter", ...
    std::string message; // plain words: what is wrong and what would be right
};

std::vector<ValidationIssue> validate(const Motor& motor);
std::vector<ValidationIssue> validate(const Nameplate& nameplate);
std::vector<ValidationIssue> validate(const Bearing& bearing, const std::string& field);

// Synchronous speed 120 f / P in r/min (REFERENCE.md 5).
double synchronousSpeedRpm(double supplyHz, int poles);
// The most poles a nameplate may give or imply (common practice: large low-speed motors stop
// well below this).
inline constexpr int kMaxPoles = 64;
// Poles from the nameplate, or derived from the rated speed: the largest even P whose
// synchronous speed still exceeds the rated speed (P = 2 floor(60 f / n)). nullopt when
// neither is usable, or when the derived P would exceed kMaxPoles.
std::optional<int> polesOf(const Nameplate& nameplate);
// Rated (full-load) slip (ns - n) / ns, when the nameplate allows it.
std::optional<double> ratedSlip(const Nameplate& nameplate);

// Defect factors from geometry (REFERENCE.md 3.1, c = (d / D) cos(phi)):
// FTF = (1 - c) / 2, BPFO = n (1 - c) / 2, BPFI = n (1 + c) / 2, BSF = D / (2 d) (1 - c^2).
BearingFactors factorsFromGeometry(const BearingGeometry& g);
BearingFactors factorsOf(const Bearing& bearing);

} // namespace humwise::motor
