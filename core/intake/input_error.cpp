#include "intake/input_error.hpp"

#include "intake/printable_text.hpp"

namespace plumbline {

std::string InputError::message() const
{
    std::string where;
    auto append = [&where](const std::string& part) {
        if (!where.empty())
            where += ", ";
        where += part;
    };
    if (!file.empty())
        append(printableExcerpt(file, 240));
    if (line > 0)
        append(lineNoun + " " + std::to_string(line));
    if (!column.empty())
        append("column '" + printableExcerpt(column, 60) + "'");
    if (!key.empty())
        append("key '" + printableExcerpt(key, 60) + "'");
    if (!value.empty())
        append("value '" + printableExcerpt(value, 60) + "'");
    // A database's own message may span lines (PostgreSQL's "LINE 1: …" and its caret) and end
    // without a full stop: one line, one sentence, before what to do.
    std::string said;
    for (const char c : problem) {
        const char shown = c == '\t' || c == '\n' || c == '\r' ? ' ' : c;
        if (shown != ' ' || (!said.empty() && said.back() != ' '))
            said += shown;
    }
    while (!said.empty() && said.back() == ' ')
        said.pop_back();
    if (!said.empty() && said.back() != '.' && said.back() != '!' && said.back() != '?' && !remedy.empty())
        said += '.';
    std::string text = where.empty() ? said : where + ": " + said;
    if (!remedy.empty())
        text += " What to do: " + remedy;
    return text;
}

} // namespace plumbline
