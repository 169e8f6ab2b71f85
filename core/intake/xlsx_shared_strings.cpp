#include "intake/xlsx_shared_strings.hpp"

#include "intake/xlsx_xml_part.hpp"

namespace plumbline {

class SharedStringsHandler : public XlsxXmlHandler {
public:
    SharedStringsHandler(XlsxSharedStrings& table, const XlsxArchive& archive, const std::string& part, const XlsxLimits& limits)
        : m_table(table)
        , m_archive(archive)
        , m_part(part)
        , m_limits(limits)
    {
    }

    void start(std::string_view name, const char**) override
    {
        if (name == "si")
            m_inEntry = true;
        else if (name == "rPh")
            m_inPhonetic = true;
        else if (name == "t")
            m_inText = m_inEntry && !m_inPhonetic;
    }
    void end(std::string_view name) override
    {
        if (name == "t") {
            m_inText = false;
        } else if (name == "rPh") {
            m_inPhonetic = false;
        } else if (name == "si" && m_inEntry) {
            m_inEntry = false;
            if (m_table.m_ends.size() >= m_limits.sharedStrings)
                return tooLarge(std::to_string(m_limits.sharedStrings) + " entries");
            m_table.m_ends.push_back(m_table.m_text.size());
        }
    }
    void text(std::string_view chunk) override
    {
        if (!m_inText)
            return;
        if (m_table.m_text.size() + chunk.size() > m_limits.sharedStringBytes)
            return tooLarge(std::to_string(m_limits.sharedStringBytes >> 20) + " MB of text");
        m_table.m_text.append(chunk);
    }

private:
    void tooLarge(const std::string& what)
    {
        InputError error;
        error.file = m_archive.path();
        error.problem = "the workbook's shared-string table ('" + m_part + "') holds more than " + what
                        + ", more than this program reads (a damaged file, or one made to exhaust memory).";
        error.remedy = "export the sheet as CSV and load that instead.";
        fail(std::move(error));
    }

    XlsxSharedStrings& m_table;
    const XlsxArchive& m_archive;
    const std::string& m_part;
    const XlsxLimits& m_limits;
    bool m_inEntry = false;
    bool m_inPhonetic = false;
    bool m_inText = false;
};

std::expected<XlsxSharedStrings, InputError> XlsxSharedStrings::read(const XlsxArchive& archive, const std::string& part,
                                                                     const XlsxLimits& limits)
{
    XlsxSharedStrings table;
    if (part.empty() || !archive.contains(part))
        return table;
    SharedStringsHandler handler(table, archive, part, limits);
    if (auto parsed = parseXlsxPart(archive, part, limits.partBytes, handler); !parsed)
        return std::unexpected(parsed.error());
    table.m_text.shrink_to_fit();
    table.m_ends.shrink_to_fit();
    return table;
}

std::optional<std::string_view> XlsxSharedStrings::at(std::size_t index) const
{
    if (index >= m_ends.size())
        return std::nullopt;
    const std::uint64_t begin = index == 0 ? 0 : m_ends[index - 1];
    return std::string_view(m_text).substr(begin, m_ends[index] - begin);
}

} // namespace plumbline
