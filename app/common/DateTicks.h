#pragma once
// Tick marks for a time axis in days since 1970-01-01 (UTC), for the trend plots of the
// workbench and the finding sheet: at the first day of a month every 1, 2, 3, 6, 12, 24, ...
// months, labelled yyyy-MM; or, when the span holds fewer than two month starts, at midnights
// every 1 or 2 days, or every 1 or 2 weeks on Mondays, labelled yyyy-MM-dd. Each label appears once: a month label on
// weekly ticks printed the same month several times.

#include <string>
#include <vector>

namespace humwise::workflow {

struct DateTick {
    double day = 0;    // days since 1970-01-01 00:00 UTC
    std::string label; // yyyy-MM or yyyy-MM-dd
};

// The ticks inside [fromDay, toDay], at most maxTicks of them (at least 2 are asked for; fewer
// come back when the span is too short even for daily ticks). Empty for an empty or inverted span.
std::vector<DateTick> dateTicks(double fromDay, double toDay, int maxTicks);

} // namespace humwise::workflow
