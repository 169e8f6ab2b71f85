#include "intake/statistical_file_table.hpp"

#include "intake/file_fingerprint.hpp"

#include "intake/read_only_file.hpp"
#include "intake/readstat_file_io.hpp"
#include "intake/utf8_text.hpp"

#include <readstat.h>

#include <algorithm>
#include <array>
#include <cctype>
#include <cmath>
#include <map>
#include <optional>
#include <string_view>

#include <sys/stat.h>

namespace plumbline {

namespace {

using Layout = StatisticalFileTable::Layout;

std::optional<Layout> layoutOf(const std::string& path)
{
    const auto dot = path.find_last_of("./");
    if (dot == std::string::npos || path[dot] != '.')
        return std::nullopt;
    std::string extension = path.substr(dot + 1);
    std::ranges::transform(extension, extension.begin(), [](unsigned char c) { return char(std::tolower(c)); });
    if (extension == "sas7bdat")
        return Layout::Sas7bdat;
    if (extension == "xpt")
        return Layout::Xport;
    if (extension == "dta")
        return Layout::Stata;
    if (extension == "sav" || extension == "zsav")
        return Layout::Spss;
    return std::nullopt;
}

StatisticalPackage packageOf(Layout layout)
{
    switch (layout) {
    case Layout::Sas7bdat:
    case Layout::Xport:
        return StatisticalPackage::Sas;
    case Layout::Stata:
        return StatisticalPackage::Stata;
    case Layout::Spss:
        break;
    }
    return StatisticalPackage::Spss;
}

std::string layoutNoun(Layout layout)
{
    switch (layout) {
    case Layout::Sas7bdat:
        return "SAS data set (.sas7bdat)";
    case Layout::Xport:
        return "SAS transport file (.xpt)";
    case Layout::Stata:
        return "Stata data file (.dta)";
    case Layout::Spss:
        break;
    }
    return "SPSS data file (.sav or .zsav)";
}

std::string packageName(Layout layout)
{
    switch (packageOf(layout)) {
    case StatisticalPackage::Sas:
        return "SAS";
    case StatisticalPackage::Stata:
        return "Stata";
    case StatisticalPackage::Spss:
        break;
    }
    return "SPSS";
}

readstat_error_t parse(readstat_parser_t* parser, Layout layout, const std::string& path, void* context)
{
    switch (layout) {
    case Layout::Sas7bdat:
        return readstat_parse_sas7bdat(parser, path.c_str(), context);
    case Layout::Xport:
        return readstat_parse_xport(parser, path.c_str(), context);
    case Layout::Stata:
        return readstat_parse_dta(parser, path.c_str(), context);
    case Layout::Spss:
        break;
    }
    return readstat_parse_sav(parser, path.c_str(), context);
}

using Parser = std::unique_ptr<readstat_parser_t, decltype(&readstat_parser_free)>;

Parser newParser(ReadStatFileIo& io)
{
    Parser parser(readstat_parser_init(), &readstat_parser_free);
    io.attachTo(parser.get());
    return parser;
}

InputError errorIn(const std::string& path, std::size_t position, std::string problem, std::string remedy)
{
    InputError error;
    error.file = path;
    error.line = position;
    error.lineNoun = "row"; // a data file has records, not lines of text
    error.problem = std::move(problem);
    error.remedy = std::move(remedy);
    return error;
}

// Text that is not UTF-8 after ReadStat converted it from the encoding the file names (or, when
// the file names none, as stored): refused rather than passed on as stray bytes.
InputError notUtf8Error(const std::string& path, Layout layout, const std::string& encoding, std::size_t position,
                        std::string column, std::string value)
{
    InputError error = errorIn(
        path, position,
        encoding.empty() ? "the text is not UTF-8 and the file does not say which character encoding it uses."
                         : "the text is not valid in the character encoding the file names ('" + encoding + "').",
        "save the file again from " + packageName(layout) +
            " with UTF-8 text (Stata 14 or later, SPSS in Unicode mode, SAS with ENCODING=UTF8), or export the cohort as CSV UTF-8.");
    error.column = std::move(column);
    error.value = std::move(value);
    return error;
}

// A failure ReadStat reports, in words: what it found and what to do.
InputError parseError(const std::string& path, Layout layout, const std::string& encoding, readstat_error_t code,
                      const ReadStatFileIo& io)
{
    const std::string detail = std::string(" (ReadStat: ") + readstat_error_message(code) + ")";
    switch (code) {
    case READSTAT_ERROR_OPEN:
        return errorIn(path, 0, "the file cannot be opened: " + io.openFailure() + ".",
                       "check the path and that you may read the file.");
    case READSTAT_ERROR_UNSUPPORTED_COMPRESSION:
        return errorIn(path, 0, "the file is compressed in a way that cannot be read" + detail + ".",
                       "save it again from " + packageName(layout) + " without compression, or export the cohort as CSV.");
    case READSTAT_ERROR_UNSUPPORTED_CHARSET:
    case READSTAT_ERROR_CONVERT:
    case READSTAT_ERROR_CONVERT_BAD_STRING:
    case READSTAT_ERROR_CONVERT_SHORT_STRING:
    case READSTAT_ERROR_CONVERT_LONG_STRING:
        return notUtf8Error(path, layout, encoding, 0, {}, {});
    default:
        break;
    }
    return errorIn(path, 0, "the file is not a readable " + layoutNoun(layout) + ", or it is damaged" + detail + ".",
                   "check that the file opens in " + packageName(layout) +
                       "; save it again (in another format version if it is an unusual one), or save the cohort as CSV.");
}

// What opening collects: the variables, in order, and the value-label sets they name.
struct MetadataPass {
    const std::string* path = nullptr;
    Layout layout = Layout::Stata;
    std::int64_t rowCount = -1;
    std::string encoding;
    struct Variable {
        std::string name;
        std::string format;
        bool text = false;
        std::string labelSet;
    };
    std::vector<Variable> variables;
    std::map<std::string, std::vector<ValueLabel>, std::less<>> labelSets;
    std::optional<InputError> failure;

    int refuse(InputError error)
    {
        failure = std::move(error);
        return READSTAT_HANDLER_ABORT;
    }
    bool isUtf8(std::string_view text) const { return !firstInvalidUtf8Byte(text); }
};

int onMetadata(readstat_metadata_t* metadata, void* context)
{
    auto& pass = *static_cast<MetadataPass*>(context);
    pass.rowCount = readstat_get_row_count(metadata);
    if (const char* encoding = readstat_get_file_encoding(metadata))
        pass.encoding = encoding;
    return READSTAT_HANDLER_OK;
}

int onVariable(int index, readstat_variable_t* variable, const char* labelSet, void* context)
{
    auto& pass = *static_cast<MetadataPass*>(context);
    MetadataPass::Variable read;
    read.name = readstat_variable_get_name(variable) ? readstat_variable_get_name(variable) : "";
    read.format = readstat_variable_get_format(variable) ? readstat_variable_get_format(variable) : "";
    read.text = readstat_variable_get_type_class(variable) == READSTAT_TYPE_CLASS_STRING;
    read.labelSet = labelSet ? labelSet : "";
    if (!pass.isUtf8(read.name))
        return pass.refuse(notUtf8Error(*pass.path, pass.layout, pass.encoding, 0, read.name, read.name));
    if (index < 0 || std::size_t(index) != pass.variables.size())
        return pass.refuse(parseError(*pass.path, pass.layout, pass.encoding, READSTAT_ERROR_PARSE, ReadStatFileIo()));
    pass.variables.push_back(std::move(read));
    return READSTAT_HANDLER_OK;
}

int onValueLabel(const char* labelSet, readstat_value_t value, const char* label, void* context)
{
    auto& pass = *static_cast<MetadataPass*>(context);
    // TypedColumn holds numeric codes: labels of text codes (SPSS string variables) and of the
    // missing codes (Stata's .a–.z) label nothing a cell can hold, and are left out.
    if (!labelSet || !label || readstat_value_type_class(value) != READSTAT_TYPE_CLASS_NUMERIC ||
        readstat_value_is_system_missing(value) || readstat_value_is_tagged_missing(value))
        return READSTAT_HANDLER_OK;
    if (!pass.isUtf8(label))
        return pass.refuse(notUtf8Error(*pass.path, pass.layout, pass.encoding, 0, {}, label));
    pass.labelSets[labelSet].push_back({readstat_double_value(value), label});
    return READSTAT_HANDLER_OK;
}

// One visit: ReadStat hands values row by row, variable by variable; a record is handed on when
// its last variable's value arrives.
struct RecordPass {
    const std::string* path = nullptr;
    Layout layout = Layout::Stata;
    const std::string* encoding = nullptr;
    const std::vector<TypedColumn>* columns = nullptr;
    const std::vector<StatisticalFileTable::ColumnReading>* readings = nullptr;
    const TypedTable::Visit* visit = nullptr;
    std::vector<TypedCell> cells;
    std::vector<std::string> texts; // the text cells' bytes, reused from record to record
    std::size_t rowsDone = 0;
    std::size_t nextColumn = 0;
    bool stopped = false;
    std::optional<InputError> failure;

    int refuse(InputError error)
    {
        failure = std::move(error);
        return READSTAT_HANDLER_ABORT;
    }
    InputError cellError(std::size_t column, std::string value, std::string problem, std::string remedy) const
    {
        InputError error = errorIn(*path, rowsDone + 1, std::move(problem), std::move(remedy));
        error.column = (*columns)[column].name;
        error.value = std::move(value);
        return error;
    }
    int store(std::size_t column, readstat_variable_t* variable, readstat_value_t value);
};

int RecordPass::store(std::size_t column, readstat_variable_t* variable, readstat_value_t value)
{
    const auto& reading = (*readings)[column];
    TypedCell& cell = cells[column];
    if (readstat_value_is_missing(value, variable)) {
        cell = TypedCell::missing();
        return READSTAT_HANDLER_OK;
    }
    if (reading.text) {
        if (readstat_value_type_class(value) != READSTAT_TYPE_CLASS_STRING)
            return refuse(cellError(column, {}, "a number stands in a text column: the file is damaged.",
                                    "export the file again from " + packageName(layout) + "."));
        const char* text = readstat_string_value(value);
        texts[column] = text ? text : "";
        if (const auto bad = firstInvalidUtf8Byte(texts[column]))
            return refuse(notUtf8Error(*path, layout, *encoding, rowsDone + 1, (*columns)[column].name, texts[column]));
        // An empty string is how the packages write a missing text.
        cell = texts[column].empty() ? TypedCell::missing() : TypedCell::ofText(texts[column]);
        return READSTAT_HANDLER_OK;
    }
    if (readstat_value_type_class(value) != READSTAT_TYPE_CLASS_NUMERIC)
        return refuse(cellError(column, {}, "a text stands in a numeric column: the file is damaged.",
                                "export the file again from " + packageName(layout) + "."));
    const double number = readstat_double_value(value);
    if (std::isnan(number)) {
        cell = TypedCell::missing();
        return READSTAT_HANDLER_OK;
    }
    if (reading.dates == DateScale::None) {
        cell = TypedCell::ofNumber(number);
        return READSTAT_HANDLER_OK;
    }
    const auto day = daysSince1970(reading.dates, number);
    if (!day)
        return refuse(cellError(column, std::to_string(number),
                                "the column's format ('" + reading.format + "') says it holds dates, but this value is no date between the years 1 and 9999.",
                                "correct the value in " + packageName(layout) + ", or give the column a numeric format if it does not hold dates."));
    cell = TypedCell::ofDate(*day);
    return READSTAT_HANDLER_OK;
}

int onValue(int observation, readstat_variable_t* variable, readstat_value_t value, void* context)
{
    auto& pass = *static_cast<RecordPass*>(context);
    const int index = readstat_variable_get_index(variable);
    if (observation < 0 || std::size_t(observation) != pass.rowsDone || index < 0 || std::size_t(index) != pass.nextColumn ||
        pass.nextColumn >= pass.cells.size())
        return pass.refuse(errorIn(*pass.path, pass.rowsDone + 1,
                                   "the file's values do not come in the order of its variables: it is damaged.",
                                   "export the file again from " + packageName(pass.layout) + ", or save the cohort as CSV."));
    if (const int verdict = pass.store(pass.nextColumn, variable, value); verdict != READSTAT_HANDLER_OK)
        return verdict;
    if (++pass.nextColumn < pass.cells.size())
        return READSTAT_HANDLER_OK;
    pass.nextColumn = 0;
    ++pass.rowsDone;
    if (!(*pass.visit)(pass.cells, pass.rowsDone)) {
        pass.stopped = true;
        return READSTAT_HANDLER_ABORT;
    }
    return READSTAT_HANDLER_OK;
}

InputError cutShortError(const std::string& path, Layout layout, std::size_t rowsDone, const std::string& detail)
{
    return errorIn(path, rowsDone + 1,
                   "the file ends before its last row, or is damaged there: " + std::to_string(rowsDone) +
                       " observations were read before it" + detail + ".",
                   "copy or export the file again from " + packageName(layout) +
                       " (a copy cut short by a full disk or an interrupted transfer looks like this).");
}

} // namespace

bool isStatisticalFile(const std::string& path)
{
    return layoutOf(path).has_value();
}

std::expected<std::unique_ptr<TypedTable>, InputError> openStatisticalFile(const std::string& path)
{
    const auto layout = layoutOf(path);
    if (!layout)
        return std::unexpected(errorIn(path, 0, "the file is not a SAS, Stata or SPSS data file (its name does not end in .sas7bdat, .xpt, .dta, .sav or .zsav).",
                                       "choose a statistics package's data file, or read the cohort as CSV."));
    return StatisticalFileTable::open(path, *layout);
}

StatisticalFileTable::StatisticalFileTable(std::string path, Layout layout)
    : m_path(std::move(path))
    , m_layout(layout)
{
}

namespace {

// A Stata file of format 117 or later is framed by <stata_dta> and </stata_dta>, and its value
// labels come last: ReadStat stops reading labels quietly where such a file is cut short, so
// the closing tag is what tells a complete file from one that lost its labels.
std::optional<InputError> stataFileCutShort(const std::string& path)
{
    auto file = ReadOnlyFile::open(path);
    if (!file)
        return std::nullopt; // the parse reports why it cannot be opened
    struct stat status {};
    if (::fstat(file->descriptor(), &status) != 0 || !S_ISREG(status.st_mode))
        return std::nullopt;
    constexpr std::string_view opening = "<stata_dta>";
    constexpr std::string_view closing = "</stata_dta>";
    std::array<char, 12> head {};
    std::array<char, 12> tail {};
    const auto size = static_cast<std::size_t>(status.st_size);
    const auto gotHead = file->readAt(0, head.data(), opening.size());
    if (!gotHead || *gotHead != opening.size() || std::string_view(head.data(), opening.size()) != opening)
        return std::nullopt; // format 113-115 (no framing), or not a Stata file: the parse judges
    const auto gotTail = size >= closing.size() ? file->readAt(size - closing.size(), tail.data(), closing.size())
                                                : std::expected<std::size_t, std::string>(0);
    if (gotTail && *gotTail == closing.size() && std::string_view(tail.data(), closing.size()) == closing)
        return std::nullopt;
    return errorIn(path, 0, "the file is cut short: its closing </stata_dta> tag is missing, so its last parts (rows or value labels) are lost.",
                   "copy or export the file again from Stata (a copy cut short by a full disk or an interrupted transfer looks like this).");
}

} // namespace

std::expected<std::unique_ptr<TypedTable>, InputError> StatisticalFileTable::open(const std::string& path, Layout layout)
{
    struct stat status {};
    if (::stat(path.c_str(), &status) == 0 && S_ISREG(status.st_mode) && status.st_size == 0)
        return std::unexpected(errorIn(path, 0, "the file is empty.", "choose the " + layoutNoun(layout) + " that holds the cohort."));

    ReadStatFileIo io;
    Parser parser = newParser(io);
    MetadataPass pass;
    pass.path = &path;
    pass.layout = layout;
    readstat_set_metadata_handler(parser.get(), &onMetadata);
    readstat_set_variable_handler(parser.get(), &onVariable);
    readstat_set_value_label_handler(parser.get(), &onValueLabel);
    const readstat_error_t code = parse(parser.get(), layout, path, &pass);
    if (pass.failure)
        return std::unexpected(*pass.failure);
    if (code != READSTAT_OK)
        return std::unexpected(parseError(path, layout, pass.encoding, code, io));
    if (layout == Layout::Stata)
        if (auto cut = stataFileCutShort(path))
            return std::unexpected(*cut);
    if (pass.variables.empty())
        return std::unexpected(errorIn(path, 0, "the file holds no variables.", "choose the " + layoutNoun(layout) + " that holds the cohort."));

    std::unique_ptr<StatisticalFileTable> table(new StatisticalFileTable(path, layout));
    table->m_rowCount = pass.rowCount;
    table->m_encoding = pass.encoding;
    for (const auto& variable : pass.variables) {
        TypedColumn column;
        column.name = variable.name;
        if (const auto labels = pass.labelSets.find(variable.labelSet); !variable.text && labels != pass.labelSets.end())
            column.labels = labels->second;
        ColumnReading reading;
        reading.text = variable.text;
        reading.format = variable.format;
        reading.dates = variable.text ? DateScale::None : dateScaleOfFormat(packageOf(layout), variable.format);
        table->m_columns.push_back(std::move(column));
        table->m_readings.push_back(reading);
    }
    return table;
}

std::expected<void, InputError> StatisticalFileTable::forEachRecord(const Visit& visit)
{
    ReadStatFileIo io;
    Parser parser = newParser(io);
    RecordPass pass;
    pass.path = &m_path;
    pass.layout = m_layout;
    pass.encoding = &m_encoding;
    pass.columns = &m_columns;
    pass.readings = &m_readings;
    pass.visit = &visit;
    pass.cells.resize(m_columns.size());
    pass.texts.resize(m_columns.size());
    // ReadStat builds the variables its value callback receives only when a variable handler is set.
    readstat_set_variable_handler(parser.get(), [](int, readstat_variable_t*, const char*, void*) { return int(READSTAT_HANDLER_OK); });
    readstat_set_value_handler(parser.get(), &onValue);
    const readstat_error_t code = parse(parser.get(), m_layout, m_path, &pass);
    if (pass.stopped)
        return {};
    if (pass.failure)
        return std::unexpected(*pass.failure);
    if (code == READSTAT_ERROR_OPEN)
        return std::unexpected(parseError(m_path, m_layout, m_encoding, code, io));
    if (code != READSTAT_OK)
        return std::unexpected(cutShortError(m_path, m_layout, pass.rowsDone, std::string(" (ReadStat: ") + readstat_error_message(code) + ")"));
    // A SAS transport file records no row count and ReadStat stops quietly at a partial row; but
    // every record of the format is 80 bytes (SAS technical report TS-140, padded with blanks),
    // so a file cut anywhere else is told by its size. A cut exactly at a record's end cannot be.
    if (m_layout == Layout::Xport && io.fileSize() % 80 != 0)
        return std::unexpected(cutShortError(m_path, m_layout, pass.rowsDone, ", its last 80-byte record is incomplete"));
    // ReadStat may end without an error where the data stop early: count the rows ourselves.
    if (pass.nextColumn != 0 || (m_rowCount >= 0 && pass.rowsDone < std::size_t(m_rowCount)))
        return std::unexpected(cutShortError(m_path, m_layout, pass.rowsDone,
                                             m_rowCount >= 0 ? ", of the " + std::to_string(m_rowCount) + " it announces" : std::string()));
    return {};
}

std::expected<std::string, InputError> StatisticalFileTable::fingerprint() const
{
    return fileFingerprint(m_path);
}

} // namespace plumbline
