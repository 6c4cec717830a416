// SPDX-License-Identifier: MIT
#pragma once

#include <array>
#include <cstdint>
#include <string>
#include <string_view>

namespace slatewise::core {

/// SHA-256 (FIPS 180-4), incremental. Used to record the source files of a workspace.
class Sha256 {
public:
    Sha256();
    void update(const void* data, std::size_t size);
    void update(std::string_view text) { update(text.data(), text.size()); }
    /// Finishes and returns the digest as 64 lower-case hex digits.
    std::string hexDigest();

    static std::string hex(std::string_view text);

private:
    void block(const std::uint8_t* p);
    std::array<std::uint32_t, 8> m_h;
    std::array<std::uint8_t, 64> m_buf{};
    std::size_t m_bufLen = 0;
    std::uint64_t m_total = 0;
};

} // namespace slatewise::core
