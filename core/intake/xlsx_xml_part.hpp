#pragma once

#include "intake/input_error.hpp"
#include "intake/xlsx_archive.hpp"

#include <cstdint>
#include <expected>
#include <optional>
#include <string>
#include <string_view>

namespace plumbline {

// Receives one XML part of a workbook as expat streams it: elements and attributes by their
// local name (a writer may put any prefix on the spreadsheet namespace, "x:row" as well as "row").
class XlsxXmlHandler {
public:
    virtual ~XlsxXmlHandler() = default;
    // `attributes`: expat's null-terminated name, value, name, value... list (names with prefix).
    virtual void start(std::string_view name, const char** attributes) = 0;
    virtual void end(std::string_view name) = 0;
    virtual void text(std::string_view) {}

    // A handler ends the parse early with success (finish) or with an error (fail).
    void finish() { m_finished = true; }
    void fail(InputError error) { m_failure = std::move(error); }
    bool finished() const { return m_finished; }
    std::optional<InputError>& failure() { return m_failure; }

private:
    bool m_finished = false;
    std::optional<InputError> m_failure;
};

// The value of attribute `name` (local name) in expat's list, or nullptr.
const char* xlsxAttribute(const char** attributes, std::string_view name);
// The local part of a qualified XML name ("x:row" → "row").
std::string_view xlsxLocalName(std::string_view name);

// Streams part `entry` of the archive through expat into `handler`, a chunk at a time. Malformed
// XML, a document type declaration (no workbook part has one; refusing them shuts out entity
// expansion attacks) or a handler's failure is an InputError; so is an inflated size over `limit`.
std::expected<void, InputError> parseXlsxPart(const XlsxArchive& archive, const std::string& entry, std::uint64_t limit,
                                              XlsxXmlHandler& handler);

} // namespace plumbline
