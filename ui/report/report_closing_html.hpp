#pragma once

#include <QString>

#include <string>
#include <vector>

namespace plumbline {

// A section's closing paragraphs as one compact HTML block, for the PDF and HTML writers alike:
// items starting "- " become one bulleted list, "Warning: " lines a list in small print, anything
// else a paragraph. One block keeps page 1's findings and warnings tight.
QString closingHtml(const std::vector<std::string>& paragraphs);

} // namespace plumbline
