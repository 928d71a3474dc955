#include "app/common/DateTicks.h"

#include <algorithm>
#include <array>
#include <chrono>
#include <cmath>
#include <cstdio>

namespace humwise::workflow {
namespace {

using namespace std::chrono;

// Months since 1970-01 of the month holding `day`, and back.
int monthIndexOf(int day) {
    const year_month_day ymd{sys_days{days{day}}};
    return (static_cast<int>(ymd.year()) - 1970) * 12 + static_cast<int>(static_cast<unsigned>(ymd.month())) - 1;
}

int firstDayOfMonth(int monthIndex) {
    const int y = 1970 + (monthIndex >= 0 ? monthIndex / 12 : (monthIndex - 11) / 12);
    const int m = monthIndex - (y - 1970) * 12 + 1;
    return static_cast<int>(sys_days{year{y} / month{static_cast<unsigned>(m)} / 1}.time_since_epoch().count());
}

std::string label(int day, bool withDay) {
    const year_month_day ymd{sys_days{days{day}}};
    char buf[16];
    if (withDay)
        std::snprintf(buf, sizeof buf, "%04d-%02u-%02u", static_cast<int>(ymd.year()), static_cast<unsigned>(ymd.month()), static_cast<unsigned>(ymd.day()));
    else
        std::snprintf(buf, sizeof buf, "%04d-%02u", static_cast<int>(ymd.year()), static_cast<unsigned>(ymd.month()));
    return buf;
}

std::vector<DateTick> monthTicks(int from, int to, int maxTicks) {
    const int firstMonth = monthIndexOf(from) + (firstDayOfMonth(monthIndexOf(from)) < from ? 1 : 0);
    const int lastMonth = monthIndexOf(to);
    const int count = lastMonth - firstMonth + 1;
    int step = 1;
    for (int s : {1, 2, 3, 6, 12}) {
        step = s;
        if ((count + s - 1) / s <= maxTicks) break;
    }
    while ((count + step - 1) / step > maxTicks) step += 12; // decades of history: whole years
    // Steps of 2, 3 and 6 months start on a multiple of the step (Jan, Apr, Jul, Oct for 3) and
    // yearly steps on January, so the ticks stay put as the view scrolls.
    const int start = firstMonth + ((step - firstMonth % step) % step + step) % step;
    std::vector<DateTick> ticks;
    for (int m = start; m <= lastMonth; m += step) ticks.push_back({static_cast<double>(firstDayOfMonth(m)), label(firstDayOfMonth(m), false)});
    return ticks;
}

std::vector<DateTick> dayTicks(int from, int to, int maxTicks) {
    const int span = to - from + 1;
    int step = 14;
    for (int s : {1, 2, 7, 14}) {
        step = s;
        if ((span + s - 1) / s <= maxTicks) break;
    }
    std::vector<DateTick> ticks;
    // Daily steps from 1970-01-01, weekly ones on Mondays (1970-01-05 was one).
    const int anchor = step >= 7 ? 4 : 0;
    const int start = from + (((anchor - from) % step) + step) % step;
    for (int d = start; d <= to; d += step) ticks.push_back({static_cast<double>(d), label(d, true)});
    return ticks;
}

} // namespace

std::vector<DateTick> dateTicks(double fromDay, double toDay, int maxTicks) {
    if (!(toDay >= fromDay) || !std::isfinite(fromDay) || !std::isfinite(toDay)) return {};
    maxTicks = std::max(2, maxTicks);
    // Whole days inside the span (a tick sits at midnight); far beyond any plausible record
    // (year 1900 .. 2200) the span is clamped rather than overflowing the calendar.
    const int from = static_cast<int>(std::ceil(std::clamp(fromDay, -25567.0, 84000.0)));
    const int to = static_cast<int>(std::floor(std::clamp(toDay, -25567.0, 84000.0)));
    if (to < from) return {};
    auto ticks = monthTicks(from, to, maxTicks);
    if (ticks.size() >= 2) return ticks;
    return dayTicks(from, to, maxTicks);
}

} // namespace humwise::workflow
