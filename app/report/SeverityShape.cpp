#include "app/report/SeverityShape.h"

#include <QPainter>
#include <QPainterPath>

namespace humwise::report {

QColor severityColour(int s) {
    switch (s) {
    case 0: return QColor(0x5b, 0x6f, 0x7d);
    case 1: return QColor(0xb8, 0x8a, 0x1e);
    case 2: return QColor(0xd0, 0x62, 0x1a);
    case 3: return QColor(0x9e, 0x1b, 0x3c);
    default: return QColor(0xa0, 0xa0, 0xa0);
    }
}

void paintSeverityShape(QPainter& p, const QRectF& r, int s) {
    p.save();
    p.setRenderHint(QPainter::Antialiasing);
    const QColor c = severityColour(s);
    p.setPen(QPen(c, std::max(1.0, r.width() / 8)));
    switch (s) {
    case 0: p.setBrush(Qt::NoBrush); p.drawEllipse(r); break;
    case 1:
        p.setBrush(Qt::NoBrush);
        p.drawEllipse(r);
        p.setBrush(c);
        p.drawEllipse(r.center(), r.width() / 6, r.height() / 6);
        break;
    case 2: {
        QPainterPath t;
        t.moveTo(r.center().x(), r.top());
        t.lineTo(r.right(), r.bottom());
        t.lineTo(r.left(), r.bottom());
        t.closeSubpath();
        p.setBrush(c);
        p.drawPath(t);
        break;
    }
    case 3: {
        QPainterPath d;
        d.moveTo(r.center().x(), r.top());
        d.lineTo(r.right(), r.center().y());
        d.lineTo(r.center().x(), r.bottom());
        d.lineTo(r.left(), r.center().y());
        d.closeSubpath();
        p.setBrush(c);
        p.drawPath(d);
        break;
    }
    default: p.setPen(QPen(c, 1, Qt::DashLine)); p.drawEllipse(r); break;
    }
    p.restore();
}

} // namespace humwise::report
