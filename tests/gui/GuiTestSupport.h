#pragma once
// One QApplication for the GUI tests (offscreen: TestMain sets QT_QPA_PLATFORM) and a small
// store imported through the workbench's own import dialog.

#include <QApplication>

namespace humwise::test {

inline QApplication& guiApp() {
    static int argc = 1;
    static char name[] = "test_gui";
    static char* argv[] = {name, nullptr};
    static QApplication app(argc, argv);
    return app;
}

} // namespace humwise::test
