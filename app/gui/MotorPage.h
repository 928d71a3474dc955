#pragma once
// One motor: its verdicts, spectra, waveform, then-and-now comparison, history and alarm limits,
// one tab each. Evidence activated on the verdicts opens the spectrum at that line.

#include "app/gui/StoreSession.h"

#include <QWidget>

class QTabWidget;

namespace humwise::gui {

class VerdictsView;
class SpectrumView;
class WaveformView;
class CompareView;
class HistoryView;
class LimitsView;

class MotorPage : public QWidget {
    Q_OBJECT
public:
    MotorPage(StoreSession& session, QWidget* parent = nullptr);
    void showMotor(const QString& tag);
    QString motor() const { return m_tag; }
    QTabWidget* tabs() const { return m_tabs; }
    VerdictsView* verdicts() const { return m_verdicts; }
    SpectrumView* spectrum() const { return m_spectrum; }
    WaveformView* waveform() const { return m_waveform; }
    CompareView* compare() const { return m_compare; }
    HistoryView* history() const { return m_history; }
    LimitsView* limits() const { return m_limits; }
    void openEvidence(const QString& point, const QString& kind, double frequencyHz);

private:
    StoreSession& m_session;
    QString m_tag;
    QTabWidget* m_tabs;
    VerdictsView* m_verdicts;
    SpectrumView* m_spectrum;
    WaveformView* m_waveform;
    CompareView* m_compare;
    HistoryView* m_history;
    LimitsView* m_limits;
};

} // namespace humwise::gui
