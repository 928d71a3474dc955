#include "app/report/PdfPlots.h"

#include "app/common/DateTicks.h"

#include <QDateTime>
#include <QPainter>
#include <QPainterPath>

#include <algorithm>
#include <cmath>

namespace humwise::report {
namespace {

const QColor kInk(0x22, 0x22, 0x22), kGrid(0xdd, 0xdd, 0xdd), kTrace(0x1f, 0x4e, 0x79), kMark(0x9e, 0x1b, 0x3c);

double niceStep(double span, int ticks) {
    const double raw = span / ticks;
    const double mag = std::pow(10.0, std::floor(std::log10(raw)));
    for (double m : {1.0, 2.0, 2.5, 5.0, 10.0})
        if (raw <= m * mag) return m * mag;
    return 10 * mag;
}

struct Frame {
    QRectF plot;
    double x0, x1, y0, y1;
    bool logY = false;
    double px(double x) const { return plot.left() + (x - x0) / (x1 - x0) * plot.width(); }
    double py(double y) const {
        const double v = logY ? std::log10(std::max(y, 1e-300)) : y;
        return plot.bottom() - (v - y0) / (y1 - y0) * plot.height();
    }
};

Frame frame(QPainter& p, const QRectF& area, const QString& title, const QString& yUnit, double x0, double x1, double y0, double y1, bool logY) {
    const QFontMetricsF fm(p.font());
    Frame f{area.adjusted(fm.horizontalAdvance("0000.0") + 6, fm.height() * 1.4, -6, -fm.height() * 1.6), x0, x1, y0, y1, logY};
    p.setPen(kInk);
    p.drawText(QRectF(area.left(), area.top(), area.width(), fm.height() * 1.3), Qt::AlignLeft | Qt::AlignVCenter, title + "  [" + yUnit + "]");
    p.setPen(QPen(kGrid, 0.5));
    const double ystep = niceStep(y1 - y0, 4);
    for (double y = std::ceil(y0 / ystep) * ystep; y <= y1 + 1e-12; y += ystep) {
        const double yy = f.plot.bottom() - (y - y0) / (y1 - y0) * f.plot.height();
        p.setPen(QPen(kGrid, 0.5));
        p.drawLine(QPointF(f.plot.left(), yy), QPointF(f.plot.right(), yy));
        p.setPen(kInk);
        const QString label = logY ? QString("1e%1").arg(y, 0, 'f', 0) : QString::number(y, 'g', 3);
        p.drawText(QRectF(area.left(), yy - fm.height() / 2, f.plot.left() - area.left() - 4, fm.height()), Qt::AlignRight | Qt::AlignVCenter, label);
    }
    p.setPen(QPen(kInk, 0.8));
    p.drawRect(f.plot);
    return f;
}

} // namespace

void drawSpectrum(QPainter& p, const QRectF& area, const workflow::SpectrumPanel& s) {
    if (s.hz.size() < 2) return;
    p.save();
    const auto [mn, mx] = std::minmax_element(s.values.begin(), s.values.end());
    double y0 = 0, y1 = *mx * 1.1;
    if (s.logarithmic) {
        y0 = std::floor(std::log10(std::max(*mn, *mx * 1e-7)));
        y1 = std::ceil(std::log10(*mx * 1.5));
    }
    if (!(y1 > y0)) y1 = y0 + 1;
    Frame f = frame(p, area, QString::fromStdString(s.title), QString::fromStdString(s.unit), s.hz.front(), s.hz.back(), y0, y1, s.logarithmic);
    const QFontMetricsF fm(p.font());
    const double xstep = niceStep(f.x1 - f.x0, 6);
    p.setPen(kInk);
    for (double x = std::ceil(f.x0 / xstep) * xstep; x <= f.x1 + 1e-9; x += xstep)
        p.drawText(QRectF(f.px(x) - 40, f.plot.bottom() + 2, 80, fm.height()), Qt::AlignHCenter | Qt::AlignTop, QString::number(x, 'g', 5));
    p.drawText(QRectF(f.plot.left(), f.plot.bottom() + fm.height(), f.plot.width(), fm.height()), Qt::AlignHCenter, QObject::tr("frequency (Hz)"));
    for (const auto& m : s.markers) {
        if (m.x < f.x0 || m.x > f.x1) continue;
        p.setPen(QPen(kMark, 0.8, Qt::DashLine));
        p.drawLine(QPointF(f.px(m.x), f.plot.top()), QPointF(f.px(m.x), f.plot.bottom()));
        p.setPen(kMark);
        p.drawText(QPointF(f.px(m.x) + 2, f.plot.top() + fm.ascent()), QString::fromStdString(m.label));
    }
    QPainterPath path;
    for (std::size_t i = 0; i < s.hz.size(); ++i) {
        const QPointF pt(f.px(s.hz[i]), std::clamp(f.py(s.values[i]), f.plot.top(), f.plot.bottom()));
        if (i == 0) path.moveTo(pt);
        else path.lineTo(pt);
    }
    p.setPen(QPen(kTrace, 0.7));
    p.setBrush(Qt::NoBrush);
    p.drawPath(path);
    p.restore();
}

void drawTrend(QPainter& p, const QRectF& area, const workflow::TrendPanel& t) {
    if (t.days.empty()) return;
    p.save();
    double x0 = t.days.front(), x1 = t.days.back();
    if (t.crossingDay && *t.crossingDay < x1 + 730) x1 = *t.crossingDay + 10;
    if (x1 - x0 < 30) {
        x0 -= 15;
        x1 += 15;
    }
    double y1 = *std::max_element(t.values.begin(), t.values.end());
    double y0 = std::min(0.0, *std::min_element(t.values.begin(), t.values.end()));
    if (t.alarm) y1 = std::max(y1, *t.alarm);
    y1 = y1 > y0 ? y1 * 1.1 : y0 + 1;
    Frame f = frame(p, area, QString::fromStdString(t.title), QString::fromStdString(t.unit), x0, x1, y0, y1, false);
    const QFontMetricsF fm(p.font());
    p.setPen(kInk);
    for (const auto& tick : workflow::dateTicks(x0, x1, 5)) {
        const QString label = QString::fromStdString(tick.label);
        p.drawText(QRectF(f.px(tick.day) - 40, f.plot.bottom() + 2, 80, fm.height()), Qt::AlignHCenter | Qt::AlignTop, label);
    }
    const auto limit = [&](double v, const QColor& c, const QString& name) {
        p.setPen(QPen(c, 0.8, Qt::DashLine));
        p.drawLine(QPointF(f.plot.left(), f.py(v)), QPointF(f.plot.right(), f.py(v)));
        p.setPen(c);
        p.drawText(QPointF(f.plot.left() + 3, f.py(v) - 2), name + " " + QString::number(v, 'g', 3));
    };
    if (t.alert) limit(*t.alert, QColor(0xb8, 0x8a, 0x1e), QObject::tr("alert"));
    if (t.alarm) limit(*t.alarm, kMark, QObject::tr("alarm"));
    QPainterPath path;
    for (std::size_t i = 0; i < t.days.size(); ++i) {
        const QPointF pt(f.px(t.days[i]), f.py(t.values[i]));
        if (i == 0) path.moveTo(pt);
        else path.lineTo(pt);
    }
    p.setPen(QPen(kTrace, 1.0));
    p.drawPath(path);
    p.setBrush(kTrace);
    for (std::size_t i = 0; i < t.days.size(); ++i) p.drawEllipse(QPointF(f.px(t.days[i]), f.py(t.values[i])), 1.8, 1.8);
    if (t.crossingDay && t.alarm && *t.crossingDay <= x1) {
        p.setPen(QPen(QColor(0x60, 0x60, 0x60), 0.8, Qt::DotLine));
        p.drawLine(QPointF(f.px(t.days.back()), f.py(t.values.back())), QPointF(f.px(*t.crossingDay), f.py(*t.alarm)));
        p.setPen(kInk);
        const QString when = QDateTime::fromSecsSinceEpoch(static_cast<qint64>(*t.crossingDay * 86400), Qt::UTC).toString("yyyy-MM-dd");
        p.drawText(QRectF(f.px(*t.crossingDay) - 150, f.py(*t.alarm) + 2, 148, fm.height()), Qt::AlignRight, QObject::tr("crossing %1").arg(when));
    }
    p.restore();
}

} // namespace humwise::report
