#include "intake/text_blocks.hpp"

#include <algorithm>
#include <cstring>

namespace plumbline {

TextBlocks::TextBlocks(std::string_view whole)
    : m_whole(whole)
{
}

TextBlocks::TextBlocks(const ReadOnlyFile& file, std::size_t begin, std::size_t end, std::size_t blockBytes)
    : m_file(&file)
    , m_readTo(begin)
    , m_end(std::max(begin, end))
    , m_blockBytes(std::max<std::size_t>(blockBytes, 1))
{
}

std::string_view TextBlocks::view() const
{
    if (!m_file)
        return m_whole;
    return {m_buffer.data() + m_viewBegin, m_viewEnd - m_viewBegin};
}

bool TextBlocks::atEnd() const
{
    return !m_file || m_readTo == m_end;
}

void TextBlocks::consume(std::size_t bytes)
{
    if (!m_file) {
        bytes = std::min(bytes, m_whole.size());
        m_whole.remove_prefix(bytes);
    } else {
        bytes = std::min(bytes, m_viewEnd - m_viewBegin);
        m_viewBegin += bytes;
    }
    m_offset += bytes;
}

std::expected<bool, std::string> TextBlocks::readMore()
{
    if (atEnd())
        return false;
    // Keep the unconsumed tail at the front; grow only when the tail leaves no room.
    const std::size_t kept = m_viewEnd - m_viewBegin;
    if (m_viewBegin > 0 && kept > 0)
        std::memmove(m_buffer.data(), m_buffer.data() + m_viewBegin, kept);
    m_viewBegin = 0;
    m_viewEnd = kept;
    if (m_buffer.size() < m_blockBytes || kept == m_buffer.size())
        m_buffer.resize(std::max(m_blockBytes, 2 * m_buffer.size()));
    const std::size_t wanted = std::min(m_buffer.size() - kept, m_end - m_readTo);
    const auto got = m_file->readAt(m_readTo, m_buffer.data() + kept, wanted);
    if (!got)
        return std::unexpected("the file could not be read to the end (" + got.error() + ").");
    if (*got < wanted)
        return std::unexpected(std::string("the file became shorter while it was read: another program is changing it."));
    m_readTo += *got;
    m_viewEnd += *got;
    return true;
}

} // namespace plumbline
