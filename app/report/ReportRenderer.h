#pragma once
// Finding sheets (one motor, one round) and route summaries (every motor of a round) as PDF, A4
// or US Letter. Text is real text (selectable; pdftotext finds it), plots are vector paths, and
// every sheet carries the safety cautions for work on live electrical equipment.

#include "app/common/ReportData.h"

#include <QString>

class QPagedPaintDevice;
class QPainter;

namespace humwise::report {

enum class Paper { A4, Letter };

struct RenderResult {
    int pages = 0;
    QString error; // empty when the file was written
};

// Write to a temporary file and rename it, so a failed run leaves no half-written PDF.
RenderResult writeMotorSheetPdf(const workflow::MotorSheet& sheet, const QString& path, Paper paper);
RenderResult writeRouteSummaryPdf(const workflow::RouteSummary& summary, const QString& path, Paper paper);
// Several sheets into one PDF (one motor after the other, each starting on a new page).
RenderResult writeMotorSheetsPdf(const std::vector<workflow::MotorSheet>& sheets, const QString& path, Paper paper);

// Paint onto any paged device (PDF writer, printer for the print preview); returns the pages.
int paintMotorSheet(QPagedPaintDevice& device, QPainter& p, const workflow::MotorSheet& sheet);
int paintRouteSummary(QPagedPaintDevice& device, QPainter& p, const workflow::RouteSummary& summary);

} // namespace humwise::report
