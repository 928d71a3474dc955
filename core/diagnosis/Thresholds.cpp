#include "core/diagnosis/Thresholds.h"

#include <algorithm>

namespace humwise::diagnosis {

int SeverityLimits::severityOf(double v) const {
    if (rising) return v >= act ? 3 : v >= plan ? 2 : v >= watch ? 1 : 0;
    return v <= act ? 3 : v <= plan ? 2 : v <= watch ? 1 : 0;
}

char ZoneBoundaries::zoneOf(double v) const {
    if (v <= ab) return 'A';
    if (v <= bc) return 'B';
    if (v <= cd) return 'C';
    return 'D';
}

ZoneBoundaries zoneBoundaries(const motor::SeverityClass& c) {
    using Std = motor::SeverityClass::Standard;
    if (c.standard == Std::Iso10816_1) {
        // ISO 10816-1:1995 Annex B classes I-IV (REFERENCE.md 2.2; from memory, verify).
        static const ZoneBoundaries classes[4] = {
            {0.71, 1.8, 4.5, "ISO 10816-1 class I (REFERENCE.md 2.2; from memory, verify)"},
            {1.12, 2.8, 7.1, "ISO 10816-1 class II (REFERENCE.md 2.2; from memory, verify)"},
            {1.8, 4.5, 11.2, "ISO 10816-1 class III (REFERENCE.md 2.2; from memory, verify)"},
            {2.8, 7.1, 18.0, "ISO 10816-1 class IV (REFERENCE.md 2.2; from memory, verify)"},
        };
        return classes[std::clamp(c.iso10816Class, 1, 4) - 1];
    }
    // ISO 20816-3 / 10816-3 groups and supports (REFERENCE.md 2.1; from memory, verify).
    const bool rigid = c.support == motor::SupportClass::Rigid;
    if (c.group == 1)
        return rigid ? ZoneBoundaries{2.3, 4.5, 7.1, "ISO 20816-3 group 1 rigid (REFERENCE.md 2.1; from memory, verify)"}
                     : ZoneBoundaries{3.5, 7.1, 11.0, "ISO 20816-3 group 1 flexible (REFERENCE.md 2.1; from memory, verify)"};
    return rigid ? ZoneBoundaries{1.4, 2.8, 4.5, "ISO 20816-3 group 2 rigid (REFERENCE.md 2.1; from memory, verify)"}
                 : ZoneBoundaries{2.3, 4.5, 7.1, "ISO 20816-3 group 2 flexible (REFERENCE.md 2.1; from memory, verify)"};
}

const Thresholds& defaultThresholds() {
    static const Thresholds t;
    return t;
}

} // namespace humwise::diagnosis
