#include "core/dsp/SpectrumCompare.h"

#include "core/dsp/Peaks.h"

#include <algorithm>
#include <cmath>
#include <stdexcept>

namespace humwise::dsp {
namespace {

double valueAt(const Spectrum& s, double hz) {
    const double x = (hz - s.startHz) / s.resolutionHz;
    if (x <= 0) return s.values.front();
    const auto i = static_cast<std::size_t>(x);
    if (i + 1 >= s.values.size()) return s.values.back();
    const double t = x - static_cast<double>(i);
    return s.values[i] * (1 - t) + s.values[i + 1] * t;
}

} // namespace

SpectrumComparison compareSpectra(const Spectrum& a, double frA, const Spectrum& b, double frB, const CompareOptions& o) {
    if (a.scale != b.scale || a.quantity != b.quantity) throw std::invalid_argument("compareSpectra: the spectra differ in scale or quantity");
    if (!(frA > 0) || !(frB > 0) || a.values.size() < 2 || b.values.size() < 2) throw std::invalid_argument("compareSpectra: need shaft frequencies > 0 and two spectra");
    SpectrumComparison out;
    const double lastA = a.frequencyHz(a.lineCount() - 1) / frA, lastB = b.frequencyHz(b.lineCount() - 1) / frB;
    const double first = std::max(a.startHz / frA, b.startHz / frB), last = std::min(lastA, lastB);
    const double step = std::min(a.resolutionHz / frA, b.resolutionHz / frB);
    double largest = 0;
    for (double v : a.values) largest = std::max(largest, v);
    for (double v : b.values) largest = std::max(largest, v);
    const double floor = std::max(largest * 1e-12, 1e-300);
    for (double ord = first; ord <= last + 1e-12; ord += step) {
        const double va = valueAt(a, ord * frA), vb = valueAt(b, ord * frB);
        out.orders.push_back(ord);
        out.a.push_back(va);
        out.b.push_back(vb);
        out.differenceDb.push_back(20.0 * std::log10(std::max(vb, floor) / std::max(va, floor)));
    }
    PeakRequest r;
    r.maxPeaks = o.maxLines;
    r.minProminence = o.minProminence;
    r.minFrequencyHz = first * frB;
    r.maxFrequencyHz = last * frB;
    for (const auto& p : findPeaks(b, r)) {
        LineChange c;
        c.order = p.frequencyHz / frB;
        c.frequencyHzB = p.frequencyHz;
        c.amplitudeB = p.amplitude;
        c.frequencyHzA = c.order * frA;
        const double tol = 1.5 * a.resolutionHz;
        PeakRequest q;
        q.maxPeaks = 1;
        q.minFrequencyHz = c.frequencyHzA - tol;
        q.maxFrequencyHz = c.frequencyHzA + tol;
        q.minProminence = 2.0;
        const auto inA = findPeaks(a, q);
        c.appeared = inA.empty();
        c.amplitudeA = inA.empty() ? valueAt(a, c.frequencyHzA) : inA.front().amplitude;
        const bool psd = a.scale == SpectrumScale::Psd;
        c.changeDb = (psd ? 10.0 : 20.0) * std::log10(std::max(c.amplitudeB, floor) / std::max(c.amplitudeA, floor));
        if (c.appeared || c.changeDb >= o.growDb) out.changes.push_back(c);
    }
    std::sort(out.changes.begin(), out.changes.end(), [](const LineChange& x, const LineChange& y) { return x.changeDb > y.changeDb; });
    return out;
}

} // namespace humwise::dsp
