#include "core/motor/FaultFrequencies.h"

#include <cmath>
#include <cstdio>
#include <stdexcept>

namespace humwise::motor {
namespace {

std::string fmt(const char* f, int a) {
    char buf[64];
    std::snprintf(buf, sizeof buf, f, a);
    return buf;
}

std::string fmt2(const char* f, int a, int b) {
    char buf[64];
    std::snprintf(buf, sizeof buf, f, a, b);
    return buf;
}

void push(std::vector<FaultLine>& out, std::string id, std::string label, LineFamily family, LineDomain domain, double hz) {
    if (hz > 0 && std::isfinite(hz)) out.push_back({std::move(id), std::move(label), family, domain, hz});
}

void vibrationLines(std::vector<FaultLine>& out, const Motor& m, const OperatingPoint& op, const FaultLineOptions& o) {
    const double fr = op.shaftHz, f = op.lineHz, pp = op.polePassHz();
    for (int n = 1; n <= o.shaftHarmonics; ++n)
        push(out, fmt("%dX", n), fmt("%dX running speed", n), LineFamily::Shaft, LineDomain::Vibration, n * fr);
    push(out, "0.5X", "0.5X (half order)", LineFamily::Shaft, LineDomain::Vibration, 0.5 * fr);
    push(out, "1.5X", "1.5X (half order)", LineFamily::Shaft, LineDomain::Vibration, 1.5 * fr);
    push(out, "LF", "line frequency", LineFamily::Line, LineDomain::Vibration, f);
    push(out, "2LF", "2x line frequency", LineFamily::Line, LineDomain::Vibration, 2 * f);
    push(out, "SLIP", "slip frequency s f", LineFamily::SlipAndPolePass, LineDomain::Vibration, op.slipHz());
    push(out, "PP", "pole pass 2 s f", LineFamily::SlipAndPolePass, LineDomain::Vibration, pp);
    push(out, "1X-PP", "1X - pole pass", LineFamily::SlipAndPolePass, LineDomain::Vibration, fr - pp);
    push(out, "1X+PP", "1X + pole pass", LineFamily::SlipAndPolePass, LineDomain::Vibration, fr + pp);
    if (m.nameplate.rotorBars) {
        const int r = *m.nameplate.rotorBars;
        push(out, "RBP", "rotor-bar pass R fr", LineFamily::RotorBarPass, LineDomain::Vibration, r * fr);
        push(out, "RBP-2LF", "rotor-bar pass - 2f", LineFamily::RotorBarPass, LineDomain::Vibration, r * fr - 2 * f);
        push(out, "RBP+2LF", "rotor-bar pass + 2f", LineFamily::RotorBarPass, LineDomain::Vibration, r * fr + 2 * f);
    }
    if (m.driven.vanesOrBlades) {
        const double fd = fr * m.driven.speedRatio;
        push(out, "VP", fmt("vane/blade pass (%d x driven shaft)", *m.driven.vanesOrBlades), LineFamily::VanePass,
             LineDomain::Vibration, *m.driven.vanesOrBlades * fd);
        push(out, "VP2", "2x vane/blade pass", LineFamily::VanePass, LineDomain::Vibration, 2.0 * *m.driven.vanesOrBlades * fd);
    }
}

void currentLines(std::vector<FaultLine>& out, const Motor& m, const OperatingPoint& op, const FaultLineOptions& o) {
    const double f = op.lineHz, s = op.slip(), fr = op.shaftHz, p = op.polePairs();
    push(out, "F", "supply frequency f", LineFamily::Line, LineDomain::Current, f);
    for (int k = 1; k <= o.sidebandOrders; ++k) {
        push(out, fmt("BRB_LOWER_%d", k), fmt("(1 - %d s) f broken-bar sideband", 2 * k), LineFamily::BrokenBar, LineDomain::Current, (1 - 2 * k * s) * f);
        push(out, fmt("BRB_UPPER_%d", k), fmt("(1 + %d s) f broken-bar sideband", 2 * k), LineFamily::BrokenBar, LineDomain::Current, (1 + 2 * k * s) * f);
    }
    for (int k = 1; k <= o.eccentricityOrders; ++k) {
        push(out, fmt("ECC_LOWER_%d", k), fmt("|f - %d fr| eccentricity", k), LineFamily::Eccentricity, LineDomain::Current, std::abs(f - k * fr));
        push(out, fmt("ECC_UPPER_%d", k), fmt("f + %d fr eccentricity", k), LineFamily::Eccentricity, LineDomain::Current, f + k * fr);
    }
    for (int n = 1; n <= 2; ++n)
        for (int k : {1, 3}) {
            const double base = (n / p) * (1 - s);
            push(out, fmt2("ST_N%d_K-%d", n, k), fmt2("shorted turns f[(%d/p)(1-s) - %d]", n, k), LineFamily::ShortedTurn, LineDomain::Current, std::abs(base - k) * f);
            push(out, fmt2("ST_N%d_K+%d", n, k), fmt2("shorted turns f[(%d/p)(1-s) + %d]", n, k), LineFamily::ShortedTurn, LineDomain::Current, (base + k) * f);
        }
    if (m.nameplate.rotorBars) {
        const double r = *m.nameplate.rotorBars;
        for (int nu : {-3, -1, 1, 3}) {
            push(out, fmt("PSH_NU%+d", nu), fmt("principal slot harmonic, nu = %+d", nu), LineFamily::SlotHarmonic, LineDomain::Current,
                 std::abs(f * (r * (1 - s) / p + nu)));
            for (int nd : {-1, 1})
                push(out, fmt2("DECC_ND%+d_NU%+d", nd, nu), fmt2("dynamic eccentricity n_d = %+d, nu = %+d", nd, nu),
                     LineFamily::DynamicEccentricity, LineDomain::Current, std::abs(f * ((r + nd) * (1 - s) / p + nu)));
        }
    }
    const auto bearingCurrent = [&](const std::optional<Bearing>& b, const char* where) {
        if (!b) return;
        const BearingFactors bf = factorsOf(*b);
        for (const auto& [name, factor] : {std::pair{"BPFO", bf.bpfo}, std::pair{"BPFI", bf.bpfi}})
            for (int mm = 1; mm <= 2; ++mm) {
                const double fv = factor * fr;
                const std::string tag = std::string(name) + "_" + where;
                push(out, "I_" + tag + fmt("_M%d-", mm), tag + fmt(" in current |f - %d fv|", mm), LineFamily::BearingInCurrent, LineDomain::Current, std::abs(f - mm * fv));
                push(out, "I_" + tag + fmt("_M%d+", mm), tag + fmt(" in current f + %d fv", mm), LineFamily::BearingInCurrent, LineDomain::Current, f + mm * fv);
            }
    };
    bearingCurrent(m.driveEndBearing, "DE");
    bearingCurrent(m.nonDriveEndBearing, "NDE");
}

} // namespace

OperatingPoint operatingPointFromSpeed(double lineHz, int poles, double speedRpm) {
    if (!(lineHz > 0) || poles < 2 || poles % 2 || !(speedRpm > 0))
        throw std::invalid_argument("operating point: need line frequency > 0, an even number of poles >= 2 and a speed > 0");
    return {lineHz, speedRpm / 60.0, poles};
}

OperatingPoint operatingPointFromSlip(double lineHz, int poles, double slip) {
    if (!(lineHz > 0) || poles < 2 || poles % 2 || !(slip >= 0 && slip < 1))
        throw std::invalid_argument("operating point: need line frequency > 0, an even number of poles >= 2 and 0 <= slip < 1");
    return {lineHz, lineHz / (poles / 2.0) * (1.0 - slip), poles};
}

const char* domainName(LineDomain d) {
    switch (d) {
    case LineDomain::Vibration: return "vibration";
    case LineDomain::Envelope: return "envelope";
    case LineDomain::Current: return "current";
    }
    return "?";
}

const char* familyName(LineFamily f) {
    switch (f) {
    case LineFamily::Shaft: return "shaft";
    case LineFamily::Line: return "line";
    case LineFamily::SlipAndPolePass: return "slip_pole_pass";
    case LineFamily::RotorBarPass: return "rotor_bar_pass";
    case LineFamily::VanePass: return "vane_pass";
    case LineFamily::Bearing: return "bearing";
    case LineFamily::BrokenBar: return "broken_bar";
    case LineFamily::Eccentricity: return "eccentricity";
    case LineFamily::SlotHarmonic: return "slot_harmonic";
    case LineFamily::DynamicEccentricity: return "dynamic_eccentricity";
    case LineFamily::ShortedTurn: return "shorted_turn";
    case LineFamily::BearingInCurrent: return "bearing_in_current";
    }
    return "?";
}

std::vector<FaultLine> bearingLines(const BearingFactors& bf, double fr, const std::string& where, int harmonics, LineDomain domain) {
    std::vector<FaultLine> out;
    const auto family = [&](const char* name, double factor) {
        for (int h = 1; h <= harmonics; ++h)
            push(out, std::string(name) + "_" + where + fmt("_%d", h), std::string(name) + " (" + where + ")" + fmt(" x%d", h),
                 LineFamily::Bearing, domain, h * factor * fr);
    };
    family("BPFO", bf.bpfo);
    family("BPFI", bf.bpfi);
    family("2xBSF", 2 * bf.bsf);
    family("FTF", bf.ftf);
    push(out, "BSF_" + where, "BSF (" + where + ", single spin)", LineFamily::Bearing, domain, bf.bsf * fr);
    push(out, "BPFI_" + where + "-1X", "BPFI (" + where + ") - 1X", LineFamily::Bearing, domain, (bf.bpfi - 1) * fr);
    push(out, "BPFI_" + where + "+1X", "BPFI (" + where + ") + 1X", LineFamily::Bearing, domain, (bf.bpfi + 1) * fr);
    push(out, "2xBSF_" + where + "-FTF", "2xBSF (" + where + ") - FTF", LineFamily::Bearing, domain, (2 * bf.bsf - bf.ftf) * fr);
    push(out, "2xBSF_" + where + "+FTF", "2xBSF (" + where + ") + FTF", LineFamily::Bearing, domain, (2 * bf.bsf + bf.ftf) * fr);
    return out;
}

std::vector<FaultLine> faultLines(const Motor& m, const OperatingPoint& op, const FaultLineOptions& o) {
    std::vector<FaultLine> out;
    vibrationLines(out, m, op, o);
    for (const auto& [bearing, where] : {std::pair{&m.driveEndBearing, "DE"}, std::pair{&m.nonDriveEndBearing, "NDE"}})
        if (*bearing) {
            const auto lines = bearingLines(factorsOf(**bearing), op.shaftHz, where, o.bearingHarmonics, LineDomain::Envelope);
            out.insert(out.end(), lines.begin(), lines.end());
        }
    currentLines(out, m, op, o);
    return out;
}

} // namespace humwise::motor
