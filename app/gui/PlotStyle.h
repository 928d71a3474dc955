#pragma once
// The look and the everyday handling every plot of the workbench shares: our palette, cosmetic
// pens (fast at any scale), mouse zoom and pan, keyboard zoom and pan, PNG and CSV export.

#include <QColor>
#include <QString>

class QCustomPlot;
class QCPAxis;
class QCPGraph;
class QWidget;

namespace humwise::gui {

QColor traceColour(int index); // the palette for data traces
void stylePlot(QCustomPlot* plot);
// A time axis in seconds since 1970-01-01 UTC, ticked at month starts (days for short spans),
// each label once.
void useDateAxis(QCPAxis* axis);
// +/- zoom the x axis, arrows pan, Home resets to the data (installed as an event filter).
void enableKeyboardNavigation(QCustomPlot* plot);
// Save the plot as PNG (2x for HiDPI) or its first graph's data as CSV; returns an error text.
QString exportPlotPng(QCustomPlot* plot, const QString& path);
QString exportGraphCsv(QCPGraph* graph, const QString& path, const QString& xName, const QString& yName);

} // namespace humwise::gui
