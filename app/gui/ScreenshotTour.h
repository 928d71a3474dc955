#pragma once
// The screenshot tour: visits every main view with real data from the open store and writes one
// PNG per view into a folder (works offscreen). Returns the files written, or an error text.

#include <QString>
#include <QStringList>

namespace humwise::gui {

class MainWindow;
class StoreSession;

struct TourResult {
    QStringList files;
    QString error;
};

TourResult runScreenshotTour(StoreSession& session, MainWindow& window, const QString& folder, const QString& importFolder = {});

} // namespace humwise::gui
