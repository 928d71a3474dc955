#pragma once
// When a long import hands the memory it has freed back to the system.
//
// glibc keeps freed blocks in its arenas for reuse. Over a route of thousands of motors the
// worker threads' arenas fragment (free space cut into pieces of a few hundred KiB by small
// blocks, too small for the next motor's large buffers): their reserved size grows without end
// (to 640-920 MB for 50-60 MB in use over 2000 motors) and the pages touched between two
// releases with it, so releasing every so many motors let the peak resident size grow with the
// route. Releasing after every motor bounds it, but the released pages fault back in (a third
// slower). So the release follows the resident size instead: after each motor, when it has grown
// by more than `budgetBytes` since just after the last release, freed memory goes back
// (malloc_trim). The peak is then the size after a release plus the budget plus one motor.

#include <cstddef>
#include <cstdint>
#include <functional>
#include <optional>

namespace humwise::workflow {

// The resident size of this process in bytes (Linux: /proc/self/statm), or nothing.
std::optional<std::uint64_t> residentBytes();

// Hands freed heap memory back to the system (glibc's malloc_trim; nothing elsewhere).
void releaseFreedMemory();

class MemoryRelease {
public:
    static constexpr std::uint64_t kDefaultBudgetBytes = std::uint64_t{32} << 20;
    // Without a resident size to follow: every this many motors.
    static constexpr std::size_t kFallbackEvery = 16;

    // `resident` and `release` are the process's own unless a test gives others.
    explicit MemoryRelease(std::uint64_t budgetBytes = kDefaultBudgetBytes,
                           std::function<std::optional<std::uint64_t>()> resident = residentBytes,
                           std::function<void()> release = releaseFreedMemory);

    // Call after each motor, its buffers freed. True when it released.
    bool afterMotor();

private:
    std::uint64_t m_budget;
    std::function<std::optional<std::uint64_t>()> m_resident;
    std::function<void()> m_release;
    std::optional<std::uint64_t> m_base; // resident size just after the last release (or at the start)
    std::size_t m_motorsSinceRelease = 0;
};

} // namespace humwise::workflow
