#pragma once
// The severity shapes shared by the workbench and the sheets (app/gui/Severity.h explains them).

#include <QColor>
#include <QRectF>

class QPainter;

namespace humwise::report {

QColor severityColour(int severity);
void paintSeverityShape(QPainter& p, const QRectF& r, int severity);

} // namespace humwise::report
