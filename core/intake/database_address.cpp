#include "intake/database_address.hpp"

#include <algorithm>
#include <cctype>
#include <regex>
#include <vector>

namespace plumbline {

namespace {

struct Span {
    std::size_t begin = 0;
    std::size_t end = 0;
    std::string key;
};

std::string lowered(std::string_view text)
{
    std::string result(text);
    std::ranges::transform(result, result.begin(), [](unsigned char c) { return static_cast<char>(std::tolower(c)); });
    return result;
}

// Address schemes are compared without regard to case (POSTGRESQL:// is postgresql://).
bool startsWith(const std::string& text, std::string_view prefix)
{
    return text.size() >= prefix.size()
        && std::equal(prefix.begin(), prefix.end(), text.begin(), [](char a, char b) {
               return std::tolower(static_cast<unsigned char>(a)) == std::tolower(static_cast<unsigned char>(b));
           });
}

// Whatever the address looks like (an unknown scheme, a bare libpq string, a typo), a user:secret@
// part and a password=… setting are blanked before the address is shown anywhere.
std::string withoutAnySecret(const std::string& text)
{
    static const std::regex userInfo(R"(^([A-Za-z][A-Za-z0-9+.\-]*://[^/:@]*):[^@/]*@)");
    static const std::regex setting(R"((password|passwd|pwd|sslpassword)(\s*=\s*)("[^"]*"|'[^']*'|\{[^}]*\}|[^;&\s]*))",
                                    std::regex::icase);
    return std::regex_replace(std::regex_replace(text, userInfo, "$1:***@"), setting, "$1$2***");
}

// %XX decoded, as libpq decodes a URI's parameter names (so "pass%77ord" is still a password).
std::string percentDecoded(std::string_view text)
{
    std::string result;
    for (std::size_t i = 0; i < text.size(); ++i) {
        if (text[i] == '%' && i + 2 < text.size() && std::isxdigit(static_cast<unsigned char>(text[i + 1]))
            && std::isxdigit(static_cast<unsigned char>(text[i + 2]))) {
            result += static_cast<char>(std::stoi(std::string(text.substr(i + 1, 2)), nullptr, 16));
            i += 2;
        } else {
            result += text[i];
        }
    }
    return result;
}

// The KEY=VALUE settings of an ODBC connection string: ';'-separated, a value in {braces} may
// hold ';' and writes '}' as "}}" (ODBC 3.8, SQLDriverConnect connection strings).
std::vector<Span> odbcSettings(std::string_view text)
{
    std::vector<Span> settings;
    std::size_t at = 0;
    while (at < text.size()) {
        Span setting{at, at, {}};
        const std::size_t equals = text.find('=', at);
        const std::size_t semicolon = text.find(';', at);
        if (equals == std::string_view::npos || (semicolon != std::string_view::npos && semicolon < equals)) {
            setting.end = semicolon == std::string_view::npos ? text.size() : semicolon + 1;
        } else {
            setting.key = lowered(text.substr(at, equals - at));
            std::size_t end = equals + 1;
            if (end < text.size() && text[end] == '{')
                for (++end; end < text.size(); ++end) {
                    if (text[end] != '}')
                        continue;
                    if (end + 1 >= text.size() || text[end + 1] != '}')
                        break;
                    ++end; // "}}" is a '}' inside the value
                }
            end = std::min(text.find(';', std::min(end, text.size())), text.size());
            setting.end = end < text.size() ? end + 1 : end;
        }
        while (!setting.key.empty() && std::isspace(static_cast<unsigned char>(setting.key.back())))
            setting.key.pop_back();
        while (!setting.key.empty() && std::isspace(static_cast<unsigned char>(setting.key.front())))
            setting.key.erase(0, 1);
        at = setting.end;
        settings.push_back(std::move(setting));
    }
    return settings;
}

// The KEY = VALUE settings of a libpq keyword/value string: a value is a word or 'quoted' with
// backslash escapes (PostgreSQL 15 documentation, 34.1.1.1).
std::vector<Span> libpqSettings(std::string_view text)
{
    std::vector<Span> settings;
    std::size_t at = 0;
    auto skipSpace = [&] {
        while (at < text.size() && std::isspace(static_cast<unsigned char>(text[at])))
            ++at;
    };
    for (skipSpace(); at < text.size(); skipSpace()) {
        Span setting{at, at, {}};
        while (at < text.size() && text[at] != '=' && !std::isspace(static_cast<unsigned char>(text[at])))
            ++at;
        setting.key = lowered(text.substr(setting.begin, at - setting.begin));
        skipSpace();
        if (at < text.size() && text[at] == '=')
            ++at;
        skipSpace();
        if (at < text.size() && text[at] == '\'') {
            for (++at; at < text.size() && text[at] != '\''; ++at)
                if (text[at] == '\\')
                    ++at;
            at = std::min(at + 1, text.size());
        } else {
            while (at < text.size() && !std::isspace(static_cast<unsigned char>(text[at])))
                ++at;
        }
        skipSpace(); // a setting left out takes its blanks along
        setting.end = at;
        settings.push_back(std::move(setting));
    }
    return settings;
}

// A libpq URI's parameters after '?', '&'-separated.
std::vector<Span> uriParameters(std::string_view text, std::size_t from)
{
    std::vector<Span> settings;
    for (std::size_t at = from; at < text.size();) {
        std::size_t end = std::min(text.find('&', at), text.size());
        const std::string_view item = text.substr(at, end - at);
        settings.push_back({at, end < text.size() ? end + 1 : end, lowered(percentDecoded(item.substr(0, item.find('='))))});
        at = end + 1;
    }
    return settings;
}

std::string without(std::string_view text, const std::vector<Span>& settings, bool (*secret)(const std::string&))
{
    std::string result;
    std::size_t kept = 0;
    for (const Span& setting : settings) {
        if (!secret(setting.key))
            continue;
        result.append(text.substr(kept, setting.begin - kept));
        kept = setting.end;
    }
    result.append(text.substr(std::min(kept, text.size())));
    return result;
}

bool libpqSecret(const std::string& key) { return key == "password" || key == "sslpassword"; }
bool odbcSecret(const std::string& key) { return key == "pwd" || key == "password"; }

std::string secretFreeUri(const std::string& uri)
{
    const std::size_t authority = uri.find("//") + 2;
    const std::size_t authorityEnd = std::min(uri.find_first_of("/?", authority), uri.size());
    std::string result = uri;
    const std::size_t at = uri.rfind('@', authorityEnd);
    if (at != std::string::npos && at >= authority) {
        const std::size_t colon = uri.find(':', authority);
        if (colon < at)
            result = uri.substr(0, colon) + uri.substr(at);
    }
    const std::size_t question = result.find('?');
    if (question == std::string::npos)
        return result;
    std::string kept = without(result, uriParameters(result, question + 1), libpqSecret);
    while (kept.ends_with('&') || kept.ends_with('?'))
        kept.pop_back();
    return kept;
}

InputError addressError(const std::string& database, std::string problem, std::string remedy)
{
    InputError failure;
    failure.file = secretFreeAddress(database);
    failure.problem = std::move(problem);
    failure.remedy = std::move(remedy);
    return failure;
}

} // namespace

namespace {

// The secrets of the address forms Plumbline reads, left out setting by setting.
std::string knownSecretsLeftOut(const std::string& database)
{
    if (startsWith(database, "postgresql://") || startsWith(database, "postgres://"))
        return secretFreeUri(database);
    for (std::string_view scheme : {"postgresql:", "postgres:"})
        if (startsWith(database, scheme)) {
            const std::string rest = database.substr(scheme.size());
            return std::string(scheme) + without(rest, libpqSettings(rest), libpqSecret);
        }
    if (startsWith(database, "odbc:")) {
        const std::string rest = database.substr(5);
        return "odbc:" + without(rest, odbcSettings(rest), odbcSecret);
    }
    return database;
}

} // namespace

std::string secretFreeAddress(const std::string& database)
{
    return withoutAnySecret(knownSecretsLeftOut(database));
}


std::expected<DatabaseAddress, InputError> readDatabaseAddress(const std::string& database)
{
    DatabaseAddress address;
    address.displayName = secretFreeAddress(database);
    if (startsWith(database, "postgresql://") || startsWith(database, "postgres://")) {
        address.kind = DatabaseKind::Postgres;
        address.target = "postgresql" + database.substr(database.find(':')); // libpq knows the scheme in lower case only
    } else if (startsWith(database, "postgresql:") || startsWith(database, "postgres:")) {
        address.kind = DatabaseKind::Postgres;
        address.target = database.substr(database.find(':') + 1);
    } else if (startsWith(database, "sqlite:")) {
        address.kind = DatabaseKind::Sqlite;
        address.target = database.substr(7);
    } else if (startsWith(database, "odbc:")) {
        address.kind = DatabaseKind::Odbc;
        address.target = database.substr(5);
    } else {
        return std::unexpected(addressError(database, "this is not a database address Plumbline reads.",
            "write postgresql://[user@]host[:port]/database, postgresql:service=NAME, sqlite:PATH or odbc:CONNECTION-STRING."));
    }
    if (address.target.find_first_not_of(" \t") == std::string::npos)
        return std::unexpected(addressError(database, "the address names no database after its prefix.",
                                            "add the database, e.g. sqlite:cohort.db or odbc:DSN=Warehouse."));
    if (address.kind == DatabaseKind::Odbc)
        for (const Span& setting : odbcSettings(address.target)) {
            if (odbcSecret(setting.key))
                return std::unexpected(addressError(database, "the connection string holds a password; it would show in the process list and the shell history.",
                    "leave PWD out: keep it in the data source's own configuration, or set the environment variable PLUMBLINE_ODBC_PASSWORD, which Plumbline appends as PWD."));
            if (setting.key == "savefile")
                return std::unexpected(addressError(database, "SAVEFILE would make the driver manager write the connection, credentials included, to a file.",
                                                    "leave SAVEFILE out of the connection string."));
        }
    return address;
}

} // namespace plumbline
