#include "intake/column_suggest.hpp"

#include "intake/field_values.hpp"

#include <algorithm>
#include <numeric>

namespace plumbline {

namespace {

// Levenshtein distance (insert, delete, substitute each cost 1).
std::size_t editDistance(const std::string& a, const std::string& b)
{
    std::vector<std::size_t> previous(b.size() + 1);
    std::vector<std::size_t> current(b.size() + 1);
    std::iota(previous.begin(), previous.end(), std::size_t{0});
    for (std::size_t i = 1; i <= a.size(); ++i) {
        current[0] = i;
        for (std::size_t j = 1; j <= b.size(); ++j) {
            const std::size_t substitute = previous[j - 1] + (a[i - 1] == b[j - 1] ? 0 : 1);
            current[j] = std::min({previous[j] + 1, current[j - 1] + 1, substitute});
        }
        std::swap(previous, current);
    }
    return previous[b.size()];
}

} // namespace

std::vector<std::string> closestColumnNames(std::string_view wanted, const std::vector<std::string>& header)
{
    const std::string target = lowerAscii(trimmed(wanted));
    struct Candidate {
        std::size_t distance;
        std::size_t index;
    };
    std::vector<Candidate> candidates;
    for (std::size_t i = 0; i < header.size(); ++i) {
        const std::string name = lowerAscii(trimmed(header[i]));
        if (name.empty())
            continue;
        std::size_t distance = editDistance(target, name);
        const bool contains = !target.empty()
            && (name.find(target) != std::string::npos || target.find(name) != std::string::npos);
        if (contains)
            distance = std::min<std::size_t>(distance, 1);
        const std::size_t allowed = std::max<std::size_t>(2, std::max(target.size(), name.size()) / 2);
        if (distance <= allowed)
            candidates.push_back({distance, i});
    }
    std::stable_sort(candidates.begin(), candidates.end(),
                     [](const Candidate& a, const Candidate& b) { return a.distance < b.distance; });
    std::vector<std::string> out;
    for (std::size_t k = 0; k < candidates.size() && k < 3; ++k)
        out.push_back(header[candidates[k].index]);
    return out;
}

std::string quotedList(const std::vector<std::string>& names)
{
    std::string out;
    for (std::size_t i = 0; i < names.size(); ++i) {
        if (i > 0)
            out += i + 1 == names.size() ? " or " : ", ";
        out += "'" + names[i] + "'";
    }
    return out;
}

} // namespace plumbline
