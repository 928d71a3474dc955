// humwise-cli: the headless command line. Exit codes: 0 ok, 1 processing error (stderr names
// the file and the problem), 2 usage error.

#include "app/cli/CliError.h"
#include "app/cli/DiagnoseCommand.h"
#include "app/cli/FaultsCommand.h"
#include "app/cli/InspectCommand.h"
#include "app/cli/LimitsCommand.h"
#include "app/cli/ReportCommand.h"
#include "app/cli/SampleFleetCommand.h"
#include "app/cli/SpectrumCommand.h"
#include "app/cli/StoreCommands.h"

#include <exception>
#include <iostream>
#include <string>
#include <vector>

namespace {

constexpr const char* kUsage = R"(usage: humwise-cli COMMAND [options]

Commands:
  inspect FILE [--json]
      Channels, sample rate, duration, per-channel waveform statistics and quality flags.
  spectrum FILE [--channel N] [--window rect|hann|hamming|blackman-harris|kaiser:BETA|flattop]
           [--lines N | --resolution HZ] [--fmax HZ] [--averages N] [--overlap F]
           [--scale peak|rms|pp|psd] [--quantity acceleration|velocity|displacement|current|voltage]
           [--input-unit U] [--input-scale F] [--rate HZ] [--as velocity|displacement|acceleration]
           [--unit U] [--cutoff HZ] [--band LO:HI] [--zoom CENTRE:SPAN] [--envelope LO:HI|auto]
           [--envelope-squared] [--db] [--peaks N] [--full] [--json|--csv]
      Averaged (Welch), envelope or zoom spectrum of one channel, its strongest peaks and
      the overall RMS level in a band. --db gives levels in dB re the ISO 1683 references
      (1 um/s^2, 1 nm/s, 1 pm; 1 A and 1 V for current and voltage).
  faults --line-hz F --poles P [--speed-rpm N | --slip S] [--rated-rpm N] [--rotor-bars R]
         [--bearing n=..,d=..,D=..[,angle=DEG] | --bearing-factors BPFO=..,BPFI=..,BSF=..,FTF=..]
         [--vanes N] [--json]
      The fault-frequency table: running-speed harmonics, line and pole-pass lines, bearing
      defect lines (d and D in one unit of length; factors in multiples of shaft frequency,
      BSF as single spin), broken-bar, eccentricity, slot-harmonic, shorted-turn and bearing
      components of the stator current.
  diagnose FILE [--channel N] [--quantity acceleration|velocity|current|voltage] [--input-unit U]
           [--direction H|V|A[,...]] [--location DE|NDE[,...]] --line-hz F --poles P [--speed-rpm N]
           [--rated-rpm N] [--rotor-bars R] [--bearing ... | --bearing-factors ...] [--vanes N]
           [--machine-group 1|2] [--support rigid|flexible] [--power-off FILE] [--json]
      Operating point (supply frequency, speed without a tachometer, slip, load), indicators and
      findings with their evidence. Vibration channels are analysed one by one (--direction and
      --location give each channel's, default H at DE); current or voltage channels are phases
      A, B, C. The bearing given applies to both ends. --power-off names a recording made just
      after the supply was cut: lines that vanish at once are electrical.

Fleet store (every command takes --db PATH; default $XDG_DATA_HOME/humwise/fleet.db or
~/.local/share/humwise/fleet.db):
  db init                       create (or migrate) the store
  db backup FILE                copy the store into FILE (SQLite online backup; the store may
                                stay in use meanwhile)
  db restore FILE               check FILE, keep the store as it was in STORE.before-restore,
                                then replace the store's content by FILE
  fleet import FILE | fleet export FILE
                                the fleet file: site, areas, motors, points, routes (JSON)
  import FOLDER [--skip-bad] [--dry-run] [--replace] [--json]
                                import a walkdown folder described by its manifest.csv
  reanalyse                     analyse every stored round again with the current rules
  motors [--json] | rounds [--json]
  findings [--round latest|DATE|ID] [--motor TAG] [--json]
  trend --motor TAG [--point NAME] --indicator NAME [--json]
  compare --motor TAG --point NAME --round A --round B [--kind velocity|envelope|current|zoom]
          [--grow-db DB] [--json]
                                order-normalised comparison: the lines that appeared or grew
  limits [--motor TAG] [--json]  the alarm limits in force at the latest round (stored or default)
  limits set --motor TAG [--point NAME] --indicator NAME --alarm X [--alert Y]
  limits clear --motor TAG [--point NAME] --indicator NAME
  limits suggest --method iso-zone|statistical|percent [--motor TAG] [--indicator NAME]
                 [--baseline N] [--store]
                                limits from the first N rounds (6); --store keeps them, all or none

Reports:
  report --motor TAG [--round latest|DATE|ID] --out FILE.pdf [--paper a4|letter] [--comment TEXT]
                                the finding sheet of one motor (PDF)
  report --round latest|DATE|ID --out FILE.pdf [--paper a4|letter]
                                the route summary: every motor of the round, most severe first
  export --round latest|DATE|ID --what findings|indicators --out FILE.csv
  export --trend --motor TAG [--point NAME] --indicator NAME --out FILE.csv

Sample data:
  sample-fleet --out DIR [--db PATH]
      Writes the sample fleet (a fictional water works: 12 motors, 13 monthly walkdowns with
      seeded faults, truth.json) under DIR; with --db also creates that store and imports the
      fleet and walkdown-01..12 (walkdown-13 is left to import by hand). PATH must be a new store.

Files: WAV (PCM 8/16/24/32-bit, float 32/64, extensible) and CSV (see README.md).
A WAV carries no unit: --quantity (default acceleration) and --input-unit (default g for
acceleration, mm/s for velocity, um for displacement, A for current, V for voltage) say
what its samples are; --input-scale multiplies them first (e.g. 1/sensitivity).

Safety: measuring on live motor circuits can kill. Use equipment rated for the measurement
category, fit clamps and taps de-energised and locked out where possible, wear arc-flash
protection, and leave the work to qualified persons under local codes and site rules.
)";

} // namespace

int main(int argc, char** argv) {
    using namespace humwise::cli;
    std::vector<std::string> args(argv + 1, argv + argc);
    if (args.empty()) {
        std::cerr << kUsage;
        return kExitUsageError;
    }
    const std::string command = args.front();
    args.erase(args.begin());
    try {
        if (command == "--help" || command == "-h" || command == "help") {
            std::cout << kUsage;
            return kExitOk;
        }
        if (command == "inspect") return runInspect(args, std::cout);
        if (command == "spectrum") return runSpectrum(args, std::cout);
        if (command == "faults") return runFaults(args, std::cout);
        if (command == "diagnose") return runDiagnose(args, std::cout);
        if (command == "db") return runDb(args, std::cout);
        if (command == "fleet") return runFleet(args, std::cout);
        if (command == "import") return runImport(args, std::cout);
        if (command == "reanalyse") return runReanalyse(args, std::cout);
        if (command == "motors") return runMotors(args, std::cout);
        if (command == "rounds") return runRounds(args, std::cout);
        if (command == "findings") return runFindings(args, std::cout);
        if (command == "trend") return runTrend(args, std::cout);
        if (command == "compare") return runCompare(args, std::cout);
        if (command == "limits") return runLimits(args, std::cout);
        if (command == "sample-fleet") return runSampleFleet(args, std::cout);
        if (command == "report") return runReport(args, std::cout);
        if (command == "export") return runExport(args, std::cout);
        throw UsageError("unknown command '" + command + "'");
    } catch (const UsageError& e) {
        std::cerr << "humwise-cli: usage error: " << e.what() << "\n(run 'humwise-cli --help' for the commands and options)\n";
        return kExitUsageError;
    } catch (const ProcessingError& e) {
        std::cerr << "humwise-cli: error: " << e.what() << '\n';
        return kExitProcessingError;
    } catch (const std::exception& e) {
        std::cerr << "humwise-cli: error: " << e.what() << '\n';
        return kExitProcessingError;
    }
}
