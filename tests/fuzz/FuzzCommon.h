#pragma once
// Shared helpers of the libFuzzer targets (DEVELOPERS.md, "Fuzzing").
// A fuzz target must never throw, crash or break the reader's contract; when a property the
// reader promises does not hold, the target aborts so libFuzzer saves the input as a crash.

#include "core/io/ReadError.h"
#include "core/model/Recording.h"

#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <string>

namespace humwise::fuzz {

[[noreturn]] inline void broken(const char* what) {
    std::fprintf(stderr, "fuzz property violated: %s\n", what);
    std::abort();
}

inline void require(bool ok, const char* what) {
    if (!ok) broken(what);
}

// Every error names its source and says what is wrong (DEVELOPERS.md, "Errors").
inline void checkError(const io::ReadError& e) {
    require(!e.detail.empty(), "a ReadError without detail");
    require(!e.message().empty(), "an empty ReadError message");
    require(std::string(io::codeName(e.code)) != "unknown", "a ReadError code without a name");
}

// A recording a reader returns: at least one channel, all of the same length, a plausible rate.
// Every sample is read so AddressSanitizer sees the whole buffer.
inline void checkRecording(const Recording& r) {
    require(!r.channels.empty(), "a recording without channels");
    require(r.sampleRateHz > 0 && std::isfinite(r.sampleRateHz), "a recording with an impossible sample rate");
    const std::size_t n = r.channels.front().samples.size();
    require(n > 0, "a recording without samples");
    volatile double sink = 0;
    for (const auto& ch : r.channels) {
        require(ch.samples.size() == n, "channels of different lengths");
        double sum = 0;
        for (double v : ch.samples) sum += v;
        sink = sink + sum;
    }
    (void)sink;
}

} // namespace humwise::fuzz
