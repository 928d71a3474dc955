#include "core/diagnosis/Finding.h"

namespace humwise::diagnosis {

std::string_view originName(Origin o) {
    switch (o) {
    case Origin::Electrical: return "electrical";
    case Origin::Mechanical: return "mechanical";
    case Origin::Unknown: return "unknown";
    }
    return "unknown";
}

std::string_view severityName(int s) {
    switch (s) {
    case 0: return "steady";
    case 1: return "watch";
    case 2: return "plan repair";
    case 3: return "act now";
    default: return "?";
    }
}

std::string_view severityMark(int s) {
    switch (s) {
    case 0: return "[ ]";
    case 1: return "[~]";
    case 2: return "[!]";
    case 3: return "[!!]";
    default: return "[?]";
    }
}

} // namespace humwise::diagnosis
