#include "intake/xlsx_workbook.hpp"

#include "intake/xlsx_xml_part.hpp"

#include <map>
#include <string_view>

namespace plumbline {

namespace {

struct Relationship {
    std::string type;
    std::string target;
};

// A relationships part: Id → type and target (external targets are left out).
class RelationshipsHandler : public XlsxXmlHandler {
public:
    std::map<std::string, Relationship> byId;

    void start(std::string_view name, const char** attributes) override
    {
        if (name != "Relationship")
            return;
        const char* id = xlsxAttribute(attributes, "Id");
        const char* type = xlsxAttribute(attributes, "Type");
        const char* target = xlsxAttribute(attributes, "Target");
        const char* mode = xlsxAttribute(attributes, "TargetMode");
        if (id && type && target && !(mode && std::string_view(mode) == "External"))
            byId.emplace(id, Relationship{type, target});
    }
    void end(std::string_view) override {}
};

struct SheetReference {
    std::string name;
    std::string relationship;
};

class WorkbookHandler : public XlsxXmlHandler {
public:
    std::vector<SheetReference> sheets;
    bool date1904 = false;

    void start(std::string_view name, const char** attributes) override
    {
        if (name == "workbookPr") {
            const char* flag = xlsxAttribute(attributes, "date1904");
            date1904 = flag && (std::string_view(flag) == "1" || std::string_view(flag) == "true");
        } else if (name == "sheet") {
            const char* sheetName = xlsxAttribute(attributes, "name");
            const char* id = xlsxAttribute(attributes, "id"); // r:id
            sheets.push_back({sheetName ? sheetName : "", id ? id : ""});
        }
    }
    void end(std::string_view) override {}
};

bool endsWith(std::string_view text, std::string_view tail)
{
    return text.size() >= tail.size() && text.substr(text.size() - tail.size()) == tail;
}

std::string relationshipsPartOf(const std::string& part)
{
    const auto slash = part.rfind('/');
    const std::string folder = slash == std::string::npos ? "" : part.substr(0, slash + 1);
    const std::string file = slash == std::string::npos ? part : part.substr(slash + 1);
    return folder + "_rels/" + file + ".rels";
}

std::expected<std::map<std::string, Relationship>, InputError> relationships(const XlsxArchive& archive, const std::string& part,
                                                                              const XlsxLimits& limits)
{
    RelationshipsHandler handler;
    if (auto parsed = parseXlsxPart(archive, part, limits.partBytes, handler); !parsed)
        return std::unexpected(parsed.error());
    return std::move(handler.byId);
}

InputError notAWorkbook(const XlsxArchive& archive, const std::string& problem)
{
    InputError error;
    error.file = archive.path();
    error.problem = problem;
    error.remedy = "save the sheet from the spreadsheet program as an Excel workbook (.xlsx) and try again.";
    return error;
}

// The workbook part: named by the package's officeDocument relationship (ECMA-376 Part 2, 9.3).
std::expected<std::string, InputError> workbookPart(const XlsxArchive& archive, const XlsxLimits& limits)
{
    const std::string packageRelationships = "_rels/.rels";
    if (archive.contains(packageRelationships)) {
        const auto package = relationships(archive, packageRelationships, limits);
        if (!package)
            return std::unexpected(package.error());
        for (const auto& [id, relationship] : *package) {
            if (endsWith(relationship.type, "/officeDocument")) {
                const std::string part = xlsxResolvedTarget("", relationship.target);
                if (archive.contains(part))
                    return part;
            }
        }
    }
    return std::unexpected(notAWorkbook(
        archive, "the file is a zip archive but not a spreadsheet workbook: it names no workbook part (is it an .ods, .docx or "
                 "another kind of archive?)."));
}

} // namespace

std::string xlsxResolvedTarget(const std::string& sourcePart, const std::string& target)
{
    std::string path;
    if (target.starts_with('/')) {
        path = target.substr(1);
    } else {
        const auto slash = sourcePart.rfind('/');
        path = (slash == std::string::npos ? "" : sourcePart.substr(0, slash + 1)) + target;
    }
    std::vector<std::string> segments;
    std::size_t begin = 0;
    while (begin <= path.size()) {
        auto end = path.find('/', begin);
        if (end == std::string::npos)
            end = path.size();
        const std::string segment = path.substr(begin, end - begin);
        if (segment == "..") {
            if (!segments.empty())
                segments.pop_back();
        } else if (!segment.empty() && segment != ".") {
            segments.push_back(segment);
        }
        begin = end + 1;
    }
    std::string resolved;
    for (const auto& segment : segments)
        resolved += (resolved.empty() ? "" : "/") + segment;
    return resolved;
}

std::expected<XlsxWorkbook, InputError> XlsxWorkbook::read(const XlsxArchive& archive, const XlsxLimits& limits)
{
    const auto part = workbookPart(archive, limits);
    if (!part)
        return std::unexpected(part.error());
    WorkbookHandler handler;
    if (auto parsed = parseXlsxPart(archive, *part, limits.partBytes, handler); !parsed)
        return std::unexpected(parsed.error());
    std::map<std::string, Relationship> links;
    if (const std::string linksPart = relationshipsPartOf(*part); archive.contains(linksPart)) {
        auto parsed = relationships(archive, linksPart, limits);
        if (!parsed)
            return std::unexpected(parsed.error());
        links = std::move(*parsed);
    }
    XlsxWorkbook workbook;
    workbook.date1904 = handler.date1904;
    for (const auto& [id, link] : links) {
        if (endsWith(link.type, "/sharedStrings"))
            workbook.sharedStringsPart = xlsxResolvedTarget(*part, link.target);
        else if (endsWith(link.type, "/styles"))
            workbook.stylesPart = xlsxResolvedTarget(*part, link.target);
    }
    for (const auto& sheet : handler.sheets) {
        const auto link = links.find(sheet.relationship);
        XlsxSheetEntry entry{sheet.name, "", false};
        if (link != links.end()) {
            entry.part = xlsxResolvedTarget(*part, link->second.target);
            entry.worksheet = endsWith(link->second.type, "/worksheet");
        }
        workbook.sheets.push_back(std::move(entry));
    }
    return workbook;
}

} // namespace plumbline
