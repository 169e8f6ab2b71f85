#include "intake/record_reader.hpp"

#include "intake/text_file.hpp"

namespace plumbline {

RecordReader::RecordReader(const TextFile& file, char delimiter, std::size_t from)
    : m_blocks(file.textBlocks(from))
    , m_scanner(m_blocks.view(), delimiter, m_blocks.atEnd())
{
}

bool RecordReader::next()
{
    while (!m_scanner.next()) {
        if (!m_scanner.needsMore() || m_readError)
            return false;
        // Keep the record that was cut, append the next block after it and read it again.
        m_blocks.consume(m_scanner.offset());
        if (auto more = m_blocks.readMore(); !more) {
            m_readError = more.error();
            return false;
        }
        m_scanner.resume(m_blocks.view(), m_blocks.atEnd());
    }
    return true;
}

} // namespace plumbline
