#pragma once
// "Then and now": two rounds of one point overlaid on an order axis (each round's frequencies
// divided by its own running speed, so a small speed change does not hide a match), their
// difference in dB, and the list of lines that appeared or grew. Default: the latest round
// against the one about three months before it.

#include "app/gui/StoreSession.h"
#include "core/dsp/SpectrumCompare.h"

#include <QWidget>

class QComboBox;
class QCustomPlot;
class QTableWidget;

namespace humwise::gui {

class CompareView : public QWidget {
    Q_OBJECT
public:
    CompareView(StoreSession& session, QWidget* parent = nullptr);
    void showMotor(const QString& tag);
    bool compare(const QString& point, const QString& kind, std::int64_t roundA, std::int64_t roundB);
    const dsp::SpectrumComparison& comparison() const { return m_cmp; }
    std::pair<std::int64_t, std::int64_t> rounds() const;
    QCustomPlot* plot() const { return m_plot; }

private:
    void run();
    StoreSession& m_session;
    QString m_tag;
    QComboBox *m_point, *m_kind, *m_a, *m_b;
    QCustomPlot* m_plot;
    QTableWidget* m_changes;
    dsp::SpectrumComparison m_cmp;
};

// The round about `months` months before `latest` (the closest one), from oldest-first rounds.
std::int64_t roundMonthsBefore(const std::vector<storage::RoundRow>& rounds, std::int64_t latest, int months);

} // namespace humwise::gui
