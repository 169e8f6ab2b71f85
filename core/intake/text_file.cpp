#include "intake/text_file.hpp"

#include "intake/sha256_stream.hpp"

#include <algorithm>
#include <cstdio>
#include <cerrno>
#include <cstdint>
#include <cstring>
#include <memory>

#include <sys/stat.h>

namespace plumbline {

namespace {

constexpr std::string_view utf8Bom = "\xEF\xBB\xBF";

bool startsWith(std::string_view text, std::string_view prefix)
{
    return text.substr(0, prefix.size()) == prefix;
}

// Length of the valid UTF-8 sequence starting at s[i], or 0 if it is not valid (RFC 3629 §4).
std::size_t utf8SequenceLength(std::string_view s, std::size_t i)
{
    const auto b0 = static_cast<unsigned char>(s[i]);
    auto cont = [&](std::size_t k) {
        return i + k < s.size() && (static_cast<unsigned char>(s[i + k]) & 0xC0) == 0x80;
    };
    auto byte = [&](std::size_t k) { return static_cast<unsigned char>(s[i + k]); };
    if (b0 < 0x80)
        return 1;
    if (b0 >= 0xC2 && b0 <= 0xDF)
        return cont(1) ? 2 : 0;
    if (b0 >= 0xE0 && b0 <= 0xEF) {
        if (!cont(1) || !cont(2))
            return 0;
        if (b0 == 0xE0 && byte(1) < 0xA0)
            return 0; // overlong
        if (b0 == 0xED && byte(1) > 0x9F)
            return 0; // surrogate
        return 3;
    }
    if (b0 >= 0xF0 && b0 <= 0xF4) {
        if (!cont(1) || !cont(2) || !cont(3))
            return 0;
        if (b0 == 0xF0 && byte(1) < 0x90)
            return 0;
        if (b0 == 0xF4 && byte(1) > 0x8F)
            return 0;
        return 4;
    }
    return 0;
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
    , m_textStart(startsWith(m_bytes, utf8Bom) ? utf8Bom.size() : 0)
{
}

TextFile::TextFile(std::string name, std::shared_ptr<const MappedFile> mapping, std::size_t releaseBlockBytes)
    : m_name(std::move(name))
    , m_mapping(std::move(mapping))
    , m_textStart(startsWith(m_mapping->view(), utf8Bom) ? utf8Bom.size() : 0)
    , m_releaseBlockBytes(std::max<std::size_t>(releaseBlockBytes, 1))
{
}

std::string_view TextFile::bytes() const
{
    return m_mapping ? m_mapping->view() : std::string_view(m_bytes);
}

std::string_view TextFile::text() const
{
    return bytes().substr(m_textStart);
}

void TextFile::releaseText(std::size_t begin, std::size_t end) const
{
    if (m_mapping)
        m_mapping->release(m_textStart + begin, m_textStart + end);
}

std::expected<TextFile, InputError> TextFile::load(const std::string& path, std::size_t maxLineBytes, std::size_t releaseBlockBytes)
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
    std::unique_ptr<std::FILE, int (*)(std::FILE*)> file(std::fopen(path.c_str(), "rb"), &std::fclose);
    if (!file) {
        error.problem = std::string("the file cannot be opened (") + std::strerror(errno) + ").";
        error.remedy = "check the path and that you may read the file.";
        return std::unexpected(error);
    }
    // Map the file when it has a size; a regular file that reports none (such as those under
    // /proc) or cannot be mapped is read into memory as before.
    struct stat opened {};
    std::optional<TextFile> loaded;
    if (::fstat(fileno(file.get()), &opened) == 0 && opened.st_size > 0) {
        if (auto mapping = MappedFile::map(fileno(file.get()), static_cast<std::size_t>(opened.st_size)))
            loaded = TextFile(path, std::make_shared<const MappedFile>(std::move(*mapping)), releaseBlockBytes);
    }
    if (!loaded) {
        std::string bytes;
        char buffer[1 << 16];
        std::size_t got = 0;
        while ((got = std::fread(buffer, 1, sizeof buffer, file.get())) > 0)
            bytes.append(buffer, got);
        if (std::ferror(file.get())) {
            error.problem = "the file could not be read to the end.";
            error.remedy = "check that the file is not a folder and is not being written to.";
            return std::unexpected(error);
        }
        loaded = TextFile(path, std::move(bytes));
        loaded->m_releaseBlockBytes = std::max<std::size_t>(releaseBlockBytes, 1);
    }
    if (const auto tooLong = loaded->firstLineLongerThan(maxLineBytes)) {
        error.line = *tooLong;
        error.problem = "line " + std::to_string(*tooLong) + " is longer than " + std::to_string(maxLineBytes)
            + " bytes, so this is not a table of patients (a document, a binary file, or a file without line breaks).";
        error.remedy = "check that this is the cohort file; if one line really is that long, raise the limit with "
                       "--max-line-length BYTES.";
        return std::unexpected(error);
    }
    return checked(std::move(*loaded));
}

std::optional<std::size_t> TextFile::firstLineLongerThan(std::size_t maxLineBytes) const
{
    // Over the raw bytes, byte-order mark included, as lines are counted from the file's start.
    // The search for a line break never looks further than the limit, so a file without line
    // breaks is refused after reading little more than the limit.
    const std::string_view all = bytes();
    std::size_t lineStart = 0, lines = 1, released = 0;
    for (std::size_t pos = 0; pos < all.size();) {
        // (Written so that a limit near SIZE_MAX cannot overflow.)
        const std::size_t limit = all.size() - lineStart > maxLineBytes ? lineStart + maxLineBytes + 1 : all.size();
        const auto* lineBreak = static_cast<const char*>(std::memchr(all.data() + pos, '\n', limit - pos));
        if (!lineBreak) {
            if (limit - lineStart > maxLineBytes)
                return lines;
            break;
        }
        ++lines;
        pos = lineStart = std::size_t(lineBreak - all.data()) + 1;
        if (pos - released >= m_releaseBlockBytes && m_mapping) {
            m_mapping->release(released, pos);
            released = pos;
        }
    }
    if (m_mapping)
        m_mapping->release(released, all.size());
    return std::nullopt;
}

std::string TextFile::fingerprint() const
{
    const std::string_view all = bytes();
    Sha256Stream digest;
    for (std::size_t from = 0; from < all.size(); from += m_releaseBlockBytes) {
        const std::size_t length = std::min(m_releaseBlockBytes, all.size() - from);
        digest.update(all.substr(from, length));
        if (m_mapping)
            m_mapping->release(from, from + length);
    }
    return digest.hexDigest();
}

std::expected<TextFile, InputError> TextFile::fromBytes(std::string name, std::string bytes)
{
    return checked(TextFile(std::move(name), std::move(bytes)));
}

std::expected<TextFile, InputError> TextFile::checked(TextFile file)
{
    InputError error;
    error.file = file.name();
    if (startsWith(file.bytes(), "\xFF\xFE") || startsWith(file.bytes(), "\xFE\xFF")) {
        error.line = 1;
        error.problem = "the file is UTF-16 encoded; Plumbline reads UTF-8 text.";
        error.remedy = "save the file as 'CSV UTF-8' (or convert it with iconv -f UTF-16 -t UTF-8).";
        return std::unexpected(error);
    }
    const std::string_view text = file.text();
    if (std::all_of(text.begin(), text.end(), [](char c) { return c == '\n' || c == '\r' || c == ' ' || c == '\t'; })) {
        error.problem = "the file is empty.";
        error.remedy = "choose the file that holds the cohort, with a header row and one row per patient.";
        return std::unexpected(error);
    }
    if (looksLikeUtf16(text)) {
        error.line = 1;
        error.problem = "the file looks UTF-16 encoded (every other byte is zero) without a byte-order mark; Plumbline reads UTF-8 text.";
        error.remedy = "save the file as 'CSV UTF-8' (or convert it with iconv -f UTF-16LE -t UTF-8, or UTF-16BE).";
        return std::unexpected(error);
    }
    if (const auto nul = file.firstNul(); nul != std::string_view::npos) {
        error.line = file.lineOfOffset(nul);
        error.problem = "the file holds binary data (a NUL byte), so it is not a delimited text file.";
        error.remedy = "export the data as CSV or tab-separated text; spreadsheets (.xlsx) must be saved as CSV first.";
        return std::unexpected(error);
    }
    return file;
}

std::size_t TextFile::firstNul() const
{
    const std::string_view s = text();
    for (std::size_t from = 0; from < s.size(); from += m_releaseBlockBytes) {
        const std::size_t length = std::min(m_releaseBlockBytes, s.size() - from);
        const std::size_t nul = s.substr(from, length).find('\0');
        releaseText(from, from + length);
        if (nul != std::string_view::npos)
            return from + nul;
    }
    return std::string_view::npos;
}

std::optional<std::size_t> TextFile::firstInvalidUtf8() const
{
    const std::string_view s = text();
    std::size_t i = 0, released = 0;
    while (i < s.size()) {
        if (i - released >= m_releaseBlockBytes) {
            releaseText(released, i);
            released = i;
        }
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
            return i;
        i += length;
    }
    releaseText(released, s.size());
    return std::nullopt;
}

std::size_t TextFile::lineOfOffset(std::size_t offset) const
{
    const std::string_view s = text().substr(0, offset);
    std::size_t lineBreaks = 0;
    for (std::size_t from = 0; from < s.size(); from += m_releaseBlockBytes) {
        const std::string_view block = s.substr(from, m_releaseBlockBytes);
        lineBreaks += static_cast<std::size_t>(std::count(block.begin(), block.end(), '\n'));
        releaseText(from, from + block.size());
    }
    return 1 + lineBreaks;
}

} // namespace plumbline
