#pragma once
// The spectrum view: vibration (velocity, acceleration or displacement; SI or imperial units),
// envelope, current and zoomed current spectra of one point and round, with the motor's own
// fault frequencies drawn over it, peak labels, a harmonic cursor and a sideband cursor, Hz or
// orders on the x axis, linear or log amplitude, zoom and pan by mouse and keyboard, PNG and CSV
// export.

#include "app/gui/StoreSession.h"
#include "core/dsp/Spectrum.h"
#include "core/motor/FaultFrequencies.h"

#include <QWidget>

#include <map>
#include <optional>
#include <vector>

class QComboBox;
class QCheckBox;
class QCustomPlot;
class QCPItemTracer;
class QCPItemText;
class QDoubleSpinBox;
class QLabel;
class QToolButton;
class QMouseEvent;

namespace humwise::gui {

enum class Overlay { Shaft, Line, BearingDe, BearingNde, BrokenBar, Eccentricity, SlotHarmonic, VanePass };

class SpectrumView : public QWidget {
    Q_OBJECT
public:
    SpectrumView(StoreSession& session, QWidget* parent = nullptr);

    void showMotor(const QString& tag);
    // Chooses point, kind ("velocity", "envelope", "current", "zoom", "voltage") and round (default latest).
    bool showPoint(const QString& point, const QString& kind, std::optional<std::int64_t> roundId = std::nullopt);
    void setQuantity(Quantity q);    // acceleration, velocity or displacement (vibration only)
    void setImperial(bool imperial);
    void setOrders(bool orders);
    void setLogarithmic(bool log);
    void setOverlay(Overlay o, bool on);
    void setOverlaysVisible(bool visible); // all at once (keyboard shortcut)
    bool overlaysVisible() const { return m_overlaysOn; }
    void highlight(double frequencyHz);
    void setHarmonicCursor(std::optional<double> fundamentalHz);
    void setSidebandCursor(std::optional<double> centreHz, double spacingHz);
    void nextPoint();

    // What is drawn, for tests and exports: x in the axis unit (Hz or orders), y in the display unit.
    struct Marker { QString label; double x; };
    std::vector<Marker> overlayMarkers() const { return m_markers; }
    std::vector<double> cursorLines() const { return m_cursorX; }
    std::optional<double> valueAtHz(double hz) const; // plotted y at the line nearest hz
    QString unitLabel() const { return m_unitLabel; }
    QString currentPoint() const;
    QString currentKind() const;
    std::optional<double> highlightedHz() const { return m_highlightHz; }
    QCustomPlot* plot() const { return m_plot; }
    const dsp::Spectrum* displayed() const { return m_shown ? &*m_shown : nullptr; }

    QString exportPng(const QString& path);
    QString exportCsv(const QString& path);

private:
    void reloadPoints();
    void reloadKinds();
    void load();
    void redraw();
    void drawOverlays();
    void drawCursors();
    void drawPeaks();
    double toAxis(double hz) const;
    double toHz(double axisX) const;
    bool eventFilter(QObject* watched, QEvent* event) override;

    StoreSession& m_session;
    QString m_tag;
    QComboBox *m_point, *m_kind, *m_round, *m_quantity, *m_units;
    QCheckBox *m_orders, *m_log;
    QToolButton* m_overlayButton;
    QComboBox* m_cursorMode;
    QDoubleSpinBox* m_spacing;
    QLabel* m_info;
    QCustomPlot* m_plot;
    std::optional<dsp::Spectrum> m_stored; // SI, as stored
    std::optional<dsp::Spectrum> m_shown;  // in display quantity and unit
    std::optional<motor::OperatingPoint> m_op;
    std::map<Overlay, bool> m_overlays;
    bool m_overlaysOn = true;
    std::vector<Marker> m_markers;
    std::vector<double> m_cursorX;
    std::optional<double> m_harmonicHz, m_sidebandHz, m_highlightHz;
    double m_sidebandSpacingHz = 1.0;
    Quantity m_displayQuantity = Quantity::Velocity;
    bool m_imperial = false;
    QString m_unitLabel;
};

} // namespace humwise::gui
