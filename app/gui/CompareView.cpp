#include "app/gui/CompareView.h"

#include "app/common/StoredData.h"
#include "app/gui/PlotStyle.h"
#include "core/util/Text.h"

#include <qcustomplot.h>

#include <QComboBox>
#include <QHBoxLayout>
#include <QHeaderView>
#include <QLabel>
#include <QSplitter>
#include <QTableWidget>
#include <QVBoxLayout>

#include <cmath>

namespace humwise::gui {

std::int64_t roundMonthsBefore(const std::vector<storage::RoundRow>& rounds, std::int64_t latest, int months) {
    using namespace std::chrono;
    std::optional<sys_time<milliseconds>> ref;
    for (const auto& r : rounds)
        if (r.id == latest) ref = text::parseIsoTime(r.startedAt);
    if (!ref) return latest;
    const auto target = *ref - hours(24 * 30 * months) - hours(12 * months);
    std::int64_t best = latest;
    double bestGap = 1e300;
    for (const auto& r : rounds) {
        const auto t = text::parseIsoTime(r.startedAt);
        if (!t || r.id == latest || *t > *ref) continue;
        const double gap = std::abs(duration<double>(*t - target).count());
        if (gap < bestGap) {
            bestGap = gap;
            best = r.id;
        }
    }
    return best;
}

CompareView::CompareView(StoreSession& session, QWidget* parent) : QWidget(parent), m_session(session) {
    m_point = new QComboBox;
    m_kind = new QComboBox;
    m_kind->addItem(tr("vibration (velocity)"), "velocity");
    m_kind->addItem(tr("envelope"), "envelope");
    m_kind->addItem(tr("current"), "current");
    m_a = new QComboBox;
    m_b = new QComboBox;
    auto* top = new QHBoxLayout;
    top->addWidget(m_point);
    top->addWidget(m_kind);
    top->addWidget(new QLabel(tr("then")));
    top->addWidget(m_a);
    top->addWidget(new QLabel(tr("now")));
    top->addWidget(m_b);
    top->addStretch();
    m_plot = new QCustomPlot;
    stylePlot(m_plot);
    enableKeyboardNavigation(m_plot);
    m_changes = new QTableWidget(0, 5);
    m_changes->setHorizontalHeaderLabels({tr("order"), tr("Hz now"), tr("then"), tr("now"), tr("change")});
    m_changes->horizontalHeader()->setStretchLastSection(true);
    auto* split = new QSplitter(Qt::Vertical);
    split->addWidget(m_plot);
    split->addWidget(m_changes);
    split->setStretchFactor(0, 3);
    auto* layout = new QVBoxLayout(this);
    layout->addLayout(top);
    layout->addWidget(split, 1);
    for (QComboBox* c : {m_point, m_kind, m_a, m_b}) connect(c, &QComboBox::currentIndexChanged, this, [this] { run(); });
}

void CompareView::showMotor(const QString& tag) {
    m_tag = tag;
    const QSignalBlocker b1(m_point), b2(m_a), b3(m_b);
    m_point->clear();
    m_a->clear();
    m_b->clear();
    if (const auto* def = m_session.fleet().motor(tag.toStdString()))
        for (const auto& p : def->points)
            if (p.quantity != Quantity::Voltage) m_point->addItem(QString::fromStdString(p.name));
    const auto& rounds = m_session.rounds();
    for (auto it = rounds.rbegin(); it != rounds.rend(); ++it)
        for (QComboBox* c : {m_a, m_b}) c->addItem(QString::fromStdString(it->startedAt.substr(0, 10)), static_cast<qlonglong>(it->id));
    if (!rounds.empty()) {
        const auto latest = rounds.back().id;
        m_b->setCurrentIndex(m_b->findData(static_cast<qlonglong>(latest)));
        m_a->setCurrentIndex(m_a->findData(static_cast<qlonglong>(roundMonthsBefore(rounds, latest, 3))));
    }
    run();
}

std::pair<std::int64_t, std::int64_t> CompareView::rounds() const { return {m_a->currentData().toLongLong(), m_b->currentData().toLongLong()}; }

bool CompareView::compare(const QString& point, const QString& kind, std::int64_t a, std::int64_t b) {
    const QSignalBlocker b1(m_point), b2(m_kind), b3(m_a), b4(m_b);
    m_point->setCurrentIndex(m_point->findText(point));
    m_kind->setCurrentIndex(m_kind->findData(kind));
    m_a->setCurrentIndex(m_a->findData(static_cast<qlonglong>(a)));
    m_b->setCurrentIndex(m_b->findData(static_cast<qlonglong>(b)));
    run();
    return !m_cmp.orders.empty();
}

void CompareView::run() {
    m_plot->clearGraphs();
    m_plot->plotLayout()->clear();
    m_changes->setRowCount(0);
    m_cmp = {};
    auto* top = new QCPAxisRect(m_plot);
    auto* bottom = new QCPAxisRect(m_plot);
    m_plot->plotLayout()->addElement(0, 0, top);
    m_plot->plotLayout()->addElement(1, 0, bottom);
    m_plot->plotLayout()->setRowStretchFactor(1, 0.4);
    if (!m_session.isOpen() || m_point->count() == 0 || m_a->count() == 0) {
        m_plot->replot();
        return;
    }
    const std::string kind = m_kind->currentData().toString().toStdString();
    try {
        auto& store = m_session.store();
        struct Side { dsp::Spectrum s; double fr = 0; };
        const auto side = [&](std::int64_t round) -> std::optional<Side> {
            const auto rec = workflow::recordingOf(store, round, m_tag.toStdString(), m_point->currentText().toStdString());
            const auto op = workflow::operatingPoint(store, round, m_tag.toStdString());
            if (!rec || !op) return std::nullopt;
            auto s = workflow::storedSpectrum(store, rec->id, kind);
            if (!s) return std::nullopt;
            return Side{*s, op->speedRpm / 60.0};
        };
        const auto A = side(m_a->currentData().toLongLong()), B = side(m_b->currentData().toLongLong());
        if (!A || !B) {
            m_plot->replot();
            return;
        }
        m_cmp = dsp::compareSpectra(A->s, A->fr, B->s, B->fr);
    } catch (const std::exception&) {
        m_plot->replot();
        return;
    }
    const double k = kind == "velocity" ? 1000.0 : 1.0; // m/s -> mm/s
    QVector<double> x(m_cmp.orders.begin(), m_cmp.orders.end()), ya, yb, yd(m_cmp.differenceDb.begin(), m_cmp.differenceDb.end());
    for (double v : m_cmp.a) ya.push_back(v * k);
    for (double v : m_cmp.b) yb.push_back(v * k);
    auto* ga = m_plot->addGraph(top->axis(QCPAxis::atBottom), top->axis(QCPAxis::atLeft));
    ga->setData(x, ya, true);
    ga->setPen(QPen(QColor(0x9a, 0x9a, 0x9a), 0));
    ga->setName(tr("then %1").arg(m_a->currentText()));
    auto* gb = m_plot->addGraph(top->axis(QCPAxis::atBottom), top->axis(QCPAxis::atLeft));
    gb->setData(x, yb, true);
    gb->setPen(QPen(traceColour(0), 0));
    gb->setName(tr("now %1").arg(m_b->currentText()));
    auto* gd = m_plot->addGraph(bottom->axis(QCPAxis::atBottom), bottom->axis(QCPAxis::atLeft));
    gd->setData(x, yd, true);
    gd->setPen(QPen(traceColour(1), 0));
    top->axis(QCPAxis::atLeft)->setLabel(kind == "velocity" ? tr("mm/s rms") : kind == "envelope" ? tr("(m/s^2)^2") : tr("A rms"));
    bottom->axis(QCPAxis::atLeft)->setLabel(tr("now - then (dB)"));
    bottom->axis(QCPAxis::atBottom)->setLabel(tr("order (x running speed of each round)"));
    for (auto* g : {ga, gb, gd}) g->rescaleAxes();
    top->axis(QCPAxis::atLeft)->setRangeLower(0);
    auto* legend = new QCPLegend;
    top->insetLayout()->addElement(legend, Qt::AlignTop | Qt::AlignRight);
    legend->setLayer("legend");
    for (auto* g : {ga, gb}) g->addToLegend(legend);
    for (const auto& c : m_cmp.changes) {
        const int row = m_changes->rowCount();
        m_changes->insertRow(row);
        m_changes->setItem(row, 0, new QTableWidgetItem(QString::number(c.order, 'f', 3)));
        m_changes->setItem(row, 1, new QTableWidgetItem(QString::number(c.frequencyHzB, 'f', 2)));
        m_changes->setItem(row, 2, new QTableWidgetItem(QString::number(c.amplitudeA * k, 'g', 3)));
        m_changes->setItem(row, 3, new QTableWidgetItem(QString::number(c.amplitudeB * k, 'g', 3)));
        m_changes->setItem(row, 4, new QTableWidgetItem(c.appeared ? tr("new (%1 dB)").arg(c.changeDb, 0, 'f', 1) : tr("%1 dB").arg(c.changeDb, 0, 'f', 1)));
    }
    m_plot->replot();
}

} // namespace humwise::gui
