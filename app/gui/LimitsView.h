#pragma once
// Alarm limits per point and indicator, editable: the analyst types alert and alarm levels, or
// sets them from the history (ISO-zone guidance, statistics of the first rounds, percentage over
// the baseline); they are stored with their method and source.

#include "app/gui/StoreSession.h"

#include <QWidget>

class QTableWidget;
class QLabel;

namespace humwise::gui {

class LimitsView : public QWidget {
    Q_OBJECT
public:
    LimitsView(StoreSession& session, QWidget* parent = nullptr);
    void showMotor(const QString& tag);
    QTableWidget* table() const { return m_table; }
    // Writes the row's limits to the store; returns an error text or empty.
    QString saveRow(int row);
    // Fills the row from the history with "iso-zone", "statistical" or "percent".
    QString suggest(int row, const QString& method);

private:
    void reload();
    StoreSession& m_session;
    QString m_tag;
    QTableWidget* m_table;
    QLabel* m_message;
};

} // namespace humwise::gui
