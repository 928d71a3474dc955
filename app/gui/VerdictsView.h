#pragma once
// A motor's verdicts: its nameplate (editable, validated, undoable) and the findings of the
// chosen round with their evidence. Activating a piece of evidence asks for its spectrum with
// the peak highlighted.

#include "app/gui/StoreSession.h"

#include <QWidget>

class QTreeWidget;
class QLabel;
class QDoubleSpinBox;
class QSpinBox;
class QUndoStack;
class QPushButton;

namespace humwise::gui {

class VerdictsView : public QWidget {
    Q_OBJECT
public:
    VerdictsView(StoreSession& session, QWidget* parent = nullptr);
    void showMotor(const QString& tag);
    QTreeWidget* findingsTree() const { return m_findings; }
    QUndoStack* undoStack() const { return m_undo; }

    // Nameplate editing (used by the form and the tests): validates, stores, records an undo step.
    // Returns an empty string or the reason it was refused.
    QString applyNameplate(const motor::Nameplate& nameplate);

signals:
    void evidenceActivated(const QString& point, const QString& kind, double frequencyHz);

private:
    void fillForm(const motor::Nameplate& n);
    bool storeNameplate(const motor::Nameplate& n, QString& error);
    friend class NameplateCommand;
    StoreSession& m_session;
    QString m_tag;
    QLabel* m_title;
    QLabel* m_message;
    QDoubleSpinBox *m_power, *m_voltage, *m_current, *m_supply, *m_speed;
    QSpinBox *m_poles, *m_bars;
    QPushButton* m_apply;
    QTreeWidget* m_findings;
    QUndoStack* m_undo;
};

// Which stored spectrum shows a piece of evidence, from its unit and label.
QString spectrumKindOfEvidence(const diagnosis::Evidence& e);

} // namespace humwise::gui
