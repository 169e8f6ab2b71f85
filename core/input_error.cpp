#include "input_error.hpp"

namespace plumbline {

namespace {
// Values from a file may be long or hold control characters; keep the message one readable line.
std::string printable(const std::string& text)
{
    constexpr std::size_t maxShown = 60;
    std::string out;
    for (char c : text) {
        if (out.size() >= maxShown) {
            out += "...";
            break;
        }
        const auto u = static_cast<unsigned char>(c);
        if (u < 0x20 || u == 0x7f) {
            static const char* hex = "0123456789ABCDEF";
            out += "\\x";
            out += hex[u >> 4];
            out += hex[u & 0xF];
        } else {
            out += c;
        }
    }
    return out;
}
} // namespace

std::string InputError::message() const
{
    std::string where;
    auto append = [&where](const std::string& part) {
        if (!where.empty())
            where += ", ";
        where += part;
    };
    if (!file.empty())
        append(file);
    if (line > 0)
        append("line " + std::to_string(line));
    if (!column.empty())
        append("column '" + printable(column) + "'");
    if (!value.empty())
        append("value '" + printable(value) + "'");
    std::string text = where.empty() ? problem : where + ": " + problem;
    if (!remedy.empty())
        text += " What to do: " + remedy;
    return text;
}

} // namespace plumbline
