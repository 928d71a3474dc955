#include "app/gui/PlantTreePanel.h"

#include "app/gui/Severity.h"

#include <QComboBox>
#include <QHeaderView>
#include <QTreeWidget>
#include <QVBoxLayout>

namespace humwise::gui {

PlantTreePanel::PlantTreePanel(StoreSession& session, QWidget* parent) : QWidget(parent), m_session(session) {
    m_filter = new QComboBox(this);
    m_tree = new QTreeWidget(this);
    m_tree->setColumnCount(3);
    m_tree->setHeaderLabels({tr("Plant"), tr("Condition"), tr("Since last round")});
    m_tree->header()->setSectionResizeMode(QHeaderView::ResizeToContents);
    m_tree->setUniformRowHeights(true);
    auto* layout = new QVBoxLayout(this);
    layout->setContentsMargins(0, 0, 0, 0);
    layout->addWidget(m_filter);
    layout->addWidget(m_tree);
    connect(&m_session, &StoreSession::changed, this, &PlantTreePanel::rebuild);
    connect(m_filter, &QComboBox::currentIndexChanged, this, &PlantTreePanel::rebuild);
    connect(m_tree, &QTreeWidget::currentItemChanged, this, [this](QTreeWidgetItem* item) {
        if (item && item->data(0, Qt::UserRole).isValid()) emit motorSelected(item->data(0, Qt::UserRole).toString());
    });
    rebuild();
}

bool PlantTreePanel::passes(const workflow::MotorStatus& s) const {
    const QString f = m_filter->currentData().toString();
    if (f == "attention") return s.worstSeverity >= 1;
    if (f == "new") return !s.newFaults.empty() || !s.worsenedFaults.empty();
    if (f.startsWith("area:")) return QString::fromStdString(s.area) == f.mid(5);
    return true;
}

void PlantTreePanel::rebuild() {
    const QString keep = currentMotor();
    {
        const QSignalBlocker block(m_filter);
        const QString current = m_filter->currentData().toString();
        m_filter->clear();
        m_filter->addItem(tr("All motors"), "all");
        m_filter->addItem(tr("Needs attention (watch or worse)"), "attention");
        m_filter->addItem(tr("New or worse since last round"), "new");
        for (const auto& a : m_session.fleet().areas) m_filter->addItem(tr("Area: %1").arg(QString::fromStdString(a)), "area:" + QString::fromStdString(a));
        const int i = m_filter->findData(current);
        m_filter->setCurrentIndex(i >= 0 ? i : 0);
    }
    const QSignalBlocker block(m_tree);
    m_tree->clear();
    auto* site = new QTreeWidgetItem(m_tree, {QString::fromStdString(m_session.fleet().site)});
    for (const auto& area : m_session.fleet().areas) {
        auto* areaItem = new QTreeWidgetItem(site, {QString::fromStdString(area)});
        int worst = -1;
        for (const auto& s : m_session.status()) {
            if (s.area != area || !passes(s)) continue;
            auto* m = new QTreeWidgetItem(areaItem);
            m->setText(0, QString::fromStdString(s.tag));
            m->setToolTip(0, QString::fromStdString(s.description));
            m->setData(0, Qt::UserRole, QString::fromStdString(s.tag));
            m->setIcon(1, severityIcon(s.worstSeverity));
            m->setText(1, severityMark(s.worstSeverity) + " " + severityName(s.worstSeverity));
            m->setText(2, QString::fromStdString(s.changeSummary()));
            if (!s.flaggedPoints.empty()) {
                m->setText(2, m->text(2) + tr("; flagged data"));
                m->setToolTip(2, tr("Flagged data: %1").arg(QString::fromStdString(s.flaggedPoints.front())));
            }
            worst = std::max(worst, s.worstSeverity);
        }
        if (areaItem->childCount() == 0) {
            delete areaItem;
            continue;
        }
        areaItem->setIcon(1, severityIcon(worst));
        areaItem->setText(1, severityMark(worst) + " " + severityName(worst));
    }
    m_tree->expandAll();
    if (!keep.isEmpty()) selectMotor(keep);
}

QString PlantTreePanel::currentMotor() const {
    const auto* item = m_tree->currentItem();
    return item && item->data(0, Qt::UserRole).isValid() ? item->data(0, Qt::UserRole).toString() : QString();
}

QStringList PlantTreePanel::visibleMotors() const {
    QStringList out;
    for (QTreeWidgetItemIterator it(m_tree); *it; ++it)
        if ((*it)->data(0, Qt::UserRole).isValid()) out << (*it)->data(0, Qt::UserRole).toString();
    return out;
}

void PlantTreePanel::selectMotor(const QString& tag) {
    for (QTreeWidgetItemIterator it(m_tree); *it; ++it)
        if ((*it)->data(0, Qt::UserRole).toString() == tag) {
            m_tree->setCurrentItem(*it);
            return;
        }
}

void PlantTreePanel::selectNext(int step) {
    const QStringList motors = visibleMotors();
    if (motors.isEmpty()) return;
    const int at = static_cast<int>(motors.indexOf(currentMotor()));
    const int next = at < 0 ? 0 : (at + step + static_cast<int>(motors.size())) % static_cast<int>(motors.size());
    selectMotor(motors[next]);
}

void PlantTreePanel::setFilter(Filter filter, const QString& area) {
    const QString key = filter == Filter::NeedsAttention ? "attention" : filter == Filter::NewFindings ? "new" : filter == Filter::Area ? "area:" + area : "all";
    const int i = m_filter->findData(key);
    if (i >= 0) m_filter->setCurrentIndex(i);
}

} // namespace humwise::gui
