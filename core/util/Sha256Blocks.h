#pragma once
// The SHA-256 compression function (FIPS 180-4, 6.2.2) over whole 64-byte blocks, in two
// implementations that must agree bit for bit (tests/core/util/Sha256Test.cpp):
//   portable     plain C++, any processor;
//   accelerated  the x86 SHA extensions (SHA-NI: sha256rnds2, sha256msg1/2; Intel, "Intel SHA
//                Extensions", Gulley et al. 2013), several times faster; only where the processor
//                has them (shaExtensionsAvailable()).
// Sha256 picks the accelerated one when it can. state holds H0..H7.

#include <cstddef>
#include <cstdint>

namespace humwise::util::detail {

void sha256BlocksPortable(std::uint32_t state[8], const std::uint8_t* data, std::size_t blocks);
bool shaExtensionsAvailable();
void sha256BlocksAccelerated(std::uint32_t state[8], const std::uint8_t* data, std::size_t blocks); // only if available

} // namespace humwise::util::detail
