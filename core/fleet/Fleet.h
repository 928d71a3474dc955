#pragma once
// A plant's fleet as Humwise knows it: the site, its areas, the motors with their measurement
// points, and the routes a technician walks. Plain data shared by the fleet file, the store and
// the import.

#include "core/model/Units.h"
#include "core/motor/Motor.h"

#include <optional>
#include <string>
#include <vector>

namespace humwise::fleet {

// One measurement point of a motor: a vibration sensor position or one phase of current/voltage.
struct PointDefinition {
    std::string name;          // unique within the motor: "DE-H", "NDE-V", "DE-A", "I-A", "V-AB"
    Quantity quantity = Quantity::Acceleration;
    std::string location;      // "DE" or "NDE" for vibration, empty for electrical points
    std::string direction;     // "H", "V" or "A" for vibration, empty for electrical points
    std::string phase;         // "A", "B", "C" (current, phase voltage) or "AB", "BC", "CA" (line voltage)
    Unit unit = Unit::G;       // unit of a sample after dividing by the sensitivity
    double sensitivity = 1.0;  // recorded value per unit (e.g. 0.1 for a 100 mV/g sensor recorded in V)
    std::string sensor;        // free text: make-neutral description of the sensor
};

struct MotorDefinition {
    motor::Motor motor;
    std::string area;
    std::string description;
    std::vector<PointDefinition> points;

    const PointDefinition* point(const std::string& name) const;
};

struct RoutePoint {
    std::string motorTag;
    std::string pointName;
};

struct Route {
    std::string name;
    std::string description;
    std::vector<RoutePoint> points; // in walking order
};

struct Fleet {
    std::string site;
    std::string siteDescription;
    std::vector<std::string> areas;
    std::vector<MotorDefinition> motors;
    std::vector<Route> routes;

    const MotorDefinition* motor(const std::string& tag) const;
};

struct FleetIssue {
    std::string where;   // "motors[3] P-101 points[2]"
    std::string message;
};

// Consistency: unique tags and point names, known areas, routes naming existing points, valid
// motors (motor::validate), vibration points with location and direction, electrical points
// with a phase. Empty when all is well.
std::vector<FleetIssue> validate(const Fleet& fleet);

} // namespace humwise::fleet
