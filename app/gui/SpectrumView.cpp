#include "app/gui/SpectrumView.h"

#include "app/common/StoredData.h"
#include "app/gui/PlotStyle.h"
#include "core/dsp/Integration.h"
#include "core/dsp/Peaks.h"

#include <qcustomplot.h>

#include <QCheckBox>
#include <QComboBox>
#include <QDoubleSpinBox>
#include <QFileDialog>
#include <QHBoxLayout>
#include <QLabel>
#include <QMenu>
#include <QToolButton>
#include <QVBoxLayout>

#include <cmath>
#include <numbers>

namespace humwise::gui {
namespace {

constexpr double kG = kStandardGravity;

QColor overlayColour(Overlay o) {
    switch (o) {
    case Overlay::Shaft: return QColor(0x2e, 0x7d, 0x32);
    case Overlay::Line: return QColor(0x6a, 0x1b, 0x9a);
    case Overlay::BearingDe: return QColor(0xc6, 0x28, 0x28);
    case Overlay::BearingNde: return QColor(0xad, 0x14, 0x57);
    case Overlay::BrokenBar: return QColor(0xef, 0x6c, 0x00);
    case Overlay::Eccentricity: return QColor(0x00, 0x83, 0x8f);
    case Overlay::SlotHarmonic: return QColor(0x45, 0x5a, 0x64);
    case Overlay::VanePass: return QColor(0x55, 0x8b, 0x2f);
    }
    return Qt::gray;
}

QString overlayName(Overlay o) {
    switch (o) {
    case Overlay::Shaft: return QObject::tr("1X and harmonics");
    case Overlay::Line: return QObject::tr("Line frequency and 2x line");
    case Overlay::BearingDe: return QObject::tr("Bearing lines, drive end");
    case Overlay::BearingNde: return QObject::tr("Bearing lines, non-drive end");
    case Overlay::BrokenBar: return QObject::tr("Broken-bar and pole-pass sidebands");
    case Overlay::Eccentricity: return QObject::tr("Eccentricity lines");
    case Overlay::SlotHarmonic: return QObject::tr("Slot harmonics and rotor-bar pass");
    case Overlay::VanePass: return QObject::tr("Vane / blade pass");
    }
    return {};
}

std::optional<Overlay> overlayOf(const motor::FaultLine& l) {
    using F = motor::LineFamily;
    switch (l.family) {
    case F::Shaft: return Overlay::Shaft;
    case F::Line: return Overlay::Line;
    case F::Bearing: return l.id.find("_NDE") != std::string::npos ? Overlay::BearingNde : Overlay::BearingDe;
    case F::BrokenBar:
    case F::SlipAndPolePass: return Overlay::BrokenBar;
    case F::Eccentricity: return Overlay::Eccentricity;
    case F::SlotHarmonic:
    case F::DynamicEccentricity:
    case F::RotorBarPass: return Overlay::SlotHarmonic;
    case F::VanePass: return Overlay::VanePass;
    default: return std::nullopt;
    }
}

} // namespace

SpectrumView::SpectrumView(StoreSession& session, QWidget* parent) : QWidget(parent), m_session(session) {
    for (Overlay o : {Overlay::Shaft, Overlay::Line, Overlay::BearingDe, Overlay::BearingNde, Overlay::BrokenBar, Overlay::Eccentricity,
                      Overlay::SlotHarmonic, Overlay::VanePass})
        m_overlays[o] = o != Overlay::SlotHarmonic;
    m_point = new QComboBox;
    m_kind = new QComboBox;
    m_round = new QComboBox;
    m_quantity = new QComboBox;
    m_quantity->addItem(tr("acceleration"), static_cast<int>(Quantity::Acceleration));
    m_quantity->addItem(tr("velocity"), static_cast<int>(Quantity::Velocity));
    m_quantity->addItem(tr("displacement"), static_cast<int>(Quantity::Displacement));
    m_quantity->setCurrentIndex(1);
    m_units = new QComboBox;
    m_units->addItems({tr("SI units"), tr("imperial units")});
    m_orders = new QCheckBox(tr("orders"));
    m_log = new QCheckBox(tr("log"));
    m_overlayButton = new QToolButton;
    m_overlayButton->setText(tr("Fault lines"));
    m_overlayButton->setPopupMode(QToolButton::InstantPopup);
    auto* menu = new QMenu(m_overlayButton);
    for (auto& [o, on] : m_overlays) {
        QAction* a = menu->addAction(overlayName(o));
        a->setCheckable(true);
        a->setChecked(on);
        const Overlay which = o;
        connect(a, &QAction::toggled, this, [this, which](bool checked) { setOverlay(which, checked); });
    }
    m_overlayButton->setMenu(menu);
    m_cursorMode = new QComboBox;
    m_cursorMode->addItems({tr("no cursor"), tr("harmonic cursor"), tr("sideband cursor")});
    m_spacing = new QDoubleSpinBox;
    m_spacing->setRange(0.01, 1000);
    m_spacing->setDecimals(3);
    m_spacing->setSuffix(" Hz");
    m_spacing->setValue(1.0);
    m_spacing->setToolTip(tr("Sideband spacing"));
    auto* png = new QToolButton;
    png->setText(tr("PNG"));
    auto* csv = new QToolButton;
    csv->setText(tr("CSV"));
    auto* controls = new QHBoxLayout;
    for (QWidget* w : std::initializer_list<QWidget*>{m_point, m_kind, m_round, m_quantity, m_units, m_orders, m_log, m_overlayButton, m_cursorMode, m_spacing, png, csv})
        controls->addWidget(w);
    controls->addStretch();
    m_plot = new QCustomPlot;
    stylePlot(m_plot);
    enableKeyboardNavigation(m_plot);
    m_plot->installEventFilter(this);
    m_info = new QLabel;
    m_info->setWordWrap(true);
    auto* layout = new QVBoxLayout(this);
    layout->addLayout(controls);
    layout->addWidget(m_plot, 1);
    layout->addWidget(m_info);

    connect(m_point, &QComboBox::currentIndexChanged, this, [this] { reloadKinds(); });
    connect(m_kind, &QComboBox::currentIndexChanged, this, [this] {
        // Current lines 40-60 dB below the supply line only show on a log axis.
        const QString k = currentKind();
        setLogarithmic(k == "zoom" || k == "current" || k == "voltage");
        load();
    });
    connect(m_round, &QComboBox::currentIndexChanged, this, [this] { load(); });
    connect(m_quantity, &QComboBox::currentIndexChanged, this, [this] { setQuantity(static_cast<Quantity>(m_quantity->currentData().toInt())); });
    connect(m_units, &QComboBox::currentIndexChanged, this, [this](int i) { setImperial(i == 1); });
    connect(m_orders, &QCheckBox::toggled, this, [this](bool on) { setOrders(on); });
    connect(m_log, &QCheckBox::toggled, this, [this](bool on) { setLogarithmic(on); });
    connect(m_cursorMode, &QComboBox::currentIndexChanged, this, [this](int mode) {
        m_plot->setInteraction(QCP::iRangeDrag, mode == 0);
        if (mode != 1) m_harmonicHz.reset();
        if (mode != 2) m_sidebandHz.reset();
        drawCursors();
        m_plot->replot();
    });
    connect(m_spacing, &QDoubleSpinBox::valueChanged, this, [this](double v) {
        m_sidebandSpacingHz = v;
        drawCursors();
        m_plot->replot();
    });
    connect(png, &QToolButton::clicked, this, [this] {
        const QString path = QFileDialog::getSaveFileName(this, tr("Save spectrum picture"), {}, tr("PNG pictures (*.png)"));
        if (!path.isEmpty()) m_info->setText(exportPng(path));
    });
    connect(csv, &QToolButton::clicked, this, [this] {
        const QString path = QFileDialog::getSaveFileName(this, tr("Save spectrum lines"), {}, tr("CSV files (*.csv)"));
        if (!path.isEmpty()) m_info->setText(exportCsv(path));
    });
}

void SpectrumView::showMotor(const QString& tag) {
    m_tag = tag;
    reloadPoints();
}

void SpectrumView::reloadPoints() {
    const QSignalBlocker b1(m_point), b2(m_round);
    m_point->clear();
    m_round->clear();
    const auto* def = m_session.fleet().motor(m_tag.toStdString());
    if (!def) return;
    for (const auto& p : def->points) m_point->addItem(QString::fromStdString(p.name));
    const auto& rounds = m_session.rounds();
    for (auto it = rounds.rbegin(); it != rounds.rend(); ++it) m_round->addItem(QString::fromStdString(it->startedAt.substr(0, 10)), static_cast<qlonglong>(it->id));
    reloadKinds();
}

void SpectrumView::reloadKinds() {
    const QSignalBlocker b(m_kind);
    const QString keep = m_kind->currentData().toString();
    m_kind->clear();
    const auto* def = m_session.fleet().motor(m_tag.toStdString());
    const auto* p = def ? def->point(m_point->currentText().toStdString()) : nullptr;
    if (p) {
        if (p->quantity == Quantity::Current) {
            m_kind->addItem(tr("current spectrum"), "current");
            m_kind->addItem(tr("zoom around the supply line"), "zoom");
        } else if (p->quantity == Quantity::Voltage) {
            m_kind->addItem(tr("voltage spectrum"), "voltage");
        } else {
            m_kind->addItem(tr("vibration spectrum"), "velocity");
            m_kind->addItem(tr("envelope spectrum"), "envelope");
        }
    }
    const int i = m_kind->findData(keep);
    m_kind->setCurrentIndex(i >= 0 ? i : 0);
    m_quantity->setEnabled(m_kind->currentData().toString() == "velocity");
    m_stored.reset(); // the previous point's spectrum is not this one's
    const QString k = currentKind();
    setLogarithmic(k == "zoom" || k == "current" || k == "voltage");
    load();
}

QString SpectrumView::currentPoint() const { return m_point->currentText(); }
QString SpectrumView::currentKind() const { return m_kind->currentData().toString(); }

bool SpectrumView::showPoint(const QString& point, const QString& kind, std::optional<std::int64_t> roundId) {
    const int pi = m_point->findText(point);
    if (pi < 0) return false;
    {
        const QSignalBlocker b(m_round);
        if (roundId) m_round->setCurrentIndex(std::max(0, m_round->findData(static_cast<qlonglong>(*roundId))));
        else m_round->setCurrentIndex(0);
    }
    m_point->setCurrentIndex(pi);
    reloadKinds();
    const int ki = m_kind->findData(kind);
    if (ki < 0) return false;
    m_kind->setCurrentIndex(ki);
    load();
    return m_stored.has_value();
}

void SpectrumView::load() {
    m_stored.reset();
    m_op.reset();
    m_highlightHz.reset();
    m_quantity->setEnabled(currentKind() == "velocity");
    if (!m_session.isOpen() || m_round->count() == 0) {
        redraw();
        return;
    }
    const std::int64_t roundId = m_round->currentData().toLongLong();
    // A current spectrum is stored under the phase set's first point (I-A / V-AB).
    QString point = currentPoint();
    const QString kind = currentKind();
    try {
        auto rec = workflow::recordingOf(m_session.store(), roundId, m_tag.toStdString(), point.toStdString());
        std::optional<dsp::Spectrum> s = rec ? workflow::storedSpectrum(m_session.store(), rec->id, kind.toStdString()) : std::nullopt;
        if (!s && (kind == "current" || kind == "zoom" || kind == "voltage")) {
            for (const auto& r : m_session.store().recordings(roundId))
                if (r.motorTag == m_tag.toStdString())
                    if ((s = workflow::storedSpectrum(m_session.store(), r.id, kind.toStdString()))) break;
        }
        m_stored = s;
        if (const auto op = workflow::operatingPoint(m_session.store(), roundId, m_tag.toStdString())) {
            const auto* def = m_session.fleet().motor(m_tag.toStdString());
            m_op = motor::OperatingPoint{op->lineHz, op->speedRpm / 60.0, def ? motor::polesOf(def->motor.nameplate).value_or(4) : 4};
        }
    } catch (const storage::StorageException& e) {
        m_info->setText(QString::fromStdString(e.error.message));
    }
    redraw();
}

void SpectrumView::setQuantity(Quantity q) {
    {
        const QSignalBlocker b(m_quantity);
        m_quantity->setCurrentIndex(std::max(0, m_quantity->findData(static_cast<int>(q))));
    }
    m_displayQuantity = q;
    redraw();
}

void SpectrumView::setImperial(bool imperial) {
    m_imperial = imperial;
    const QSignalBlocker b(m_units);
    m_units->setCurrentIndex(imperial ? 1 : 0);
    redraw();
}

void SpectrumView::setOrders(bool orders) {
    const QSignalBlocker b(m_orders);
    m_orders->setChecked(orders);
    redraw();
}

void SpectrumView::setLogarithmic(bool log) {
    const QSignalBlocker b(m_log);
    m_log->setChecked(log);
    m_plot->yAxis->setScaleType(log ? QCPAxis::stLogarithmic : QCPAxis::stLinear);
    if (log) m_plot->yAxis->setTicker(QSharedPointer<QCPAxisTickerLog>(new QCPAxisTickerLog));
    else m_plot->yAxis->setTicker(QSharedPointer<QCPAxisTicker>(new QCPAxisTicker));
    redraw();
}

void SpectrumView::setOverlay(Overlay o, bool on) {
    m_overlays[o] = on;
    for (QAction* a : m_overlayButton->menu()->actions())
        if (a->text() == overlayName(o)) {
            const QSignalBlocker b(a);
            a->setChecked(on);
        }
    redraw();
}

void SpectrumView::setOverlaysVisible(bool visible) {
    m_overlaysOn = visible;
    redraw();
}

void SpectrumView::highlight(double hz) {
    m_highlightHz = hz;
    redraw();
}

void SpectrumView::setHarmonicCursor(std::optional<double> hz) {
    m_harmonicHz = hz;
    drawCursors();
    m_plot->replot();
}

void SpectrumView::setSidebandCursor(std::optional<double> centreHz, double spacingHz) {
    m_sidebandHz = centreHz;
    m_sidebandSpacingHz = spacingHz;
    drawCursors();
    m_plot->replot();
}

void SpectrumView::nextPoint() {
    if (m_point->count() > 0) m_point->setCurrentIndex((m_point->currentIndex() + 1) % m_point->count());
}

double SpectrumView::toAxis(double hz) const { return m_orders->isChecked() && m_op && m_op->shaftHz > 0 ? hz / m_op->shaftHz : hz; }
double SpectrumView::toHz(double x) const { return m_orders->isChecked() && m_op && m_op->shaftHz > 0 ? x * m_op->shaftHz : x; }

void SpectrumView::redraw() {
    m_plot->clearGraphs();
    m_plot->clearItems();
    m_markers.clear();
    m_cursorX.clear();
    m_shown.reset();
    if (!m_stored) {
        m_info->setText(m_tag.isEmpty() ? QString() : tr("No stored spectrum of this kind for %1 in that round.").arg(currentPoint()));
        m_plot->replot();
        return;
    }
    dsp::Spectrum s = *m_stored;
    const QString kind = currentKind();
    const bool motion = s.quantity == Quantity::Acceleration || s.quantity == Quantity::Velocity || s.quantity == Quantity::Displacement;
    if (kind == "velocity" && !motion) { // a stale spectrum of another kind: draw nothing rather than convert it
        m_plot->replot();
        return;
    }
    Unit unit = siUnitOf(s.quantity);
    double power = 1; // the display value is SI value / factor^power
    if (kind == "velocity") {
        dsp::convertSpectrum(s, m_displayQuantity, 2.0);
        switch (m_displayQuantity) {
        case Quantity::Acceleration: unit = m_imperial ? Unit::G : Unit::MetrePerSecond2; break;
        case Quantity::Displacement: unit = m_imperial ? Unit::Mil : Unit::Micrometre; break;
        default: unit = m_imperial ? Unit::InchPerSecond : Unit::MillimetrePerSecond; break;
        }
        m_unitLabel = QString::fromStdString(std::string(unitSymbol(unit))) + " rms";
    } else if (kind == "envelope") {
        unit = Unit::G;
        power = 2;
        m_unitLabel = "g^2 rms (squared envelope)";
    } else {
        m_unitLabel = QString::fromStdString(std::string(unitSymbol(unit))) + " rms";
    }
    const double k = std::pow(1.0 / toSiFactor(unit), power);
    for (double& v : s.values) v *= k;
    m_shown = s;
    QVector<double> x(static_cast<qsizetype>(s.lineCount())), y(static_cast<qsizetype>(s.lineCount()));
    for (std::size_t i = 0; i < s.lineCount(); ++i) {
        x[static_cast<qsizetype>(i)] = toAxis(s.frequencyHz(i));
        y[static_cast<qsizetype>(i)] = m_log->isChecked() ? std::max(s.values[i], 1e-12) : s.values[i];
    }
    QCPGraph* g = m_plot->addGraph();
    g->setPen(QPen(traceColour(0), 0));
    g->setData(x, y, true);
    g->setAdaptiveSampling(true);
    m_plot->xAxis->setLabel(m_orders->isChecked() ? tr("order (x running speed)") : tr("frequency (Hz)"));
    m_plot->yAxis->setLabel(m_unitLabel);
    m_plot->rescaleAxes();
    if (!m_log->isChecked()) m_plot->yAxis->setRangeLower(0);
    drawOverlays();
    drawPeaks();
    drawCursors();
    if (m_highlightHz) {
        auto* t = new QCPItemTracer(m_plot);
        t->setGraph(g);
        t->setGraphKey(toAxis(*m_highlightHz));
        t->setStyle(QCPItemTracer::tsCircle);
        t->setSize(12);
        t->setPen(QPen(QColor(0x9e, 0x1b, 0x3c), 2));
        auto* label = new QCPItemText(m_plot);
        label->position->setParentAnchor(t->position);
        label->position->setCoords(0, -16);
        label->setText(tr("evidence %1 Hz").arg(*m_highlightHz, 0, 'f', 2));
        label->setColor(QColor(0x9e, 0x1b, 0x3c));
        // Show the neighbourhood of the highlighted line.
        const double span = std::max(10 * s.resolutionHz, 0.25 * *m_highlightHz);
        m_plot->xAxis->setRange(toAxis(*m_highlightHz - span), toAxis(*m_highlightHz + span));
    }
    QString text = tr("%1 lines, %2 Hz apart").arg(s.lineCount()).arg(s.resolutionHz, 0, 'g', 4);
    if (m_op) text += tr("; running speed %1 r/min, supply %2 Hz").arg(m_op->speedRpm(), 0, 'f', 1).arg(m_op->lineHz, 0, 'f', 3);
    m_info->setText(text);
    m_plot->replot();
}

void SpectrumView::drawOverlays() {
    if (!m_overlaysOn || !m_op || !m_shown) return;
    const auto* def = m_session.fleet().motor(m_tag.toStdString());
    if (!def) return;
    const QString kind = currentKind();
    const double lo = m_shown->startHz, hi = m_shown->frequencyHz(m_shown->lineCount() - 1);
    // Bearing lines of the end the point sits at; the other end's bearing stays in the menu's
    // other entry for points without a location.
    const auto* point = def->point(currentPoint().toStdString());
    const std::string end = point ? point->location : std::string();
    std::size_t labelled = 0;
    for (const auto& line : motor::faultLines(def->motor, *m_op)) {
        if (line.family == motor::LineFamily::Bearing) {
            const bool nde = line.id.find("_NDE") != std::string::npos;
            if (!end.empty() && (end == "NDE") != nde) continue;
            if (line.id.find("+") != std::string::npos || line.id.find("-") != std::string::npos || line.id.rfind("BSF_", 0) == 0) continue;
        }
        const bool current = kind == "current" || kind == "zoom" || kind == "voltage";
        if (current != (line.domain == motor::LineDomain::Current)) continue;
        if (kind == "envelope" && line.family != motor::LineFamily::Bearing && line.family != motor::LineFamily::Shaft) continue;
        const auto o = overlayOf(line);
        if (!o || !m_overlays[*o] || line.frequencyHz < lo || line.frequencyHz > hi) continue;
        const double x = toAxis(line.frequencyHz);
        auto* v = new QCPItemStraightLine(m_plot);
        v->point1->setCoords(x, 0);
        v->point2->setCoords(x, 1);
        v->setPen(QPen(overlayColour(*o), 0, Qt::DashLine));
        // Label the fundamentals only: harmonics are plain to see from their spacing.
        const bool fundamental = line.id.size() < 2 || (line.id.substr(line.id.size() - 2) != "_2" && line.id.substr(line.id.size() - 2) != "_3" &&
                                                         !(line.family == motor::LineFamily::Shaft && line.id != "1X" && line.id != "0.5X"));
        if (fundamental) {
            auto* label = new QCPItemText(m_plot);
            label->position->setTypeY(QCPItemPosition::ptAxisRectRatio);
            label->position->setCoords(x, 0.02 + 0.045 * static_cast<double>(labelled++ % 3));
            label->setPositionAlignment(Qt::AlignLeft | Qt::AlignTop);
            label->setText(QString::fromStdString(line.id));
            label->setColor(overlayColour(*o));
            label->setFont(QFont(font().family(), 7));
        }
        m_markers.push_back({QString::fromStdString(line.id), x});
    }
}

void SpectrumView::drawPeaks() {
    dsp::PeakRequest r;
    r.maxPeaks = 6;
    r.minProminence = 4;
    r.minFrequencyHz = m_shown->startHz + 2 * m_shown->resolutionHz;
    for (const auto& p : dsp::findPeaks(*m_shown, r)) {
        auto* t = new QCPItemText(m_plot);
        t->position->setCoords(toAxis(p.frequencyHz), m_log->isChecked() ? std::max(p.amplitude, 1e-12) : p.amplitude);
        t->setPositionAlignment(Qt::AlignBottom | Qt::AlignHCenter);
        t->setText(QString::number(p.frequencyHz, 'f', p.frequencyHz < 100 ? 2 : 1));
        t->setFont(QFont(font().family(), 7));
        t->setColor(QColor(0x33, 0x33, 0x33));
    }
}

void SpectrumView::drawCursors() {
    for (int i = m_plot->itemCount() - 1; i >= 0; --i)
        if (m_plot->item(i)->property("cursor").toBool()) m_plot->removeItem(i);
    m_cursorX.clear();
    std::vector<double> hz;
    if (m_harmonicHz)
        for (int n = 1; n <= 10; ++n) hz.push_back(n * *m_harmonicHz);
    if (m_sidebandHz)
        for (int k = -4; k <= 4; ++k) hz.push_back(*m_sidebandHz + k * m_sidebandSpacingHz);
    for (double f : hz) {
        if (f <= 0) continue;
        const double x = toAxis(f);
        auto* v = new QCPItemStraightLine(m_plot);
        v->setProperty("cursor", true);
        v->point1->setCoords(x, 0);
        v->point2->setCoords(x, 1);
        v->setPen(QPen(QColor(0x1f, 0x4e, 0x79), 0, Qt::DotLine));
        m_cursorX.push_back(x);
    }
}

std::optional<double> SpectrumView::valueAtHz(double hz) const {
    if (!m_shown || m_shown->values.empty()) return std::nullopt;
    const double k = std::round((hz - m_shown->startHz) / m_shown->resolutionHz);
    if (k < 0 || k >= static_cast<double>(m_shown->lineCount())) return std::nullopt;
    return m_shown->values[static_cast<std::size_t>(k)];
}

bool SpectrumView::eventFilter(QObject* watched, QEvent* event) {
    if (watched == m_plot && m_cursorMode->currentIndex() > 0 &&
        (event->type() == QEvent::MouseButtonPress || (event->type() == QEvent::MouseMove && (static_cast<QMouseEvent*>(event)->buttons() & Qt::LeftButton)))) {
        auto* me = static_cast<QMouseEvent*>(event);
        if (me->buttons() & Qt::LeftButton) {
            const double hz = toHz(m_plot->xAxis->pixelToCoord(me->position().x()));
            if (m_cursorMode->currentIndex() == 1) m_harmonicHz = hz;
            else m_sidebandHz = hz;
            drawCursors();
            m_plot->replot(QCustomPlot::rpQueuedReplot);
            return true;
        }
    }
    return QWidget::eventFilter(watched, event);
}

QString SpectrumView::exportPng(const QString& path) {
    const QString e = exportPlotPng(m_plot, path);
    return e.isEmpty() ? tr("Saved %1").arg(path) : e;
}

QString SpectrumView::exportCsv(const QString& path) {
    if (m_plot->graphCount() == 0) return tr("Nothing to save");
    const QString e = exportGraphCsv(m_plot->graph(0), path, m_orders->isChecked() ? "order" : "frequency_hz", "amplitude_" + m_unitLabel.section(' ', 0, 0));
    return e.isEmpty() ? tr("Saved %1").arg(path) : e;
}

} // namespace humwise::gui
