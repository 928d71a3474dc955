#pragma once
// The one repository API of the fleet store, shared by the command line, the workbench and the
// reports. It speaks in core's types and plain row structs; no SQL leaves storage/. Narrow on
// purpose: another database (a server shared by several analysts) could stand behind the same
// functions.
//
// Errors: every function throws StorageException (a typed StorageError naming the database);
// the workflow layer catches it at its boundary. Writes that belong together run inside one
// Transaction the caller holds (see transaction()).

#include "core/diagnosis/Finding.h"
#include "core/fleet/Fleet.h"
#include "storage/Database.h"
#include "storage/Schema.h"

#include <cstdint>
#include <filesystem>
#include <memory>
#include <optional>
#include <string>
#include <vector>

namespace humwise::storage {

struct RoundRow {
    std::int64_t id = 0;
    std::optional<std::string> route;  // route name
    std::string startedAt;             // ISO 8601
    std::string technician;
    std::string notes;
    std::string manifestHash;
    std::string sourceFolder;
    std::string importedAt;
};

struct RecordingRow {
    std::int64_t id = 0;
    std::int64_t roundId = 0;
    std::string motorTag;
    std::string pointName;
    std::string recordedAt;
    double sampleRateHz = 0;
    std::int64_t sampleCount = 0;
    std::string fileName;
    std::string fileHash;
    std::string fileFormat;   // "wav", "csv", "uff"
    int channelIndex = 0;     // 0-based channel of the file
    std::string unit;         // unit of (file value / sensitivity)
    double sensitivity = 1;
    std::string quality;      // comma-separated quality flag names, empty when clean
    std::optional<double> speedRpm;
    std::optional<double> loadPercent;
};

struct SpectrumRow {
    std::int64_t recordingId = 0;
    std::string kind;       // "velocity", "envelope", "zoom", "current"
    std::string quantity;   // quantity of the values
    std::string unit;       // unit of the values as stored (SI)
    std::string scale;      // "rms", "peak", ...
    std::string window;
    double startHz = 0;
    double resolutionHz = 0;
    double enbwHz = 0;
    int averages = 0;
    double sampleRateHz = 0;
    std::int64_t segmentLength = 0;   // samples per transform (0 in rows from schema version 2)
    std::int64_t transformLength = 0; // >= segmentLength when zero-padded
    std::string parameters; // free text (band, etc.)
    int analysisVersion = 0;
    std::vector<float> values;
};

struct RoundMotorRow {
    std::int64_t roundId = 0;
    std::string motorTag;
    double lineHz = 0;
    std::string lineMethod;
    double speedRpm = 0;
    std::string speedMethod;
    double speedConfidence = 0;
    double slip = 0;
    std::optional<double> loadPercent;
    int analysisVersion = 0;
    std::string notes;
};

struct IndicatorRow {
    std::string motorTag;
    std::string pointName; // empty for motor-level indicators (slip, line frequency, ...)
    std::string name;
    double value = 0;
    std::string unit;
};

struct FindingRow {
    std::int64_t id = 0;
    std::int64_t roundId = 0;
    std::string roundStartedAt;
    std::string motorTag;
    diagnosis::Finding finding;
};

struct TrendPoint {
    std::int64_t roundId = 0;
    std::string startedAt;
    double value = 0;
    std::string unit;
};

struct AlarmLimitRow {
    std::string motorTag;
    std::string pointName; // empty: motor-level indicator
    std::string indicator;
    std::string method;    // "absolute", "iso-zone", "statistical", "percent"
    std::optional<double> alert;
    std::optional<double> alarm;
    std::optional<int> baselineRounds;
    std::string source;
    std::string updatedAt;
};

class FleetStore {
public:
    // Opens (creating when asked) and migrates the database; throws StorageException.
    static std::unique_ptr<FleetStore> open(const std::filesystem::path& path, bool create = true);
    // Opens an existing store for reading only (a file on a write-protected medium, or one to
    // look at without any risk of change): never migrated; every write throws ReadOnly. Throws
    // TooNew for a newer schema and ReadOnly for an older one (it would need migrating).
    static std::unique_ptr<FleetStore> openReadOnly(const std::filesystem::path& path);

    Database& database() { return *m_db; }
    int schemaVersion() { return storage::schemaVersion(*m_db); }

    // Fleet: adds new motors/points/routes and updates existing ones (by tag and point name);
    // motors absent from `fleet` are kept with their history. Call inside a transaction.
    void saveFleet(const fleet::Fleet& fleet);
    fleet::Fleet loadFleet();
    bool hasFleet();

    // Rounds.
    std::optional<RoundRow> roundByManifestHash(const std::string& hash);
    std::int64_t insertRound(const RoundRow& round);
    void setRoundManifestHash(std::int64_t roundId, const std::string& hash); // the walkdown's identity, known once imported
    void deleteRound(std::int64_t roundId);
    std::vector<RoundRow> rounds(); // oldest first
    std::optional<RoundRow> round(std::int64_t id);

    // Raw files, content-addressed by SHA-256.
    void storeSourceFile(const std::string& hash, std::span<const std::byte> bytes);
    std::vector<std::byte> sourceFile(const std::string& hash);

    std::int64_t insertRecording(const RecordingRow& recording);
    std::vector<RecordingRow> recordings(std::int64_t roundId);

    // Analysis products (replaced by reanalysis).
    void deleteAnalysis(std::int64_t roundId);
    void insertSpectrum(const SpectrumRow& spectrum);
    std::optional<SpectrumRow> spectrum(std::int64_t recordingId, const std::string& kind);
    void insertRoundMotor(const RoundMotorRow& row);
    std::vector<RoundMotorRow> roundMotors(std::int64_t roundId);
    void insertIndicator(std::int64_t roundId, const IndicatorRow& indicator);
    std::vector<IndicatorRow> indicators(std::int64_t roundId, const std::string& motorTag);
    void insertFinding(std::int64_t roundId, const std::string& motorTag, const diagnosis::Finding& finding);
    std::vector<FindingRow> findings(std::optional<std::int64_t> roundId, const std::string& motorTag = "");

    // One indicator of one motor (and point) across all rounds, oldest first.
    std::vector<TrendPoint> trend(const std::string& motorTag, const std::string& pointName, const std::string& indicator);

    // The analyst's limits of one (point, indicator): set replaces any earlier ones; clear removes
    // them (the defaults apply again) and says whether there were any.
    void setAlarmLimit(const AlarmLimitRow& limit);
    bool clearAlarmLimit(const std::string& motorTag, const std::string& pointName, const std::string& indicator);
    std::vector<AlarmLimitRow> alarmLimits(const std::string& motorTag);

    // Folds the write-ahead log into the database file (after a bulk build).
    void checkpoint();

    // PRAGMA integrity_check and the application's own checks (every recording's file present,
    // every analysed round has its per-motor rows). Empty when consistent.
    std::vector<std::string> checkConsistency();

private:
    explicit FleetStore(std::unique_ptr<Database> db) : m_db(std::move(db)) {}
    std::int64_t motorId(const std::string& tag);
    std::optional<std::int64_t> pointId(std::int64_t motorId, const std::string& name);
    std::unique_ptr<Database> m_db;
};

} // namespace humwise::storage
