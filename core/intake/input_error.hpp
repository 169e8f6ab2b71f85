#pragma once

#include <cstddef>
#include <string>

namespace plumbline {

// What kind of failure the user is looking at; the CLI maps it to its exit status.
enum class ErrorKind {
    UnusableInput,      // a file or setting cannot be used as given (exit 2)
    ImpossibleAnalysis, // the data are readable but cannot support the analysis (exit 3)
    OutsideFolder,      // an analysis file names an input outside its folder: the user must confirm (exit 2)
};

// A problem the user caused and can fix. Every field that is known is filled so the
// message can point at the exact place: file, line, column and value, plus what to do.
struct InputError {
    ErrorKind kind = ErrorKind::UnusableInput;
    std::string file;        // path as the user gave it; empty for settings errors
    std::size_t line = 0;    // 1-based physical line; 0 when not tied to a line
    std::string lineNoun = "line"; // what `line` counts: "row" in a sheet, a statistical file or a query result
    std::string column;      // column name; empty when not tied to a column
    std::string key;         // the setting, in an analysis file ("options.confidence"); empty otherwise
    std::string value;       // the offending value; empty when none
    std::string problem;     // what is wrong, one sentence
    std::string remedy;      // what to do about it, one sentence

    // "FILE, line L, column 'C', key 'K', value 'V': problem. What to do: remedy". Column and
    // value are shown as short, printable excerpts (see printableExcerpt).
    std::string message() const;
};

} // namespace plumbline
