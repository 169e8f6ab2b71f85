#include "intake/text_file.hpp"

#include "intake/sha256_stream.hpp"
#include "intake/utf8_text.hpp"

#include <algorithm>
#include <cerrno>
#include <cstdint>
#include <cstring>
#include <memory>

#include <sys/stat.h>

namespace plumbline {

namespace {

constexpr std::string_view utf8Bom = "\xEF\xBB\xBF";

// The checks of a file's kind (byte-order marks, UTF-16 without one) look at the first 4096 bytes
// of the text, which may follow a three-byte mark.
constexpr std::size_t headBytes = 4096 + 3;

bool startsWith(std::string_view text, std::string_view prefix)
{
    return text.substr(0, prefix.size()) == prefix;
}

// ASCII text in UTF-16 has a zero byte at every other position (odd ones little-endian, even
// ones big-endian); other binary files do not.
bool looksLikeUtf16(std::string_view text)
{
    const std::size_t n = std::min<std::size_t>(text.size(), 4096) & ~std::size_t{1};
    if (n < 8)
        return false;
    std::size_t zeroEven = 0, zeroOdd = 0;
    for (std::size_t i = 0; i < n; i += 2) {
        zeroEven += text[i] == '\0' ? 1 : 0;
        zeroOdd += text[i + 1] == '\0' ? 1 : 0;
    }
    const std::size_t half = n / 2;
    return (zeroOdd * 10 >= half * 7 && zeroEven * 20 <= half) || (zeroEven * 10 >= half * 7 && zeroOdd * 20 <= half);
}

} // namespace

TextFile::TextFile(std::string name, std::string bytes)
    : m_name(std::move(name))
    , m_bytes(std::move(bytes))
    , m_size(m_bytes.size())
    , m_head(m_bytes.substr(0, headBytes))
    , m_textStart(startsWith(m_bytes, utf8Bom) ? utf8Bom.size() : 0)
{
}

TextFile::TextFile(std::string name, std::shared_ptr<const ReadOnlyFile> file, std::size_t size, std::string head,
                   std::size_t blockBytes)
    : m_name(std::move(name))
    , m_file(std::move(file))
    , m_size(size)
    , m_head(std::move(head))
    , m_textStart(startsWith(m_head, utf8Bom) ? utf8Bom.size() : 0)
    , m_blockBytes(std::max<std::size_t>(blockBytes, 1))
{
}

TextBlocks TextFile::byteBlocks() const
{
    if (!m_file)
        return TextBlocks(m_bytes);
    return TextBlocks(*m_file, 0, m_size, m_blockBytes);
}

std::expected<bool, InputError> TextFile::advance(TextBlocks& blocks, std::size_t consumed) const
{
    blocks.consume(consumed);
    const auto more = blocks.readMore();
    if (!more)
        return std::unexpected(readFailure(more.error()));
    return *more;
}

TextBlocks TextFile::textBlocks(std::size_t from) const
{
    from = std::min(from, textSize());
    if (!m_file)
        return TextBlocks(std::string_view(m_bytes).substr(m_textStart + from));
    return TextBlocks(*m_file, m_textStart + from, m_size, m_blockBytes);
}

InputError TextFile::readFailure(const std::string& problem) const
{
    InputError error;
    error.file = m_name;
    error.problem = problem;
    error.remedy = "wait until no other program is writing the file (or work on a copy of it), then run again.";
    return error;
}

std::expected<std::string, InputError> TextFile::readText(std::size_t begin, std::size_t end) const
{
    begin = std::min(begin, textSize());
    end = std::clamp(end, begin, textSize());
    if (!m_file)
        return m_bytes.substr(m_textStart + begin, end - begin);
    std::string out(end - begin, '\0');
    const auto got = m_file->readAt(m_textStart + begin, out.data(), out.size());
    if (!got)
        return std::unexpected(readFailure("the file could not be read (" + got.error() + ")."));
    if (*got < out.size())
        return std::unexpected(readFailure("the file became shorter while it was read: another program is changing it."));
    return out;
}

std::expected<TextFile, InputError> TextFile::load(const std::string& path, std::size_t maxLineBytes, std::size_t blockBytes)
{
    InputError error;
    error.file = path;
    // Only regular files: a FIFO would block forever at open, a device such as /dev/zero never
    // ends, and a folder is not a cohort. stat() itself never blocks.
    struct stat status {};
    if (::stat(path.c_str(), &status) != 0) {
        error.problem = std::string("the file cannot be opened (") + std::strerror(errno) + ").";
        error.remedy = "check the path and that you may read the file.";
        return std::unexpected(error);
    }
    if (S_ISDIR(status.st_mode)) {
        error.problem = "this is a folder, not a file.";
        error.remedy = "choose the cohort file inside it.";
        return std::unexpected(error);
    }
    if (!S_ISREG(status.st_mode)) {
        error.problem = "this is not a regular file (it is a device, a pipe or a socket), so it cannot be read as a table.";
        error.remedy = "save the data to a file and choose that file.";
        return std::unexpected(error);
    }
    auto opened = ReadOnlyFile::open(path);
    if (!opened) {
        error.problem = "the file cannot be opened (" + opened.error() + ").";
        error.remedy = "check the path and that you may read the file.";
        return std::unexpected(error);
    }
    auto file = std::make_shared<const ReadOnlyFile>(std::move(*opened));
    struct stat described {};
    const bool sized = ::fstat(file->descriptor(), &described) == 0 && S_ISREG(described.st_mode) && described.st_size > 0;
    std::optional<TextFile> loaded;
    if (sized) {
        // Passes read the file in blocks from here on, up to the size it has now.
        std::string head(std::min<std::size_t>(headBytes, static_cast<std::size_t>(described.st_size)), '\0');
        const auto got = file->readAt(0, head.data(), head.size());
        if (!got) {
            error.problem = "the file could not be read (" + got.error() + ").";
            error.remedy = "check that you may read the file.";
            return std::unexpected(error);
        }
        head.resize(*got);
        loaded = TextFile(path, std::move(file), static_cast<std::size_t>(described.st_size), std::move(head), blockBytes);
    } else {
        // A regular file that reports no size (such as those under /proc) is read whole.
        std::string bytes;
        char buffer[1 << 16];
        for (;;) {
            const auto got = file->readAt(bytes.size(), buffer, sizeof buffer);
            if (!got) {
                error.problem = "the file could not be read to the end.";
                error.remedy = "check that the file is not a folder and is not being written to.";
                return std::unexpected(error);
            }
            bytes.append(buffer, *got);
            if (*got < sizeof buffer)
                break;
        }
        loaded = TextFile(path, std::move(bytes));
        loaded->m_blockBytes = std::max<std::size_t>(blockBytes, 1);
    }
    const auto tooLong = loaded->firstLineLongerThan(maxLineBytes);
    if (!tooLong)
        return std::unexpected(tooLong.error());
    if (*tooLong) {
        error.line = **tooLong;
        error.problem = "line " + std::to_string(**tooLong) + " is longer than " + std::to_string(maxLineBytes)
            + " bytes, so this is not a table of patients (a document, a binary file, or a file without line breaks).";
        error.remedy = "check that this is the cohort file; if one line really is that long, raise the limit with "
                       "--max-line-length BYTES.";
        return std::unexpected(error);
    }
    return checked(std::move(*loaded));
}

std::expected<std::optional<std::size_t>, InputError> TextFile::firstLineLongerThan(std::size_t maxLineBytes) const
{
    // Over the raw bytes, byte-order mark included, as lines are counted from the file's start.
    // Each block is searched for line breaks as it comes, so a file without line breaks is
    // refused after reading little more than the limit.
    TextBlocks blocks = byteBlocks();
    std::size_t lineStart = 0, lines = 1;
    for (;;) {
        const std::string_view block = blocks.view();
        const std::size_t base = blocks.offset();
        for (std::size_t pos = 0; pos < block.size();) {
            const auto* lineBreak = static_cast<const char*>(std::memchr(block.data() + pos, '\n', block.size() - pos));
            if (!lineBreak)
                break;
            if (base + std::size_t(lineBreak - block.data()) - lineStart > maxLineBytes)
                return lines;
            ++lines;
            pos = std::size_t(lineBreak - block.data()) + 1;
            lineStart = base + pos;
        }
        if (base + block.size() - lineStart > maxLineBytes)
            return lines;
        const auto more = advance(blocks, block.size());
        if (!more)
            return std::unexpected(more.error());
        if (!*more)
            return std::nullopt;
    }
}

std::expected<std::string, InputError> TextFile::fingerprint() const
{
    TextBlocks blocks = byteBlocks();
    Sha256Stream digest;
    for (;;) {
        digest.update(blocks.view());
        const auto more = advance(blocks, blocks.view().size());
        if (!more)
            return std::unexpected(more.error());
        if (!*more)
            return digest.hexDigest();
    }
}

std::expected<TextFile, InputError> TextFile::fromBytes(std::string name, std::string bytes)
{
    return checked(TextFile(std::move(name), std::move(bytes)));
}

std::expected<TextFile, InputError> TextFile::checked(TextFile file)
{
    InputError error;
    error.file = file.name();
    if (startsWith(file.m_head, "\xFF\xFE") || startsWith(file.m_head, "\xFE\xFF")) {
        error.line = 1;
        error.problem = "the file is UTF-16 encoded; Plumbline reads UTF-8 text.";
        error.remedy = "save the file as 'CSV UTF-8' (or convert it with iconv -f UTF-16 -t UTF-8).";
        return std::unexpected(error);
    }
    const auto blank = file.onlyBlank();
    if (!blank)
        return std::unexpected(blank.error());
    if (*blank) {
        error.problem = "the file is empty.";
        error.remedy = "choose the file that holds the cohort, with a header row and one row per patient.";
        return std::unexpected(error);
    }
    if (looksLikeUtf16(std::string_view(file.m_head).substr(file.m_textStart))) {
        error.line = 1;
        error.problem = "the file looks UTF-16 encoded (every other byte is zero) without a byte-order mark; Plumbline reads UTF-8 text.";
        error.remedy = "save the file as 'CSV UTF-8' (or convert it with iconv -f UTF-16LE -t UTF-8, or UTF-16BE).";
        return std::unexpected(error);
    }
    const auto nul = file.firstNul();
    if (!nul)
        return std::unexpected(nul.error());
    if (*nul) {
        const auto position = file.positionOf(**nul);
        if (!position)
            return std::unexpected(position.error());
        error.line = position->line;
        error.problem = "the file holds binary data (a NUL byte), so it is not a delimited text file.";
        error.remedy = "Plumbline reads delimited text, workbooks (.xlsx), SAS, Stata and SPSS files by their extension "
                       "(.sas7bdat .xpt .dta .sav .zsav) and databases with --database (an SQLite file: --database sqlite:PATH "
                       "--query \"SELECT …\"); give the file its right extension, or export it as CSV.";
        return std::unexpected(error);
    }
    return file;
}

std::expected<bool, InputError> TextFile::onlyBlank() const
{
    TextBlocks blocks = textBlocks();
    for (;;) {
        const std::string_view block = blocks.view();
        if (block.find_first_not_of("\n\r \t") != std::string_view::npos)
            return false;
        const auto more = advance(blocks, block.size());
        if (!more)
            return std::unexpected(more.error());
        if (!*more)
            return true;
    }
}

std::expected<std::optional<std::size_t>, InputError> TextFile::firstNul() const
{
    TextBlocks blocks = textBlocks();
    for (;;) {
        const std::string_view block = blocks.view();
        if (const std::size_t nul = block.find('\0'); nul != std::string_view::npos)
            return blocks.offset() + nul;
        const auto more = advance(blocks, block.size());
        if (!more)
            return std::unexpected(more.error());
        if (!*more)
            return std::nullopt;
    }
}

std::expected<std::optional<std::size_t>, InputError> TextFile::firstInvalidUtf8() const
{
    TextBlocks blocks = textBlocks();
    for (;;) {
        const std::string_view s = blocks.view();
        // A sequence cut by the block's end is judged once the next block is appended to it.
        const std::size_t judged = blocks.atEnd() || s.size() < 4 ? (blocks.atEnd() ? s.size() : 0) : s.size() - 3;
        std::size_t i = 0;
        while (i < judged) {
            // Fast path: eight ASCII bytes at a time.
            if (i + 8 <= s.size()) {
                std::uint64_t word = 0;
                std::memcpy(&word, s.data() + i, 8);
                if ((word & 0x8080808080808080ULL) == 0) {
                    i += 8;
                    continue;
                }
            }
            const std::size_t length = utf8SequenceLength(s, i);
            if (length == 0)
                return blocks.offset() + i;
            i += length;
        }
        const auto more = advance(blocks, std::min(i, s.size()));
        if (!more)
            return std::unexpected(more.error());
        if (!*more)
            return std::nullopt; // every sequence was judged
    }
}

std::expected<TextPosition, InputError> TextFile::positionOf(std::size_t offset) const
{
    offset = std::min(offset, textSize());
    TextBlocks blocks = textBlocks();
    TextPosition position;
    for (;;) {
        const std::string_view block = blocks.view().substr(0, offset - blocks.offset());
        for (std::size_t at = block.find('\n'); at != std::string_view::npos; at = block.find('\n', at + 1)) {
            ++position.line;
            position.lineStart = blocks.offset() + at + 1;
        }
        blocks.consume(block.size());
        if (blocks.offset() == offset)
            return position;
        const auto more = blocks.readMore();
        if (!more)
            return std::unexpected(readFailure(more.error()));
        if (!*more)
            return position;
    }
}

} // namespace plumbline
