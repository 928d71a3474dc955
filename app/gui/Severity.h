#pragma once
// How the workbench shows a severity: Humwise's own names and text marks (core/diagnosis/
// Finding.h) with a shape that reads without colour - a hollow ring (steady), a ring with a dot
// (watch), a triangle (plan repair), a square standing on its corner (act now) - and a colour
// of our own palette as a second cue.

#include <QColor>
#include <QIcon>
#include <QString>

namespace humwise::gui {

QString severityName(int severity);  // "steady" ... ; "not measured" for -1
QString severityMark(int severity);  // "[ ]" ...
QColor severityColour(int severity);
QIcon severityIcon(int severity, int size = 16);

} // namespace humwise::gui
