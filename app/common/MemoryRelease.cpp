#include "app/common/MemoryRelease.h"

#include <fstream>
#include <unistd.h>
#ifdef __GLIBC__
#include <malloc.h>
#endif

namespace humwise::workflow {

std::optional<std::uint64_t> residentBytes() {
    // statm: total program size, then resident pages (proc(5)).
    std::ifstream statm("/proc/self/statm");
    std::uint64_t size = 0, resident = 0;
    const long page = sysconf(_SC_PAGESIZE);
    if (!(statm >> size >> resident) || page <= 0) return std::nullopt;
    return resident * static_cast<std::uint64_t>(page);
}

void releaseFreedMemory() {
#ifdef __GLIBC__
    malloc_trim(0);
#endif
}

MemoryRelease::MemoryRelease(std::uint64_t budgetBytes, std::function<std::optional<std::uint64_t>()> resident, std::function<void()> release)
    : m_budget(budgetBytes), m_resident(std::move(resident)), m_release(std::move(release)), m_base(m_resident()) {}

bool MemoryRelease::afterMotor() {
    ++m_motorsSinceRelease;
    const auto now = m_resident();
    const bool due = now && m_base ? *now > *m_base + m_budget : m_motorsSinceRelease >= kFallbackEvery;
    if (!due) return false;
    m_release();
    m_base = m_resident();
    m_motorsSinceRelease = 0;
    return true;
}

} // namespace humwise::workflow
