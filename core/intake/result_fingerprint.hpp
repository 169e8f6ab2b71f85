#pragma once

#include "intake/sha256_stream.hpp"
#include "intake/typed_cell.hpp"
#include "intake/typed_table.hpp"

#include <span>
#include <string>
#include <vector>

namespace plumbline {

// SHA-256 of a query result in a canonical encoding, so that the same cells give the same hash
// whichever database (and whichever client library) produced them. All integers little-endian:
//   column count (u64), then per column its name as length (u64) and UTF-8 bytes;
//   per cell, row by row: its CellKind byte, then for a Number the 8 bytes of the IEEE double,
//   for Text its length (u64) and bytes, for a Date the day as int64; nothing for Missing.
class ResultFingerprint {
public:
    explicit ResultFingerprint(const std::vector<TypedColumn>& columns);
    void addRecord(std::span<const TypedCell> cells);
    // 64 lower-case hex digits; call once, after the last record.
    std::string hexDigest();

private:
    void addCount(std::uint64_t value);
    Sha256Stream m_digest;
};

} // namespace plumbline
