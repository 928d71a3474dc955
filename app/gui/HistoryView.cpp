#include "app/gui/HistoryView.h"

#include "app/common/LimitRules.h"
#include "app/common/StoredData.h"
#include "app/gui/PlotStyle.h"
#include "core/util/Text.h"

#include <qcustomplot.h>

#include <QComboBox>
#include <QDateTime>
#include <QHBoxLayout>
#include <QLabel>
#include <QSplitter>
#include <QVBoxLayout>

#include <algorithm>
#include <cmath>
#include <set>

namespace humwise::gui {
namespace {

constexpr std::size_t kProjectionRounds = 4;

double epochSeconds(const std::string& iso) {
    const auto t = text::parseIsoTime(iso);
    return t ? static_cast<double>(std::chrono::duration_cast<std::chrono::seconds>(t->time_since_epoch()).count()) : 0.0;
}

} // namespace

HistoryView::HistoryView(StoreSession& session, QWidget* parent) : QWidget(parent), m_session(session) {
    m_point = new QComboBox;
    m_indicator = new QComboBox;
    auto* top = new QHBoxLayout;
    top->addWidget(m_point);
    top->addWidget(m_indicator);
    top->addStretch();
    m_cascade = new QCustomPlot;
    m_trend = new QCustomPlot;
    for (auto* p : {m_cascade, m_trend}) {
        stylePlot(p);
        enableKeyboardNavigation(p);
    }
    useDateAxis(m_trend->xAxis);
    m_note = new QLabel;
    m_note->setWordWrap(true);
    auto* split = new QSplitter(Qt::Horizontal);
    split->addWidget(m_cascade);
    auto* right = new QWidget;
    auto* rl = new QVBoxLayout(right);
    rl->setContentsMargins(0, 0, 0, 0);
    rl->addWidget(m_trend, 1);
    rl->addWidget(m_note);
    split->addWidget(right);
    split->setSizes({600, 600});
    auto* layout = new QVBoxLayout(this);
    layout->addLayout(top);
    layout->addWidget(split, 1);
    connect(m_point, &QComboBox::currentIndexChanged, this, [this] {
        fillIndicators();
        loadCascade();
        loadTrend();
    });
    connect(m_indicator, &QComboBox::currentIndexChanged, this, [this] { loadTrend(); });
}

void HistoryView::showMotor(const QString& tag) {
    m_tag = tag;
    {
        const QSignalBlocker b(m_point);
        m_point->clear();
        if (const auto* def = m_session.fleet().motor(tag.toStdString())) {
            m_point->addItem(tr("(motor)"), QString());
            for (const auto& p : def->points) m_point->addItem(QString::fromStdString(p.name), QString::fromStdString(p.name));
            m_point->setCurrentIndex(def->points.empty() ? 0 : 1);
        }
    }
    fillIndicators();
    loadCascade();
    loadTrend();
}

bool HistoryView::showTrend(const QString& point, const QString& indicator) {
    const int pi = m_point->findData(point);
    if (pi < 0) return false;
    m_point->setCurrentIndex(pi);
    const int ii = m_indicator->findText(indicator);
    if (ii < 0) return false;
    m_indicator->setCurrentIndex(ii);
    loadTrend();
    return !m_points.empty();
}

void HistoryView::fillIndicators() {
    const QSignalBlocker b(m_indicator);
    const QString keep = m_indicator->currentText();
    m_indicator->clear();
    if (!m_session.isOpen() || m_session.rounds().empty()) return;
    std::set<std::string> names;
    try {
        for (const auto& i : m_session.store().indicators(m_session.rounds().back().id, m_tag.toStdString()))
            if (i.pointName == m_point->currentData().toString().toStdString()) names.insert(i.name);
    } catch (const storage::StorageException&) {
    }
    for (const auto& n : names) m_indicator->addItem(QString::fromStdString(n));
    const int i = m_indicator->findText(keep.isEmpty() ? "velocity_rms" : keep);
    m_indicator->setCurrentIndex(i >= 0 ? i : std::max(0, m_indicator->findText("velocity_rms")));
}

void HistoryView::loadCascade() {
    m_cascade->clearGraphs();
    m_cascade->clearItems();
    m_traces = 0;
    const QString point = m_point->currentData().toString();
    if (!m_session.isOpen() || point.isEmpty()) {
        m_cascade->replot();
        return;
    }
    const auto* def = m_session.fleet().motor(m_tag.toStdString());
    const auto* p = def ? def->point(point.toStdString()) : nullptr;
    const std::string kind = p && p->quantity == Quantity::Current ? "zoom" : "velocity";
    const double k = kind == "velocity" ? 1000.0 : 1.0;
    std::vector<std::pair<std::string, dsp::Spectrum>> spectra;
    try {
        for (const auto& r : m_session.rounds()) {
            const auto rec = workflow::recordingOf(m_session.store(), r.id, m_tag.toStdString(), point.toStdString());
            if (!rec) continue;
            if (auto s = workflow::storedSpectrum(m_session.store(), rec->id, kind)) spectra.emplace_back(r.startedAt.substr(0, 10), std::move(*s));
        }
    } catch (const storage::StorageException&) {
    }
    double peak = 0;
    for (const auto& [d, s] : spectra)
        for (std::size_t i = 0; i < s.lineCount(); ++i)
            if (s.frequencyHz(i) <= (kind == "velocity" ? 1000.0 : 1e9)) peak = std::max(peak, s.values[i] * k);
    const double step = peak > 0 ? 0.5 * peak : 1.0;
    for (std::size_t n = 0; n < spectra.size(); ++n) {
        const auto& [date, s] = spectra[n];
        QVector<double> x, y;
        for (std::size_t i = 0; i < s.lineCount(); ++i) {
            const double f = s.frequencyHz(i);
            if (kind == "velocity" && f > 1000) break;
            x.push_back(f);
            y.push_back(s.values[i] * k + step * static_cast<double>(n));
        }
        auto* g = m_cascade->addGraph();
        g->setData(x, y, true);
        g->setPen(QPen(n + 1 == spectra.size() ? traceColour(0) : QColor(0x70, 0x80, 0x90), 0));
        g->setAdaptiveSampling(true);
        auto* label = new QCPItemText(m_cascade);
        label->position->setCoords(x.isEmpty() ? 0 : x.back(), step * static_cast<double>(n));
        label->setPositionAlignment(Qt::AlignRight | Qt::AlignBottom);
        label->setText(QString::fromStdString(date));
        label->setFont(QFont(font().family(), 7));
        ++m_traces;
    }
    m_cascade->xAxis->setLabel(kind == "velocity" ? tr("frequency (Hz)") : tr("frequency (Hz), around the supply line"));
    m_cascade->yAxis->setLabel(kind == "velocity" ? tr("mm/s rms, one step per round (newest on top)") : tr("A rms, one step per round"));
    m_cascade->rescaleAxes();
    m_cascade->replot();
}

std::optional<double> HistoryView::crossingDays() const {
    if (!m_projection || !m_projection->crossingDay) return std::nullopt;
    return *m_projection->crossingDay - m_lastDay;
}

QString HistoryView::projectionText() const {
    if (!m_limits.alarm) return tr("No alarm limit for this indicator.");
    QString text = tr("Alarm limits (%1): alert %2, alarm %3 - %4.").arg(QString::fromStdString(m_limits.method))
                       .arg(m_limits.alert ? QString::number(*m_limits.alert, 'g', 3) : "-")
                       .arg(QString::number(*m_limits.alarm, 'g', 3), QString::fromStdString(m_limits.source));
    if (const auto d = crossingDays())
        text += tr(" Projected to reach the alarm limit in %1 (linear least-squares fit of the last %2 rounds, R^2 = %3).")
                    .arg(std::lround(*d) == 1 ? tr("1 day") : tr("%1 days").arg(*d, 0, 'f', 0))
                    .arg(kProjectionRounds)
                    .arg(m_projection->r2, 0, 'f', 2);
    else
        text += tr(" No rising trend toward the alarm limit (linear least-squares fit of the last %1 rounds).").arg(kProjectionRounds);
    return text;
}

void HistoryView::loadTrend() {
    m_trend->clearGraphs();
    m_trend->clearItems();
    m_points.clear();
    m_projection.reset();
    m_limits = {};
    if (!m_session.isOpen() || m_indicator->count() == 0) {
        m_note->clear();
        m_trend->replot();
        return;
    }
    const auto* def = m_session.fleet().motor(m_tag.toStdString());
    const std::string point = m_point->currentData().toString().toStdString(), indicator = m_indicator->currentText().toStdString();
    try {
        m_points = m_session.store().trend(m_tag.toStdString(), point, indicator);
        if (def) m_limits = workflow::effectiveLimits(m_session.store(), *def, point, indicator, workflow::valuesOf(m_points));
    } catch (const storage::StorageException& e) {
        m_note->setText(QString::fromStdString(e.error.message));
        return;
    }
    QVector<double> t, v;
    std::vector<double> days, values;
    for (const auto& p : m_points) {
        t.push_back(epochSeconds(p.startedAt));
        v.push_back(p.value);
        days.push_back(t.back() / 86400.0);
        values.push_back(p.value);
    }
    auto* g = m_trend->addGraph();
    g->setData(t, v, true);
    g->setPen(QPen(traceColour(0), 0));
    g->setScatterStyle(QCPScatterStyle(QCPScatterStyle::ssCircle, 5));
    m_trend->yAxis->setLabel(QString::fromStdString(indicator) + (m_points.empty() ? QString() : " (" + QString::fromStdString(m_points.front().unit) + ")"));
    m_trend->rescaleAxes();
    double top = m_trend->yAxis->range().upper;
    const auto limitLine = [&](double value, const QColor& c, const QString& name) {
        auto* l = new QCPItemStraightLine(m_trend);
        l->point1->setCoords(0, value);
        l->point2->setCoords(1, value);
        l->setPen(QPen(c, 0, Qt::DashLine));
        auto* label = new QCPItemText(m_trend);
        label->position->setTypeX(QCPItemPosition::ptAxisRectRatio);
        label->position->setCoords(0.01, value);
        label->setPositionAlignment(Qt::AlignLeft | Qt::AlignBottom);
        label->setText(name);
        label->setColor(c);
        top = std::max(top, value * 1.1);
    };
    if (m_limits.alert) limitLine(*m_limits.alert, QColor(0xb8, 0x8a, 0x1e), tr("alert"));
    if (m_limits.alarm) limitLine(*m_limits.alarm, QColor(0x9e, 0x1b, 0x3c), tr("alarm"));
    if (!days.empty()) m_lastDay = days.back();
    if (m_limits.alarm && days.size() >= 3) {
        // The recent course decides where the indicator goes next: fit the last rounds only.
        const std::size_t n = std::min<std::size_t>(kProjectionRounds, days.size());
        const std::vector<double> recentDays(days.end() - static_cast<std::ptrdiff_t>(n), days.end());
        const std::vector<double> recentValues(values.end() - static_cast<std::ptrdiff_t>(n), values.end());
        m_projection = trend::project(recentDays, recentValues, *m_limits.alarm, trend::Model::Linear);
        if (m_projection) {
            const double endDay = m_projection->crossingDay ? std::min(*m_projection->crossingDay, days.back() + 730) : days.back() + 90;
            const double startDay = days[days.size() - n];
            QVector<double> pt{startDay * 86400.0, endDay * 86400.0};
            QVector<double> pv{m_projection->intercept + m_projection->slope * startDay, m_projection->intercept + m_projection->slope * endDay};
            auto* proj = m_trend->addGraph();
            proj->setData(pt, pv);
            proj->setPen(QPen(QColor(0x60, 0x60, 0x60), 0, Qt::DotLine));
            if (m_projection->crossingDay && *m_projection->crossingDay <= days.back() + 730) {
                auto* label = new QCPItemText(m_trend);
                label->position->setCoords(*m_projection->crossingDay * 86400.0, *m_limits.alarm);
                label->setPositionAlignment(Qt::AlignRight | Qt::AlignTop);
                label->setText(tr("crossing %1").arg(QDateTime::fromSecsSinceEpoch(static_cast<qint64>(*m_projection->crossingDay * 86400.0), Qt::UTC).toString("yyyy-MM-dd")));
            }
            m_trend->xAxis->setRangeUpper(endDay * 86400.0 + 86400.0 * 10);
        }
    }
    m_trend->yAxis->setRange(0, top);
    m_note->setText(projectionText());
    m_trend->replot();
}

} // namespace humwise::gui
