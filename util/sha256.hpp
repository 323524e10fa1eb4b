// sha256.hpp — SHA-256 of a byte string (FIPS PUB 180-4, "Secure Hash Standard", sec. 6.2),
// written here so that the report can name the exact input files it was made from without a
// cryptographic library. Not for security: only to identify files.
#pragma once

#include <array>
#include <cstdint>
#include <string>
#include <string_view>

namespace fp {

class Sha256 {
 public:
  Sha256();
  void update(std::string_view bytes);
  // The digest; the object must not be updated afterwards.
  std::array<std::uint8_t, 32> finish();

 private:
  void block(const std::uint8_t* p);
  std::array<std::uint32_t, 8> h_;
  std::array<std::uint8_t, 64> buf_{};
  std::size_t fill_ = 0;
  std::uint64_t length_ = 0;  // bytes hashed so far
};

// Lower-case hexadecimal digest of `bytes` (64 characters).
std::string sha256_hex(std::string_view bytes);

}  // namespace fp
