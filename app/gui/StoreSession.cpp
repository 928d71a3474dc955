#include "app/gui/StoreSession.h"

namespace humwise::gui {

StoreSession::StoreSession(QObject* parent) : QObject(parent) {}

QString StoreSession::open(const QString& path, bool create) {
    try {
        auto store = storage::FleetStore::open(path.toStdString(), create);
        m_store = std::move(store);
        m_path = path;
        reload();
        return {};
    } catch (const storage::StorageException& e) {
        return QString::fromStdString(e.error.message);
    }
}

void StoreSession::suspend() { m_store.reset(); }

QString StoreSession::resume() {
    if (m_store || m_path.isEmpty()) return {};
    const QString failure = open(m_path, false);
    if (!failure.isEmpty()) {
        m_fleet = {};
        m_rounds.clear();
        m_status.clear();
        emit changed();
    }
    return failure;
}

void StoreSession::reload() {
    if (!m_store) return;
    try {
        m_fleet = m_store->loadFleet();
        m_rounds = m_store->rounds();
        m_status = workflow::fleetStatus(*m_store);
    } catch (const storage::StorageException&) {
        // Keep what was loaded; the views keep working on it.
    }
    emit changed();
}

const workflow::MotorStatus* StoreSession::statusOf(const std::string& tag) const {
    for (const auto& s : m_status)
        if (s.tag == tag) return &s;
    return nullptr;
}

} // namespace humwise::gui
