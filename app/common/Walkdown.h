#pragma once
// Importing a walkdown folder into the fleet store, and re-analysing stored rounds.
//
// Import is atomic: the round, its raw files, recordings, analysis, indicators and findings are
// committed in one transaction, or nothing is. Every bad file is reported with its name and the
// reason; with skipBad the good ones import and the bad ones are listed. A walkdown already
// imported (same manifest and files, by SHA-256) is refused unless replace is asked. Recordings
// whose quality flags say the data are bad (clipped, flat, drifting bias, NaN) are stored - the
// analyst may want to see them - but left out of the diagnosis, and listed as flagged.

#include "core/model/Result.h"
#include "storage/FleetStore.h"

#include <cstdint>
#include <filesystem>
#include <functional>
#include <optional>
#include <string>
#include <vector>

namespace humwise::workflow {

struct ImportProgress {
    std::size_t done = 0;
    std::size_t total = 0;
    std::string stage; // "checking files", "analysing P-101", ...
};

// Return false to cancel; the import then rolls back and reports cancelled.
using ProgressCallback = std::function<bool(const ImportProgress&)>;

struct ImportOptions {
    bool skipBad = false;
    bool dryRun = false;   // check and match only, write nothing
    bool replace = false;  // replace a walkdown imported before
    ProgressCallback progress;
    unsigned threads = 0;  // analysis threads; 0 = the machine's cores
};

struct ImportProblem {
    std::string file;    // relative to the walkdown folder
    std::string kind;    // unreadable, missing, wrong_rate, too_short, wrong_quantity, no_channel, unknown_point,
                         // duplicate, outside_folder, clipped, flat_line, bias_drift, non_finite
    std::string reason;  // plain words
};

struct MatchedRecording {
    std::string file;
    int channel = 1;
    std::string motorTag;
    std::string pointName;
    std::string how;     // "manifest" or "file name"
};

struct ImportReport {
    std::string folder;
    std::string roundStart;
    std::vector<MatchedRecording> matched;
    std::vector<ImportProblem> bad;      // not imported
    std::vector<ImportProblem> flagged;  // imported, left out of the diagnosis
    std::vector<std::string> unmatched;  // files neither listed nor matched by name
    std::optional<std::int64_t> roundId;
    bool replaced = false;
    // The round went through a rollback journal, the store having no other connection
    // (storage/Database.h, SoleWriterJournal); false when it went through the write-ahead log.
    bool throughJournal = false;
    std::size_t motorsAnalysed = 0;
    std::size_t findings = 0;
    std::vector<std::string> notes;
};

struct ImportError {
    enum class Code { NoFolder, NoManifest, BadManifest, NoFleet, BadFiles, AlreadyImported, Cancelled, Storage };
    Code code = Code::Storage;
    std::string message;
    ImportReport report; // what was found before the import stopped
};

[[nodiscard]] Result<ImportReport, ImportError> importWalkdown(storage::FleetStore& store, const std::filesystem::path& folder,
                                                               const ImportOptions& options = {});

struct ReanalysisReport {
    std::size_t rounds = 0;
    std::size_t motors = 0;
    std::size_t findings = 0;
};

// Re-analyses every stored round from its raw files with the current rules (one transaction per
// round). Running it twice gives the same products.
[[nodiscard]] Result<ReanalysisReport, ImportError> reanalyseAll(storage::FleetStore& store, const ProgressCallback& progress = {},
                                                                 unsigned threads = 0);

} // namespace humwise::workflow
