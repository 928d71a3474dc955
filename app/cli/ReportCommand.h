#pragma once
#include <ostream>
#include <string>
#include <vector>

namespace humwise::cli {
// humwise-cli report --motor TAG [--round latest|DATE|ID] --out FILE.pdf [--paper a4|letter] [--comment TEXT]
// humwise-cli report --round latest|DATE|ID --out FILE.pdf [--paper a4|letter]        (route summary)
int runReport(const std::vector<std::string>& args, std::ostream& out);
// humwise-cli export --round latest|DATE|ID --what findings|indicators --out FILE.csv
// humwise-cli export --trend --motor TAG [--point NAME] --indicator NAME --out FILE.csv
int runExport(const std::vector<std::string>& args, std::ostream& out);
} // namespace humwise::cli
