#include "app/gui/HelpDialog.h"

#include <QTextBrowser>
#include <QVBoxLayout>

namespace humwise::gui {

QString HelpDialog::guideHtml() {
    return QObject::tr(R"(<h2>Humwise workbench</h2>
<h3>Safety first</h3>
<p><b>Measuring current and voltage on live motor circuits can kill.</b> Use meters, leads, clamps and
current transformers rated for the measurement category and voltage of the point (motor terminal
boxes and MCC feeders are usually CAT III; switchboards near the supply CAT IV); the lowest rating
in the chain governs. Fit clamps and voltage taps with the circuit de-energised and locked out where
possible, then energise. Never open the secondary of a loaded current transformer. Use fused
voltage leads. Wear the arc-flash protection your risk assessment asks for. Keep sensor cables
clear of rotating parts and keep guards closed. Drive-fed motors carry fast voltage edges and
common-mode voltage: use sensors rated for them. Only qualified persons should work inside
enclosures. Local codes, site rules and your electrical safety programme come first; nothing in
this software overrides them.</p>
<h3>Every day</h3>
<ul>
<li><b>Import a walkdown</b> (Ctrl+I, or drop the folder on the window): check shows which file goes to
which motor and point and what is wrong with each bad file; import stores the round and analyses it.</li>
<li><b>Plant tree</b> (left): every motor with the condition of its latest round - a shape and a
mark as well as a colour: ring <i>steady</i> [ ], ring with a dot <i>watch</i> [~], triangle
<i>plan repair</i> [!], square on its corner <i>act now</i> [!!] - and what changed since the round before.
Filter for what needs attention. Alt+Down / Alt+Up: next / previous motor.</li>
<li><b>Verdicts</b>: the nameplate (edit, apply, undo) and the findings with their evidence;
double-click a piece of evidence to open its spectrum with the line marked.</li>
<li><b>Spectrum</b>: vibration, envelope, current and zoomed current; acceleration, velocity or
displacement, SI or imperial; Hz or orders; the motor's own fault lines (Ctrl+L shows or hides them);
harmonic and sideband cursors (choose the cursor, then click or drag on the plot); F6: next point;
mouse wheel and drag, or + - arrows Home, to zoom and pan.</li>
<li><b>Then and now</b>: two rounds of one point on an order axis, their difference and the lines
that appeared or grew.</li>
<li><b>History</b>: the cascade of a point's spectra over the rounds, and an indicator's trend
with its alarm limits and projected crossing date (linear least-squares fit).</li>
<li><b>Limits</b>: alert and alarm levels per point and indicator, typed or set from the history.</li>
</ul>
<p>Findings name their rule and the source of every threshold; where no published source was found
the threshold says <i>common practice</i>.</p>)");
}

HelpDialog::HelpDialog(QWidget* parent) : QDialog(parent) {
    setWindowTitle(tr("Humwise guide"));
    auto* text = new QTextBrowser;
    text->setHtml(guideHtml());
    auto* layout = new QVBoxLayout(this);
    layout->addWidget(text);
    resize(760, 640);
}

} // namespace humwise::gui
