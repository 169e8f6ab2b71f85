#include "intake/result_fingerprint.hpp"

#include <bit>

namespace plumbline {

namespace {

// Little-endian whatever the machine, so a hash recorded on one machine checks on another.
std::string littleEndian(std::uint64_t value)
{
    std::string bytes(8, '\0');
    for (std::size_t i = 0; i < 8; ++i)
        bytes[i] = static_cast<char>((value >> (8 * i)) & 0xffu);
    return bytes;
}

} // namespace

ResultFingerprint::ResultFingerprint(const std::vector<TypedColumn>& columns)
{
    addCount(columns.size());
    for (const TypedColumn& column : columns) {
        addCount(column.name.size());
        m_digest.update(column.name);
    }
}

void ResultFingerprint::addCount(std::uint64_t value) { m_digest.update(littleEndian(value)); }

void ResultFingerprint::addRecord(std::span<const TypedCell> cells)
{
    for (const TypedCell& cell : cells) {
        const char kind = static_cast<char>(cell.kind);
        m_digest.update(std::string_view(&kind, 1));
        switch (cell.kind) {
        case CellKind::Missing:
            break;
        case CellKind::Number:
            addCount(std::bit_cast<std::uint64_t>(cell.number));
            break;
        case CellKind::Text:
            addCount(cell.text.size());
            m_digest.update(cell.text);
            break;
        case CellKind::Date:
            addCount(static_cast<std::uint64_t>(cell.day));
            break;
        }
    }
}

std::string ResultFingerprint::hexDigest() { return m_digest.hexDigest(); }

} // namespace plumbline
