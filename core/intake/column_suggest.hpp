#pragma once

#include <string>
#include <string_view>
#include <vector>

namespace plumbline {

// Up to three header names closest to a name the user typed (case-insensitive edit distance,
// a name containing the other counts as close), best first.
std::vector<std::string> closestColumnNames(std::string_view wanted, const std::vector<std::string>& header);

// "'a', 'b' or 'c'": names as a message lists them.
std::string quotedList(const std::vector<std::string>& names);

} // namespace plumbline
