#include "intake/xlsx_dates.hpp"
#include "intake/xlsx_table.hpp"
#include "intake/xlsx_workbook.hpp"

#include "test_paths.hpp"

#include <catch2/catch.hpp>
#include <minizip/zip.h>
#include <nlohmann/json.hpp>

#include <filesystem>
#include <fstream>
#include <map>
#include <sstream>
#include <string>
#include <vector>

using namespace plumbline;

namespace {

const std::string spreadsheets = std::string(plumbline::test::spreadsheetsDir) + "/";

// One visited record: its position and its cells, texts copied out of the visit.
struct Record {
    std::size_t position = 0;
    std::vector<TypedCell> cells;
    std::vector<std::string> texts;
};

std::vector<Record> allRecords(TypedTable& table)
{
    std::vector<Record> records;
    const auto visited = table.forEachRecord([&](std::span<const TypedCell> cells, std::size_t position) {
        Record record{position, {cells.begin(), cells.end()}, {}};
        for (const TypedCell& cell : cells)
            record.texts.emplace_back(cell.text);
        records.push_back(std::move(record));
        return true;
    });
    REQUIRE(visited.has_value());
    return records;
}

std::unique_ptr<TypedTable> opened(const std::string& path, const std::optional<std::string>& sheet = std::nullopt)
{
    auto table = openXlsxTable(path, sheet);
    if (!table)
        FAIL(table.error().message());
    return std::move(*table);
}

std::string openFailure(const std::string& path, const std::optional<std::string>& sheet = std::nullopt,
                        const XlsxLimits& limits = XlsxLimits{})
{
    auto table = openXlsxTable(path, sheet, limits);
    if (table) {
        const auto visited = (*table)->forEachRecord([](std::span<const TypedCell>, std::size_t) { return true; });
        REQUIRE_FALSE(visited.has_value());
        return visited.error().message();
    }
    return table.error().message();
}

// Splits "AB12" into its 1-based column and row.
std::pair<std::uint32_t, std::size_t> cellPlace(const std::string& reference)
{
    std::uint32_t column = 0;
    std::size_t i = 0;
    for (; i < reference.size() && std::isupper(static_cast<unsigned char>(reference[i])); ++i)
        column = column * 26 + static_cast<std::uint32_t>(reference[i] - 'A' + 1);
    return {column, std::stoul(reference.substr(i))};
}

// Checks every record of every sheet of `name` against openpyxl's reading in NAME.json
// (tests/reference/make_spreadsheet_fixtures.py; openpyxl 3.0.9, load_workbook(data_only=True)).
void compareWithOpenpyxl(const std::string& name)
{
    const std::string path = spreadsheets + name + ".xlsx";
    std::ifstream in(spreadsheets + name + ".json");
    const auto reading = nlohmann::json::parse(in);
    const auto sheetNames = xlsxSheetNames(path);
    REQUIRE(sheetNames.has_value());
    CHECK(*sheetNames == reading["sheets"].get<std::vector<std::string>>()); // openpyxl 3.0.9 wb.sheetnames
    for (const auto& sheet : *sheetNames) {
        INFO(name << ", sheet " << sheet);
        std::map<std::size_t, std::map<std::uint32_t, nlohmann::json>> rows;
        for (const auto& cell : reading["cells"][sheet]) {
            const auto [column, row] = cellPlace(cell[0].get<std::string>());
            rows[row][column] = cell;
        }
        auto table = opened(path, sheet);
        // The header: openpyxl's first row with a value, first to last named cell.
        const auto& header = rows.begin()->second;
        const std::uint32_t first = header.begin()->first;
        const std::uint32_t last = header.rbegin()->first;
        REQUIRE(table->columns().size() == last - first + 1);
        for (const auto& [column, cell] : header) {
            const std::string expected = cell[1] == "number" ? cell[2].dump() : cell[2].get<std::string>();
            CHECK(table->columns()[column - first].name == expected); // openpyxl 3.0.9
        }
        // The records: every later row with a value in the header's columns, at its row number.
        std::vector<std::size_t> expectedPositions;
        for (auto it = std::next(rows.begin()); it != rows.end(); ++it) {
            if (it->second.lower_bound(first) != it->second.upper_bound(last))
                expectedPositions.push_back(it->first);
        }
        const auto records = allRecords(*table);
        std::vector<std::size_t> positions;
        for (const auto& record : records)
            positions.push_back(record.position);
        CHECK(positions == expectedPositions); // openpyxl 3.0.9 cell coordinates
        for (const auto& record : records) {
            for (std::uint32_t column = first; column <= last; ++column) {
                INFO("row " << record.position << ", column " << column);
                const TypedCell& got = record.cells[column - first];
                const auto& row = rows[record.position];
                const auto found = row.find(column);
                if (found == row.end()) {
                    CHECK(got.kind == CellKind::Missing); // openpyxl 3.0.9: None
                    continue;
                }
                const auto& cell = found->second;
                const std::string kind = cell[1];
                if (kind == "number" || kind == "bool") {
                    REQUIRE(got.kind == CellKind::Number);
                    CHECK(got.number == (kind == "bool" ? (cell[2].get<bool>() ? 1.0 : 0.0) : cell[2].get<double>())); // openpyxl 3.0.9
                } else if (kind == "text") {
                    REQUIRE(got.kind == CellKind::Text);
                    CHECK(record.texts[column - first] == cell[2].get<std::string>()); // openpyxl 3.0.9
                } else if (kind == "date") {
                    REQUIRE(got.kind == CellKind::Date);
                    CHECK(got.day == cell[3].get<std::int64_t>()); // openpyxl 3.0.9 from_excel, date part
                } else {
                    CHECK(kind == "error");
                    // An error cell is its code as text, as openpyxl 3.0.9 reads it and as a delimited
                    // export writes it, so a score there is "not a number", as in a CSV.
                    REQUIRE(got.kind == CellKind::Text);
                    CHECK(record.texts[column - first] == cell[2].get<std::string>()); // openpyxl 3.0.9
                }
            }
        }
    }
}

// A zip archive of the given entries (minizip's zip.h), for workbooks no writer makes.
std::string zippedWorkbook(const std::string& name, const std::map<std::string, std::string>& entries)
{
    const auto path = (std::filesystem::temp_directory_path() / name).string();
    zipFile handle = zipOpen64(path.c_str(), APPEND_STATUS_CREATE);
    REQUIRE(handle != nullptr);
    for (const auto& [entry, bytes] : entries) {
        REQUIRE(zipOpenNewFileInZip64(handle, entry.c_str(), nullptr, nullptr, 0, nullptr, 0, nullptr, Z_DEFLATED,
                                      Z_DEFAULT_COMPRESSION, 1) == ZIP_OK);
        REQUIRE(zipWriteInFileInZip(handle, bytes.data(), static_cast<unsigned>(bytes.size())) == ZIP_OK);
        REQUIRE(zipCloseFileInZip(handle) == ZIP_OK);
    }
    REQUIRE(zipClose(handle, nullptr) == ZIP_OK);
    return path;
}

const std::string mainNs = R"(xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main" )"
                           R"(xmlns:r="http://schemas.openxmlformats.org/officeDocument/2006/relationships")";
const std::string relType = "http://schemas.openxmlformats.org/officeDocument/2006/relationships/";

std::string relationships(const std::vector<std::array<std::string, 3>>& links)
{
    std::string xml = R"(<Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships">)";
    for (const auto& [id, type, target] : links)
        xml += R"(<Relationship Id=")" + id + R"(" Type=")" + relType + type + R"(" Target=")" + target + R"("/>)";
    return xml + "</Relationships>";
}

// A workbook of one sheet "Data" whose sheetData is `rows`, with optional shared strings and
// styles; `workbookPr` goes into the workbook part as it is.
std::map<std::string, std::string> workbookParts(const std::string& rows, const std::string& sharedStrings = "",
                                                 const std::string& styles = "", const std::string& workbookPr = "")
{
    std::vector<std::array<std::string, 3>> links{{"rId1", "worksheet", "worksheets/sheet1.xml"}};
    std::map<std::string, std::string> parts{
        {"_rels/.rels", relationships({{"rId1", "officeDocument", "xl/workbook.xml"}})},
        {"xl/workbook.xml", "<workbook " + mainNs + ">" + workbookPr + R"(<sheets><sheet name="Data" sheetId="1" r:id="rId1"/></sheets></workbook>)"},
        {"xl/worksheets/sheet1.xml", "<worksheet " + mainNs + "><sheetData>" + rows + "</sheetData></worksheet>"},
    };
    if (!sharedStrings.empty()) {
        links.push_back({"rId2", "sharedStrings", "sharedStrings.xml"});
        parts["xl/sharedStrings.xml"] = "<sst " + mainNs + ">" + sharedStrings + "</sst>";
    }
    if (!styles.empty()) {
        links.push_back({"rId3", "styles", "/xl/styles.xml"});
        parts["xl/styles.xml"] = "<styleSheet " + mainNs + ">" + styles + "</styleSheet>";
    }
    parts["xl/_rels/workbook.xml.rels"] = relationships(links);
    return parts;
}

std::string fileBytes(const std::string& path)
{
    std::ifstream in(path, std::ios::binary);
    return {std::istreambuf_iterator<char>(in), std::istreambuf_iterator<char>()};
}

} // namespace

TEST_CASE("xlsx: a sheet written by openpyxl reads as openpyxl reads it", "[intake][xlsx]")
{
    compareWithOpenpyxl("openpyxl_cohort");
}

TEST_CASE("xlsx: the 1904 date system written by openpyxl reads as openpyxl reads it", "[intake][xlsx]")
{
    compareWithOpenpyxl("openpyxl_1904");
}

TEST_CASE("xlsx: inline and rich strings written by libxlsxwriter read as openpyxl reads them", "[intake][xlsx]")
{
    compareWithOpenpyxl("xlsxwriter_inline");
}

TEST_CASE("xlsx: shared strings and cached formula values written by libxlsxwriter read as openpyxl reads them", "[intake][xlsx]")
{
    compareWithOpenpyxl("xlsxwriter_shared");
}

TEST_CASE("xlsx: errors, formulas without a value and cells outside the header are counted in warnings", "[intake][xlsx]")
{
    auto table = opened(spreadsheets + "openpyxl_cohort.xlsx");
    CHECK(table->sourceName() == spreadsheets + "openpyxl_cohort.xlsx, sheet 'Cohort'");
    CHECK(table->positionNoun() == "row");
    allRecords(*table);
    const auto warnings = table->warnings();
    REQUIRE(warnings.size() == 3);
    CHECK(warnings[0] == "2 cells hold an error value such as #N/A or #DIV/0!, read as that text (a score there is not a number) (first: Cohort!D7, #N/A).");
    CHECK(warnings[1] == "1 cell holds a formula without a saved value (first: Cohort!H3); open and save the workbook in a "
                         "spreadsheet program to store the values.");
    CHECK(warnings[2] == "1 row has cells outside the columns the header names (first: Cohort!J8); those cells are left out. "
                         "Name their columns in the header row to read them.");
    // A second visit counts afresh.
    allRecords(*table);
    CHECK(table->warnings() == warnings);
}

TEST_CASE("xlsx: a sheet is chosen by name first, then by its number", "[intake][xlsx]")
{
    const std::string path = spreadsheets + "openpyxl_cohort.xlsx";
    CHECK(opened(path, "Notes")->columns().at(0).name == "note");
    CHECK(opened(path, "2")->columns().at(0).name == "sheet");   // the sheet named "2", which is third
    CHECK(opened(path, "1")->columns().at(0).name == "patient"); // no sheet named "1": the first sheet
    CHECK(opened(path, "3")->columns().at(0).name == "sheet");
    const std::string missing = openFailure(path, "Visits");
    CHECK_THAT(missing, Catch::Contains("value 'Visits'") && Catch::Contains("'Cohort', 'Notes', '2'")
                            && Catch::Contains("a number from 1 to 3"));
    CHECK_THAT(openFailure(path, "4"), Catch::Contains("'Cohort', 'Notes', '2'"));
}

TEST_CASE("xlsx: the fingerprint is the SHA-256 of the file's bytes", "[intake][xlsx]")
{
    // sha256sum (GNU coreutils 9.1) of the committed fixture; written again, the fixture changes
    // and so does this digest.
    auto table = opened(spreadsheets + "xlsxwriter_shared.xlsx");
    const auto fingerprint = table->fingerprint();
    REQUIRE(fingerprint.has_value());
    CHECK(*fingerprint == "e8708d9e7b7246e888c07b01ddbe2774e677247f4a097359974a89a45f332e99");
}

TEST_CASE("xlsx: only .xlsx names are spreadsheets", "[intake][xlsx]")
{
    CHECK(isSpreadsheetFile("cohort.xlsx"));
    CHECK(isSpreadsheetFile("COHORT.XLSX"));
    CHECK_FALSE(isSpreadsheetFile("cohort.xls"));
    CHECK_FALSE(isSpreadsheetFile("cohort.csv"));
    CHECK_FALSE(isSpreadsheetFile("xlsx"));
}

TEST_CASE("xlsx: date formats are told from number formats", "[intake][xlsx]")
{
    // ECMA-376 Part 1, 18.8.30: built-in ids 14-22 and 45-47 show dates or times.
    CHECK(isBuiltinDateFormat(14));
    CHECK(isBuiltinDateFormat(22));
    CHECK(isBuiltinDateFormat(47));
    CHECK_FALSE(isBuiltinDateFormat(13));
    CHECK_FALSE(isBuiltinDateFormat(23));
    CHECK_FALSE(isBuiltinDateFormat(0));
    CHECK(isDateFormatCode("yyyy-mm-dd"));
    CHECK(isDateFormatCode("[$-409]d-mmm-yy;@"));
    CHECK(isDateFormatCode("dd/mm/yyyy;@"));
    CHECK_FALSE(isDateFormatCode("0.00\" d\""));
    CHECK_FALSE(isDateFormatCode("[Red]0.00"));
    CHECK_FALSE(isDateFormatCode("General"));
    CHECK_FALSE(isDateFormatCode("#,##0\\d"));
    CHECK_FALSE(isDateFormatCode("0.0%"));
}

TEST_CASE("xlsx: date serials follow both date systems", "[intake][xlsx]")
{
    // openpyxl 3.0.9 utils.datetime.from_excel, date part, as days since 1970-01-01.
    CHECK(xlsxSerialToDays(25569.0, false) == 0);       // 1970-01-01
    CHECK(xlsxSerialToDays(61.0, false) == -25508);     // 1900-03-01
    CHECK(xlsxSerialToDays(59.0, false) == -25509);     // 1900-02-28
    CHECK(xlsxSerialToDays(1.0, false) == -25567);      // 1900-01-01
    CHECK(xlsxSerialToDays(44269.75, false) == 18700);  // 2021-03-14 18:00
    CHECK(xlsxSerialToDays(24107.0, true) == 0);        // 1970-01-01
    CHECK(xlsxSerialToDays(1.0, true) == -24106);       // 1904-01-02
    CHECK(xlsxSerialToDays(2958465.0, false) == 2932896); // 9999-12-31
    CHECK_FALSE(xlsxSerialToDays(2958466.0, false).has_value());
    CHECK_FALSE(xlsxSerialToDays(-1.0, false).has_value());
}

TEST_CASE("xlsx: hand-made parts: rich shared strings, prefixes, rows and cells without references", "[intake][xlsx]")
{
    const std::string shared = R"(<si><t>id</t></si><si><r><t>a</t></r><r><t>b</t></r><rPh><t>phonetic</t></rPh></si><si><t/></si>)";
    const std::string styles = R"(<numFmts><numFmt numFmtId="200" formatCode="d.m.yy"/></numFmts>)"
                               R"(<cellStyleXfs><xf numFmtId="14"/></cellStyleXfs><cellXfs><xf numFmtId="0"/><xf numFmtId="200"/></cellXfs>)";
    const std::string rows = R"(<row><c t="s"><v>0</v></c><c t="inlineStr"><is><t>when</t></is></c><c><v>7</v></c></row>)"
                             R"(<row r="4"><c r="A4" t="s"><v>1</v></c><c s="1"><v>24108</v></c><c t="d"><v>2020-02-29T10:00:00</v></c></row>)"
                             R"(<row><c t="s"><v>2</v></c><c r="C5" s="1"><v>24107</v></c></row>)"
                             R"(<x:row xmlns:x="urn:other-prefix"><x:c><x:v>42</x:v></x:c></x:row>)";
    auto table = opened(zippedWorkbook("hand_made.xlsx", workbookParts(rows, shared, styles, R"(<workbookPr date1904="true"/>)")));
    REQUIRE(table->columns().size() == 3);
    CHECK(table->columns()[2].name == "7");
    const auto records = allRecords(*table);
    REQUIRE(records.size() == 3);
    CHECK(records[0].position == 4);
    CHECK(records[0].texts[0] == "ab");         // runs joined, the phonetic guide left out
    CHECK(records[0].cells[1].kind == CellKind::Date);
    CHECK(records[0].cells[1].day == 1);        // 1904 system: serial 24107 is 1970-01-01
    CHECK(records[0].cells[2].day == 18321);    // 2020-02-29, Python datetime.date(2020, 2, 29) - date(1970, 1, 1)
    CHECK(records[1].position == 5);
    CHECK(records[1].cells[0].kind == CellKind::Missing); // an empty shared string
    CHECK(records[1].cells[2].kind == CellKind::Date);    // custom code d.m.yy
    CHECK(records[1].cells[2].day == 0);
    CHECK(records[2].position == 6);                      // a prefixed row, following row 5
    CHECK(records[2].cells[0].number == 42.0);            // no style: the number as stored
}

TEST_CASE("xlsx: bad files end in a message, never a crash", "[intake][xlsx]")
{
    SECTION("not a zip")
    {
        const auto path = (std::filesystem::temp_directory_path() / "not_a_zip.xlsx").string();
        std::ofstream(path) << "outcome,score\n1,0.5\n";
        CHECK_THAT(openFailure(path), Catch::Contains("not a zip archive"));
    }
    SECTION("every truncated copy")
    {
        const std::string bytes = fileBytes(spreadsheets + "openpyxl_cohort.xlsx");
        const std::size_t complete = allRecords(*opened(spreadsheets + "openpyxl_cohort.xlsx")).size();
        const auto path = (std::filesystem::temp_directory_path() / "truncated.xlsx").string();
        for (std::size_t length = 0; length < bytes.size(); length += length + 40 < bytes.size() ? 61 : 1) {
            std::ofstream(path, std::ios::binary | std::ios::trunc) << bytes.substr(0, length);
            INFO("first " << length << " bytes");
            // Only a cut inside the archive's last record (22 bytes, after every entry) can leave
            // all the content; then every row must be read, none lost.
            auto table = openXlsxTable(path, std::nullopt);
            if (length + 22 > bytes.size() && table)
                CHECK(allRecords(**table).size() == complete);
            else
                CHECK_THAT(openFailure(path), Catch::Contains("truncated.xlsx"));
        }
    }
    SECTION("a damaged byte in the sheet's compressed data")
    {
        std::string bytes = fileBytes(spreadsheets + "xlsxwriter_shared.xlsx");
        const auto path = (std::filesystem::temp_directory_path() / "damaged.xlsx").string();
        std::size_t failures = 0;
        for (std::size_t at = 100; at < bytes.size(); at += 97) {
            std::string copy = bytes;
            copy[at] = static_cast<char>(copy[at] ^ 0x5a);
            std::ofstream(path, std::ios::binary | std::ios::trunc) << copy;
            auto table = openXlsxTable(path, std::nullopt);
            if (table)
                failures += (*table)->forEachRecord([](std::span<const TypedCell>, std::size_t) { return true; }) ? 0 : 1;
            else
                failures += 1;
        }
        CHECK(failures > 0); // most damage is found (checksums); none of it crashes
    }
    SECTION("malformed XML in the sheet")
    {
        auto parts = workbookParts(R"(<row r="1"><c t="inlineStr"><is><t>id</t></is></c></row><row r="2"><c><v>1</c></row>)");
        CHECK_THAT(openFailure(zippedWorkbook("malformed.xlsx", parts)), Catch::Contains("'xl/worksheets/sheet1.xml' is not well-formed XML"));
    }
    SECTION("a document type declaration")
    {
        auto parts = workbookParts("");
        parts["xl/workbook.xml"] = R"(<?xml version="1.0"?><!DOCTYPE x [<!ENTITY a "aaaa">]><workbook/>)";
        CHECK_THAT(openFailure(zippedWorkbook("doctype.xlsx", parts)), Catch::Contains("declares a document type"));
    }
    SECTION("a workbook without sheets")
    {
        auto parts = workbookParts("");
        parts["xl/workbook.xml"] = "<workbook " + mainNs + "><sheets/></workbook>";
        CHECK_THAT(openFailure(zippedWorkbook("no_sheets.xlsx", parts)), Catch::Contains("the workbook has no sheets"));
    }
    SECTION("a sheet without values")
    {
        CHECK_THAT(openFailure(zippedWorkbook("empty_sheet.xlsx", workbookParts(R"(<row r="3"><c r="B3" s="1"/></row>)"))),
                   Catch::Contains("no header row"));
    }
    SECTION("a zip that is no workbook")
    {
        CHECK_THAT(openFailure(zippedWorkbook("other.xlsx", {{"content.xml", "<document/>"}})), Catch::Contains("not a spreadsheet workbook"));
    }
    SECTION("rows out of order")
    {
        const std::string rows = R"(<row r="2"><c t="inlineStr"><is><t>id</t></is></c></row><row r="5"><c><v>1</v></c></row>)"
                                 R"(<row r="4"><c><v>2</v></c></row>)";
        const std::string message = openFailure(zippedWorkbook("order.xlsx", workbookParts(rows)));
        CHECK_THAT(message, Catch::Contains("row 4") && Catch::Contains("out of order"));
    }
    SECTION("a number cell that holds no number")
    {
        const std::string rows = R"(<row r="1"><c t="inlineStr"><is><t>age</t></is></c></row><row r="2"><c r="A2"><v>12x</v></c></row>)";
        const std::string message = openFailure(zippedWorkbook("bad_number.xlsx", workbookParts(rows)));
        CHECK_THAT(message, Catch::Contains("row 2") && Catch::Contains("column 'age'") && Catch::Contains("value '12x'")
                                && Catch::Contains("cell A2"));
    }
    SECTION("a shared string the table does not hold")
    {
        const std::string rows = R"(<row r="1"><c t="s"><v>3</v></c></row>)";
        CHECK_THAT(openFailure(zippedWorkbook("bad_index.xlsx", workbookParts(rows, "<si><t>x</t></si>"))),
                   Catch::Contains("shared string 3"));
    }
}

TEST_CASE("xlsx: bounds turn a zip bomb into a message", "[intake][xlsx]")
{
    const std::string header = R"(<row r="1"><c t="inlineStr"><is><t>id</t></is></c></row>)";
    XlsxLimits limits;
    SECTION("a part that inflates too far")
    {
        limits.partBytes = 64 * 1024;
        const auto path = zippedWorkbook("bomb.xlsx", workbookParts(header + std::string(200'000, ' ')));
        CHECK_THAT(openFailure(path, std::nullopt, limits), Catch::Contains("inflates to more than"));
        CHECK(openXlsxTable(path, std::nullopt).has_value()); // the default bound lets it through
    }
    SECTION("too many shared strings")
    {
        limits.sharedStrings = 2;
        const auto path = zippedWorkbook("strings.xlsx", workbookParts(header, "<si><t>a</t></si><si><t>b</t></si><si><t>c</t></si>"));
        CHECK_THAT(openFailure(path, std::nullopt, limits), Catch::Contains("more than 2 entries"));
    }
    SECTION("a cell text too long")
    {
        limits.cellBytes = 100;
        const auto path = zippedWorkbook("long.xlsx", workbookParts(header + R"(<row r="2"><c t="inlineStr"><is><t>)" + std::string(101, 'x')
                                                             + "</t></is></c></row>"));
        CHECK_THAT(openFailure(path, std::nullopt, limits), Catch::Contains("more than 100 bytes"));
    }
}
