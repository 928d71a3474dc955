#include "app/gui/LimitsView.h"

#include "app/common/LimitRules.h"
#include "core/util/Text.h"

#include <QComboBox>
#include <QHBoxLayout>
#include <QHeaderView>
#include <QLabel>
#include <QPushButton>
#include <QTableWidget>
#include <QVBoxLayout>

#include <set>

namespace humwise::gui {

namespace {
enum Column { Point, Indicator, Method, Alert, Alarm, Source };
}

LimitsView::LimitsView(StoreSession& session, QWidget* parent) : QWidget(parent), m_session(session) {
    m_table = new QTableWidget(0, 6);
    m_table->setHorizontalHeaderLabels({tr("Point"), tr("Indicator"), tr("Method"), tr("Alert"), tr("Alarm"), tr("Source")});
    m_table->horizontalHeader()->setStretchLastSection(true);
    m_message = new QLabel;
    auto* method = new QComboBox;
    method->addItem(tr("ISO-zone guidance"), "iso-zone");
    method->addItem(tr("statistics of the first rounds"), "statistical");
    method->addItem(tr("percentage over the baseline"), "percent");
    auto* suggestButton = new QPushButton(tr("Set selected from history"));
    auto* save = new QPushButton(tr("Store selected"));
    auto* buttons = new QHBoxLayout;
    buttons->addWidget(method);
    buttons->addWidget(suggestButton);
    buttons->addWidget(save);
    buttons->addStretch();
    auto* layout = new QVBoxLayout(this);
    layout->addWidget(m_table, 1);
    layout->addLayout(buttons);
    layout->addWidget(m_message);
    connect(suggestButton, &QPushButton::clicked, this, [this, method] {
        for (const auto& idx : m_table->selectionModel()->selectedRows()) m_message->setText(suggest(idx.row(), method->currentData().toString()));
    });
    connect(save, &QPushButton::clicked, this, [this] {
        for (const auto& idx : m_table->selectionModel()->selectedRows()) m_message->setText(saveRow(idx.row()));
    });
}

void LimitsView::showMotor(const QString& tag) {
    m_tag = tag;
    reload();
}

void LimitsView::reload() {
    m_table->setRowCount(0);
    const auto* def = m_session.fleet().motor(m_tag.toStdString());
    if (!def || !m_session.isOpen() || m_session.rounds().empty()) return;
    try {
        auto& store = m_session.store();
        std::set<std::pair<std::string, std::string>> keys;
        for (const auto& i : store.indicators(m_session.rounds().back().id, def->motor.tag)) keys.insert({i.pointName, i.name});
        for (const auto& [point, name] : keys) {
            if (!workflow::deservesLimit(name)) continue; // the rest stay in the trends
            const int row = m_table->rowCount();
            m_table->insertRow(row);
            m_table->setItem(row, Point, new QTableWidgetItem(QString::fromStdString(point)));
            m_table->setItem(row, Indicator, new QTableWidgetItem(QString::fromStdString(name)));
            const auto history = store.trend(def->motor.tag, point, name);
            const auto l = workflow::effectiveLimits(store, *def, point, name, workflow::valuesOf(history));
            m_table->setItem(row, Method, new QTableWidgetItem(QString::fromStdString(l.method)));
            m_table->setItem(row, Alert, new QTableWidgetItem(l.alert ? QString::number(*l.alert, 'g', 4) : QString()));
            m_table->setItem(row, Alarm, new QTableWidgetItem(l.alarm ? QString::number(*l.alarm, 'g', 4) : QString()));
            m_table->setItem(row, Source, new QTableWidgetItem(QString::fromStdString(l.source)));
            for (int c : {Point, Indicator}) m_table->item(row, c)->setFlags(m_table->item(row, c)->flags() & ~Qt::ItemIsEditable);
        }
    } catch (const storage::StorageException& e) {
        m_message->setText(QString::fromStdString(e.error.message));
    }
}

QString LimitsView::suggest(int row, const QString& method) {
    const auto* def = m_session.fleet().motor(m_tag.toStdString());
    if (!def || row < 0 || row >= m_table->rowCount()) return tr("No such row");
    const std::string point = m_table->item(row, Point)->text().toStdString(), name = m_table->item(row, Indicator)->text().toStdString();
    const auto history = m_session.store().trend(def->motor.tag, point, name);
    const auto suggested = workflow::suggestLimits(*def, name, method.toStdString(), workflow::valuesOf(history));
    if (!suggested) return QString::fromStdString(suggested.error());
    const trend::Limits& l = suggested.value();
    m_table->item(row, Method)->setText(QString::fromStdString(l.method));
    m_table->item(row, Alert)->setText(l.alert ? QString::number(*l.alert, 'g', 4) : QString());
    m_table->item(row, Alarm)->setText(l.alarm ? QString::number(*l.alarm, 'g', 4) : QString());
    m_table->item(row, Source)->setText(QString::fromStdString(l.source));
    return tr("Suggested; store to keep it.");
}

QString LimitsView::saveRow(int row) {
    if (row < 0 || row >= m_table->rowCount()) return tr("No such row");
    storage::AlarmLimitRow a;
    a.motorTag = m_tag.toStdString();
    a.pointName = m_table->item(row, Point)->text().toStdString();
    a.indicator = m_table->item(row, Indicator)->text().toStdString();
    a.method = m_table->item(row, Method)->text().toStdString();
    if (a.method.empty()) a.method = "absolute";
    bool okAlert = false, okAlarm = false;
    const double alert = m_table->item(row, Alert)->text().toDouble(&okAlert);
    const double alarm = m_table->item(row, Alarm)->text().toDouble(&okAlarm);
    if (!okAlarm) return tr("The alarm level must be a number");
    if (okAlert && alert > alarm) return tr("The alert level must not exceed the alarm level");
    if (okAlert) a.alert = alert;
    a.alarm = alarm;
    a.source = m_table->item(row, Source)->text().toStdString();
    a.updatedAt = text::isoNow();
    if (!m_session.isOpen()) return tr("No store is open");
    try {
        storage::Transaction tx(m_session.store().database());
        m_session.store().setAlarmLimit(a);
        tx.commit();
    } catch (const storage::StorageException& e) {
        return QString::fromStdString(e.error.message);
    }
    return tr("Stored the limits of %1 %2").arg(QString::fromStdString(a.pointName), QString::fromStdString(a.indicator));
}

} // namespace humwise::gui
