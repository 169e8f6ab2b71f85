#include "analysis_file.hpp"

#include "atomic_file.hpp"
#include "sha256.hpp"
#include "text_file.hpp"

#include <nlohmann/json.hpp>

#include <filesystem>
#include <fstream>
#include <sstream>

namespace plumbline {

namespace fs = std::filesystem;
using Json = nlohmann::ordered_json;

namespace {

constexpr int formatVersion = 1;

std::string relativeTo(const std::string& file, const fs::path& folder)
{
    std::error_code error;
    const fs::path absolute = fs::absolute(file, error);
    const fs::path relative = fs::relative(absolute, folder, error);
    return error || relative.empty() ? absolute.generic_string() : relative.generic_string();
}

std::string resolved(const std::string& stored, const fs::path& folder)
{
    const fs::path p(stored);
    return (p.is_absolute() ? p : folder / p).lexically_normal().string();
}

std::string fileHash(const std::string& path)
{
    const auto file = TextFile::load(path);
    return file ? sha256Hex(file->bytes()) : std::string();
}

template <typename T>
Json optional(const std::optional<T>& value)
{
    return value ? Json(*value) : Json(nullptr);
}

template <typename T>
void readOptional(const Json& json, const char* key, std::optional<T>& out)
{
    if (json.contains(key) && !json.at(key).is_null())
        out = json.at(key).get<T>();
}

} // namespace

std::expected<void, InputError> saveAnalysisFile(const std::string& path, const AnalysisFile& a)
{
    const fs::path folder = fs::absolute(fs::path(path)).parent_path();
    Json inputs = Json::array();
    inputs.push_back({{"role", "cohort"}, {"path", relativeTo(a.intake.cohortFile, folder)}, {"sha256", fileHash(a.intake.cohortFile)}});
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
                       {"event", optional(a.intake.eventValue)}};
    json["reading"] = {{"scale", std::string(scaleName(a.intake.scale))},
                       {"scale_given", a.intake.scaleGiven},
                       {"delimiter", a.intake.delimiter ? Json(std::string(1, *a.intake.delimiter)) : Json(nullptr)},
                       {"decimal_comma", a.intake.decimalComma}};
    json["options"] = {{"confidence", a.panel.confidence},
                       {"risk_groups", a.panel.riskGroups},
                       {"thresholds", a.panel.thresholds},
                       {"nri_cuts", a.panel.nriCutPoints},
                       {"decision_threshold", a.panel.decisionThreshold},
                       {"decision_range", {a.panel.decisionFrom, a.panel.decisionTo, a.panel.decisionStep}},
                       {"period_unit", a.panel.periodUnit == PeriodUnit::Quarter ? "quarter" : "month"},
                       {"date_format", !a.panel.dateFormat ? "iso" : *a.panel.dateFormat == DateFormat::DayFirst ? "dmy" : "mdy"},
                       {"c_statistic_interval", a.panel.cStatisticScale == CStatisticScale::Logit ? "logit" : "plain"},
                       {"binomial_interval", a.panel.binomialInterval == CiMethod::ClopperPearson ? "clopper-pearson" : "wilson"},
                       {"bootstrap", a.bootstrap.replicates},
                       {"seed", a.bootstrap.seed},
                       {"ci_method", std::string(bootstrapCiName(a.bootstrap.method))},
                       {"stratified_bootstrap", a.bootstrap.stratified},
                       {"add_updated", a.addUpdated},
                       {"minimum_cell", a.minimumCell}};
    json["report"] = {{"title", a.report.title}, {"model", a.report.model}, {"outcome", a.report.outcome},
                      {"population", a.report.population}, {"period", a.report.period}, {"notes", a.report.notes}};
    return writeFileAtomically(path, json.dump(2) + "\n");
}

std::expected<AnalysisFile, InputError> loadAnalysisFile(const std::string& path, std::vector<std::string>& warnings)
{
    InputError error;
    error.file = path;
    const auto text = TextFile::load(path);
    if (!text)
        return std::unexpected(text.error());
    Json json;
    try {
        json = Json::parse(text->text());
    } catch (const nlohmann::json::parse_error& parseError) {
        error.problem = std::string("the analysis file is not valid JSON (") + parseError.what() + ").";
        error.remedy = "open an analysis saved by Plumbline (*.plumbline.json), or save it again.";
        return std::unexpected(error);
    }
    if (!json.contains("plumbline_analysis") || !json.at("plumbline_analysis").is_number_integer()) {
        error.problem = "this JSON file is not a Plumbline analysis (no \"plumbline_analysis\" version).";
        error.remedy = "choose a file saved with File → Save analysis (or --save-settings).";
        return std::unexpected(error);
    }
    if (json.at("plumbline_analysis").get<int>() > formatVersion) {
        error.problem = "the analysis was saved by a newer Plumbline.";
        error.remedy = "update Plumbline to open it.";
        return std::unexpected(error);
    }
    try {
        const fs::path folder = fs::absolute(fs::path(path)).parent_path();
        AnalysisFile a;
        for (const auto& input : json.at("inputs")) {
            const std::string file = resolved(input.at("path").get<std::string>(), folder);
            (input.at("role").get<std::string>() == "outcomes" ? a.intake.outcomesFile.emplace() : a.intake.cohortFile) = file;
            const std::string stored = input.value("sha256", std::string());
            const std::string now = fileHash(file);
            if (now.empty())
                warnings.push_back("The input " + file + " named in the analysis cannot be read.");
            else if (!stored.empty() && stored != now)
                warnings.push_back("The input " + file + " has changed since the analysis was saved (SHA-256 " + stored.substr(0, 12)
                                   + "... then, " + now.substr(0, 12) + "... now): results will differ.");
        }
        const Json& c = json.at("columns");
        a.intake.outcomeColumn = c.at("outcome").get<std::string>();
        a.intake.scoreColumns = c.at("scores").get<std::vector<std::string>>();
        a.intake.groupColumns = c.value("groups", std::vector<std::string>{});
        readOptional(c, "id", a.intake.idColumn);
        readOptional(c, "outcomes_id", a.intake.outcomesIdColumn);
        readOptional(c, "period", a.intake.periodColumn);
        readOptional(c, "event", a.intake.eventValue);
        const Json& r = json.at("reading");
        a.intake.scale = scaleFromName(r.at("scale").get<std::string>()).value_or(ScoreScale::Probability);
        a.intake.scaleGiven = r.value("scale_given", false);
        if (r.contains("delimiter") && r.at("delimiter").is_string() && !r.at("delimiter").get<std::string>().empty())
            a.intake.delimiter = r.at("delimiter").get<std::string>()[0];
        a.intake.decimalComma = r.value("decimal_comma", false);
        const Json& o = json.at("options");
        a.panel.confidence = o.value("confidence", a.panel.confidence);
        a.panel.riskGroups = o.value("risk_groups", a.panel.riskGroups);
        a.panel.thresholds = o.value("thresholds", a.panel.thresholds);
        a.panel.nriCutPoints = o.value("nri_cuts", a.panel.nriCutPoints);
        a.panel.decisionThreshold = o.value("decision_threshold", a.panel.decisionThreshold);
        const auto range = o.value("decision_range", std::vector<double>{a.panel.decisionFrom, a.panel.decisionTo, a.panel.decisionStep});
        if (range.size() == 3) {
            a.panel.decisionFrom = range[0];
            a.panel.decisionTo = range[1];
            a.panel.decisionStep = range[2];
        }
        a.panel.periodUnit = o.value("period_unit", std::string("month")) == "quarter" ? PeriodUnit::Quarter : PeriodUnit::Month;
        const std::string dates = o.value("date_format", std::string("iso"));
        if (dates == "dmy")
            a.panel.dateFormat = DateFormat::DayFirst;
        else if (dates == "mdy")
            a.panel.dateFormat = DateFormat::MonthFirst;
        a.panel.cStatisticScale = o.value("c_statistic_interval", std::string("logit")) == "plain" ? CStatisticScale::Plain : CStatisticScale::Logit;
        a.panel.binomialInterval = o.value("binomial_interval", std::string("wilson")) == "clopper-pearson" ? CiMethod::ClopperPearson : CiMethod::Wilson;
        a.bootstrap.replicates = o.value("bootstrap", a.bootstrap.replicates);
        a.bootstrap.seed = o.value("seed", a.bootstrap.seed);
        a.bootstrap.method = o.value("ci_method", std::string("bca")) == "percentile" ? BootstrapCi::Percentile : BootstrapCi::Bca;
        a.bootstrap.stratified = o.value("stratified_bootstrap", a.bootstrap.stratified);
        a.addUpdated = o.value("add_updated", std::string());
        a.minimumCell = o.value("minimum_cell", a.minimumCell);
        a.panel.minimumCell = a.minimumCell;
        if (json.contains("report")) {
            const Json& t = json.at("report");
            a.report = {t.value("title", std::string()), t.value("model", std::string()), t.value("outcome", std::string()),
                        t.value("population", std::string()), t.value("period", std::string()), t.value("notes", std::string())};
        }
        return a;
    } catch (const nlohmann::json::exception& jsonError) {
        error.problem = std::string("the analysis file misses or mistypes a field (") + jsonError.what() + ").";
        error.remedy = "save the analysis again from Plumbline rather than editing it by hand.";
        return std::unexpected(error);
    }
}

} // namespace plumbline
