#include "intake/column_roles.hpp"

#include "intake/field_values.hpp"
#include "intake/typed_table_intake.hpp"

#include <algorithm>
#include <cctype>
#include <array>

namespace plumbline {

namespace {

bool nameHas(const std::string& name, std::initializer_list<std::string_view> fragments)
{
    const std::string lower = lowerAscii(name);
    return std::any_of(fragments.begin(), fragments.end(),
                       [&](std::string_view f) { return lower.find(f) != std::string::npos; });
}

double maximumOf(const ColumnProfile& c)
{
    return c.maximum.empty() ? 0.0 : parseNumber(c.maximum, false).value_or(0.0);
}

} // namespace

ColumnRoles guessColumnRoles(const TableProfile& profile)
{
    ColumnRoles roles;
    const auto& columns = profile.columns;
    // Outcome: a two-valued column with outcome-like values (0/1, no/yes, n/y, false/true),
    // preferring outcome-like names. Other pairs (F/M, say) are never guessed.
    auto outcomeLike = [](const ColumnProfile& c) {
        static const std::vector<std::vector<std::string>> pairs{{"0", "1"}, {"no", "yes"}, {"n", "y"}, {"false", "true"}};
        return c.type == "binary" && std::find(pairs.begin(), pairs.end(), c.levels) != pairs.end();
    };
    auto outcomeNamed = [](const ColumnProfile& c) {
        return nameHas(c.name, {"readmit", "outcome", "event", "died", "death", "status", "label"});
    };
    for (int pass = 0; pass < 2 && !roles.outcome; ++pass)
        for (const auto& c : columns)
            if (outcomeLike(c) && (pass == 1 || outcomeNamed(c))) {
                roles.outcome = c.name;
                break;
            }
    // Scores: numeric columns named like scores, or numbers within 0-1.
    for (const auto& c : columns) {
        if (roles.outcome && c.name == *roles.outcome)
            continue;
        const bool numeric = couldHoldScores(c);
        const bool named = nameHas(c.name, {"score", "risk", "prob", "pred"});
        if (numeric && (named || (c.type == "number" && maximumOf(c) <= 1.0)))
            roles.scores.push_back(c.name);
    }
    if (!roles.scores.empty()) {
        const auto it = std::find_if(columns.begin(), columns.end(), [&](const ColumnProfile& c) { return c.name == roles.scores[0]; });
        const double hi = maximumOf(*it);
        // A few stray values just above 1 are data errors the intake will count, not percent.
        if (hi > 2.0 && hi <= 100.0 && it->type != "integer")
            roles.scale = ScoreScale::Percent;
        else if (it->type == "integer" && hi > 1.0)
            roles.scale = ScoreScale::Points;
    }
    std::vector<std::string> free;
    for (const auto& c : columns)
        if (!(roles.outcome && c.name == *roles.outcome) && std::find(roles.scores.begin(), roles.scores.end(), c.name) == roles.scores.end())
            free.push_back(c.name);
    roles.site = guessSiteColumn(free);
    for (const auto& c : columns) {
        const bool taken = (roles.outcome && c.name == *roles.outcome)
            || std::find(roles.scores.begin(), roles.scores.end(), c.name) != roles.scores.end();
        if (taken)
            continue;
        // The site column stays a subgroup too (its Cochran's Q and funnel), but "hospital_id"
        // names a site, not a patient, so it is never the id.
        const bool site = roles.site && c.name == *roles.site;
        if (!roles.id && !site && c.type == "text" && (nameHas(c.name, {"id", "encounter", "mrn", "number"}) || c.distinct == c.nonMissing))
            roles.id = c.name;
        else if (!roles.period && c.type == "date")
            roles.period = c.name;
        // An outcome-named column the outcome guess passed over (three values, say) is a
        // problem for the user to resolve, not a subgroup.
        else if ((c.type == "text" || c.type == "binary") && c.distinct >= 2 && c.distinct <= 20 && !outcomeNamed(c))
            roles.groups.push_back(c.name);
    }
    return roles;
}

bool couldHoldScores(const ColumnProfile& c)
{
    return c.type == "number" || c.type == "integer" || (c.type == "text" && !c.minimum.empty());
}

bool couldBeSubgroup(const ColumnProfile& c)
{
    return (c.type == "text" || c.type == "binary" || c.type == "integer") && !c.distinctCapped && c.distinct >= 2 && c.distinct <= 100;
}

TablePreview previewTable(const DelimitedTable& table, std::size_t maxRows)
{
    TablePreview preview;
    preview.header = table.header();
    table.forEachRecord([&](const CsvScanner& scanner) {
        if (preview.rows.size() >= maxRows)
            return;
        preview.rows.emplace_back(scanner.fields().begin(), scanner.fields().end());
        preview.lines.push_back(scanner.line());
    });
    return preview;
}

std::expected<TablePreview, InputError> previewTable(TypedTable& table, std::size_t maxRows)
{
    TablePreview preview;
    for (const auto& column : table.columns())
        preview.header.push_back(column.name);
    const auto& columns = table.columns();
    const auto visited = table.forEachRecord([&](std::span<const TypedCell> cells, std::size_t position) {
        if (preview.rows.size() >= maxRows)
            return false;
        std::vector<std::string> row;
        for (std::size_t c = 0; c < cells.size(); ++c)
            row.push_back(typedCellText(cells[c], c < columns.size() && !columns[c].labels.empty() ? &columns[c].labels : nullptr));
        preview.rows.push_back(std::move(row));
        preview.lines.push_back(position);
        return true;
    });
    if (!visited)
        return std::unexpected(visited.error());
    return preview;
}

} // namespace plumbline

namespace plumbline {

bool looksLikeSiteColumn(std::string_view name)
{
    std::string lower;
    for (const char ch : name)
        lower.push_back(char(std::tolower(static_cast<unsigned char>(ch))));
    for (const std::string_view suffix : {"_id", "_name"})
        if (lower.size() > suffix.size() && lower.ends_with(suffix)) {
            lower.resize(lower.size() - suffix.size());
            break;
        }
    static constexpr std::array<std::string_view, 7> words{"hospital", "site", "facility", "centre", "center", "clinic", "practice"};
    return std::find(words.begin(), words.end(), lower) != words.end();
}

std::optional<std::string> guessSiteColumn(const std::vector<std::string>& header)
{
    for (const auto& name : header)
        if (looksLikeSiteColumn(name))
            return name;
    return std::nullopt;
}

} // namespace plumbline
