#pragma once
// Result<T, E>: a value or a typed error, never both. Readers and other operations whose
// failure is an expected outcome (a broken file, a signal too short) return one of these
// instead of throwing; programming errors (bad parameters) still throw
// std::invalid_argument at the entry point.

#include <stdexcept>
#include <utility>
#include <variant>

namespace humwise {

template <class E>
struct Failure {
    E error;
};

template <class E>
Failure<E> fail(E error) { return Failure<E>{std::move(error)}; }

template <class T, class E>
class [[nodiscard]] Result {
public:
    Result(T value) : m_state(std::in_place_index<0>, std::move(value)) {}
    Result(Failure<E> failure) : m_state(std::in_place_index<1>, std::move(failure.error)) {}

    bool ok() const { return m_state.index() == 0; }
    explicit operator bool() const { return ok(); }

    const T& value() const& { check(true); return std::get<0>(m_state); }
    T& value() & { check(true); return std::get<0>(m_state); }
    T&& value() && { check(true); return std::get<0>(std::move(m_state)); }
    const E& error() const { check(false); return std::get<1>(m_state); }

private:
    void check(bool wantValue) const {
        if (ok() != wantValue)
            throw std::logic_error(wantValue ? "Result::value() called on an error"
                                             : "Result::error() called on a value");
    }
    std::variant<T, E> m_state;
};

} // namespace humwise
