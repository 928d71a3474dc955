#pragma once
// The workbench's one connection to the fleet store (GUI thread) and the data the views share:
// the fleet, the rounds and the status of every motor. Long work (import, reanalysis) opens its
// own connection in a worker thread and calls reload() when it is done.

#include "app/common/FleetStatus.h"
#include "core/fleet/Fleet.h"
#include "storage/FleetStore.h"

#include <QObject>
#include <QString>

#include <memory>

namespace humwise::gui {

class StoreSession : public QObject {
    Q_OBJECT
public:
    explicit StoreSession(QObject* parent = nullptr);

    // Opens the database (creating it when `create` and it does not exist); on failure returns
    // the message and keeps the previous one.
    QString open(const QString& path, bool create = true);
    // Closes the connection while a long write in a worker (an import) runs, so that the write
    // finds the store unused and may take it to itself (storage/Database.h, SoleWriterJournal:
    // its raw files are then written once); the views keep the data they loaded and see
    // isOpen() false meanwhile. resume() reopens the same store (never creating it: a store
    // moved away meanwhile is not replaced by an empty one) and reloads; on failure it returns
    // the message, and the session stays closed with nothing loaded (views show no store).
    void suspend();
    QString resume();
    bool isOpen() const { return m_store != nullptr; }
    QString path() const { return m_path; }
    storage::FleetStore& store() { return *m_store; }

    const fleet::Fleet& fleet() const { return m_fleet; }
    const std::vector<storage::RoundRow>& rounds() const { return m_rounds; }
    const std::vector<workflow::MotorStatus>& status() const { return m_status; }
    const workflow::MotorStatus* statusOf(const std::string& tag) const;

public slots:
    void reload();

signals:
    void changed();

private:
    std::unique_ptr<storage::FleetStore> m_store;
    QString m_path;
    fleet::Fleet m_fleet;
    std::vector<storage::RoundRow> m_rounds;
    std::vector<workflow::MotorStatus> m_status;
};

} // namespace humwise::gui
