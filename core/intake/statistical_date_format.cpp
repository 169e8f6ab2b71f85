#include "intake/statistical_date_format.hpp"

#include <algorithm>
#include <iterator>
#include <cctype>
#include <cmath>
#include <string>

namespace plumbline {

namespace {

// Days from each package's epoch to 1970-01-01: 1960-01-01 is 3653 days earlier, 1582-10-14
// 141428 days earlier (Python 3.11 datetime.date arithmetic; the SPSS figure is also the
// 12219379200 seconds ReadStat writes for 1970-01-01).
constexpr std::int64_t days1960To1970 = 3653;
constexpr std::int64_t days1582To1970 = 141428;

// The format's name without its width and decimals ("DATE9." -> "DATE", "ADATE10" -> "ADATE",
// "E8601DA10." -> "E8601DA"): digits inside a name stay.
std::string formatName(std::string_view format)
{
    while (!format.empty() && (std::isdigit(static_cast<unsigned char>(format.back())) || format.back() == '.'))
        format.remove_suffix(1);
    std::string name(format);
    std::ranges::transform(name, name.begin(), [](unsigned char c) { return char(std::toupper(c)); });
    return name;
}

template <std::size_t N>
bool isOneOf(const std::string& name, const std::string_view (&names)[N])
{
    return std::ranges::find(names, name) != std::end(names);
}

// SAS formats whose values are days since 1960-01-01 (SAS 9.4 Formats and Informats: Reference,
// "Formats by Category: Date and Time"); the separator variants (B, C, D, N, P, S) included.
constexpr std::string_view sasDateFormats[] = {
    "DATE", "DAY", "DDMMYY", "DDMMYYB", "DDMMYYC", "DDMMYYD", "DDMMYYN", "DDMMYYP", "DDMMYYS",
    "MMDDYY", "MMDDYYB", "MMDDYYC", "MMDDYYD", "MMDDYYN", "MMDDYYP", "MMDDYYS",
    "YYMMDD", "YYMMDDB", "YYMMDDC", "YYMMDDD", "YYMMDDN", "YYMMDDP", "YYMMDDS",
    "MMYY", "MMYYC", "MMYYD", "MMYYN", "MMYYP", "MMYYS", "YYMM", "YYMMC", "YYMMD", "YYMMN", "YYMMP",
    "YYMMS", "MONYY", "YYMON", "MONNAME", "YEAR", "YYQ", "YYQC", "YYQD", "YYQN", "YYQP", "YYQS",
    "YYQR", "QTR", "JULDAY", "JULIAN", "WEEKDATE", "WEEKDATX", "WEEKDAY", "WORDDATE", "WORDDATX",
    "DOWNAME", "E8601DA", "B8601DA", "NLDATE"};
// SAS formats whose values are seconds since 1960-01-01 00:00.
constexpr std::string_view sasDatetimeFormats[] = {
    "DATETIME", "DATEAMPM", "DTDATE", "DTMONYY", "DTWKDATX", "DTYEAR", "DTYYQC", "E8601DT", "B8601DT",
    "E8601DZ", "B8601DZ", "NLDATM"};
// SPSS formats whose values are seconds since 1582-10-14 (IBM SPSS Statistics Command Syntax
// Reference, "Date and time formats"): dates and datetimes alike. TIME and DTIME are durations.
constexpr std::string_view spssDateFormats[] = {
    "DATE", "ADATE", "EDATE", "JDATE", "SDATE", "QYR", "MOYR", "WKYR", "DATETIME", "YMDHMS"};

DateScale stataScale(std::string_view format)
{
    // "%td", "%-tdCCYY-NN-DD", "%tc", "%tC"; "%d..." is the date format of Stata before 10.
    if (format.empty() || format.front() != '%')
        return DateScale::None;
    format.remove_prefix(1);
    if (!format.empty() && format.front() == '-')
        format.remove_prefix(1);
    if (format.starts_with("td") || format.starts_with("d"))
        return DateScale::DaysSince1960;
    if (format.starts_with("tc") || format.starts_with("tC"))
        return DateScale::MillisecondsSince1960;
    return DateScale::None;
}

} // namespace

DateScale dateScaleOfFormat(StatisticalPackage package, std::string_view format)
{
    switch (package) {
    case StatisticalPackage::Stata:
        return stataScale(format);
    case StatisticalPackage::Sas: {
        const std::string name = formatName(format);
        if (isOneOf(name, sasDateFormats))
            return DateScale::DaysSince1960;
        return isOneOf(name, sasDatetimeFormats) ? DateScale::SecondsSince1960 : DateScale::None;
    }
    case StatisticalPackage::Spss:
        return isOneOf(formatName(format), spssDateFormats) ? DateScale::SecondsSince1582 : DateScale::None;
    }
    return DateScale::None;
}

std::optional<std::int64_t> daysSince1970(DateScale scale, double stored)
{
    double perDay = 1.0;
    std::int64_t epochOffset = days1960To1970;
    switch (scale) {
    case DateScale::None:
        return std::nullopt;
    case DateScale::DaysSince1960:
        break;
    case DateScale::MillisecondsSince1960:
        perDay = 86'400'000.0;
        break;
    case DateScale::SecondsSince1960:
        perDay = 86'400.0;
        break;
    case DateScale::SecondsSince1582:
        perDay = 86'400.0;
        epochOffset = days1582To1970;
        break;
    }
    const double days = std::floor(stored / perDay);
    // 0001-01-01 is 719162 days before 1970-01-01 and 9999-12-31 is 2932896 days after
    // (Python 3.11 datetime.date.toordinal): outside that no calendar date is meant.
    if (!std::isfinite(days) || days - double(epochOffset) < -719162.0 || days - double(epochOffset) > 2932896.0)
        return std::nullopt;
    return static_cast<std::int64_t>(days) - epochOffset;
}

} // namespace plumbline
