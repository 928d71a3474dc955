#include "app/gui/Severity.h"

#include "app/report/SeverityShape.h"
#include "core/diagnosis/Finding.h"

#include <QPainter>
#include <QPixmap>

namespace humwise::gui {

QString severityName(int s) { return s < 0 ? QStringLiteral("not measured") : QString::fromUtf8(std::string(diagnosis::severityName(s)).c_str()); }
QString severityMark(int s) { return s < 0 ? QStringLiteral("[-]") : QString::fromUtf8(std::string(diagnosis::severityMark(s)).c_str()); }

QColor severityColour(int s) { return report::severityColour(s); }

QIcon severityIcon(int s, int size) {
    const qreal dpr = 2.0; // crisp on HiDPI screens
    QPixmap pm(static_cast<int>(size * dpr), static_cast<int>(size * dpr));
    pm.setDevicePixelRatio(dpr);
    pm.fill(Qt::transparent);
    QPainter p(&pm);
    report::paintSeverityShape(p, QRectF(2, 2, size - 4, size - 4), s);
    return QIcon(pm);
}

} // namespace humwise::gui
