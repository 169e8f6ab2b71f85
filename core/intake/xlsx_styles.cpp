#include "intake/xlsx_styles.hpp"

#include "intake/xlsx_dates.hpp"
#include "intake/xlsx_xml_part.hpp"

#include <charconv>
#include <map>
#include <string_view>

namespace plumbline {

namespace {

int formatId(const char* text)
{
    int id = -1;
    if (text)
        std::from_chars(text, text + std::char_traits<char>::length(text), id);
    return id;
}

// numFmts gives the custom format codes; cellXfs the cell formats, in index order. Formats in
// cellStyleXfs (named styles) are not what a cell's `s` points at, so they are skipped.
class StylesHandler : public XlsxXmlHandler {
public:
    std::map<int, bool> customIsDate;
    std::vector<int> cellFormatIds;

    void start(std::string_view name, const char** attributes) override
    {
        if (name == "numFmt") {
            const char* code = xlsxAttribute(attributes, "formatCode");
            customIsDate[formatId(xlsxAttribute(attributes, "numFmtId"))] = code && isDateFormatCode(code);
        } else if (name == "cellXfs") {
            m_inCellFormats = true;
        } else if (name == "xf" && m_inCellFormats) {
            cellFormatIds.push_back(formatId(xlsxAttribute(attributes, "numFmtId")));
        }
    }
    void end(std::string_view name) override
    {
        if (name == "cellXfs")
            m_inCellFormats = false;
    }

private:
    bool m_inCellFormats = false;
};

} // namespace

std::expected<XlsxStyles, InputError> XlsxStyles::read(const XlsxArchive& archive, const std::string& part,
                                                       const XlsxLimits& limits)
{
    XlsxStyles styles;
    if (part.empty() || !archive.contains(part))
        return styles;
    StylesHandler handler;
    if (auto parsed = parseXlsxPart(archive, part, limits.partBytes, handler); !parsed)
        return std::unexpected(parsed.error());
    styles.m_dates.reserve(handler.cellFormatIds.size());
    for (const int id : handler.cellFormatIds) {
        // A custom code may redefine an id below 164; it then decides.
        const auto custom = handler.customIsDate.find(id);
        styles.m_dates.push_back(custom != handler.customIsDate.end() ? custom->second : isBuiltinDateFormat(id));
    }
    return styles;
}

} // namespace plumbline
