#pragma once
// Small vector plots for the sheets: a spectrum with its evidence lines marked, and a trend with
// its alarm limits and projected crossing. Drawn as QPainter paths, so a PDF keeps them as
// vectors at any zoom.

#include "app/common/ReportData.h"

#include <QRectF>

class QPainter;

namespace humwise::report {

void drawSpectrum(QPainter& p, const QRectF& area, const workflow::SpectrumPanel& panel);
void drawTrend(QPainter& p, const QRectF& area, const workflow::TrendPanel& panel);

} // namespace humwise::report
