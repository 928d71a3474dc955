#include "app/report/ReportRenderer.h"

#include "app/report/PdfPlots.h"
#include "app/report/SeverityShape.h"
#include "core/diagnosis/Finding.h"

#include <QDateTime>
#include <QDir>
#include <QFile>
#include <QPagedPaintDevice>
#include <QPainter>
#include <QPdfWriter>

#include <functional>

namespace humwise::report {
namespace {

QString q(const std::string& s) { return QString::fromStdString(s); }

// The sheets' font, without shaping: no typographic ligatures, so words such as "finding" stay
// searchable in the PDF's text (pdftotext would otherwise see the one "fi" glyph).
QFont sheetFont(double points, bool bold = false) {
    QFont f("DejaVu Sans", 1);
    f.setPointSizeF(points);
    f.setBold(bold);
    f.setStyleStrategy(QFont::PreferNoShaping);
    return f;
}

// A simple top-to-bottom page flow on a paged device.
class Flow {
public:
    Flow(QPagedPaintDevice& d, QPainter& p, QString footer) : m_device(d), m_p(p), m_footer(std::move(footer)) { start(); }

    double width() const { return m_page.width(); }
    int pages() const { return m_pages; }

    void need(double h) {
        if (m_y + h > m_page.bottom() - m_footerHeight) newPage();
    }
    void newPage() {
        m_device.newPage();
        start();
    }
    // Wrapped text; returns its height.
    double text(const QString& s, double size = 9, bool bold = false, const QColor& colour = Qt::black, double indent = 0) {
        m_p.setFont(sheetFont(size, bold));
        const QRectF box(m_page.left() + indent, m_y, m_page.width() - indent, 1e6);
        const QRectF used = m_p.boundingRect(box, Qt::TextWordWrap, s);
        need(used.height());
        m_p.setPen(colour);
        m_p.drawText(QRectF(m_page.left() + indent, m_y, m_page.width() - indent, used.height()), Qt::TextWordWrap, s);
        m_y += used.height() + size * 0.35;
        return used.height();
    }
    void gap(double h) { m_y += h; }
    // A block of fixed height drawn by `paint` in the rectangle it is given.
    void block(double h, const std::function<void(const QRectF&)>& paint) {
        need(h);
        paint(QRectF(m_page.left(), m_y, m_page.width(), h));
        m_y += h;
    }
    double y() const { return m_y; }
    QPainter& painter() { return m_p; }

private:
    void start() {
        ++m_pages;
        m_page = QRectF(QPointF(0, 0), QSizeF(m_device.width(), m_device.height()));
        m_y = m_page.top();
        m_p.setFont(sheetFont(7));
        m_p.setPen(QColor(0x55, 0x55, 0x55));
        const QRectF foot(m_page.left(), m_page.bottom() - 14, m_page.width(), 14);
        m_p.drawText(foot, Qt::AlignLeft | Qt::AlignVCenter, m_footer);
        m_p.drawText(foot, Qt::AlignRight | Qt::AlignVCenter, QObject::tr("page %1").arg(m_pages));
    }
    QPagedPaintDevice& m_device;
    QPainter& m_p;
    QString m_footer;
    QRectF m_page;
    double m_y = 0;
    double m_footerHeight = 22;
    int m_pages = 0;
};

void severityLine(Flow& flow, int severity, const QString& text, double size) {
    flow.block(size * 1.9, [&](const QRectF& r) {
        QPainter& p = flow.painter();
        paintSeverityShape(p, QRectF(r.left(), r.top() + 2, size * 1.3, size * 1.3), severity);
        p.setFont(sheetFont(size, true));
        p.setPen(Qt::black);
        p.drawText(QRectF(r.left() + size * 1.9, r.top(), r.width() - size * 2, r.height()), Qt::AlignLeft | Qt::AlignVCenter, text);
    });
}

QString severityText(int s) {
    return s < 0 ? QObject::tr("[-] not measured") : q(std::string(diagnosis::severityMark(s)) + " " + std::string(diagnosis::severityName(s)));
}

void caution(Flow& flow) {
    flow.gap(6);
    flow.text(QString::fromUtf8(workflow::kSafetyCaution), 7.5, false, QColor(0x40, 0x40, 0x40));
}

template <class Paint>
RenderResult writePdf(const QString& path, Paper paper, const QString& title, Paint&& paint) {
    const QString partial = path + ".part";
    RenderResult out;
    {
        QPdfWriter writer(partial);
        writer.setPageSize(paper == Paper::A4 ? QPageSize(QPageSize::A4) : QPageSize(QPageSize::Letter));
        writer.setResolution(96); // QPainter fonts in points then come out at their true size
        writer.setPageMargins(QMarginsF(15, 15, 15, 15), QPageLayout::Millimeter);
        writer.setTitle(title);
        writer.setCreator("Humwise");
        QPainter p;
        if (!p.begin(&writer)) return {0, QObject::tr("%1: cannot write the PDF").arg(path)};
        out.pages = paint(writer, p);
        p.end();
    }
    QFile::remove(path);
    if (!QFile::rename(partial, path)) {
        QFile::remove(partial);
        return {0, QObject::tr("%1: cannot write the PDF (folder missing or not writable?)").arg(path)};
    }
    return out;
}

} // namespace

int paintMotorSheet(QPagedPaintDevice& device, QPainter& p, const workflow::MotorSheet& s) {
    Flow flow(device, p, QObject::tr("Humwise finding sheet - %1 - round of %2").arg(q(s.tag), q(s.roundStart.substr(0, 10))));
    flow.text(QObject::tr("Finding sheet: %1").arg(q(s.tag)), 16, true);
    flow.text(q(s.site + " / " + s.area + (s.description.empty() ? "" : " - " + s.description)), 9.5);
    QString round = QObject::tr("Round of %1").arg(q(s.roundStart.substr(0, 16)));
    if (!s.technician.empty()) round += QObject::tr(", measured by %1").arg(q(s.technician));
    if (!s.previousRoundStart.empty()) round += QObject::tr("; previous round %1").arg(q(s.previousRoundStart.substr(0, 10)));
    flow.text(round, 9);
    QString plate;
    for (const auto& [k, v] : s.nameplate) plate += q(k) + ": " + q(v) + "   ";
    flow.text(plate, 8.5, false, QColor(0x33, 0x33, 0x33));
    if (!s.operatingPoint.empty()) flow.text(QObject::tr("Running at %1").arg(q(s.operatingPoint)), 8.5, false, QColor(0x33, 0x33, 0x33));
    if (!s.isoZone.empty()) flow.text(QObject::tr("Vibration severity: %1").arg(q(s.isoZone)), 8.5);
    for (const auto& f : s.flaggedData) flow.text(QObject::tr("Flagged data, left out of the diagnosis: %1").arg(q(f)), 8.5, false, QColor(0x9e, 0x1b, 0x3c));
    flow.gap(4);
    severityLine(flow, s.worstSeverity, QObject::tr("Overall: %1").arg(severityText(s.worstSeverity)), 11);

    flow.text(QObject::tr("Findings"), 12, true);
    for (const auto& row : s.findings) {
        const auto& f = row.finding;
        if (f.severity == 0 && !f.withheld && f.fault != "iso_zone") continue;
        severityLine(flow, f.severity, q(f.fault) + "  " + severityText(f.severity) + (f.withheld ? QObject::tr(" - verdict withheld") : QString()) +
                                           QObject::tr("  (%1, confidence %2)").arg(q(std::string(diagnosis::originName(f.origin)))).arg(f.confidence, 0, 'f', 2), 10);
        flow.text(q(f.explanation), 8.5, false, Qt::black, 14);
        if (f.withheld) flow.text(QObject::tr("Withheld because %1").arg(q(f.withheldReason)), 8.5, false, Qt::black, 14);
        for (const auto& e : f.evidence) {
            QString line = "- " + q(e.label);
            if (e.expectedHz) line += QObject::tr(": expected %1 Hz").arg(*e.expectedHz, 0, 'f', 3);
            if (e.measuredHz) line += QObject::tr(", measured %1 Hz").arg(*e.measuredHz, 0, 'f', 3);
            line += QStringLiteral(", %1 %2").arg(e.amplitude, 0, 'g', 4).arg(q(e.unit));
            if (e.threshold) line += QObject::tr(" (limit %1 - %2)").arg(*e.threshold, 0, 'g', 4).arg(q(e.thresholdSource));
            if (!e.channel.empty()) line += " [" + q(e.channel) + "]";
            flow.text(line, 7.5, false, QColor(0x30, 0x30, 0x30), 22);
        }
        flow.text(QObject::tr("Recommended action: %1").arg(q(f.action)), 8.5, true, Qt::black, 14);
        flow.text(QObject::tr("Rule %1").arg(q(f.rule)), 7, false, QColor(0x66, 0x66, 0x66), 14);
        flow.gap(3);
    }
    if (!s.changes.empty()) {
        flow.text(QObject::tr("Since the previous round"), 12, true);
        for (const auto& c : s.changes) {
            if (c.now == 0 && (!c.before || *c.before == 0)) continue;
            const QString before = c.before ? severityText(*c.before) : QObject::tr("not found then");
            flow.text(QStringLiteral("%1: %2  ->  %3").arg(q(c.fault), before, severityText(c.now)), 8.5, false, Qt::black, 10);
        }
    }
    for (const auto& panel : s.spectra) flow.block(210, [&](const QRectF& r) { drawSpectrum(p, r.adjusted(0, 6, 0, -6), panel); });
    for (const auto& t : s.trends) {
        flow.block(190, [&](const QRectF& r) { drawTrend(p, r.adjusted(0, 6, 0, -6), t); });
        QString note = t.alarm ? QObject::tr("Alarm limits: %1.").arg(q(t.limitSource)) : QObject::tr("No alarm limit set for this indicator.");
        if (t.crossingDay) note += QObject::tr(" Projected crossing of the alarm limit: %1 (%2).")
                                       .arg(QDateTime::fromSecsSinceEpoch(static_cast<qint64>(*t.crossingDay * 86400), Qt::UTC).toString("yyyy-MM-dd"), q(t.model));
        flow.text(note, 7.5, false, QColor(0x40, 0x40, 0x40));
    }
    flow.text(QObject::tr("Analyst's comment"), 12, true);
    flow.text(s.comment.empty() ? QObject::tr("(none)") : q(s.comment), 9);
    caution(flow);
    return flow.pages();
}

int paintRouteSummary(QPagedPaintDevice& device, QPainter& p, const workflow::RouteSummary& s) {
    Flow flow(device, p, QObject::tr("Humwise route summary - round of %1").arg(q(s.roundStart.substr(0, 10))));
    flow.text(QObject::tr("Route summary: %1").arg(q(s.site)), 16, true);
    flow.text(QObject::tr("Round of %1%2%3").arg(q(s.roundStart.substr(0, 16)), s.route.empty() ? QString() : ", " + q(s.route),
                                                 s.technician.empty() ? QString() : QObject::tr(", measured by %1").arg(q(s.technician))),
              9.5);
    int attention = 0, notMeasured = 0;
    for (const auto& r : s.rows) {
        attention += r.worstSeverity >= 1;
        notMeasured += !r.measured;
    }
    flow.text(QObject::tr("%1 motors: %2 need attention, %3 not measured in this round. Most severe first.").arg(s.rows.size()).arg(attention).arg(notMeasured), 9);
    flow.gap(4);
    for (const auto& r : s.rows) {
        severityLine(flow, r.worstSeverity, q(r.tag) + "  " + severityText(r.worstSeverity) + "  - " + q(r.area), 9.5);
        if (!r.faults.empty()) {
            QString faults;
            for (const auto& f : r.faults) faults += (faults.isEmpty() ? "" : "; ") + q(f);
            flow.text(faults, 8, false, Qt::black, 16);
        }
        flow.text(QObject::tr("Since the last round: %1").arg(q(r.change)), 8, false, QColor(0x33, 0x33, 0x33), 16);
        for (const auto& f : r.flagged) flow.text(QObject::tr("Bad data: %1").arg(q(f)), 8, false, QColor(0x9e, 0x1b, 0x3c), 16);
    }
    caution(flow);
    return flow.pages();
}

RenderResult writeMotorSheetPdf(const workflow::MotorSheet& sheet, const QString& path, Paper paper) {
    return writePdf(path, paper, QObject::tr("Finding sheet %1").arg(q(sheet.tag)), [&](QPagedPaintDevice& d, QPainter& p) { return paintMotorSheet(d, p, sheet); });
}

RenderResult writeMotorSheetsPdf(const std::vector<workflow::MotorSheet>& sheets, const QString& path, Paper paper) {
    return writePdf(path, paper, QObject::tr("Finding sheets"), [&](QPagedPaintDevice& d, QPainter& p) {
        int pages = 0;
        for (std::size_t i = 0; i < sheets.size(); ++i) {
            if (i) d.newPage();
            pages += paintMotorSheet(d, p, sheets[i]);
        }
        return pages;
    });
}

RenderResult writeRouteSummaryPdf(const workflow::RouteSummary& summary, const QString& path, Paper paper) {
    return writePdf(path, paper, QObject::tr("Route summary"), [&](QPagedPaintDevice& d, QPainter& p) { return paintRouteSummary(d, p, summary); });
}

} // namespace humwise::report
