#include "app/gui/PlotStyle.h"

#include "app/common/DateTicks.h"

#include <qcustomplot.h>

#include <QFile>
#include <QKeyEvent>
#include <QTextStream>

namespace humwise::gui {
namespace {

class KeyboardNavigation : public QObject {
public:
    explicit KeyboardNavigation(QCustomPlot* plot) : QObject(plot), m_plot(plot) {}

protected:
    bool eventFilter(QObject*, QEvent* e) override {
        if (e->type() != QEvent::KeyPress) return false;
        auto* k = static_cast<QKeyEvent*>(e);
        QCPAxis* x = m_plot->xAxis;
        const double span = x->range().size();
        switch (k->key()) {
        case Qt::Key_Plus:
        case Qt::Key_Equal: x->scaleRange(0.8, x->range().center()); break;
        case Qt::Key_Minus: x->scaleRange(1.25, x->range().center()); break;
        case Qt::Key_Left: x->moveRange(-0.1 * span); break;
        case Qt::Key_Right: x->moveRange(0.1 * span); break;
        case Qt::Key_Home: m_plot->rescaleAxes(); break;
        default: return false;
        }
        m_plot->replot();
        return true;
    }

private:
    QCustomPlot* m_plot;
};

// Ticks at month starts (or days for short spans), each label once (app/common/DateTicks.h).
class DateTicker : public QCPAxisTicker {
public:
    void generate(const QCPRange& range, const QLocale&, QChar, int, QVector<double>& ticks, QVector<double>* subTicks,
                  QVector<QString>* tickLabels) override {
        ticks.clear();
        if (subTicks) subTicks->clear();
        if (tickLabels) tickLabels->clear();
        for (const auto& t : workflow::dateTicks(range.lower / kSecondsPerDay, range.upper / kSecondsPerDay, tickCount() + 1)) {
            ticks.push_back(t.day * kSecondsPerDay);
            if (tickLabels) tickLabels->push_back(QString::fromStdString(t.label));
        }
    }

private:
    static constexpr double kSecondsPerDay = 86400.0;
};

} // namespace

void useDateAxis(QCPAxis* axis) { axis->setTicker(QSharedPointer<QCPAxisTicker>(new DateTicker)); }

QColor traceColour(int i) {
    static const QColor palette[] = {QColor(0x1f, 0x4e, 0x79), QColor(0xc0, 0x6c, 0x16), QColor(0x3b, 0x7a, 0x57), QColor(0x7a, 0x3b, 0x69),
                                     QColor(0x5c, 0x5c, 0x5c), QColor(0x2a, 0x8c, 0x9a)};
    return palette[static_cast<unsigned>(i) % 6];
}

void stylePlot(QCustomPlot* plot) {
    plot->setInteractions(QCP::iRangeDrag | QCP::iRangeZoom);
    plot->axisRect()->setRangeZoom(Qt::Horizontal | Qt::Vertical);
    plot->setNotAntialiasedElements(QCP::aeAll); // fast redraws of long spectra
    plot->setAntialiasedElements(QCP::aeItems | QCP::aeAxes);
    plot->setFocusPolicy(Qt::StrongFocus);
    for (QCPAxis* a : {plot->xAxis, plot->yAxis}) {
        a->setBasePen(QPen(QColor(0x44, 0x44, 0x44), 0));
        a->setTickPen(QPen(QColor(0x44, 0x44, 0x44), 0));
        a->setSubTickPen(QPen(QColor(0x44, 0x44, 0x44), 0));
        a->grid()->setPen(QPen(QColor(0xdd, 0xdd, 0xdd), 0, Qt::DotLine));
    }
}

void enableKeyboardNavigation(QCustomPlot* plot) { plot->installEventFilter(new KeyboardNavigation(plot)); }

QString exportPlotPng(QCustomPlot* plot, const QString& path) {
    if (!plot->savePng(path, 0, 0, 2.0)) return QStringLiteral("%1: the picture could not be written").arg(path);
    return {};
}

QString exportGraphCsv(QCPGraph* graph, const QString& path, const QString& xName, const QString& yName) {
    QFile f(path);
    if (!f.open(QIODevice::WriteOnly | QIODevice::Truncate | QIODevice::Text)) return QStringLiteral("%1: %2").arg(path, f.errorString());
    QTextStream out(&f);
    out << xName << ',' << yName << '\n';
    for (auto it = graph->data()->constBegin(); it != graph->data()->constEnd(); ++it)
        out << QString::number(it->key, 'g', 10) << ',' << QString::number(it->value, 'g', 9) << '\n';
    if (out.status() != QTextStream::Ok) return QStringLiteral("%1: writing failed").arg(path);
    return {};
}

} // namespace humwise::gui
