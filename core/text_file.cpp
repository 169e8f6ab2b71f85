#include "text_file.hpp"

#include <algorithm>
#include <cstdio>
#include <cerrno>
#include <cstdint>
#include <cstring>
#include <memory>

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

} // namespace

TextFile::TextFile(std::string name, std::string bytes)
    : m_name(std::move(name))
    , m_bytes(std::move(bytes))
    , m_textStart(startsWith(m_bytes, utf8Bom) ? utf8Bom.size() : 0)
{
}

std::string_view TextFile::text() const
{
    return std::string_view(m_bytes).substr(m_textStart);
}

std::expected<TextFile, InputError> TextFile::load(const std::string& path)
{
    InputError error;
    error.file = path;
    std::unique_ptr<std::FILE, int (*)(std::FILE*)> file(std::fopen(path.c_str(), "rb"), &std::fclose);
    if (!file) {
        error.problem = std::string("the file cannot be opened (") + std::strerror(errno) + ").";
        error.remedy = "check the path and that you may read the file.";
        return std::unexpected(error);
    }
    std::string bytes;
    if (std::fseek(file.get(), 0, SEEK_END) == 0) {
        const long size = std::ftell(file.get());
        if (size > 0)
            bytes.reserve(static_cast<std::size_t>(size));
        std::fseek(file.get(), 0, SEEK_SET);
    }
    char buffer[1 << 16];
    std::size_t got = 0;
    while ((got = std::fread(buffer, 1, sizeof buffer, file.get())) > 0)
        bytes.append(buffer, got);
    if (std::ferror(file.get())) {
        error.problem = "the file could not be read to the end.";
        error.remedy = "check that the file is not a folder and is not being written to.";
        return std::unexpected(error);
    }
    return checked(path, std::move(bytes));
}

std::expected<TextFile, InputError> TextFile::fromBytes(std::string name, std::string bytes)
{
    return checked(std::move(name), std::move(bytes));
}

std::expected<TextFile, InputError> TextFile::checked(std::string name, std::string bytes)
{
    InputError error;
    error.file = name;
    if (startsWith(bytes, "\xFF\xFE") || startsWith(bytes, "\xFE\xFF")) {
        error.line = 1;
        error.problem = "the file is UTF-16 encoded; Plumbline reads UTF-8 text.";
        error.remedy = "save the file as 'CSV UTF-8' (or convert it with iconv -f UTF-16 -t UTF-8).";
        return std::unexpected(error);
    }
    TextFile file(std::move(name), std::move(bytes));
    const std::string_view text = file.text();
    if (std::all_of(text.begin(), text.end(), [](char c) { return c == '\n' || c == '\r' || c == ' ' || c == '\t'; })) {
        error.problem = "the file is empty.";
        error.remedy = "choose the file that holds the cohort, with a header row and one row per patient.";
        return std::unexpected(error);
    }
    if (const auto nul = text.find('\0'); nul != std::string_view::npos) {
        error.line = file.lineOfOffset(nul);
        error.problem = "the file holds binary data (a NUL byte), so it is not a delimited text file.";
        error.remedy = "export the data as CSV or tab-separated text; spreadsheets (.xlsx) must be saved as CSV first.";
        return std::unexpected(error);
    }
    return file;
}

std::optional<std::size_t> TextFile::firstInvalidUtf8() const
{
    const std::string_view s = text();
    std::size_t i = 0;
    while (i < s.size()) {
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
    return std::nullopt;
}

std::size_t TextFile::lineOfOffset(std::size_t offset) const
{
    const std::string_view s = text().substr(0, offset);
    return 1 + static_cast<std::size_t>(std::count(s.begin(), s.end(), '\n'));
}

} // namespace plumbline
