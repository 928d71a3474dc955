#include "core/diagnosis/CurrentAnalysis.h"

#include "core/dsp/Zoom.h"

#include <algorithm>
#include <stdexcept>

namespace humwise::diagnosis {

PhaseSetProducts analysePhaseSet(const std::string& name, const std::vector<std::vector<double>>& phases, double fs,
                                 double nominalHz, bool driveFed, double maxSlip, Quantity quantity) {
    if (phases.empty() || phases.size() > 3) throw std::invalid_argument(name + ": one to three phases are needed");
    const auto& a = phases.front();
    for (const auto& p : phases)
        if (p.size() != a.size()) throw std::invalid_argument(name + ": the phases must be recorded together (same length)");
    if (!(fs > 0) || a.size() < static_cast<std::size_t>(2.0 * fs)) throw std::invalid_argument(name + ": at least 2 s of current are needed");
    PhaseSetProducts out;
    out.name = name;
    out.sampleRateHz = fs;
    // One Blackman-Harris transform of phase A serves the supply search and the zoom.
    const auto transform = dsp::ZoomTransform::of(a, fs);
    if (!transform.ok()) throw std::invalid_argument(name + ": " + transform.error().message);
    const auto line = motor::estimateSupplyFrequency(a, transform.value(), nominalHz, driveFed);
    if (!line) throw std::invalid_argument(name + ": no supply line found in phase A");
    out.line = *line;
    const double f = line->hz;

    double span = 2.0 * (2.0 * maxSlip * f + 2.0);
    span = std::min(span, 2.0 * f - 1.0);
    auto zs = transform.value().band(f, span, dsp::SpectrumScale::Rms, quantity);
    if (!zs.ok()) throw std::invalid_argument(name + ": " + zs.error().message);
    out.zoom = std::move(zs).value();

    dsp::SpectrumRequest w;
    w.resolutionHz = std::max(0.1, fs / static_cast<double>(a.size()));
    w.fmaxHz = std::min(fs / 2.56, 2500.0);
    w.quantity = quantity;
    auto ws = dsp::averagedSpectrum(a, fs, w);
    if (!ws.ok()) throw std::invalid_argument(name + ": " + ws.error().message);
    out.wide = std::move(ws).value();

    for (const auto& p : phases) out.fundamentals.push_back(power::phasorAt(p, fs, f));
    if (phases.size() == 3) {
        out.sequence = power::symmetricalComponents(power::toComplex(out.fundamentals[0]), power::toComplex(out.fundamentals[1]),
                                                    power::toComplex(out.fundamentals[2]));
        out.unbalancePercent = power::nemaUnbalancePercent(out.fundamentals[0].magnitude, out.fundamentals[1].magnitude,
                                                           out.fundamentals[2].magnitude);
    }
    try {
        out.harmonics = power::harmonicAnalysis(a, fs, f);
    } catch (const std::invalid_argument&) {
        // Too few samples per period for harmonics: THD stays unknown.
    }
    return out;
}

} // namespace humwise::diagnosis
