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
    std::string text = where.empty() ? problem : where + ": " + problem;
    if (!remedy.empty())
        text += " What to do: " + remedy;
    return text;
}

} // namespace plumbline
