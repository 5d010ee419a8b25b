// UTF-8 validation for drop files (RFC 3629): rejects overlong forms,
// surrogates (U+D800..U+DFFF) and code points above U+10FFFF.
#pragma once

#include <cstddef>
#include <string_view>

namespace ferrum::ingest {

// Length (1..4) of the valid UTF-8 sequence starting at s[pos], or 0 when the
// bytes there are not valid UTF-8. REQUIRES: pos < s.size().
std::size_t utf8_sequence_length(std::string_view s, std::size_t pos);

// True when every byte is below 0x80 (then the text is valid UTF-8); checks
// eight bytes at a time, for the common all-ASCII record.
bool is_ascii(std::string_view s);

// Byte offset of the first invalid sequence in `s`, or npos when all valid.
std::size_t find_invalid_utf8(std::string_view s);

}  // namespace ferrum::ingest
