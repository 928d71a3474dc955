#pragma once
// The typed error of an analysis step that cannot produce a result from the data it was
// given (a record too short for the asked resolution, a band outside the Nyquist range).

#include <string>

namespace humwise::dsp {

struct AnalysisError {
    enum class Code { RecordTooShort, InvalidRequest, NoFiniteSamples };
    Code code = Code::InvalidRequest;
    std::string message;
};

} // namespace humwise::dsp
