#pragma once
// Objects kept by length within a budget of bytes: the bookkeeping of the per-thread transform
// caches (Fft.cpp keptRealFft, BandSignal.cpp band transforms). Not thread-safe: each thread keeps
// its own (thread_local).

#include <cstddef>
#include <map>
#include <memory>

namespace humwise::dsp {

template <class T>
class KeptByLength {
public:
    explicit KeptByLength(std::size_t budgetBytes) : m_budget(budgetBytes) {}

    std::size_t budget() const { return m_budget; }
    std::size_t bytes() const { return m_bytes; }

    T* find(std::size_t n) const {
        const auto it = m_byLength.find(n);
        return it == m_byLength.end() ? nullptr : it->second.get();
    }

    // Keeps `made`, whose buffers take `bytes`, as the object of length n (not kept yet). When
    // that would pass the budget every other object is dropped first; one larger than the budget
    // alone is then kept until the next. Made by the caller beforehand, so that a length the
    // object refuses (it throws) leaves nothing behind.
    T& keep(std::size_t n, std::unique_ptr<T> made, std::size_t bytes) {
        if (m_bytes + bytes > m_budget) {
            m_byLength.clear();
            m_bytes = 0;
        }
        T& kept = *m_byLength.emplace(n, std::move(made)).first->second;
        m_bytes += bytes;
        return kept;
    }

private:
    std::size_t m_budget;
    std::map<std::size_t, std::unique_ptr<T>> m_byLength;
    std::size_t m_bytes = 0;
};

} // namespace humwise::dsp
