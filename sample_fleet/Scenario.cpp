#include "sample_fleet/Scenario.h"

#include <cstdio>
#include <stdexcept>

namespace humwise::sample {
namespace {

using namespace std::chrono;

// First weekday of the month (1 January is a holiday at the works).
sys_days firstWorkingDay(int year, unsigned month) {
    sys_days d = year_month_day{std::chrono::year{year}, std::chrono::month{month}, day{1}};
    const auto holiday = [&](sys_days x) {
        const year_month_day ymd{x};
        return ymd.month() == January && ymd.day() == day{1};
    };
    while (weekday{d} == Saturday || weekday{d} == Sunday || holiday(d)) d += days{1};
    return d;
}

std::vector<Round> makeRounds() {
    // Grid frequency during each round (49.95-50.05 Hz) and the hour the technician set out.
    constexpr double kSupply[kRounds] = {49.98, 50.02, 49.97, 50.04, 50.01, 49.96, 50.03, 49.99, 50.05, 49.95, 50.00, 50.02, 49.98};
    constexpr int kStart[kRounds] = {425, 470, 440, 415, 455, 480, 430, 465, 420, 450, 475, 435, 445};
    std::vector<Round> out;
    for (int i = 0; i < kRounds; ++i) {
        Round r;
        r.number = i + 1;
        r.date = i < 12 ? firstWorkingDay(2026, static_cast<unsigned>(i + 1)) : firstWorkingDay(2027, 1);
        r.startMinuteOfDay = kStart[i];
        r.supplyHz = kSupply[i];
        r.technician = i % 2 == 0 ? "technician 1" : "technician 2";
        out.push_back(r);
    }
    out[6].notes = "P-401 coupling and DE bearing replaced in the outage of 2026-06-16; first round since";
    out[11].notes = "P-402 power-off test at DE-H during the planned stop (files P-402_poweroff_*.wav)";
    return out;
}

PerRound series(std::initializer_list<double> v) {
    if (v.size() != kRounds) throw std::logic_error("sample fleet: a fault needs one strength per round");
    PerRound p{};
    std::size_t i = 0;
    for (double x : v) p[i++] = x;
    return p;
}

std::array<int, kRounds> severities(std::initializer_list<int> v) {
    if (v.size() != kRounds) throw std::logic_error("sample fleet: a fault needs one expected severity per round");
    std::array<int, kRounds> s{};
    std::size_t i = 0;
    for (int x : v) s[i++] = x;
    return s;
}

std::vector<SeededFault> makeFaults() {
    std::vector<SeededFault> f;
    f.push_back({FaultKind::OuterRace, "bearing_outer_race", "P-101", {"DE-H", "DE-V", "DE-A"}, 3, 3,
                 "peak acceleration of one impact at the DE housing, g",
                 series({0, 0, 0.02, 0.026, 0.032, 0.04, 0.05, 0.065, 0.085, 0.11, 0.14, 0.18, 0.22}),
                 severities({0, 0, 2, 2, 2, 2, 3, 3, 3, 3, 3, 3, 3}),
                 {"iso_zone"},
                 "A spall on the DE bearing's outer race: impacts at BPFO ring the housing (envelope first); from round 10 "
                 "the spall is wide enough to deflect the race at each passage, which shows in velocity too.",
                 10});
    f.push_back({FaultKind::InnerRace, "bearing_inner_race", "B-201", {"NDE-H", "NDE-V"}, 5, 5,
                 "peak acceleration of one impact at the NDE housing (before load-zone modulation), g",
                 series({0, 0, 0, 0, 0.02, 0.026, 0.032, 0.04, 0.05, 0.065, 0.085, 0.11, 0.14}),
                 severities({0, 0, 0, 0, 1, 2, 2, 2, 3, 3, 3, 3, 3}),
                 {"iso_zone"},
                 "A defect on the NDE bearing's inner race: impacts at BPFI, modulated at the shaft rate as the defect passes "
                 "through the load zone (1X sidebands in the envelope); in velocity too from round 12.",
                 12});
    f.push_back({FaultKind::Unbalance, "unbalance", "F-301", {"DE-H", "DE-V", "NDE-H", "NDE-V"}, 4, 6,
                 "1X velocity the unbalance adds at DE-H, mm/s r.m.s.",
                 series({0, 0, 0, 1.0, 1.4, 2.3, 3.0, 3.7, 4.5, 5.3, 6.2, 7.2, 8.3}),
                 severities({0, 0, 0, 0, 0, 1, 1, 1, 2, 2, 2, 3, 3}),
                 {"iso_zone"},
                 "Dust from the filter gallery builds up unevenly on the fan blades: a growing heavy spot, 1X radial."});
    f.push_back({FaultKind::Misalignment, "misalignment", "P-401", {"DE-H", "DE-V", "DE-A", "NDE-H", "NDE-V"}, 7, 7,
                 "radial 2X velocity at DE-H, mm/s r.m.s. (axial 1X at DE-A is 0.85 of it)",
                 series({0, 0, 0, 0, 0, 0, 2.8, 3.0, 3.3, 3.7, 4.1, 4.8, 5.3}),
                 severities({0, 0, 0, 0, 0, 0, 1, 1, 1, 1, 1, 2, 2}),
                 {"iso_zone"},
                 "The coupling and DE bearing were replaced on 2026-06-16 and the shafts left out of line (angular and offset); "
                 "coupling wear makes it slowly worse."});
    f.push_back({FaultKind::Looseness, "looseness", "P-403", {"DE-V", "NDE-V", "DE-H", "NDE-H"}, 6, 8,
                 "peak velocity of the once-per-revolution rocking pulse at the feet (V), mm/s",
                 series({0, 0, 0, 0, 0, 6, 9, 14, 17, 20, 26, 30, 33}),
                 severities({0, 0, 0, 0, 0, 0, 0, 1, 1, 1, 2, 2, 2}),
                 {"iso_zone"},
                 "Hold-down bolts of the motor base work loose and the grout cracks: the foot lifts once per revolution, "
                 "landing harder every other turn (harmonics of 1X and half orders)."});
    f.push_back({FaultKind::BrokenBars, "broken_rotor_bar", "P-103", {"I-A", "I-B", "I-C"}, 2, 6,
                 "mean level of the (1 -+ 2s) f sidebands below the supply line, dB",
                 series({60, 55, 53, 51, 49.5, 47, 45, 43.5, 41, 39.5, 37.5, 35, 33}),
                 severities({0, 0, 0, 0, 0, 1, 1, 1, 2, 2, 2, 3, 3}),
                 {},
                 "Rotor bars crack at the end-ring joints one after another (frequent starts): from a sound cage to several "
                 "broken bars; pole-pass sidebands around 1X in vibration follow."});
    f.push_back({FaultKind::StaticEccentricity, "electrical_2lf", "P-402", {"DE-H", "DE-V", "NDE-H", "NDE-V"}, 4, 7,
                 "2 x line frequency velocity at DE-H, mm/s r.m.s.",
                 series({0.2, 0.2, 0.2, 1.0, 1.6, 2.0, 2.7, 3.2, 3.8, 4.9, 5.6, 6.4, 7.6}),
                 severities({0, 0, 0, 0, 0, 0, 1, 1, 1, 2, 2, 2, 3}),
                 {"iso_zone"},
                 "Static eccentricity: the stator frame distorts on a base shim that settled, the air gap is uneven and the "
                 "magnetic pull at twice line frequency grows."});
    f.push_back({FaultKind::StatorWinding, "stator_winding", "B-202", {"I-A", "I-B", "I-C"}, 6, 7,
                 "negative / positive sequence current ratio",
                 series({0.012, 0.012, 0.012, 0.012, 0.012, 0.035, 0.07, 0.085, 0.12, 0.15, 0.18, 0.23, 0.28}),
                 severities({0, 0, 0, 0, 0, 0, 1, 1, 2, 2, 2, 3, 3}),
                 {"current_unbalance"},
                 "Inter-turn insulation in one phase degrades (shorted turns): a growing negative-sequence current on a "
                 "balanced supply (not recorded on this motor control centre)."});
    for (const char* tag : {"P-401", "P-402", "P-403", "P-404"})
        f.push_back({FaultKind::VoltageUnbalance, "voltage_unbalance", tag, {"V-AB", "V-BC", "V-CA"}, 6, 7,
                     "NEMA line-voltage unbalance of the MCC-2 bus, %",
                     series({0.35, 0.40, 0.30, 0.45, 0.40, 0.75, 1.3, 1.6, 2.3, 2.6, 3.0, 3.4, 3.8}),
                     severities({0, 0, 0, 0, 0, 0, 1, 1, 2, 2, 2, 2, 2}),
                     {"current_unbalance"},
                     "Single-phase loads added to phase C of MCC-2 (site heating and a welding outlet) sag that phase; every "
                     "motor on the bus sees the same unbalance and draws 5-7 times as much negative-sequence current."});
    f.push_back({FaultKind::LightLoadBrokenBars, "withheld_broken_rotor_bar", "F-302", {"I-A", "I-B", "I-C"}, 1, 1,
                 "mean level of the (1 -+ 2s) f sidebands below the supply line, dB (at about 30 % load)",
                 series({44, 44, 43.5, 43.5, 43, 43, 42.5, 42.5, 42, 42, 41.5, 41.5, 41}),
                 severities({0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0}),
                 {},
                 "An oversized fan motor running at about 30 % load with a cracked bar: the sidebands are there, but below "
                 "half load the diagnosis must withhold its verdict."});
    return f;
}

} // namespace

std::string Round::folder() const {
    char buf[32];
    std::snprintf(buf, sizeof buf, "walkdown-%02d", number);
    return buf;
}

const std::vector<Round>& rounds() {
    static const std::vector<Round> r = makeRounds();
    return r;
}

const std::vector<SeededFault>& seededFaults() {
    static const std::vector<SeededFault> f = makeFaults();
    return f;
}

const SeededFault* faultOn(const std::string& tag, FaultKind kind) {
    for (const auto& f : seededFaults())
        if (f.motorTag == tag && f.kind == kind) return &f;
    return nullptr;
}

double strengthOf(const std::string& tag, FaultKind kind, int number, double healthy) {
    const auto* f = faultOn(tag, kind);
    return f ? f->strength[static_cast<std::size_t>(number - 1)] : healthy;
}

std::vector<std::string> healthyMotors() { return {"P-102", "B-203"}; }

const BadRecording& badRecording() {
    static const BadRecording b{8, "P-102", "NDE-V", "bias_drift",
                                "The accelerometer was recorded before its bias had settled after the magnet went on: a slow "
                                "exponential offset that the import's quality check flags (the point is left out of the diagnosis).",
                                0.25, 1.2};
    return b;
}

const PowerOffPair& powerOffPair() {
    static const PowerOffPair p{12, "P-402", "DE-H", "P-402_poweroff_energised.wav", "P-402_poweroff_after.wav",
                                "Recorded at DE-H just before and right after the supply was cut: the 2 x line-frequency line "
                                "of the static eccentricity vanishes at once while 1X coasts down. Not in the manifest.",
                                4.0, 2.0, 25.0, 0.05};
    return p;
}

} // namespace humwise::sample
