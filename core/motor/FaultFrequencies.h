#pragma once
// The frequencies at which each fault of an induction motor shows, for one operating point.
//
// Notation (REFERENCE.md 4 and 5): f supply frequency, P poles, p = P/2 pole pairs, s slip,
// fr = f (1 - s) / p shaft frequency, R rotor bars.
//   vibration  nX = n fr; 2 x line = 2f; slip frequency s f; pole pass 2 s f (= P (ns - n) / 60);
//              1X +- 2 s f (rotor-bar/pole-pass sidebands); rotor-bar pass R fr and R fr +- 2f;
//              vane/blade pass V fr_driven; bearing BPFO, BPFI, 2 x BSF, FTF (and harmonics),
//              BPFI with 1X sidebands, 2 x BSF with FTF sidebands (Randall & Antoni 2011)
//   current    broken bars (1 +- 2 k s) f (Thomson & Fenger 2001); eccentricity |f +- k fr|
//              (Dorrell, Thomson & Roach 1997); slot harmonics f [(k R +- n_d)(1 - s)/p +- nu],
//              n_d = 0 principal (PSH), 1 dynamic eccentricity (Nandi, Toliyat & Li 2005);
//              shorted turns f [(n / p)(1 - s) +- k], k odd (Thomson; Penman et al. 1994);
//              bearing |f +- m f_v| (Schoen et al. 1995)
// REFERENCE.md marks several of these "from memory (verify)"; the worked 4-pole 50 Hz table
// there is reproduced by the tests.

#include "core/motor/Motor.h"

#include <string>
#include <vector>

namespace humwise::motor {

struct OperatingPoint {
    double lineHz = 50;  // supply frequency present at the motor
    double shaftHz = 0;  // running speed, Hz
    int poles = 4;

    double polePairs() const { return poles / 2.0; }
    double synchronousHz() const { return lineHz / polePairs(); }
    double slip() const { return 1.0 - shaftHz / synchronousHz(); }
    double slipHz() const { return slip() * lineHz; }
    double polePassHz() const { return 2.0 * slipHz(); }
    double speedRpm() const { return shaftHz * 60.0; }
};

// Operating point from a speed (r/min) or a slip.
OperatingPoint operatingPointFromSpeed(double lineHz, int poles, double speedRpm);
OperatingPoint operatingPointFromSlip(double lineHz, int poles, double slip);

enum class LineDomain { Vibration, Envelope, Current };
enum class LineFamily {
    Shaft, Line, SlipAndPolePass, RotorBarPass, VanePass, Bearing, BrokenBar, Eccentricity, SlotHarmonic,
    DynamicEccentricity, ShortedTurn, BearingInCurrent,
};

const char* domainName(LineDomain d);  // "vibration", "envelope", "current"
const char* familyName(LineFamily f);  // "shaft", "line", ...

struct FaultLine {
    std::string id;      // stable for scripts: "1X", "2LF", "BPFO_DE_1", "BRB_LOWER_1", "PSH_K1_NU-1", ...
    std::string label;   // for people: "2x line frequency", "BPFO (DE) x1", "(1 - 2s) f"
    LineFamily family;
    LineDomain domain;
    double frequencyHz = 0;
};

struct FaultLineOptions {
    int shaftHarmonics = 10;   // 1X .. nX
    int bearingHarmonics = 3;
    int sidebandOrders = 3;    // k of broken-bar sidebands
    int eccentricityOrders = 2;
};

std::vector<FaultLine> faultLines(const Motor& motor, const OperatingPoint& op, const FaultLineOptions& options = {});

// Lines of one bearing at shaft frequency fr (for the envelope): BPFO, BPFI, 2xBSF, FTF with
// harmonics; `where` names the bearing ("DE", "NDE").
std::vector<FaultLine> bearingLines(const BearingFactors& f, double shaftHz, const std::string& where, int harmonics,
                                    LineDomain domain);

} // namespace humwise::motor
