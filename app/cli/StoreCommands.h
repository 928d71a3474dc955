#pragma once
// Commands on the fleet store: db init, fleet import/export, import, reanalyse, motors, rounds,
// findings, trend, compare. All take --db PATH (default: the user's data directory,
// $XDG_DATA_HOME/humwise/fleet.db or ~/.local/share/humwise/fleet.db).

#include <ostream>
#include <string>
#include <vector>

namespace humwise::cli {

int runDb(const std::vector<std::string>& args, std::ostream& out);
int runFleet(const std::vector<std::string>& args, std::ostream& out);
int runImport(const std::vector<std::string>& args, std::ostream& out);
int runReanalyse(const std::vector<std::string>& args, std::ostream& out);
int runMotors(const std::vector<std::string>& args, std::ostream& out);
int runRounds(const std::vector<std::string>& args, std::ostream& out);
int runFindings(const std::vector<std::string>& args, std::ostream& out);
int runTrend(const std::vector<std::string>& args, std::ostream& out);
int runCompare(const std::vector<std::string>& args, std::ostream& out);

} // namespace humwise::cli
