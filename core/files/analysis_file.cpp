#include "files/analysis_file.hpp"

#include "files/atomic_file.hpp"
#include "files/settings_check.hpp"
#include "intake/field_values.hpp"
#include "intake/file_fingerprint.hpp"
#include "intake/text_file.hpp"

#include <nlohmann/json.hpp>

#include <filesystem>
#include <fstream>
#include <sstream>

namespace plumbline {

namespace fs = std::filesystem;
using Json = nlohmann::ordered_json;

namespace {

constexpr int formatVersion = 1;
constexpr std::size_t maxAnalysisFileBytes = 10u << 20;

std::string relativeTo(const std::string& file, const fs::path& folder)
{
    std::error_code error;
    const fs::path absolute = fs::absolute(file, error);
    const fs::path relative = fs::relative(absolute, folder, error);
    return error || relative.empty() ? absolute.generic_string() : relative.generic_string();
}

bool isSqliteAddress(const std::string& database)
{
    return database.size() > 7 && lowerAscii(database.substr(0, 7)) == "sqlite:";
}

std::string fileHash(const std::string& path)
{
    return fileFingerprint(path).value_or(std::string());
}

template <typename T>
Json optional(const std::optional<T>& value)
{
    return value ? Json(*value) : Json(nullptr);
}

} // namespace

std::expected<void, InputError> saveAnalysisFile(const std::string& path, const AnalysisFile& a)
{
    const fs::path folder = fs::absolute(fs::path(path)).parent_path();
    Json inputs = Json::array();
    if (a.intake.database) {
        // The URI was refused at intake if it held a password, so it is safe to store.
        // An SQLite file is an input file like any other: stored relative to the analysis file.
        const std::string database = isSqliteAddress(*a.intake.database)
            ? "sqlite:" + relativeTo(a.intake.database->substr(7), folder) : *a.intake.database;
        inputs.push_back({{"role", "cohort"}, {"database", database}, {"query", a.intake.query.value_or("")},
                          {"sha256", a.queryResultSha256}});
    } else {
        Json cohort = {{"role", "cohort"}, {"path", relativeTo(a.intake.cohortFile, folder)}, {"sha256", fileHash(a.intake.cohortFile)}};
        if (a.intake.sheet)
            cohort["sheet"] = *a.intake.sheet;
        inputs.push_back(cohort);
    }
    if (a.intake.outcomesFile)
        inputs.push_back({{"role", "outcomes"}, {"path", relativeTo(*a.intake.outcomesFile, folder)}, {"sha256", fileHash(*a.intake.outcomesFile)}});
    Json json;
    json["plumbline_analysis"] = formatVersion;
    json["inputs"] = inputs;
    json["columns"] = {{"outcome", a.intake.outcomeColumn},
                       {"scores", a.intake.scoreColumns},
                       {"id", optional(a.intake.idColumn)},
                       {"outcomes_id", optional(a.intake.outcomesIdColumn)},
                       {"groups", a.intake.groupColumns},
                       {"period", optional(a.intake.periodColumn)},
                       {"cluster", optional(a.intake.clusterColumn)},
                       {"event", optional(a.intake.eventValue)}};
    json["reading"] = {{"scale", std::string(scaleName(a.intake.scale))},
                       {"scale_given", a.intake.scaleGiven},
                       {"delimiter", a.intake.delimiter ? Json(std::string(1, *a.intake.delimiter)) : Json(nullptr)},
                       {"decimal_comma", a.intake.decimalComma},
                       {"max_line_bytes", a.intake.maxLineBytes}};
    json["options"] = {{"confidence", a.panel.confidence},
                       {"risk_groups", a.panel.riskGroups},
                       {"thresholds", a.panel.thresholds},
                       {"nri_cuts", a.panel.nriCutPoints},
                       {"decision_threshold", a.panel.decisionThreshold},
                       {"decision_range", {a.panel.decisionFrom, a.panel.decisionTo, a.panel.decisionStep}},
                       {"acceptable", acceptableCriteriaText(a.panel.acceptable)},
                       {"period_unit", a.panel.periodUnit == PeriodUnit::Quarter ? "quarter" : "month"},
                       {"date_format", !a.panel.dateFormat ? "iso" : *a.panel.dateFormat == DateFormat::DayFirst ? "dmy" : "mdy"},
                       {"cusum_odds", {a.panel.monitoring.worseOdds, a.panel.monitoring.betterOdds}},
                       {"cusum_years", a.panel.monitoring.targetYears},
                       {"c_statistic_interval", a.panel.cStatisticScale == CStatisticScale::Logit ? "logit" : "plain"},
                       {"binomial_interval", a.panel.binomialInterval == CiMethod::ClopperPearson ? "clopper-pearson" : "wilson"},
                       {"bootstrap", a.bootstrap.replicates},
                       {"seed", a.bootstrap.seed},
                       {"ci_method", std::string(bootstrapCiName(a.bootstrap.method))},
                       {"stratified_bootstrap", a.bootstrap.stratified},
                       {"add_updated", a.addUpdated},
                       {"minimum_cell", a.minimumCell},
                       {"capacity", a.panel.capacity ? Json(capacityText(*a.panel.capacity)) : Json(nullptr)}};
    json["report"] = {{"title", a.report.title}, {"model", a.report.model}, {"outcome", a.report.outcome},
                      {"population", a.report.population}, {"period", a.report.period}, {"notes", a.report.notes}};
    return writeFileAtomically(path, json.dump(2) + "\n");
}

namespace {

// Reading an analysis file: every value is checked for its type and range before it is used, and
// a value that cannot be used is refused naming the file, the key and the value. Refusal is
// thrown inside this file only and turned into an InputError at loadAnalysisFile's boundary.
struct Refusal {
    InputError error;
};

class FieldReader {
public:
    FieldReader(const Json& object, std::string section, const std::string& file)
        : m_object(object)
        , m_section(std::move(section))
        , m_file(file)
    {
    }

    [[noreturn]] void refuse(const std::string& key, const std::string& value, const std::string& problem,
                             const std::string& remedy = "save the analysis again from Plumbline rather than editing it by hand.") const
    {
        InputError error;
        error.file = m_file;
        error.key = m_section.empty() ? key : m_section + "." + key;
        error.value = value;
        error.problem = problem;
        error.remedy = remedy;
        throw Refusal{error};
    }

    bool has(const std::string& key) const { return m_object.contains(key) && !m_object.at(key).is_null(); }

    double number(const std::string& key, double fallback) const
    {
        if (!has(key))
            return fallback;
        const Json& v = m_object.at(key);
        if (!v.is_number())
            refuse(key, v.dump(), "must be a number.");
        return v.get<double>();
    }

    // A whole number from 0 up: 2.5, −1 and "10" are refused, not rounded or wrapped.
    std::uint64_t count(const std::string& key, std::uint64_t fallback) const
    {
        if (!has(key))
            return fallback;
        const Json& v = m_object.at(key);
        if (v.is_number_unsigned())
            return v.get<std::uint64_t>();
        refuse(key, v.dump(), "must be a whole number of 0 or more.");
    }

    bool flag(const std::string& key, bool fallback) const
    {
        if (!has(key))
            return fallback;
        const Json& v = m_object.at(key);
        if (!v.is_boolean())
            refuse(key, v.dump(), "must be true or false.");
        return v.get<bool>();
    }

    std::string text(const std::string& key, const std::string& fallback) const
    {
        if (!has(key))
            return fallback;
        const Json& v = m_object.at(key);
        if (!v.is_string())
            refuse(key, v.dump(), "must be text.");
        return v.get<std::string>();
    }

    std::optional<std::string> optionalText(const std::string& key) const
    {
        return has(key) ? std::optional<std::string>(text(key, {})) : std::nullopt;
    }

    std::string choice(const std::string& key, const std::string& fallback, std::initializer_list<const char*> allowed) const
    {
        const std::string value = text(key, fallback);
        std::string list;
        for (const char* a : allowed) {
            if (value == a)
                return value;
            list += std::string(list.empty() ? "" : ", ") + (*a ? a : "\"\"");
        }
        refuse(key, value, "must be one of: " + list + ".");
    }

    std::vector<double> numbers(const std::string& key, const std::vector<double>& fallback) const
    {
        if (!has(key))
            return fallback;
        const Json& v = m_object.at(key);
        if (!v.is_array())
            refuse(key, v.dump().substr(0, 40), "must be a list of numbers.");
        std::vector<double> out;
        for (const Json& item : v) {
            if (!item.is_number())
                refuse(key, item.dump().substr(0, 40), "must be a list of numbers.");
            out.push_back(item.get<double>());
        }
        return out;
    }

    std::vector<std::string> texts(const std::string& key) const
    {
        if (!has(key))
            return {};
        const Json& v = m_object.at(key);
        if (!v.is_array())
            refuse(key, v.dump().substr(0, 40), "must be a list of column names.");
        std::vector<std::string> out;
        for (const Json& item : v) {
            if (!item.is_string())
                refuse(key, item.dump().substr(0, 40), "must be a list of column names.");
            out.push_back(item.get<std::string>());
        }
        return out;
    }

    const Json& object(const std::string& key) const
    {
        if (!m_object.contains(key) || !m_object.at(key).is_object())
            refuse(key, {}, "is missing or is not a section of settings.");
        return m_object.at(key);
    }

private:
    const Json& m_object;
    std::string m_section;
    const std::string& m_file;
};

// An input's path: relative paths resolve against the analysis file's folder. A path that is
// absolute or leaves that folder (after symbolic links) is read only when the user has said so:
// an analysis file received from someone else must not read, hash and quote any file it names.
std::string inputPath(const std::string& key, const std::string& stored, const fs::path& folder,
                      const AnalysisFileReading& reading, const std::string& analysisPath)
{
    const fs::path given(stored);
    const fs::path path = (given.is_absolute() ? given : folder / given).lexically_normal();
    std::error_code ignored;
    const fs::path real = fs::weakly_canonical(path, ignored);
    const fs::path realFolder = fs::weakly_canonical(folder, ignored);
    const fs::path inside = real.lexically_relative(realFolder);
    const bool outside = given.is_absolute() || inside.empty() || *inside.begin() == "..";
    if (outside && !reading.allowOutsidePaths) {
        InputError error;
        error.kind = ErrorKind::OutsideFolder;
        error.file = analysisPath;
        error.key = key;
        error.value = stored;
        error.problem = "this input lies outside the analysis file's folder (an absolute path, or one that leaves the folder).";
        error.remedy = "open it only if you trust the analysis file: confirm it in the window, or give --allow-outside-paths on the "
                       "command line; or keep the data beside the analysis file.";
        throw Refusal{error};
    }
    return path.string();
}

AnalysisFile readAnalysis(const Json& json, const std::string& path, std::vector<std::string>& warnings, const AnalysisFileReading& reading)
{
    const fs::path folder = fs::absolute(fs::path(path)).parent_path();
    const FieldReader top(json, "", path);
    AnalysisFile a;
    const Json& inputs = json.contains("inputs") ? json.at("inputs") : Json();
    if (!inputs.is_array() || inputs.empty() || inputs.size() > 2)
        top.refuse("inputs", {}, "must list the cohort file and, when outcomes are in a second file, the outcomes file.");
    bool cohortSeen = false;
    for (std::size_t k = 0; k < inputs.size(); ++k) {
        if (!inputs[k].is_object())
            top.refuse("inputs", {}, "must list objects with a role, a path and a SHA-256.");
        const FieldReader input(inputs[k], "inputs[" + std::to_string(k) + "]", path);
        const std::string role = input.choice("role", "", {"cohort", "outcomes"});
        if ((role == "cohort" && cohortSeen) || (role == "outcomes" && a.intake.outcomesFile))
            input.refuse("role", role, "appears twice.");
        if (role == "cohort" && inputs[k].contains("database")) {
            a.intake.database = input.text("database", "");
            if (isSqliteAddress(*a.intake.database))
                a.intake.database = "sqlite:" + inputPath("inputs[" + std::to_string(k) + "].database", a.intake.database->substr(7),
                                                          folder, reading, path);
            a.intake.query = input.text("query", "");
            if (a.intake.database->empty() || a.intake.query->empty())
                input.refuse("query", {}, "a database input needs both the database and the query.");
            a.queryResultSha256 = input.text("sha256", "");
            if (a.queryResultSha256.empty())
                warnings.push_back("The analysis file records no SHA-256 for the query's result, so a change to the data cannot be detected.");
            cohortSeen = true;
            continue;
        }
        if (role == "cohort" && inputs[k].contains("sheet"))
            a.intake.sheet = input.text("sheet", "");
        const std::string stored = input.text("path", "");
        if (stored.empty())
            input.refuse("path", {}, "is missing.");
        const std::string file = inputPath("inputs[" + std::to_string(k) + "].path", stored, folder, reading, path);
        (role == "outcomes" ? a.intake.outcomesFile.emplace() : a.intake.cohortFile) = file;
        cohortSeen = cohortSeen || role == "cohort";
        const std::string recorded = input.text("sha256", "");
        const std::string now = fileHash(file);
        std::string warning;
        if (now.empty())
            warning = "The input " + file + " named in the analysis cannot be read.";
        else if (recorded.empty())
            warning = "The analysis file records no SHA-256 for " + file + ", so a change to that file cannot be detected.";
        else if (recorded != now)
            warning = "The input " + file + " has changed since the analysis was saved (SHA-256 " + recorded.substr(0, 12) + "... then, "
                + now.substr(0, 12) + "... now): results will differ from the saved analysis.";
        if (!warning.empty() && reading.strictInputs && !now.empty())
            input.refuse("sha256", recorded.substr(0, 16), warning.substr(0, warning.size() - 1) + ", and --strict-inputs asks for the saved inputs.",
                         "re-run on the files the analysis was saved with, or save the analysis again.");
        if (!warning.empty())
            warnings.push_back(warning);
    }
    if (!cohortSeen)
        top.refuse("inputs", {}, "name no cohort file.");
    const FieldReader columns(top.object("columns"), "columns", path);
    a.intake.outcomeColumn = columns.text("outcome", "");
    a.intake.scoreColumns = columns.texts("scores");
    a.intake.groupColumns = columns.texts("groups");
    a.intake.idColumn = columns.optionalText("id");
    a.intake.outcomesIdColumn = columns.optionalText("outcomes_id");
    a.intake.periodColumn = columns.optionalText("period");
    a.intake.clusterColumn = columns.optionalText("cluster");
    a.intake.eventValue = columns.optionalText("event");
    const FieldReader read(top.object("reading"), "reading", path);
    a.intake.scale = *scaleFromName(read.choice("scale", "probability", {"probability", "percent", "logit", "points"}));
    a.intake.scaleGiven = read.flag("scale_given", false);
    const std::string delimiter = read.text("delimiter", "");
    if (delimiter.size() > 1 || delimiter == "\"" || delimiter == "\n" || delimiter == "\r")
        read.refuse("delimiter", delimiter, "must be one character.");
    if (!delimiter.empty())
        a.intake.delimiter = delimiter[0];
    a.intake.decimalComma = read.flag("decimal_comma", false);
    a.intake.maxLineBytes = read.count("max_line_bytes", a.intake.maxLineBytes);
    const FieldReader o(top.object("options"), "options", path);
    a.panel.confidence = o.number("confidence", a.panel.confidence);
    a.panel.riskGroups = o.count("risk_groups", a.panel.riskGroups);
    a.panel.thresholds = o.numbers("thresholds", a.panel.thresholds);
    a.panel.nriCutPoints = o.numbers("nri_cuts", a.panel.nriCutPoints);
    a.panel.decisionThreshold = o.number("decision_threshold", a.panel.decisionThreshold);
    const auto range = o.numbers("decision_range", {a.panel.decisionFrom, a.panel.decisionTo, a.panel.decisionStep});
    if (range.size() != 3)
        o.refuse("decision_range", std::to_string(range.size()) + " numbers", "must hold three numbers: from, to and step.");
    a.panel.decisionFrom = range[0];
    a.panel.decisionTo = range[1];
    a.panel.decisionStep = range[2];
    if (const std::string acceptable = o.text("acceptable", ""); !acceptable.empty()) {
        const auto criteria = parseAcceptableCriteria(acceptable, "the criteria");
        if (!criteria)
            o.refuse("acceptable", acceptable, criteria.error().problem, criteria.error().remedy);
        a.panel.acceptable = *criteria;
    }
    a.panel.periodUnit = o.choice("period_unit", "month", {"month", "quarter"}) == "quarter" ? PeriodUnit::Quarter : PeriodUnit::Month;
    const std::string dates = o.choice("date_format", "iso", {"iso", "dmy", "mdy"});
    if (dates != "iso")
        a.panel.dateFormat = dates == "dmy" ? DateFormat::DayFirst : DateFormat::MonthFirst;
    const auto odds = o.numbers("cusum_odds", {a.panel.monitoring.worseOdds, a.panel.monitoring.betterOdds});
    if (odds.size() != 2)
        o.refuse("cusum_odds", std::to_string(odds.size()) + " numbers", "must hold two odds ratios: the worse chart's (above 1) and the better chart's (below 1).");
    a.panel.monitoring.worseOdds = odds[0];
    a.panel.monitoring.betterOdds = odds[1];
    a.panel.monitoring.targetYears = o.number("cusum_years", a.panel.monitoring.targetYears);
    a.panel.cStatisticScale = o.choice("c_statistic_interval", "logit", {"logit", "plain"}) == "plain" ? CStatisticScale::Plain : CStatisticScale::Logit;
    a.panel.binomialInterval = o.choice("binomial_interval", "wilson", {"wilson", "clopper-pearson"}) == "clopper-pearson" ? CiMethod::ClopperPearson
                                                                                                                             : CiMethod::Wilson;
    a.bootstrap.replicates = o.count("bootstrap", a.bootstrap.replicates);
    a.bootstrap.seed = o.count("seed", a.bootstrap.seed);
    a.bootstrap.method = o.choice("ci_method", "bca", {"bca", "percentile"}) == "percentile" ? BootstrapCi::Percentile : BootstrapCi::Bca;
    a.bootstrap.stratified = o.flag("stratified_bootstrap", a.bootstrap.stratified);
    a.addUpdated = o.choice("add_updated", "", {"", "intercept", "logistic", "closed-test"});
    a.minimumCell = o.count("minimum_cell", a.minimumCell);
    a.panel.minimumCell = a.minimumCell;
    if (const auto capacity = o.optionalText("capacity")) {
        const auto spec = parseCapacity(*capacity, "the capacity");
        if (!spec)
            o.refuse("capacity", *capacity, spec.error().problem, spec.error().remedy);
        a.panel.capacity = *spec;
    }
    a.panel.simulationSeed = a.bootstrap.seed;
    if (json.contains("report")) {
        const FieldReader t(top.object("report"), "report", path);
        a.report = {t.text("title", ""), t.text("model", ""), t.text("outcome", ""), t.text("population", ""), t.text("period", ""), t.text("notes", "")};
    }
    return a;
}

} // namespace

std::expected<AnalysisFile, InputError> loadAnalysisFile(const std::string& path, std::vector<std::string>& warnings,
                                                         const AnalysisFileReading& reading)
{
    const auto text = TextFile::load(path);
    if (!text)
        return std::unexpected(text.error());
    return readAnalysisFile(*text, warnings, reading);
}

std::expected<AnalysisFile, InputError> readAnalysisFile(const TextFile& file, std::vector<std::string>& warnings,
                                                         const AnalysisFileReading& reading)
{
    const std::string& path = file.name();
    const TextFile* text = &file;
    InputError error;
    error.file = path;
    if (text->sizeInBytes() > maxAnalysisFileBytes) {
        error.problem = "the file is " + std::to_string(text->sizeInBytes() / 1024) + " KB; an analysis file is a few kilobytes.";
        error.remedy = "choose an analysis saved by Plumbline (*.plumbline.json).";
        return std::unexpected(error);
    }
    const auto whole = text->readText(0, text->textSize());
    if (!whole)
        return std::unexpected(whole.error());
    Json json;
    try {
        json = Json::parse(*whole);
    } catch (const nlohmann::json::exception& parseError) { // syntax, or a number such as 1e400 that overflows
        error.problem = std::string("the analysis file is not valid JSON (") + parseError.what() + ").";
        error.remedy = "open an analysis saved by Plumbline (*.plumbline.json), or save it again.";
        return std::unexpected(error);
    }
    if (!json.is_object() || !json.contains("plumbline_analysis") || !json.at("plumbline_analysis").is_number_unsigned()) {
        error.problem = "this JSON file is not a Plumbline analysis (no \"plumbline_analysis\" version).";
        error.remedy = "choose a file saved with File → Save analysis (or --save-settings).";
        return std::unexpected(error);
    }
    const auto version = json.at("plumbline_analysis").get<std::uint64_t>();
    if (version < 1 || version > std::uint64_t(formatVersion)) {
        error.key = "plumbline_analysis";
        error.value = std::to_string(version);
        error.problem = version > std::uint64_t(formatVersion) ? "the analysis was saved by a newer Plumbline (format " + std::to_string(version) + ")."
                                                               : "this analysis format is unknown.";
        error.remedy = version > std::uint64_t(formatVersion) ? "update Plumbline to open it." : "save the analysis again from Plumbline.";
        return std::unexpected(error);
    }
    try {
        std::vector<std::string> found;
        AnalysisFile a = readAnalysis(json, path, found, reading);
        if (auto checked = checkAnalysisSettings(a, SettingsSource::AnalysisFile, path); !checked)
            return std::unexpected(checked.error());
        warnings.insert(warnings.end(), found.begin(), found.end());
        return a;
    } catch (const Refusal& refusal) {
        return std::unexpected(refusal.error);
    } catch (const nlohmann::json::exception& jsonError) {
        error.problem = std::string("the analysis file misses or mistypes a field (") + jsonError.what() + ").";
        error.remedy = "save the analysis again from Plumbline rather than editing it by hand.";
        return std::unexpected(error);
    }
}

std::optional<std::string> queryResultChange(const AnalysisFile& analysis, const std::string& resultSha256)
{
    if (!analysis.intake.database || analysis.queryResultSha256.empty() || analysis.queryResultSha256 == resultSha256)
        return std::nullopt;
    return "The query's result has changed since the analysis was saved (SHA-256 " + analysis.queryResultSha256.substr(0, 12)
        + "... then, " + resultSha256.substr(0, 12) + "... now): results will differ from the saved analysis.";
}

} // namespace plumbline
