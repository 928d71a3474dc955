#include "app/gui/MotorPage.h"

#include "app/gui/CompareView.h"
#include "app/gui/HistoryView.h"
#include "app/gui/LimitsView.h"
#include "app/gui/SpectrumView.h"
#include "app/gui/VerdictsView.h"
#include "app/gui/WaveformView.h"

#include <QTabWidget>
#include <QVBoxLayout>

namespace humwise::gui {

MotorPage::MotorPage(StoreSession& session, QWidget* parent) : QWidget(parent), m_session(session) {
    m_tabs = new QTabWidget(this);
    m_verdicts = new VerdictsView(session);
    m_spectrum = new SpectrumView(session);
    m_waveform = new WaveformView(session);
    m_compare = new CompareView(session);
    m_history = new HistoryView(session);
    m_limits = new LimitsView(session);
    m_tabs->addTab(m_verdicts, tr("Verdicts"));
    m_tabs->addTab(m_spectrum, tr("Spectrum"));
    m_tabs->addTab(m_waveform, tr("Waveform"));
    m_tabs->addTab(m_compare, tr("Then and now"));
    m_tabs->addTab(m_history, tr("History"));
    m_tabs->addTab(m_limits, tr("Limits"));
    auto* layout = new QVBoxLayout(this);
    layout->setContentsMargins(0, 0, 0, 0);
    layout->addWidget(m_tabs);
    connect(m_verdicts, &VerdictsView::evidenceActivated, this, &MotorPage::openEvidence);
    connect(&m_session, &StoreSession::changed, this, [this] {
        if (!m_tag.isEmpty()) showMotor(m_tag);
    });
}

void MotorPage::showMotor(const QString& tag) {
    m_tag = tag;
    m_verdicts->showMotor(tag);
    m_spectrum->showMotor(tag);
    m_waveform->showMotor(tag);
    m_compare->showMotor(tag);
    m_history->showMotor(tag);
    m_limits->showMotor(tag);
}

void MotorPage::openEvidence(const QString& point, const QString& kind, double frequencyHz) {
    if (m_spectrum->showPoint(point, kind)) {
        m_spectrum->highlight(frequencyHz);
        m_tabs->setCurrentWidget(m_spectrum);
    }
}

} // namespace humwise::gui
