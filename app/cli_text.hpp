#pragma once

#include "intake/intake.hpp"

#include <cstddef>
#include <ostream>
#include <string>

namespace plumbline::cli {

// 24000 → "24,000": counts in the terminal are read by people.
std::string withThousands(std::size_t value);

// The intake audit as a short, readable block: rows read, used, excluded by reason with lines.
void printIntakeSummary(std::ostream& out, const IntakeSettings& settings, const IntakeResult& result);

// The standard cautions, one per line.
void printCautions(std::ostream& out);

} // namespace plumbline::cli
