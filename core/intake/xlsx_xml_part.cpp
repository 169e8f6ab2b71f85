#include "intake/xlsx_xml_part.hpp"

#include <expat.h>

#include <memory>

namespace plumbline {

namespace {

struct ParseState {
    XML_Parser parser = nullptr;
    XlsxXmlHandler* handler = nullptr;
    bool doctype = false;
};

// expat may still deliver an event after XML_StopParser: a handler that is done sees no more.
bool done(const ParseState& state)
{
    return state.handler->finished() || state.handler->failure() || state.doctype;
}

void stopIfDone(ParseState& state)
{
    if (state.handler->finished() || state.handler->failure())
        XML_StopParser(state.parser, XML_FALSE);
}

void XMLCALL onStart(void* data, const XML_Char* name, const XML_Char** attributes)
{
    auto& state = *static_cast<ParseState*>(data);
    if (done(state))
        return;
    state.handler->start(xlsxLocalName(name), attributes);
    stopIfDone(state);
}

void XMLCALL onEnd(void* data, const XML_Char* name)
{
    auto& state = *static_cast<ParseState*>(data);
    if (done(state))
        return;
    state.handler->end(xlsxLocalName(name));
    stopIfDone(state);
}

void XMLCALL onText(void* data, const XML_Char* text, int length)
{
    auto& state = *static_cast<ParseState*>(data);
    if (done(state))
        return;
    state.handler->text(std::string_view(text, static_cast<std::size_t>(length)));
    stopIfDone(state);
}

void XMLCALL onDoctype(void* data, const XML_Char*, const XML_Char*, const XML_Char*, int)
{
    auto& state = *static_cast<ParseState*>(data);
    state.doctype = true;
    XML_StopParser(state.parser, XML_FALSE);
}

InputError malformed(const XlsxArchive& archive, const std::string& entry, const std::string& problem)
{
    InputError error;
    error.file = archive.path();
    error.problem = "the workbook's part '" + entry + "' " + problem;
    error.remedy = "the file is damaged or was not written by a spreadsheet program: open it in one and save it again as .xlsx.";
    return error;
}

} // namespace

std::string_view xlsxLocalName(std::string_view name)
{
    const auto colon = name.rfind(':');
    return colon == std::string_view::npos ? name : name.substr(colon + 1);
}

const char* xlsxAttribute(const char** attributes, std::string_view name)
{
    for (const char** at = attributes; at && *at; at += 2) {
        if (xlsxLocalName(*at) == name)
            return at[1];
    }
    return nullptr;
}

std::expected<void, InputError> parseXlsxPart(const XlsxArchive& archive, const std::string& entry, std::uint64_t limit,
                                              XlsxXmlHandler& handler)
{
    std::unique_ptr<XML_ParserStruct, void (*)(XML_Parser)> parser(XML_ParserCreate("UTF-8"), &XML_ParserFree);
    if (!parser)
        throw std::bad_alloc();
    ParseState state{parser.get(), &handler, false};
    XML_SetUserData(parser.get(), &state);
    XML_SetElementHandler(parser.get(), onStart, onEnd);
    XML_SetCharacterDataHandler(parser.get(), onText);
    XML_SetStartDoctypeDeclHandler(parser.get(), onDoctype);

    std::optional<InputError> xmlError;
    auto describe = [&]() {
        if (state.doctype)
            return malformed(archive, entry, "declares a document type, which no workbook part does.");
        return malformed(archive, entry,
                         "is not well-formed XML (XML line " + std::to_string(XML_GetCurrentLineNumber(parser.get()))
                             + ", column " + std::to_string(XML_GetCurrentColumnNumber(parser.get()))
                             + ": " + XML_ErrorString(XML_GetErrorCode(parser.get())) + ").");
    };
    auto feed = [&](std::string_view chunk, bool last) {
        if (XML_Parse(parser.get(), chunk.data(), static_cast<int>(chunk.size()), last ? XML_TRUE : XML_FALSE) == XML_STATUS_OK)
            return true;
        if (!handler.finished() && !handler.failure())
            xmlError = describe();
        return false;
    };
    const auto read = archive.read(entry, limit, [&](std::string_view chunk) { return feed(chunk, false); });
    if (handler.failure())
        return std::unexpected(*handler.failure());
    if (handler.finished())
        return {};
    if (xmlError)
        return std::unexpected(*xmlError);
    if (!read)
        return std::unexpected(read.error());
    if (!feed({}, true)) {
        if (handler.failure())
            return std::unexpected(*handler.failure());
        if (xmlError)
            return std::unexpected(*xmlError);
    }
    return {};
}

} // namespace plumbline
