#include "core/fleet/Fleet.h"

#include <map>
#include <set>

namespace humwise::fleet {

const PointDefinition* MotorDefinition::point(const std::string& name) const {
    for (const auto& p : points)
        if (p.name == name) return &p;
    return nullptr;
}

const MotorDefinition* Fleet::motor(const std::string& tag) const {
    for (const auto& m : motors)
        if (m.motor.tag == tag) return &m;
    return nullptr;
}

std::vector<FleetIssue> validate(const Fleet& f) {
    std::vector<FleetIssue> out;
    if (f.site.empty()) out.push_back({"site", "the site needs a name"});
    std::set<std::string> areas(f.areas.begin(), f.areas.end());
    if (areas.size() != f.areas.size()) out.push_back({"areas", "an area name appears twice"});
    std::map<std::string, const MotorDefinition*> byTag; // the first motor of each tag, for the routes below
    for (std::size_t i = 0; i < f.motors.size(); ++i) {
        const auto& m = f.motors[i];
        const std::string where = "motors[" + std::to_string(i) + "] " + m.motor.tag;
        if (!byTag.emplace(m.motor.tag, &m).second) out.push_back({where, "motor tag '" + m.motor.tag + "' appears twice"});
        if (!areas.count(m.area)) out.push_back({where, "area '" + m.area + "' is not one of the site's areas"});
        for (const auto& issue : motor::validate(m.motor)) out.push_back({where + " " + issue.field, issue.message});
        std::set<std::string> names;
        for (std::size_t k = 0; k < m.points.size(); ++k) {
            const auto& p = m.points[k];
            const std::string pw = where + " points[" + std::to_string(k) + "] " + p.name;
            if (p.name.empty()) out.push_back({pw, "a point needs a name"});
            if (!names.insert(p.name).second) out.push_back({pw, "point name '" + p.name + "' appears twice on " + m.motor.tag});
            if (quantityOf(p.unit) != p.quantity) out.push_back({pw, std::string("unit ") + std::string(unitSymbol(p.unit)) + " is not a unit of " + std::string(quantityName(p.quantity))});
            if (!(p.sensitivity > 0)) out.push_back({pw, "the sensitivity must be > 0"});
            const bool vibration = p.quantity == Quantity::Acceleration || p.quantity == Quantity::Velocity || p.quantity == Quantity::Displacement;
            if (vibration && ((p.location != "DE" && p.location != "NDE") || (p.direction != "H" && p.direction != "V" && p.direction != "A")))
                out.push_back({pw, "a vibration point needs location DE or NDE and direction H, V or A"});
            if (!vibration) {
                static const std::set<std::string> phases{"A", "B", "C", "AB", "BC", "CA"};
                if (!phases.count(p.phase)) out.push_back({pw, "an electrical point needs a phase: A, B, C, AB, BC or CA"});
            }
        }
    }
    std::set<std::string> routeNames;
    for (std::size_t r = 0; r < f.routes.size(); ++r) {
        const auto& route = f.routes[r];
        const std::string where = "routes[" + std::to_string(r) + "] " + route.name;
        if (!routeNames.insert(route.name).second) out.push_back({where, "route name appears twice"});
        for (const auto& rp : route.points) {
            const auto it = byTag.find(rp.motorTag); // not f.motor(): a route of every point of a large fleet
            const MotorDefinition* m = it == byTag.end() ? nullptr : it->second;
            if (!m) out.push_back({where, "motor '" + rp.motorTag + "' is not in the fleet"});
            else if (!m->point(rp.pointName)) out.push_back({where, "motor '" + rp.motorTag + "' has no point '" + rp.pointName + "'"});
        }
    }
    return out;
}

} // namespace humwise::fleet
