#include "storage/Schema.h"

#include <string>

namespace humwise::storage {
namespace {

constexpr const char* kVersion1 = R"SQL(
CREATE TABLE sites (
  id INTEGER PRIMARY KEY,
  name TEXT NOT NULL UNIQUE,
  description TEXT NOT NULL DEFAULT ''
);
CREATE TABLE areas (
  id INTEGER PRIMARY KEY,
  site_id INTEGER NOT NULL REFERENCES sites(id) ON DELETE CASCADE,
  name TEXT NOT NULL,
  position INTEGER NOT NULL,
  UNIQUE (site_id, name)
);
CREATE TABLE motors (
  id INTEGER PRIMARY KEY,
  area_id INTEGER NOT NULL REFERENCES areas(id),
  position INTEGER NOT NULL,
  tag TEXT NOT NULL UNIQUE,
  description TEXT NOT NULL DEFAULT '',
  rated_power_kw REAL NOT NULL,
  rated_voltage_v REAL NOT NULL,
  rated_current_a REAL NOT NULL,
  supply_hz REAL NOT NULL,
  rated_speed_rpm REAL NOT NULL,
  poles INTEGER,
  drive TEXT NOT NULL CHECK (drive IN ('direct-on-line', 'drive-fed')),
  rotor_bars INTEGER,
  stator_slots INTEGER,
  driven_kind TEXT NOT NULL,
  driven_vanes INTEGER,
  driven_speed_ratio REAL NOT NULL,
  severity_standard TEXT NOT NULL,
  severity_group INTEGER,
  severity_support TEXT,
  severity_class INTEGER
);
CREATE TABLE bearings (
  motor_id INTEGER NOT NULL REFERENCES motors(id) ON DELETE CASCADE,
  end_position TEXT NOT NULL CHECK (end_position IN ('DE', 'NDE')),
  designation TEXT NOT NULL DEFAULT '',
  rolling_elements INTEGER,
  element_diameter REAL,
  pitch_diameter REAL,
  contact_angle_deg REAL,
  bpfo REAL, bpfi REAL, bsf REAL, ftf REAL,
  PRIMARY KEY (motor_id, end_position)
);
CREATE TABLE points (
  id INTEGER PRIMARY KEY,
  motor_id INTEGER NOT NULL REFERENCES motors(id) ON DELETE CASCADE,
  position INTEGER NOT NULL,
  name TEXT NOT NULL,
  quantity TEXT NOT NULL,
  location TEXT NOT NULL DEFAULT '',
  direction TEXT NOT NULL DEFAULT '',
  phase TEXT NOT NULL DEFAULT '',
  unit TEXT NOT NULL,
  sensitivity REAL NOT NULL,
  sensor TEXT NOT NULL DEFAULT '',
  UNIQUE (motor_id, name)
);
CREATE TABLE routes (
  id INTEGER PRIMARY KEY,
  name TEXT NOT NULL UNIQUE,
  description TEXT NOT NULL DEFAULT ''
);
CREATE TABLE route_points (
  route_id INTEGER NOT NULL REFERENCES routes(id) ON DELETE CASCADE,
  position INTEGER NOT NULL,
  point_id INTEGER NOT NULL REFERENCES points(id),
  PRIMARY KEY (route_id, position)
);
CREATE TABLE rounds (
  id INTEGER PRIMARY KEY,
  route_id INTEGER REFERENCES routes(id),
  started_at TEXT NOT NULL,
  technician TEXT NOT NULL DEFAULT '',
  notes TEXT NOT NULL DEFAULT '',
  manifest_hash TEXT NOT NULL UNIQUE,
  source_folder TEXT NOT NULL DEFAULT '',
  imported_at TEXT NOT NULL
);
CREATE TABLE source_files (
  hash TEXT PRIMARY KEY,
  size INTEGER NOT NULL,
  bytes BLOB NOT NULL
);
CREATE TABLE recordings (
  id INTEGER PRIMARY KEY,
  round_id INTEGER NOT NULL REFERENCES rounds(id) ON DELETE CASCADE,
  point_id INTEGER NOT NULL REFERENCES points(id),
  recorded_at TEXT NOT NULL,
  sample_rate_hz REAL NOT NULL,
  sample_count INTEGER NOT NULL,
  file_name TEXT NOT NULL,
  file_hash TEXT NOT NULL REFERENCES source_files(hash),
  file_format TEXT NOT NULL,
  channel_index INTEGER NOT NULL,
  unit TEXT NOT NULL,
  sensitivity REAL NOT NULL,
  quality TEXT NOT NULL DEFAULT '',
  speed_rpm REAL,
  load_percent REAL,
  UNIQUE (round_id, point_id)
);
CREATE TABLE round_motors (
  round_id INTEGER NOT NULL REFERENCES rounds(id) ON DELETE CASCADE,
  motor_id INTEGER NOT NULL REFERENCES motors(id),
  line_hz REAL NOT NULL,
  line_method TEXT NOT NULL,
  speed_rpm REAL NOT NULL,
  speed_method TEXT NOT NULL,
  speed_confidence REAL NOT NULL,
  slip REAL NOT NULL,
  load_percent REAL,
  analysis_version INTEGER NOT NULL,
  notes TEXT NOT NULL DEFAULT '',
  PRIMARY KEY (round_id, motor_id)
);
CREATE TABLE indicators (
  round_id INTEGER NOT NULL REFERENCES rounds(id) ON DELETE CASCADE,
  motor_id INTEGER NOT NULL REFERENCES motors(id),
  point_id INTEGER REFERENCES points(id),
  name TEXT NOT NULL,
  value REAL NOT NULL,
  unit TEXT NOT NULL
);
CREATE TABLE findings (
  id INTEGER PRIMARY KEY,
  round_id INTEGER NOT NULL REFERENCES rounds(id) ON DELETE CASCADE,
  motor_id INTEGER NOT NULL REFERENCES motors(id),
  fault TEXT NOT NULL,
  severity INTEGER NOT NULL CHECK (severity BETWEEN 0 AND 3),
  withheld INTEGER NOT NULL,
  withheld_reason TEXT NOT NULL DEFAULT '',
  origin TEXT NOT NULL,
  confidence REAL NOT NULL,
  explanation TEXT NOT NULL,
  action TEXT NOT NULL,
  rule TEXT NOT NULL,
  evidence TEXT NOT NULL
);
CREATE INDEX recordings_by_round ON recordings(round_id);
CREATE INDEX findings_by_round ON findings(round_id, motor_id);
)SQL";

constexpr const char* kVersion2 = R"SQL(
CREATE TABLE spectra (
  id INTEGER PRIMARY KEY,
  recording_id INTEGER NOT NULL REFERENCES recordings(id) ON DELETE CASCADE,
  kind TEXT NOT NULL,
  quantity TEXT NOT NULL,
  unit TEXT NOT NULL,
  scale TEXT NOT NULL,
  window_name TEXT NOT NULL,
  start_hz REAL NOT NULL,
  resolution_hz REAL NOT NULL,
  enbw_hz REAL NOT NULL,
  averages INTEGER NOT NULL,
  parameters TEXT NOT NULL DEFAULT '',
  analysis_version INTEGER NOT NULL,
  line_values BLOB NOT NULL,
  UNIQUE (recording_id, kind)
);
CREATE TABLE alarm_limits (
  id INTEGER PRIMARY KEY,
  motor_id INTEGER NOT NULL REFERENCES motors(id) ON DELETE CASCADE,
  point_id INTEGER REFERENCES points(id) ON DELETE CASCADE,
  indicator TEXT NOT NULL,
  method TEXT NOT NULL CHECK (method IN ('absolute', 'iso-zone', 'statistical', 'percent')),
  alert REAL,
  alarm REAL,
  baseline_rounds INTEGER,
  source TEXT NOT NULL DEFAULT '',
  updated_at TEXT NOT NULL
);
CREATE UNIQUE INDEX alarm_limits_key ON alarm_limits(motor_id, IFNULL(point_id, 0), indicator);
CREATE INDEX indicators_trend ON indicators(motor_id, point_id, name, round_id);
)SQL";

constexpr const char* kVersion3 = R"SQL(
ALTER TABLE spectra ADD COLUMN sample_rate_hz REAL NOT NULL DEFAULT 0;
ALTER TABLE spectra ADD COLUMN segment_length INTEGER NOT NULL DEFAULT 0;
ALTER TABLE spectra ADD COLUMN transform_length INTEGER NOT NULL DEFAULT 0;
)SQL";

constexpr const char* kMigrations[] = {kVersion1, kVersion2, kVersion3};

void runScript(Database& db, const char* script) {
    // One statement at a time: the wrappers prepare single statements.
    std::string_view rest(script);
    while (true) {
        const auto end = rest.find(';');
        if (end == std::string_view::npos) break;
        const auto stmt = rest.substr(0, end + 1);
        rest.remove_prefix(end + 1);
        if (stmt.find_first_not_of(" \n\t;") == std::string_view::npos) continue;
        db.execute(stmt);
    }
}

} // namespace

int schemaVersion(Database& db) {
    auto s = db.prepare("PRAGMA user_version");
    s.step();
    return static_cast<int>(s.integer(0));
}

void migrate(Database& db, int target) {
    const int current = schemaVersion(db);
    if (current > kSchemaVersion) {
        throw StorageException{{StorageError::Code::TooNew,
                                db.path().string() + ": the database has schema version " + std::to_string(current) +
                                    ", newer than this Humwise understands (" + std::to_string(kSchemaVersion) +
                                    "); open it with a newer Humwise - nothing was changed",
                                0}};
    }
    for (int v = current + 1; v <= target; ++v) {
        Transaction tx(db);
        runScript(db, kMigrations[v - 1]);
        db.execute("PRAGMA user_version = " + std::to_string(v)); // v is ours, not user data
        tx.commit();
    }
}

} // namespace humwise::storage
