#pragma once
// A short guide to the workbench, with the safety cautions for measurements on live motor
// circuits.

#include <QDialog>

namespace humwise::gui {

class HelpDialog : public QDialog {
    Q_OBJECT
public:
    explicit HelpDialog(QWidget* parent = nullptr);
    static QString guideHtml();
};

} // namespace humwise::gui
