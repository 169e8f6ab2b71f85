#include "files/cohort_simulator.hpp"

#include "resampling/random_stream.hpp"

#include <array>
#include <charconv>
#include <cmath>
#include <string_view>
#include <vector>

namespace plumbline {

namespace {

constexpr std::array<std::string_view, 5> hospitals{"Harbour General", "Millbrook Community", "Ashford Regional",
                                                   "Linnet Hill Memorial", "Saltmarsh District"};
constexpr std::array<double, 5> hospitalShare{0.34, 0.26, 0.16, 0.12, 0.12};
constexpr std::array<std::string_view, 5> ageBands{"18-44", "45-64", "65-74", "75-84", "85+"};
constexpr std::array<double, 5> ageShare{0.15, 0.28, 0.22, 0.22, 0.13};
constexpr std::array<double, 5> ageEffect{-0.35, -0.10, 0.05, 0.20, 0.35};
constexpr std::array<std::string_view, 4> payers{"Medicare", "Medicaid", "Commercial", "Self-pay"};
constexpr std::array<double, 4> payerShareOlder{0.85, 0.04, 0.10, 0.01};
constexpr std::array<double, 4> payerShareYounger{0.08, 0.29, 0.55, 0.08};
constexpr int millbrook = 1;
constexpr int ashford = 2;
constexpr int linnetHill = 3;
constexpr int saltmarsh = 4;
constexpr int medicaid = 1;
constexpr int daysInPeriod = 731; // 2024-01-01 .. 2025-12-31

constexpr long firstDay = 19723; // 2024-01-01
// The patterns the monitoring should find (sample-data/README.md), as days since 2024-01-01.
constexpr long codingShiftFrom = 547;        // 2025-07-01: Linnet Hill codes the supplier's inputs more fully
constexpr long disruptionFrom = 456;         // 2025-04-01: Saltmarsh's discharge process is disrupted ...
constexpr long disruptionUntil = 578;        // ... until 2025-08-01 (exclusive), after which it recovers

struct Discharge {
    std::string id;
    std::string date;
    long day = 0; // of `date`, since 1970-01-01
    int hospital = 0;
    int ageBand = 0;
    bool male = false;
    int payer = 0;
    double supplier = 0.0;
    double local = 0.0;
    bool readmitted = false;
    bool localMissing = false;
    bool outcomeMissing = false;
    int supplierDefect = 0; // 0 none, 1 out of range, 2 not a number
};

double expit(double x)
{
    return 1.0 / (1.0 + std::exp(-x));
}

template <std::size_t N>
int pick(RandomStream& random, const std::array<double, N>& shares)
{
    const double u = random.uniform();
    double cumulative = 0.0;
    for (std::size_t k = 0; k < N; ++k) {
        cumulative += shares[k];
        if (u < cumulative)
            return static_cast<int>(k);
    }
    return static_cast<int>(N - 1);
}

// Proleptic Gregorian date of a day count from 1970-01-01 (H. Hinnant's civil_from_days).
std::string isoDate(long days)
{
    days += 719468;
    const long era = (days >= 0 ? days : days - 146096) / 146097;
    const long doe = days - era * 146097;
    const long yoe = (doe - doe / 1460 + doe / 36524 - doe / 146096) / 365;
    const long doy = doe - (365 * yoe + yoe / 4 - yoe / 100);
    const long mp = (5 * doy + 2) / 153;
    const long day = doy - (153 * mp + 2) / 5 + 1;
    const long month = mp < 10 ? mp + 3 : mp - 9;
    const long year = yoe + era * 400 + (month <= 2 ? 1 : 0);
    char buffer[64];
    std::snprintf(buffer, sizeof buffer, "%04ld-%02ld-%02ld", year, month, day);
    return buffer;
}

// A risk as a supplier's file would hold it: 4 decimals by default (at most 10,001 distinct
// values), more for a model exported at full precision (almost every risk distinct).
std::string fixedDigits(double value, int decimals)
{
    char buffer[48];
    const auto result = std::to_chars(buffer, buffer + sizeof buffer, value, std::chars_format::fixed, decimals);
    return std::string(buffer, result.ptr);
}

Discharge simulateOne(RandomStream& random, std::size_t index, std::size_t rows)
{
    Discharge d;
    const long day = static_cast<long>(index * daysInPeriod / rows); // since 2024-01-01
    d.day = firstDay + day;
    d.date = isoDate(d.day);
    char id[32];
    std::snprintf(id, sizeof id, "KB%07zu", index + 1);
    d.id = id;
    d.hospital = pick(random, hospitalShare);
    d.ageBand = pick(random, ageShare);
    d.male = random.uniform() < 0.48;
    d.payer = d.ageBand >= 2 ? pick(random, payerShareOlder) : pick(random, payerShareYounger);

    // Truth: comorbidity burden, age, sex, an unmodelled Medicaid effect, and from month 13 a
    // transitional-care programme that lowers readmissions (ramping in over three months).
    const double burden = random.normal();
    const double month = 12.0 * double(day) / 365.25;
    const double programme = month < 12.0 ? 0.0 : -0.30 * std::min(1.0, (month - 11.0) / 3.0);
    const double demographic = ageEffect[d.ageBand] + (d.male ? 0.10 : 0.0);
    // Saltmarsh's catchment is a little healthier than the scores assume.
    const double siteEffect = d.hospital == millbrook ? 0.05 : d.hospital == ashford ? -0.05 : d.hospital == saltmarsh ? -0.10 : 0.0;
    // Saltmarsh's disruption: for four months the programme's benefit is lost there and the odds
    // of readmission are more than doubled, to about twice what either score predicts there.
    const bool disrupted = d.hospital == saltmarsh && day >= disruptionFrom && day < disruptionUntil;
    const double disruption = disrupted ? -programme + 0.85 : 0.0;
    const double truth = -2.07 + 0.95 * burden + demographic + (d.payer == medicaid ? 0.45 : 0.0) + siteEffect
        + programme + disruption;
    d.readmitted = random.uniform() < expit(truth);

    // Supplier: developed on a higher-risk population (intercept too high), sees the burden
    // well; Ashford's coding spreads its scores out (too extreme there).
    // Saltmarsh's records carry the burden less fully and less of it: there the supplier
    // discriminates a little less and, unlike at the other sites, is calibrated on average
    // (the site whose calibration differs).
    const double supplierNoise = d.hospital == saltmarsh ? 0.50 : 0.40;
    double supplier = -1.70 + 0.95 * (burden + supplierNoise * random.normal()) + demographic;
    if (d.hospital == ashford)
        supplier = -1.55 + 1.7 * (supplier + 1.55);
    if (d.hospital == saltmarsh)
        supplier -= 0.40;
    // From July 2025 Linnet Hill codes the supplier's inputs more fully: its predicted odds rise
    // by a quarter while the true risk does not change.
    if (d.hospital == linnetHill && day >= codingShiftFrom)
        supplier += std::log(1.25);
    d.supplier = expit(supplier);
    // Local refit on year-one data: calibrated on average then, but sees the burden through
    // noisier local fields (less discriminating) and knows nothing of the programme.
    const double local = -1.93 + 0.70 * (burden + 0.60 * random.normal()) + 0.8 * demographic;
    d.local = expit(local);

    d.localMissing = random.uniform() < 0.004;
    d.outcomeMissing = random.uniform() < 0.001;
    const double defect = random.uniform();
    d.supplierDefect = defect < 0.0002 ? 1 : defect < 0.0003 ? 2 : 0;
    return d;
}

std::string supplierText(const Discharge& d, int decimals)
{
    if (d.supplierDefect == 1)
        return fixedDigits(1.0 + d.supplier, decimals);
    if (d.supplierDefect == 2)
        return "#VALUE!";
    return fixedDigits(d.supplier, decimals);
}

std::string cohortRow(const Discharge& d, int decimals)
{
    std::string row = d.id;
    row += ',' + supplierText(d, decimals);
    row += ',' + (d.localMissing ? std::string("NA") : fixedDigits(d.local, decimals));
    row += ',' + (d.outcomeMissing ? std::string() : std::string(d.readmitted ? "yes" : "no"));
    row += ',' + std::string(hospitals[d.hospital]);
    row += ',' + std::string(ageBands[d.ageBand]);
    row += d.male ? ",M" : ",F";
    row += ',' + std::string(payers[d.payer]);
    row += ',' + d.date;
    return row;
}

// A risk as the number its written digits stand for, so the cells equal a reading of the CSV.
CohortCell riskCell(double value, int decimals)
{
    const std::string digits = fixedDigits(value, decimals);
    double written = 0.0;
    std::from_chars(digits.data(), digits.data() + digits.size(), written);
    return CohortCell::ofNumber(written);
}

std::vector<CohortCell> cohortCells(const Discharge& d, int decimals)
{
    std::vector<CohortCell> cells;
    cells.reserve(9);
    cells.push_back(CohortCell::ofText(d.id));
    cells.push_back(d.supplierDefect == 2 ? CohortCell::ofText(supplierText(d, decimals))
                                          : riskCell(d.supplierDefect == 1 ? 1.0 + d.supplier : d.supplier, decimals));
    cells.push_back(d.localMissing ? CohortCell::missing() : riskCell(d.local, decimals));
    cells.push_back(d.outcomeMissing ? CohortCell::missing() : CohortCell::ofText(d.readmitted ? "yes" : "no"));
    cells.push_back(CohortCell::ofText(std::string(hospitals[d.hospital])));
    cells.push_back(CohortCell::ofText(std::string(ageBands[d.ageBand])));
    cells.push_back(CohortCell::ofText(d.male ? "M" : "F"));
    cells.push_back(CohortCell::ofText(std::string(payers[d.payer])));
    cells.push_back(CohortCell::ofDate(d.day));
    return cells;
}

std::string scoresRow(const Discharge& d, int decimals)
{
    return d.id + ',' + supplierText(d, decimals) + ',' + (d.localMissing ? std::string("NA") : fixedDigits(d.local, decimals)) + ','
        + std::string(hospitals[d.hospital]) + ',' + std::string(ageBands[d.ageBand]) + (d.male ? ",M," : ",F,")
        + std::string(payers[d.payer]) + ',' + d.date;
}

std::string outcomeRow(const Discharge& d)
{
    return d.id + ',' + (d.outcomeMissing ? std::string() : std::string(d.readmitted ? "yes" : "no"));
}

void shuffle(std::vector<std::string>& rows, RandomStream& random)
{
    for (std::size_t i = rows.size(); i > 1; --i)
        std::swap(rows[i - 1], rows[random.below(i)]);
}

std::string joinLines(const std::string& header, const std::vector<std::string>& rows)
{
    std::string out = header + "\n";
    for (const auto& row : rows)
        out += row + "\n";
    return out;
}

// The split files carry defects of their own so the join and the audit have work to do:
// outcomes not yet recorded, outcomes of patients outside the extract, duplicated ids and
// rows damaged in transfer. Rates scale with the cohort, with at least one of each.
void writeSplitFiles(const std::vector<Discharge>& discharges, int decimals, RandomStream& random, SimulatedFiles& files)
{
    const std::size_t n = discharges.size();
    auto atLeastOne = [n](double rate) { return std::max<std::size_t>(1, static_cast<std::size_t>(rate * double(n))); };
    std::vector<std::string> scores;
    std::vector<std::string> outcomes;
    for (const auto& d : discharges) {
        scores.push_back(scoresRow(d, decimals));
        outcomes.push_back(outcomeRow(d));
    }
    for (std::size_t k = 0, drop = atLeastOne(0.002); k < drop && !outcomes.empty(); ++k)
        outcomes.erase(outcomes.begin() + static_cast<long>(random.below(outcomes.size())));
    for (std::size_t k = 0, extra = atLeastOne(0.0005); k < extra; ++k) {
        char id[32];
        std::snprintf(id, sizeof id, "KB9%06zu", k + 1);
        outcomes.push_back(std::string(id) + (random.uniform() < 0.15 ? ",yes" : ",no"));
    }
    for (std::size_t k = 0, copies = atLeastOne(0.0003); k < copies; ++k)
        scores.push_back(scores[random.below(n)]);
    for (std::size_t k = 0, copies = atLeastOne(0.0003); k < copies; ++k) {
        const std::string& original = outcomes[random.below(outcomes.size())];
        const std::string id = original.substr(0, original.find(','));
        outcomes.push_back(id + (original.ends_with("yes") ? ",no" : ",yes")); // a conflicting copy
    }
    for (std::size_t k = 0, damaged = atLeastOne(0.0002); k < damaged; ++k) {
        std::string& row = scores[random.below(scores.size())];
        row = row.substr(0, row.find(',', row.find(',') + 1)); // cut after the supplier score
    }
    outcomes.push_back("KB0000000,yes,see note"); // a row with an extra field
    shuffle(scores, random);
    shuffle(outcomes, random);
    files.scores = joinLines("encounter_id,supplier_score,local_score,hospital,age_band,sex,payer,discharge_date", scores);
    files.outcomes = joinLines("encounter_id,readmitted_30d", outcomes);
}

} // namespace

SimulatedFiles simulateCohort(const SimulationSettings& settings, bool withSplitFiles, bool withCells)
{
    RandomStream random(settings.seed, 0);
    std::vector<Discharge> discharges;
    discharges.reserve(settings.rows);
    SimulatedFiles files;
    files.cohort = "encounter_id,supplier_score,local_score,readmitted_30d,hospital,age_band,sex,payer,discharge_date\n";
    if (withCells) {
        files.cells.columns = {"encounter_id", "supplier_score", "local_score", "readmitted_30d", "hospital",
                               "age_band", "sex", "payer", "discharge_date"};
        files.cells.rows.reserve(settings.rows);
    }
    files.cohort.reserve(settings.rows * 96);
    for (std::size_t i = 0; i < settings.rows; ++i) {
        Discharge d = simulateOne(random, i, settings.rows);
        files.cohort += cohortRow(d, settings.decimals);
        files.cohort += '\n';
        if (withCells)
            files.cells.rows.push_back(cohortCells(d, settings.decimals));
        if (withSplitFiles)
            discharges.push_back(std::move(d));
    }
    if (withSplitFiles) {
        RandomStream splitRandom(settings.seed, 1);
        writeSplitFiles(discharges, settings.decimals, splitRandom, files);
    }
    return files;
}

} // namespace plumbline
