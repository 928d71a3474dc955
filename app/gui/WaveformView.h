#pragma once
// The time waveform of one point and round, read back from the raw file kept in the store, with
// its statistics (RMS, peak, peak-to-peak, crest factor, kurtosis, skewness, DC offset).

#include "app/gui/StoreSession.h"
#include "core/dsp/Statistics.h"

#include <QWidget>

class QComboBox;
class QCustomPlot;
class QLabel;

namespace humwise::gui {

class WaveformView : public QWidget {
    Q_OBJECT
public:
    WaveformView(StoreSession& session, QWidget* parent = nullptr);
    void showMotor(const QString& tag);
    bool showPoint(const QString& point);
    const dsp::WaveformStatistics& statistics() const { return m_stats; }
    QCustomPlot* plot() const { return m_plot; }
    QString statisticsText() const;

private:
    void load();
    StoreSession& m_session;
    QString m_tag;
    QComboBox *m_point, *m_round;
    QCustomPlot* m_plot;
    QLabel* m_stats_label;
    dsp::WaveformStatistics m_stats;
    QString m_unit;
};

} // namespace humwise::gui
