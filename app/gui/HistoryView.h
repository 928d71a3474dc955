#pragma once
// History of one point: a cascade of its spectra across rounds (each round's spectrum drawn a
// step above the one before, newest on top, so a peak's growth over months stands out), and the
// trend of one indicator with its alarm limits and a projected crossing date (linear least-
// squares fit of the last four rounds, stated on the plot; core/trend/AlarmLimits.h).

#include "app/gui/StoreSession.h"
#include "core/trend/AlarmLimits.h"

#include <QWidget>

#include <optional>

class QComboBox;
class QCustomPlot;
class QLabel;

namespace humwise::gui {

class HistoryView : public QWidget {
    Q_OBJECT
public:
    HistoryView(StoreSession& session, QWidget* parent = nullptr);
    void showMotor(const QString& tag);
    bool showTrend(const QString& point, const QString& indicator);
    int cascadeTraces() const { return m_traces; }
    const std::vector<storage::TrendPoint>& trendPoints() const { return m_points; }
    const trend::Limits& limits() const { return m_limits; }
    std::optional<double> crossingDays() const; // from the last round to the alarm limit
    QString projectionText() const;
    QCustomPlot* cascadePlot() const { return m_cascade; }
    QCustomPlot* trendPlot() const { return m_trend; }

private:
    void loadCascade();
    void loadTrend();
    void fillIndicators();
    StoreSession& m_session;
    QString m_tag;
    QComboBox *m_point, *m_indicator;
    QCustomPlot *m_cascade, *m_trend;
    QLabel* m_note;
    int m_traces = 0;
    std::vector<storage::TrendPoint> m_points;
    trend::Limits m_limits;
    std::optional<trend::Projection> m_projection;
    double m_lastDay = 0;
};

} // namespace humwise::gui
