#include "app/gui/WaveformView.h"

#include "app/common/StoredData.h"
#include "app/gui/PlotStyle.h"

#include <qcustomplot.h>

#include <QComboBox>
#include <QHBoxLayout>
#include <QLabel>
#include <QVBoxLayout>

namespace humwise::gui {

WaveformView::WaveformView(StoreSession& session, QWidget* parent) : QWidget(parent), m_session(session) {
    m_point = new QComboBox;
    m_round = new QComboBox;
    m_plot = new QCustomPlot;
    stylePlot(m_plot);
    enableKeyboardNavigation(m_plot);
    m_stats_label = new QLabel;
    m_stats_label->setTextInteractionFlags(Qt::TextSelectableByMouse);
    auto* top = new QHBoxLayout;
    top->addWidget(m_point);
    top->addWidget(m_round);
    top->addStretch();
    auto* layout = new QVBoxLayout(this);
    layout->addLayout(top);
    layout->addWidget(m_plot, 1);
    layout->addWidget(m_stats_label);
    connect(m_point, &QComboBox::currentIndexChanged, this, [this] { load(); });
    connect(m_round, &QComboBox::currentIndexChanged, this, [this] { load(); });
}

void WaveformView::showMotor(const QString& tag) {
    m_tag = tag;
    const QSignalBlocker b1(m_point), b2(m_round);
    m_point->clear();
    m_round->clear();
    if (const auto* def = m_session.fleet().motor(tag.toStdString()))
        for (const auto& p : def->points) m_point->addItem(QString::fromStdString(p.name));
    const auto& rounds = m_session.rounds();
    for (auto it = rounds.rbegin(); it != rounds.rend(); ++it) m_round->addItem(QString::fromStdString(it->startedAt.substr(0, 10)), static_cast<qlonglong>(it->id));
    load();
}

bool WaveformView::showPoint(const QString& point) {
    const int i = m_point->findText(point);
    if (i < 0) return false;
    m_point->setCurrentIndex(i);
    load();
    return m_stats.count > 0;
}

QString WaveformView::statisticsText() const {
    return tr("RMS %1  peak %2  peak-to-peak %3  crest factor %4  kurtosis %5 (normal = 3)  skewness %6  DC %7  [%8]")
        .arg(m_stats.rms, 0, 'g', 4).arg(m_stats.peak, 0, 'g', 4).arg(m_stats.peakToPeak, 0, 'g', 4).arg(m_stats.crestFactor, 0, 'f', 2)
        .arg(m_stats.kurtosis, 0, 'f', 2).arg(m_stats.skewness, 0, 'f', 2).arg(m_stats.dcOffset, 0, 'g', 3).arg(m_unit);
}

void WaveformView::load() {
    m_plot->clearGraphs();
    m_stats = {};
    if (!m_session.isOpen() || m_round->count() == 0 || m_point->count() == 0) {
        m_plot->replot();
        return;
    }
    try {
        const auto rec = workflow::recordingOf(m_session.store(), m_round->currentData().toLongLong(), m_tag.toStdString(), m_point->currentText().toStdString());
        const auto w = rec ? workflow::storedWaveform(m_session.store(), *rec) : std::nullopt;
        if (!w) {
            m_stats_label->setText(tr("No recording of %1 in that round.").arg(m_point->currentText()));
            m_plot->replot();
            return;
        }
        const Unit unit = defaultDisplayUnit(w->quantity);
        m_unit = QString::fromStdString(std::string(unitSymbol(unit)));
        const double k = 1.0 / toSiFactor(unit);
        QVector<double> t(static_cast<qsizetype>(w->samples.size())), y(static_cast<qsizetype>(w->samples.size()));
        std::vector<double> display(w->samples.size());
        for (std::size_t i = 0; i < w->samples.size(); ++i) {
            t[static_cast<qsizetype>(i)] = static_cast<double>(i) / w->sampleRateHz;
            display[i] = y[static_cast<qsizetype>(i)] = w->samples[i] * k;
        }
        m_stats = dsp::waveformStatistics(display);
        auto* g = m_plot->addGraph();
        g->setPen(QPen(traceColour(0), 0));
        g->setData(t, y, true);
        g->setAdaptiveSampling(true);
        m_plot->xAxis->setLabel(tr("time (s)"));
        m_plot->yAxis->setLabel(QString::fromStdString(std::string(quantityName(w->quantity))) + " (" + m_unit + ")");
        m_plot->rescaleAxes();
        m_stats_label->setText(statisticsText() + (rec->quality.empty() ? QString() : tr("\nQuality flags: %1").arg(QString::fromStdString(rec->quality))));
    } catch (const storage::StorageException& e) {
        m_stats_label->setText(QString::fromStdString(e.error.message));
    }
    m_plot->replot();
}

} // namespace humwise::gui
