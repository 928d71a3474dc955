#include "app/cli/ReportCommand.h"

#include "app/cli/ArgParser.h"
#include "app/cli/CliError.h"
#include "app/cli/StoreAccess.h"
#include "app/common/ReportData.h"
#include "storage/FleetStore.h"

#ifdef HUMWISE_HAVE_REPORT
#include "app/report/ReportRenderer.h"

#include <QGuiApplication>
#endif

#include <cstdlib>

namespace humwise::cli {

int runReport(const std::vector<std::string>& args, std::ostream& out) {
    const ParsedArgs a(args, {{"db"}, {"motor"}, {"round"}, {"out"}, {"paper"}, {"comment"}});
    if (!a.positional().empty()) throw UsageError("report takes options only");
    if (!a.has("out")) throw UsageError("report needs --out FILE.pdf");
    if (!a.has("motor") && !a.has("round")) throw UsageError("report needs --motor TAG (a finding sheet) or --round (a route summary)");
    const std::string paper = a.value("paper").value_or("a4");
    if (paper != "a4" && paper != "letter") throw UsageError("--paper is a4 or letter");
#ifdef HUMWISE_HAVE_REPORT
    auto store = openStore(a, false);
    const std::int64_t round = pickRound(*store, a.value("round").value_or("latest")).id;
    if (!std::getenv("DISPLAY") && !std::getenv("WAYLAND_DISPLAY")) setenv("QT_QPA_PLATFORM", "offscreen", 0);
    static int argc = 1;
    static char name[] = "humwise-cli";
    static char* argv[] = {name, nullptr};
    static QGuiApplication app(argc, argv); // fonts for the PDF text
    const auto size = paper == "a4" ? report::Paper::A4 : report::Paper::Letter;
    const QString file = QString::fromStdString(*a.value("out"));
    report::RenderResult r;
    try {
        if (a.has("motor")) {
            if (!store->loadFleet().motor(*a.value("motor"))) throw UsageError("no motor '" + *a.value("motor") + "' in the store");
            r = report::writeMotorSheetPdf(workflow::buildMotorSheet(*store, *a.value("motor"), round, a.value("comment").value_or("")), file, size);
        } else {
            r = report::writeRouteSummaryPdf(workflow::buildRouteSummary(*store, round), file, size);
        }
    } catch (const storage::StorageException& e) {
        throw ProcessingError(e.error.message);
    }
    if (!r.error.isEmpty()) throw ProcessingError(r.error.toStdString());
    out << *a.value("out") << ": " << r.pages << " page(s)\n";
    return 0;
#else
    (void)out;
    throw ProcessingError("this humwise-cli was built without Qt: PDF reports are not available");
#endif
}

int runExport(const std::vector<std::string>& args, std::ostream& out) {
    const ParsedArgs a(args, {{"db"}, {"round"}, {"what"}, {"out"}, {"trend", false}, {"motor"}, {"point"}, {"indicator"}});
    if (!a.positional().empty()) throw UsageError("export takes options only");
    if (!a.has("out")) throw UsageError("export needs --out FILE.csv");
    auto store = openStore(a, false);
    std::string csv;
    try {
        if (a.has("trend")) {
            if (!a.has("motor") || !a.has("indicator")) throw UsageError("export --trend needs --motor and --indicator");
            csv = workflow::trendCsv(store->trend(*a.value("motor"), a.value("point").value_or(""), *a.value("indicator")));
        } else {
            const std::string what = a.value("what").value_or("findings");
            const std::int64_t round = pickRound(*store, a.value("round").value_or("latest")).id;
            if (what == "findings") csv = workflow::findingsCsv(*store, round);
            else if (what == "indicators") csv = workflow::indicatorsCsv(*store, round);
            else throw UsageError("--what is findings or indicators");
        }
    } catch (const storage::StorageException& e) {
        throw ProcessingError(e.error.message);
    }
    writeFileWhole(*a.value("out"), csv);
    out << *a.value("out") << ": written\n";
    return 0;
}

} // namespace humwise::cli
