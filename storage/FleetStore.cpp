#include "storage/FleetStore.h"

#include "core/util/JsonReader.h"
#include "core/util/JsonWriter.h"

#include <bit>
#include <cstring>
#include <sstream>

namespace humwise::storage {
namespace {

using diagnosis::Evidence;
using diagnosis::Finding;

StorageException notFound(const Database& db, const std::string& what) {
    return StorageException{{StorageError::Code::NotFound, db.path().string() + ": " + what, 0}};
}

const char* severityStandard(const motor::SeverityClass& s) {
    return s.standard == motor::SeverityClass::Standard::Iso20816_3 ? "ISO 20816-3" : "ISO 10816-1";
}

motor::DrivenKind drivenKindFrom(const std::string& s) { return motor::drivenKindFromName(s).value_or(motor::DrivenKind::None); }

std::string evidenceJson(const std::vector<Evidence>& evidence) {
    std::ostringstream out;
    json::Writer w(out, false);
    w.beginArray();
    for (const auto& e : evidence) {
        w.beginObject();
        w.field("label", e.label);
        if (e.expectedHz) w.field("expected_hz", *e.expectedHz);
        if (e.measuredHz) w.field("measured_hz", *e.measuredHz);
        w.field("amplitude", e.amplitude);
        w.field("unit", e.unit);
        w.field("channel", e.channel);
        if (e.threshold) w.field("threshold", *e.threshold);
        if (!e.thresholdSource.empty()) w.field("threshold_source", e.thresholdSource);
        w.endObject();
    }
    w.endArray();
    return out.str();
}

std::vector<Evidence> evidenceFrom(const std::string& text) {
    std::vector<Evidence> out;
    json::ParseError error;
    const auto v = json::parse(text, error);
    if (!v || !v->isArray()) return out;
    for (const auto& item : v->items()) {
        Evidence e;
        const auto str = [&](const char* k) { const auto* x = item.find(k); return x && x->isString() ? x->string() : std::string(); };
        const auto num = [&](const char* k) -> std::optional<double> { const auto* x = item.find(k); if (x && x->isNumber()) return x->number(); return std::nullopt; };
        e.label = str("label");
        e.expectedHz = num("expected_hz");
        e.measuredHz = num("measured_hz");
        e.amplitude = num("amplitude").value_or(0.0);
        e.unit = str("unit");
        e.channel = str("channel");
        e.threshold = num("threshold");
        e.thresholdSource = str("threshold_source");
        out.push_back(std::move(e));
    }
    return out;
}

diagnosis::Origin originFrom(const std::string& s) {
    if (s == "electrical") return diagnosis::Origin::Electrical;
    if (s == "mechanical") return diagnosis::Origin::Mechanical;
    return diagnosis::Origin::Unknown;
}

std::vector<std::byte> floatBlob(const std::vector<float>& values) {
    static_assert(sizeof(float) == 4);
    std::vector<std::byte> out(values.size() * 4);
    // Stored little-endian; every platform Humwise builds on is little-endian (checked below).
    std::memcpy(out.data(), values.data(), out.size());
    return out;
}

std::vector<float> floatsFrom(const std::vector<std::byte>& blob) {
    std::vector<float> out(blob.size() / 4);
    std::memcpy(out.data(), blob.data(), out.size() * 4);
    return out;
}

} // namespace

static_assert(std::endian::native == std::endian::little, "the spectrum blobs are stored little-endian");

std::unique_ptr<FleetStore> FleetStore::open(const std::filesystem::path& path, bool create) {
    auto db = std::make_unique<Database>(path, create ? Database::Mode::ReadWriteCreate : Database::Mode::ReadWrite);
    migrate(*db);
    return std::unique_ptr<FleetStore>(new FleetStore(std::move(db)));
}

std::unique_ptr<FleetStore> FleetStore::openReadOnly(const std::filesystem::path& path) {
    auto db = std::make_unique<Database>(path, Database::Mode::ReadOnly);
    const int version = storage::schemaVersion(*db);
    if (version > kSchemaVersion) migrate(*db); // throws TooNew with its message, changes nothing
    if (version < kSchemaVersion)
        throw StorageException{{StorageError::Code::ReadOnly,
                                path.string() + ": the store has schema version " + std::to_string(version) + " and needs upgrading to " +
                                    std::to_string(kSchemaVersion) + ", which a read-only store cannot take; open it once with write access",
                                0}};
    return std::unique_ptr<FleetStore>(new FleetStore(std::move(db)));
}

std::int64_t FleetStore::motorId(const std::string& tag) {
    auto& s = m_db->cached("SELECT id FROM motors WHERE tag = ?1");
    s.bind(1, tag);
    if (!s.step()) throw notFound(*m_db, "no motor '" + tag + "'");
    const std::int64_t id = s.integer(0);
    s.reset(); // a kept statement must not hold a read open
    return id;
}

std::optional<std::int64_t> FleetStore::pointId(std::int64_t motor, const std::string& name) {
    if (name.empty()) return std::nullopt;
    auto& s = m_db->cached("SELECT id FROM points WHERE motor_id = ?1 AND name = ?2");
    s.bind(1, motor).bind(2, name);
    if (!s.step()) {
        s.reset();
        throw notFound(*m_db, "no point '" + name + "'");
    }
    const std::int64_t id = s.integer(0);
    s.reset();
    return id;
}

bool FleetStore::hasFleet() {
    auto s = m_db->prepare("SELECT COUNT(*) FROM motors");
    s.step();
    return s.integer(0) > 0;
}

void FleetStore::saveFleet(const fleet::Fleet& f) {
    auto site = m_db->prepare("INSERT INTO sites(name, description) VALUES (?1, ?2) ON CONFLICT(name) DO UPDATE SET description = excluded.description");
    site.bind(1, f.site).bind(2, f.siteDescription).run();
    auto siteId = m_db->prepare("SELECT id FROM sites WHERE name = ?1");
    siteId.bind(1, f.site);
    siteId.step();
    const std::int64_t sid = siteId.integer(0);
    for (std::size_t i = 0; i < f.areas.size(); ++i) {
        auto a = m_db->prepare("INSERT INTO areas(site_id, name, position) VALUES (?1, ?2, ?3) ON CONFLICT(site_id, name) DO UPDATE SET position = excluded.position");
        a.bind(1, sid).bind(2, f.areas[i]).bind(3, static_cast<std::int64_t>(i)).run();
    }
    for (std::size_t i = 0; i < f.motors.size(); ++i) {
        const auto& def = f.motors[i];
        const auto& n = def.motor.nameplate;
        const auto& sev = def.motor.severity;
        auto areaId = m_db->prepare("SELECT id FROM areas WHERE site_id = ?1 AND name = ?2");
        areaId.bind(1, sid).bind(2, def.area);
        if (!areaId.step()) throw notFound(*m_db, "no area '" + def.area + "'");
        auto m = m_db->prepare(R"SQL(
            INSERT INTO motors(area_id, position, tag, description, rated_power_kw, rated_voltage_v, rated_current_a, supply_hz,
                               rated_speed_rpm, poles, drive, rotor_bars, stator_slots, driven_kind, driven_vanes, driven_speed_ratio,
                               severity_standard, severity_group, severity_support, severity_class)
            VALUES (?1, ?2, ?3, ?4, ?5, ?6, ?7, ?8, ?9, ?10, ?11, ?12, ?13, ?14, ?15, ?16, ?17, ?18, ?19, ?20)
            ON CONFLICT(tag) DO UPDATE SET area_id = excluded.area_id, position = excluded.position, description = excluded.description,
              rated_power_kw = excluded.rated_power_kw, rated_voltage_v = excluded.rated_voltage_v, rated_current_a = excluded.rated_current_a,
              supply_hz = excluded.supply_hz, rated_speed_rpm = excluded.rated_speed_rpm, poles = excluded.poles, drive = excluded.drive,
              rotor_bars = excluded.rotor_bars, stator_slots = excluded.stator_slots, driven_kind = excluded.driven_kind,
              driven_vanes = excluded.driven_vanes, driven_speed_ratio = excluded.driven_speed_ratio,
              severity_standard = excluded.severity_standard, severity_group = excluded.severity_group,
              severity_support = excluded.severity_support, severity_class = excluded.severity_class)SQL");
        const bool iso3 = sev.standard == motor::SeverityClass::Standard::Iso20816_3;
        m.bind(1, areaId.integer(0)).bind(2, static_cast<std::int64_t>(i)).bind(3, def.motor.tag).bind(4, def.description);
        m.bind(5, n.ratedPowerKw).bind(6, n.ratedVoltageV).bind(7, n.ratedCurrentA).bind(8, n.supplyHz).bind(9, n.ratedSpeedRpm);
        m.bind(10, n.poles).bind(11, n.drive == motor::DriveKind::DirectOnLine ? "direct-on-line" : "drive-fed");
        m.bind(12, n.rotorBars).bind(13, n.statorSlots).bind(14, motor::drivenKindName(def.motor.driven.kind));
        m.bind(15, def.motor.driven.vanesOrBlades).bind(16, def.motor.driven.speedRatio).bind(17, severityStandard(sev));
        if (iso3) m.bind(18, sev.group).bind(19, sev.support == motor::SupportClass::Rigid ? "rigid" : "flexible").bindNull(20);
        else m.bindNull(18).bindNull(19).bind(20, sev.iso10816Class);
        m.run();
        const std::int64_t mid = motorId(def.motor.tag);
        auto clear = m_db->prepare("DELETE FROM bearings WHERE motor_id = ?1");
        clear.bind(1, mid).run();
        for (const auto& [bearing, end] : {std::pair{&def.motor.driveEndBearing, "DE"}, std::pair{&def.motor.nonDriveEndBearing, "NDE"}}) {
            if (!*bearing) continue;
            auto b = m_db->prepare(R"SQL(INSERT INTO bearings(motor_id, end_position, designation, rolling_elements, element_diameter,
                                     pitch_diameter, contact_angle_deg, bpfo, bpfi, bsf, ftf) VALUES (?1, ?2, ?3, ?4, ?5, ?6, ?7, ?8, ?9, ?10, ?11))SQL");
            b.bind(1, mid).bind(2, end).bind(3, (*bearing)->designation);
            if (const auto* g = std::get_if<motor::BearingGeometry>(&(*bearing)->data)) {
                b.bind(4, g->rollingElements).bind(5, g->elementDiameter).bind(6, g->pitchDiameter).bind(7, g->contactAngleDeg);
                b.bindNull(8).bindNull(9).bindNull(10).bindNull(11);
            } else {
                const auto& fct = std::get<motor::BearingFactors>((*bearing)->data);
                b.bindNull(4).bindNull(5).bindNull(6).bindNull(7).bind(8, fct.bpfo).bind(9, fct.bpfi).bind(10, fct.bsf).bind(11, fct.ftf);
            }
            b.run();
        }
        for (std::size_t k = 0; k < def.points.size(); ++k) {
            const auto& p = def.points[k];
            auto s = m_db->prepare(R"SQL(INSERT INTO points(motor_id, position, name, quantity, location, direction, phase, unit, sensitivity, sensor)
                VALUES (?1, ?2, ?3, ?4, ?5, ?6, ?7, ?8, ?9, ?10)
                ON CONFLICT(motor_id, name) DO UPDATE SET position = excluded.position, quantity = excluded.quantity, location = excluded.location,
                  direction = excluded.direction, phase = excluded.phase, unit = excluded.unit, sensitivity = excluded.sensitivity, sensor = excluded.sensor)SQL");
            s.bind(1, mid).bind(2, static_cast<std::int64_t>(k)).bind(3, p.name).bind(4, quantityName(p.quantity)).bind(5, p.location);
            s.bind(6, p.direction).bind(7, p.phase).bind(8, unitSymbol(p.unit)).bind(9, p.sensitivity).bind(10, p.sensor).run();
        }
    }
    for (const auto& r : f.routes) {
        auto ins = m_db->prepare("INSERT INTO routes(name, description) VALUES (?1, ?2) ON CONFLICT(name) DO UPDATE SET description = excluded.description");
        ins.bind(1, r.name).bind(2, r.description).run();
        auto rid = m_db->prepare("SELECT id FROM routes WHERE name = ?1");
        rid.bind(1, r.name);
        rid.step();
        const std::int64_t routeId = rid.integer(0);
        auto clear = m_db->prepare("DELETE FROM route_points WHERE route_id = ?1");
        clear.bind(1, routeId).run();
        for (std::size_t k = 0; k < r.points.size(); ++k) {
            const auto pid = pointId(motorId(r.points[k].motorTag), r.points[k].pointName);
            auto rp = m_db->prepare("INSERT INTO route_points(route_id, position, point_id) VALUES (?1, ?2, ?3)");
            rp.bind(1, routeId).bind(2, static_cast<std::int64_t>(k)).bind(3, *pid).run();
        }
    }
}

fleet::Fleet FleetStore::loadFleet() {
    fleet::Fleet f;
    auto site = m_db->prepare("SELECT id, name, description FROM sites ORDER BY id LIMIT 1");
    if (!site.step()) return f;
    const std::int64_t sid = site.integer(0);
    f.site = site.text(1);
    f.siteDescription = site.text(2);
    auto areas = m_db->prepare("SELECT name FROM areas WHERE site_id = ?1 ORDER BY position");
    areas.bind(1, sid);
    while (areas.step()) f.areas.push_back(areas.text(0));
    auto motors = m_db->prepare(R"SQL(SELECT m.id, a.name, m.tag, m.description, m.rated_power_kw, m.rated_voltage_v, m.rated_current_a,
        m.supply_hz, m.rated_speed_rpm, m.poles, m.drive, m.rotor_bars, m.stator_slots, m.driven_kind, m.driven_vanes,
        m.driven_speed_ratio, m.severity_standard, m.severity_group, m.severity_support, m.severity_class
        FROM motors m JOIN areas a ON a.id = m.area_id ORDER BY m.position, m.id)SQL");
    while (motors.step()) {
        fleet::MotorDefinition def;
        const std::int64_t mid = motors.integer(0);
        def.area = motors.text(1);
        def.motor.tag = motors.text(2);
        def.description = motors.text(3);
        auto& n = def.motor.nameplate;
        n.ratedPowerKw = motors.real(4);
        n.ratedVoltageV = motors.real(5);
        n.ratedCurrentA = motors.real(6);
        n.supplyHz = motors.real(7);
        n.ratedSpeedRpm = motors.real(8);
        if (auto p = motors.optionalInteger(9)) n.poles = static_cast<int>(*p);
        n.drive = motors.text(10) == "drive-fed" ? motor::DriveKind::VariableFrequency : motor::DriveKind::DirectOnLine;
        if (auto r = motors.optionalInteger(11)) n.rotorBars = static_cast<int>(*r);
        if (auto s = motors.optionalInteger(12)) n.statorSlots = static_cast<int>(*s);
        def.motor.driven.kind = drivenKindFrom(motors.text(13));
        if (auto v = motors.optionalInteger(14)) def.motor.driven.vanesOrBlades = static_cast<int>(*v);
        def.motor.driven.speedRatio = motors.real(15);
        auto& sev = def.motor.severity;
        if (motors.text(16) == "ISO 20816-3") {
            sev.standard = motor::SeverityClass::Standard::Iso20816_3;
            sev.group = static_cast<int>(motors.integer(17));
            sev.support = motors.text(18) == "rigid" ? motor::SupportClass::Rigid : motor::SupportClass::Flexible;
        } else {
            sev.standard = motor::SeverityClass::Standard::Iso10816_1;
            sev.iso10816Class = static_cast<int>(motors.integer(19));
        }
        auto bearings = m_db->prepare(R"SQL(SELECT end_position, designation, rolling_elements, element_diameter, pitch_diameter,
            contact_angle_deg, bpfo, bpfi, bsf, ftf FROM bearings WHERE motor_id = ?1)SQL");
        bearings.bind(1, mid);
        while (bearings.step()) {
            motor::Bearing b;
            b.designation = bearings.text(1);
            if (!bearings.isNull(2))
                b.data = motor::BearingGeometry{static_cast<int>(bearings.integer(2)), bearings.real(3), bearings.real(4), bearings.real(5)};
            else
                b.data = motor::BearingFactors{bearings.real(6), bearings.real(7), bearings.real(8), bearings.real(9)};
            (bearings.text(0) == "DE" ? def.motor.driveEndBearing : def.motor.nonDriveEndBearing) = b;
        }
        auto points = m_db->prepare(R"SQL(SELECT name, quantity, location, direction, phase, unit, sensitivity, sensor
            FROM points WHERE motor_id = ?1 ORDER BY position, id)SQL");
        points.bind(1, mid);
        while (points.step()) {
            fleet::PointDefinition p;
            p.name = points.text(0);
            p.quantity = parseQuantity(points.text(1)).value_or(Quantity::Acceleration);
            p.location = points.text(2);
            p.direction = points.text(3);
            p.phase = points.text(4);
            p.unit = parseUnit(points.text(5)).value_or(Unit::G);
            p.sensitivity = points.real(6);
            p.sensor = points.text(7);
            def.points.push_back(std::move(p));
        }
        f.motors.push_back(std::move(def));
    }
    auto routes = m_db->prepare("SELECT id, name, description FROM routes ORDER BY id");
    while (routes.step()) {
        fleet::Route r;
        r.name = routes.text(1);
        r.description = routes.text(2);
        auto pts = m_db->prepare(R"SQL(SELECT m.tag, p.name FROM route_points rp JOIN points p ON p.id = rp.point_id
            JOIN motors m ON m.id = p.motor_id WHERE rp.route_id = ?1 ORDER BY rp.position)SQL");
        pts.bind(1, routes.integer(0));
        while (pts.step()) r.points.push_back({pts.text(0), pts.text(1)});
        f.routes.push_back(std::move(r));
    }
    return f;
}

std::optional<RoundRow> FleetStore::roundByManifestHash(const std::string& hash) {
    auto s = m_db->prepare("SELECT id FROM rounds WHERE manifest_hash = ?1");
    s.bind(1, hash);
    if (!s.step()) return std::nullopt;
    return round(s.integer(0));
}

std::optional<RoundRow> FleetStore::round(std::int64_t id) {
    auto s = m_db->prepare(R"SQL(SELECT r.id, ro.name, r.started_at, r.technician, r.notes, r.manifest_hash, r.source_folder, r.imported_at
        FROM rounds r LEFT JOIN routes ro ON ro.id = r.route_id WHERE r.id = ?1)SQL");
    s.bind(1, id);
    if (!s.step()) return std::nullopt;
    RoundRow r;
    r.id = s.integer(0);
    if (!s.isNull(1)) r.route = s.text(1);
    r.startedAt = s.text(2);
    r.technician = s.text(3);
    r.notes = s.text(4);
    r.manifestHash = s.text(5);
    r.sourceFolder = s.text(6);
    r.importedAt = s.text(7);
    return r;
}

std::int64_t FleetStore::insertRound(const RoundRow& r) {
    std::optional<std::int64_t> routeId;
    if (r.route) {
        auto s = m_db->prepare("SELECT id FROM routes WHERE name = ?1");
        s.bind(1, *r.route);
        if (!s.step()) throw notFound(*m_db, "no route '" + *r.route + "'");
        routeId = s.integer(0);
    }
    auto s = m_db->prepare(R"SQL(INSERT INTO rounds(route_id, started_at, technician, notes, manifest_hash, source_folder, imported_at)
        VALUES (?1, ?2, ?3, ?4, ?5, ?6, ?7))SQL");
    s.bind(1, routeId).bind(2, r.startedAt).bind(3, r.technician).bind(4, r.notes).bind(5, r.manifestHash).bind(6, r.sourceFolder).bind(7, r.importedAt).run();
    return m_db->lastInsertId();
}

void FleetStore::setRoundManifestHash(std::int64_t roundId, const std::string& hash) {
    auto s = m_db->prepare("UPDATE rounds SET manifest_hash = ?1 WHERE id = ?2");
    s.bind(1, hash).bind(2, roundId).run();
}

void FleetStore::deleteRound(std::int64_t id) {
    auto s = m_db->prepare("DELETE FROM rounds WHERE id = ?1");
    s.bind(1, id).run();
    // Raw files no other recording uses go too.
    m_db->execute("DELETE FROM source_files WHERE hash NOT IN (SELECT file_hash FROM recordings)");
}

std::vector<RoundRow> FleetStore::rounds() {
    std::vector<RoundRow> out;
    auto s = m_db->prepare("SELECT id FROM rounds ORDER BY started_at, id");
    while (s.step()) out.push_back(*round(s.integer(0)));
    return out;
}

void FleetStore::storeSourceFile(const std::string& hash, std::span<const std::byte> bytes) {
    // Bound in place (a raw file is up to megabytes, copied once more for nothing otherwise), and
    // unbound again before `bytes` can go: the statement is kept for the next file.
    auto& s = m_db->cached("INSERT OR IGNORE INTO source_files(hash, size, bytes) VALUES (?1, ?2, ?3)");
    s.bind(1, hash).bind(2, static_cast<std::int64_t>(bytes.size())).bindBlobInPlace(3, bytes);
    try {
        s.run();
    } catch (...) {
        s.reset();
        throw;
    }
    s.reset();
}

std::vector<std::byte> FleetStore::sourceFile(const std::string& hash) {
    auto s = m_db->prepare("SELECT bytes FROM source_files WHERE hash = ?1");
    s.bind(1, hash);
    if (!s.step()) throw notFound(*m_db, "no stored file with hash " + hash);
    return s.blob(0);
}

std::int64_t FleetStore::insertRecording(const RecordingRow& r) {
    const auto mid = motorId(r.motorTag);
    const auto pid = pointId(mid, r.pointName);
    // Kept: an import inserts a row per file (preparing it anew was a hundredth of the import).
    auto& s = m_db->cached(R"SQL(INSERT INTO recordings(round_id, point_id, recorded_at, sample_rate_hz, sample_count, file_name, file_hash,
        file_format, channel_index, unit, sensitivity, quality, speed_rpm, load_percent)
        VALUES (?1, ?2, ?3, ?4, ?5, ?6, ?7, ?8, ?9, ?10, ?11, ?12, ?13, ?14))SQL");
    s.bind(1, r.roundId).bind(2, *pid).bind(3, r.recordedAt).bind(4, r.sampleRateHz).bind(5, r.sampleCount).bind(6, r.fileName);
    s.bind(7, r.fileHash).bind(8, r.fileFormat).bind(9, r.channelIndex).bind(10, r.unit).bind(11, r.sensitivity).bind(12, r.quality);
    s.bind(13, r.speedRpm).bind(14, r.loadPercent).run();
    return m_db->lastInsertId();
}

std::vector<RecordingRow> FleetStore::recordings(std::int64_t roundId) {
    std::vector<RecordingRow> out;
    auto s = m_db->prepare(R"SQL(SELECT r.id, r.round_id, m.tag, p.name, r.recorded_at, r.sample_rate_hz, r.sample_count, r.file_name,
        r.file_hash, r.file_format, r.channel_index, r.unit, r.sensitivity, r.quality, r.speed_rpm, r.load_percent
        FROM recordings r JOIN points p ON p.id = r.point_id JOIN motors m ON m.id = p.motor_id
        WHERE r.round_id = ?1 ORDER BY m.position, p.position)SQL");
    s.bind(1, roundId);
    while (s.step()) {
        RecordingRow r;
        r.id = s.integer(0);
        r.roundId = s.integer(1);
        r.motorTag = s.text(2);
        r.pointName = s.text(3);
        r.recordedAt = s.text(4);
        r.sampleRateHz = s.real(5);
        r.sampleCount = s.integer(6);
        r.fileName = s.text(7);
        r.fileHash = s.text(8);
        r.fileFormat = s.text(9);
        r.channelIndex = static_cast<int>(s.integer(10));
        r.unit = s.text(11);
        r.sensitivity = s.real(12);
        r.quality = s.text(13);
        r.speedRpm = s.optionalReal(14);
        r.loadPercent = s.optionalReal(15);
        out.push_back(std::move(r));
    }
    return out;
}

void FleetStore::deleteAnalysis(std::int64_t roundId) {
    for (const char* sql : {"DELETE FROM spectra WHERE recording_id IN (SELECT id FROM recordings WHERE round_id = ?1)",
                            "DELETE FROM indicators WHERE round_id = ?1", "DELETE FROM findings WHERE round_id = ?1",
                            "DELETE FROM round_motors WHERE round_id = ?1"}) {
        auto s = m_db->prepare(sql);
        s.bind(1, roundId).run();
    }
}

void FleetStore::insertSpectrum(const SpectrumRow& r) {
    auto& s = m_db->cached(R"SQL(INSERT INTO spectra(recording_id, kind, quantity, unit, scale, window_name, start_hz, resolution_hz, enbw_hz,
        averages, parameters, analysis_version, line_values, sample_rate_hz, segment_length, transform_length)
        VALUES (?1, ?2, ?3, ?4, ?5, ?6, ?7, ?8, ?9, ?10, ?11, ?12, ?13, ?14, ?15, ?16))SQL");
    s.bind(1, r.recordingId).bind(2, r.kind).bind(3, r.quantity).bind(4, r.unit).bind(5, r.scale).bind(6, r.window).bind(7, r.startHz);
    s.bind(8, r.resolutionHz).bind(9, r.enbwHz).bind(10, r.averages).bind(11, r.parameters).bind(12, r.analysisVersion);
    s.bindBlob(13, floatBlob(r.values)).bind(14, r.sampleRateHz).bind(15, r.segmentLength).bind(16, r.transformLength).run();
}

std::optional<SpectrumRow> FleetStore::spectrum(std::int64_t recordingId, const std::string& kind) {
    auto s = m_db->prepare(R"SQL(SELECT quantity, unit, scale, window_name, start_hz, resolution_hz, enbw_hz, averages, parameters,
        analysis_version, line_values, sample_rate_hz, segment_length, transform_length FROM spectra WHERE recording_id = ?1 AND kind = ?2)SQL");
    s.bind(1, recordingId).bind(2, kind);
    if (!s.step()) return std::nullopt;
    SpectrumRow r;
    r.recordingId = recordingId;
    r.kind = kind;
    r.quantity = s.text(0);
    r.unit = s.text(1);
    r.scale = s.text(2);
    r.window = s.text(3);
    r.startHz = s.real(4);
    r.resolutionHz = s.real(5);
    r.enbwHz = s.real(6);
    r.averages = static_cast<int>(s.integer(7));
    r.parameters = s.text(8);
    r.analysisVersion = static_cast<int>(s.integer(9));
    r.values = floatsFrom(s.blob(10));
    r.sampleRateHz = s.real(11);
    r.segmentLength = s.integer(12);
    r.transformLength = s.integer(13);
    return r;
}

void FleetStore::insertRoundMotor(const RoundMotorRow& r) {
    auto& s = m_db->cached(R"SQL(INSERT INTO round_motors(round_id, motor_id, line_hz, line_method, speed_rpm, speed_method, speed_confidence,
        slip, load_percent, analysis_version, notes) VALUES (?1, ?2, ?3, ?4, ?5, ?6, ?7, ?8, ?9, ?10, ?11))SQL");
    s.bind(1, r.roundId).bind(2, motorId(r.motorTag)).bind(3, r.lineHz).bind(4, r.lineMethod).bind(5, r.speedRpm).bind(6, r.speedMethod);
    s.bind(7, r.speedConfidence).bind(8, r.slip).bind(9, r.loadPercent).bind(10, r.analysisVersion).bind(11, r.notes).run();
}

std::vector<RoundMotorRow> FleetStore::roundMotors(std::int64_t roundId) {
    std::vector<RoundMotorRow> out;
    auto s = m_db->prepare(R"SQL(SELECT m.tag, rm.line_hz, rm.line_method, rm.speed_rpm, rm.speed_method, rm.speed_confidence, rm.slip,
        rm.load_percent, rm.analysis_version, rm.notes FROM round_motors rm JOIN motors m ON m.id = rm.motor_id
        WHERE rm.round_id = ?1 ORDER BY m.position)SQL");
    s.bind(1, roundId);
    while (s.step()) {
        RoundMotorRow r;
        r.roundId = roundId;
        r.motorTag = s.text(0);
        r.lineHz = s.real(1);
        r.lineMethod = s.text(2);
        r.speedRpm = s.real(3);
        r.speedMethod = s.text(4);
        r.speedConfidence = s.real(5);
        r.slip = s.real(6);
        r.loadPercent = s.optionalReal(7);
        r.analysisVersion = static_cast<int>(s.integer(8));
        r.notes = s.text(9);
        out.push_back(std::move(r));
    }
    return out;
}

void FleetStore::insertIndicator(std::int64_t roundId, const IndicatorRow& r) {
    const auto mid = motorId(r.motorTag);
    const auto pid = pointId(mid, r.pointName);
    auto& s = m_db->cached("INSERT INTO indicators(round_id, motor_id, point_id, name, value, unit) VALUES (?1, ?2, ?3, ?4, ?5, ?6)");
    s.bind(1, roundId).bind(2, mid).bind(3, pid).bind(4, r.name).bind(5, r.value).bind(6, r.unit).run();
}

std::vector<IndicatorRow> FleetStore::indicators(std::int64_t roundId, const std::string& motorTag) {
    std::vector<IndicatorRow> out;
    auto s = m_db->prepare(R"SQL(SELECT IFNULL(p.name, ''), i.name, i.value, i.unit FROM indicators i LEFT JOIN points p ON p.id = i.point_id
        WHERE i.round_id = ?1 AND i.motor_id = ?2 ORDER BY i.rowid)SQL");
    s.bind(1, roundId).bind(2, motorId(motorTag));
    while (s.step()) out.push_back({motorTag, s.text(0), s.text(1), s.real(2), s.text(3)});
    return out;
}

void FleetStore::insertFinding(std::int64_t roundId, const std::string& motorTag, const Finding& f) {
    auto& s = m_db->cached(R"SQL(INSERT INTO findings(round_id, motor_id, fault, severity, withheld, withheld_reason, origin, confidence,
        explanation, action, rule, evidence) VALUES (?1, ?2, ?3, ?4, ?5, ?6, ?7, ?8, ?9, ?10, ?11, ?12))SQL");
    s.bind(1, roundId).bind(2, motorId(motorTag)).bind(3, f.fault).bind(4, f.severity).bind(5, f.withheld ? 1 : 0).bind(6, f.withheldReason);
    s.bind(7, diagnosis::originName(f.origin)).bind(8, f.confidence).bind(9, f.explanation).bind(10, f.action).bind(11, f.rule);
    s.bind(12, evidenceJson(f.evidence)).run();
}

std::vector<FindingRow> FleetStore::findings(std::optional<std::int64_t> roundId, const std::string& motorTag) {
    std::vector<FindingRow> out;
    auto s = m_db->prepare(R"SQL(SELECT f.id, f.round_id, r.started_at, m.tag, f.fault, f.severity, f.withheld, f.withheld_reason, f.origin,
        f.confidence, f.explanation, f.action, f.rule, f.evidence FROM findings f JOIN rounds r ON r.id = f.round_id
        JOIN motors m ON m.id = f.motor_id
        WHERE (?1 IS NULL OR f.round_id = ?1) AND (?2 = '' OR m.tag = ?2)
        ORDER BY r.started_at, m.position, f.severity DESC, f.confidence DESC)SQL");
    s.bind(1, roundId).bind(2, motorTag);
    while (s.step()) {
        FindingRow r;
        r.id = s.integer(0);
        r.roundId = s.integer(1);
        r.roundStartedAt = s.text(2);
        r.motorTag = s.text(3);
        auto& f = r.finding;
        f.fault = s.text(4);
        f.severity = static_cast<int>(s.integer(5));
        f.withheld = s.integer(6) != 0;
        f.withheldReason = s.text(7);
        f.origin = originFrom(s.text(8));
        f.confidence = s.real(9);
        f.explanation = s.text(10);
        f.action = s.text(11);
        f.rule = s.text(12);
        f.evidence = evidenceFrom(s.text(13));
        out.push_back(std::move(r));
    }
    return out;
}

std::vector<TrendPoint> FleetStore::trend(const std::string& motorTag, const std::string& pointName, const std::string& indicator) {
    const auto mid = motorId(motorTag);
    const auto pid = pointId(mid, pointName);
    std::vector<TrendPoint> out;
    auto& s = m_db->cached(R"SQL(SELECT i.round_id, r.started_at, i.value, i.unit FROM indicators i JOIN rounds r ON r.id = i.round_id
        WHERE i.motor_id = ?1 AND i.point_id IS ?2 AND i.name = ?3 ORDER BY r.started_at, r.id)SQL");
    s.bind(1, mid).bind(2, pid).bind(3, indicator);
    while (s.step()) out.push_back({s.integer(0), s.text(1), s.real(2), s.text(3)});
    s.reset();
    return out;
}

bool FleetStore::clearAlarmLimit(const std::string& motorTag, const std::string& pointName, const std::string& indicator) {
    const auto mid = motorId(motorTag);
    const auto pid = pointId(mid, pointName);
    auto del = m_db->prepare("DELETE FROM alarm_limits WHERE motor_id = ?1 AND point_id IS ?2 AND indicator = ?3");
    del.bind(1, mid).bind(2, pid).bind(3, indicator).run();
    return m_db->changes() > 0;
}

void FleetStore::setAlarmLimit(const AlarmLimitRow& a) {
    clearAlarmLimit(a.motorTag, a.pointName, a.indicator);
    const auto mid = motorId(a.motorTag);
    const auto pid = pointId(mid, a.pointName);
    auto s = m_db->prepare(R"SQL(INSERT INTO alarm_limits(motor_id, point_id, indicator, method, alert, alarm, baseline_rounds, source, updated_at)
        VALUES (?1, ?2, ?3, ?4, ?5, ?6, ?7, ?8, ?9))SQL");
    s.bind(1, mid).bind(2, pid).bind(3, a.indicator).bind(4, a.method).bind(5, a.alert).bind(6, a.alarm);
    s.bind(7, a.baselineRounds ? std::optional<std::int64_t>(*a.baselineRounds) : std::nullopt).bind(8, a.source).bind(9, a.updatedAt).run();
}

std::vector<AlarmLimitRow> FleetStore::alarmLimits(const std::string& motorTag) {
    std::vector<AlarmLimitRow> out;
    auto s = m_db->prepare(R"SQL(SELECT IFNULL(p.name, ''), a.indicator, a.method, a.alert, a.alarm, a.baseline_rounds, a.source, a.updated_at
        FROM alarm_limits a LEFT JOIN points p ON p.id = a.point_id WHERE a.motor_id = ?1 ORDER BY a.id)SQL");
    s.bind(1, motorId(motorTag));
    while (s.step()) {
        AlarmLimitRow a;
        a.motorTag = motorTag;
        a.pointName = s.text(0);
        a.indicator = s.text(1);
        a.method = s.text(2);
        a.alert = s.optionalReal(3);
        a.alarm = s.optionalReal(4);
        if (auto b = s.optionalInteger(5)) a.baselineRounds = static_cast<int>(*b);
        a.source = s.text(6);
        a.updatedAt = s.text(7);
        out.push_back(std::move(a));
    }
    return out;
}

void FleetStore::checkpoint() { m_db->execute("PRAGMA wal_checkpoint(TRUNCATE)"); }

std::vector<std::string> FleetStore::checkConsistency() {
    std::vector<std::string> problems;
    auto integrity = m_db->prepare("PRAGMA integrity_check");
    while (integrity.step())
        if (integrity.text(0) != "ok") problems.push_back("integrity: " + integrity.text(0));
    auto fk = m_db->prepare("PRAGMA foreign_key_check");
    while (fk.step()) problems.push_back("foreign key broken in table " + fk.text(0));
    auto orphans = m_db->prepare("SELECT COUNT(*) FROM recordings WHERE file_hash NOT IN (SELECT hash FROM source_files)");
    orphans.step();
    if (orphans.integer(0) > 0) problems.push_back(std::to_string(orphans.integer(0)) + " recording(s) without their raw file");
    auto unanalysed = m_db->prepare(R"SQL(SELECT COUNT(*) FROM rounds r WHERE NOT EXISTS (SELECT 1 FROM round_motors rm WHERE rm.round_id = r.id)
        AND EXISTS (SELECT 1 FROM recordings x WHERE x.round_id = r.id))SQL");
    unanalysed.step();
    if (unanalysed.integer(0) > 0) problems.push_back(std::to_string(unanalysed.integer(0)) + " round(s) stored without their analysis");
    return problems;
}

} // namespace humwise::storage
