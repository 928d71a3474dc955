#include "app/gui/VerdictsView.h"

#include "app/gui/Severity.h"

#include <QDoubleSpinBox>
#include <QFormLayout>
#include <QGroupBox>
#include <QHBoxLayout>
#include <QHeaderView>
#include <QLabel>
#include <QPushButton>
#include <QSpinBox>
#include <QSplitter>
#include <QTreeWidget>
#include <QUndoStack>
#include <QVBoxLayout>

namespace humwise::gui {

QString spectrumKindOfEvidence(const diagnosis::Evidence& e) {
    if (e.unit.find("envelope") != std::string::npos) return "envelope";
    if (e.unit == "mm/s rms") return "velocity";
    if (e.unit == "dB re f") {
        if (e.label.find("(1 ") != std::string::npos || e.label.find("supply line") != std::string::npos) return "zoom";
        return "current";
    }
    return {};
}

class NameplateCommand : public QUndoCommand {
public:
    NameplateCommand(VerdictsView& view, motor::Nameplate before, motor::Nameplate after)
        : QUndoCommand(QObject::tr("edit nameplate")), m_view(view), m_before(std::move(before)), m_after(std::move(after)) {}
    void undo() override { apply(m_before); }
    void redo() override { apply(m_after); }

private:
    void apply(const motor::Nameplate& n) {
        QString error;
        if (m_view.storeNameplate(n, error)) m_view.fillForm(n);
    }
    VerdictsView& m_view;
    motor::Nameplate m_before, m_after;
};

namespace {
QDoubleSpinBox* spin(double max, int decimals, const QString& suffix) {
    auto* s = new QDoubleSpinBox;
    s->setRange(0, max);
    s->setDecimals(decimals);
    s->setSuffix(suffix);
    return s;
}
} // namespace

VerdictsView::VerdictsView(StoreSession& session, QWidget* parent) : QWidget(parent), m_session(session) {
    m_undo = new QUndoStack(this);
    m_title = new QLabel(this);
    m_title->setWordWrap(true);
    auto* form = new QFormLayout;
    form->addRow(tr("Rated power"), m_power = spin(1e5, 1, " kW"));
    form->addRow(tr("Rated voltage"), m_voltage = spin(1e5, 0, " V"));
    form->addRow(tr("Rated current"), m_current = spin(1e5, 1, " A"));
    form->addRow(tr("Supply"), m_supply = spin(400, 2, " Hz"));
    form->addRow(tr("Rated speed"), m_speed = spin(1e5, 0, " r/min"));
    m_poles = new QSpinBox;
    m_poles->setRange(0, 64);
    m_poles->setSpecialValueText(tr("from speed"));
    form->addRow(tr("Poles"), m_poles);
    m_bars = new QSpinBox;
    m_bars->setRange(0, 500);
    m_bars->setSpecialValueText(tr("unknown"));
    form->addRow(tr("Rotor bars"), m_bars);
    m_apply = new QPushButton(tr("Apply nameplate"));
    auto* undo = new QPushButton(tr("Undo"));
    auto* redo = new QPushButton(tr("Redo"));
    connect(undo, &QPushButton::clicked, m_undo, &QUndoStack::undo);
    connect(redo, &QPushButton::clicked, m_undo, &QUndoStack::redo);
    connect(m_undo, &QUndoStack::canUndoChanged, undo, &QPushButton::setEnabled);
    connect(m_undo, &QUndoStack::canRedoChanged, redo, &QPushButton::setEnabled);
    undo->setEnabled(false);
    redo->setEnabled(false);
    auto* buttons = new QHBoxLayout;
    buttons->addWidget(m_apply);
    buttons->addWidget(undo);
    buttons->addWidget(redo);
    m_message = new QLabel;
    m_message->setWordWrap(true);
    auto* plateBox = new QGroupBox(tr("Nameplate"));
    auto* plateLayout = new QVBoxLayout(plateBox);
    plateLayout->addLayout(form);
    plateLayout->addLayout(buttons);
    plateLayout->addWidget(m_message);
    plateLayout->addStretch();

    m_findings = new QTreeWidget;
    m_findings->setColumnCount(4);
    m_findings->setHeaderLabels({tr("Finding / evidence"), tr("Condition"), tr("Origin"), tr("Detail")});
    m_findings->header()->setSectionResizeMode(0, QHeaderView::Interactive);
    m_findings->header()->resizeSection(0, 380);
    m_findings->header()->resizeSection(1, 130);
    m_findings->header()->resizeSection(2, 130);
    m_findings->header()->setStretchLastSection(true);
    m_findings->setWordWrap(true);
    connect(m_findings, &QTreeWidget::itemActivated, this, [this](QTreeWidgetItem* item) {
        if (item->data(0, Qt::UserRole + 1).isValid())
            emit evidenceActivated(item->data(0, Qt::UserRole).toString(), item->data(0, Qt::UserRole + 1).toString(), item->data(0, Qt::UserRole + 2).toDouble());
    });
    auto* split = new QSplitter(this);
    split->addWidget(plateBox);
    split->addWidget(m_findings);
    split->setStretchFactor(1, 3);
    m_title->setSizePolicy(QSizePolicy::Preferred, QSizePolicy::Maximum);
    auto* layout = new QVBoxLayout(this);
    layout->addWidget(m_title);
    layout->addWidget(split, 1);

    connect(m_apply, &QPushButton::clicked, this, [this] {
        motor::Nameplate n;
        if (const auto* m = m_session.fleet().motor(m_tag.toStdString())) n = m->motor.nameplate;
        n.ratedPowerKw = m_power->value();
        n.ratedVoltageV = m_voltage->value();
        n.ratedCurrentA = m_current->value();
        n.supplyHz = m_supply->value();
        n.ratedSpeedRpm = m_speed->value();
        n.poles = m_poles->value() > 0 ? std::optional<int>(m_poles->value()) : std::nullopt;
        n.rotorBars = m_bars->value() > 0 ? std::optional<int>(m_bars->value()) : std::nullopt;
        m_message->setText(applyNameplate(n));
    });
}

void VerdictsView::fillForm(const motor::Nameplate& n) {
    m_power->setValue(n.ratedPowerKw);
    m_voltage->setValue(n.ratedVoltageV);
    m_current->setValue(n.ratedCurrentA);
    m_supply->setValue(n.supplyHz);
    m_speed->setValue(n.ratedSpeedRpm);
    m_poles->setValue(n.poles.value_or(0));
    m_bars->setValue(n.rotorBars.value_or(0));
}

QString VerdictsView::applyNameplate(const motor::Nameplate& n) {
    const auto issues = motor::validate(n);
    if (!issues.empty()) {
        QString text = tr("Not applied:");
        for (const auto& i : issues) text += "\n- " + QString::fromStdString(i.message);
        return text;
    }
    const auto* m = m_session.fleet().motor(m_tag.toStdString());
    if (!m) return tr("No motor selected");
    m_undo->push(new NameplateCommand(*this, m->motor.nameplate, n));
    return tr("Nameplate stored. Re-analyse to apply it to stored rounds.");
}

bool VerdictsView::storeNameplate(const motor::Nameplate& n, QString& error) {
    if (!m_session.isOpen()) {
        error = tr("No store is open");
        m_message->setText(error);
        return false;
    }
    fleet::Fleet f = m_session.fleet();
    for (auto& m : f.motors)
        if (m.motor.tag == m_tag.toStdString()) m.motor.nameplate = n;
    try {
        storage::Transaction tx(m_session.store().database());
        m_session.store().saveFleet(f);
        tx.commit();
    } catch (const storage::StorageException& e) {
        error = QString::fromStdString(e.error.message);
        m_message->setText(error);
        return false;
    }
    m_session.reload();
    return true;
}

void VerdictsView::showMotor(const QString& tag) {
    if (tag != m_tag) m_undo->clear();
    m_tag = tag;
    const auto* def = m_session.fleet().motor(tag.toStdString());
    const auto* st = m_session.statusOf(tag.toStdString());
    m_findings->clear();
    if (!def) return;
    fillForm(def->motor.nameplate);
    m_title->setText(QStringLiteral("<b>%1</b> - %2, %3<br>%4").arg(tag, QString::fromStdString(def->description), QString::fromStdString(def->area),
                                                                    st && st->roundId ? tr("Round of %1: %2").arg(QString::fromStdString(st->roundStart), QString::fromStdString(st->changeSummary()))
                                                                                      : tr("No analysed round yet")));
    if (!st) return;
    for (const auto& row : st->findings) {
        const auto& f = row.finding;
        auto* item = new QTreeWidgetItem(m_findings);
        item->setText(0, QString::fromStdString(f.fault) + (f.withheld ? tr(" (withheld)") : QString()));
        item->setIcon(1, severityIcon(f.severity));
        item->setText(1, severityMark(f.severity) + " " + severityName(f.severity));
        item->setText(2, QString::fromStdString(std::string(diagnosis::originName(f.origin))) + QStringLiteral(", %1").arg(f.confidence, 0, 'f', 2));
        item->setText(3, QString::fromStdString(f.explanation + (f.withheld ? " " + f.withheldReason : "") + "  Next: " + f.action));
        item->setToolTip(3, item->text(3));
        for (const auto& e : f.evidence) {
            auto* ev = new QTreeWidgetItem(item);
            QString text = QString::fromStdString(e.label);
            if (e.expectedHz) text += tr("  expected %1 Hz").arg(*e.expectedHz, 0, 'f', 3);
            if (e.measuredHz) text += tr("  measured %1 Hz").arg(*e.measuredHz, 0, 'f', 3);
            ev->setText(0, text);
            ev->setText(3, QStringLiteral("%1 %2").arg(e.amplitude, 0, 'g', 4).arg(QString::fromStdString(e.unit)) +
                               (e.threshold ? tr("  (limit %1; %2)").arg(*e.threshold, 0, 'g', 4).arg(QString::fromStdString(e.thresholdSource)) : QString()) +
                               "  [" + QString::fromStdString(e.channel) + "]");
            const QString kind = spectrumKindOfEvidence(e);
            if (!kind.isEmpty() && (e.measuredHz || e.expectedHz)) {
                ev->setData(0, Qt::UserRole, QString::fromStdString(e.channel));
                ev->setData(0, Qt::UserRole + 1, kind);
                ev->setData(0, Qt::UserRole + 2, e.measuredHz.value_or(*e.expectedHz));
                ev->setToolTip(0, tr("Double-click to open the spectrum at this line"));
            }
        }
    }
    m_findings->expandAll();
}

} // namespace humwise::gui
