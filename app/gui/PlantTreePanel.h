#pragma once
// The plant tree: site -> area -> motor, each motor with its latest worst severity (shape, mark
// and name) and what changed since the previous round; a filter for what needs attention.

#include "app/gui/StoreSession.h"

#include <QWidget>

class QComboBox;
class QTreeWidget;
class QTreeWidgetItem;

namespace humwise::gui {

class PlantTreePanel : public QWidget {
    Q_OBJECT
public:
    enum class Filter { All, NeedsAttention, NewFindings, Area };
    explicit PlantTreePanel(StoreSession& session, QWidget* parent = nullptr);

    QString currentMotor() const;
    void selectMotor(const QString& tag);
    void selectNext(int step); // +1 next motor, -1 previous, in tree order (visible motors only)
    void setFilter(Filter filter, const QString& area = {});
    QTreeWidget* tree() const { return m_tree; }
    QStringList visibleMotors() const;

signals:
    void motorSelected(const QString& tag);

private:
    void rebuild();
    bool passes(const workflow::MotorStatus& s) const;
    StoreSession& m_session;
    QComboBox* m_filter;
    QTreeWidget* m_tree;
};

} // namespace humwise::gui
