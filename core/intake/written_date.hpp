#pragma once

#include <string_view>

namespace plumbline {

// A date text as it is written, read once at intake: its shape and its numbers, before any
// convention is applied. Whether 03/04/2025 is 3 April or March 4 is an analysis setting, so the
// period analysis applies it to these numbers and never reads the text again.
struct WrittenDate {
    enum class Shape {
        Unreadable,
        Iso,     // YYYY-MM-DD, a time may follow after 'T' or a space: first = month, second = day
        Slashed, // a/b/YYYY with one or two digits in a and b, separators / . or -: first = a, second = b
    };
    Shape shape = Shape::Unreadable;
    int year = 0;
    int first = 0;
    int second = 0;
};

// The shape and numbers of a date text (spaces around it ignored). Not a check that the date
// exists: 2025-02-30 reads as Iso.
WrittenDate readWrittenDate(std::string_view text);

} // namespace plumbline
