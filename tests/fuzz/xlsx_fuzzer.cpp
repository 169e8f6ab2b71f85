// libFuzzer harness of the spreadsheet reader: any bytes as an .xlsx file, every sheet opened by
// name and visited to the end, warnings and fingerprint taken. Nothing may crash, hang or leak,
// and a visit must give each record one cell per column, at positions that only go up.
#include "intake/xlsx_table.hpp"

#include <cstddef>
#include <cstdint>
#include <cstdio>
#include <string>

#include <unistd.h>

namespace {

// One file per process, written for each input and removed after it (libFuzzer may end the
// process without running exit handlers): the reader takes a path, as the intake does.
const std::string& scratchPath()
{
    static const std::string path = "/tmp/plumbline-xlsx-fuzz-" + std::to_string(::getpid()) + ".xlsx";
    return path;
}

void visitSheet(const std::string& path, const std::optional<std::string>& sheet)
{
    auto table = plumbline::openXlsxTable(path, sheet);
    if (!table) {
        (void)table.error().message();
        return;
    }
    const std::size_t width = (*table)->columns().size();
    std::size_t previous = 0;
    const auto visited = (*table)->forEachRecord([&](std::span<const plumbline::TypedCell> cells, std::size_t position) {
        if (cells.size() != width || position <= previous)
            __builtin_trap();
        previous = position;
        return true;
    });
    if (!visited)
        (void)visited.error().message();
    (void)(*table)->warnings();
    (void)(*table)->fingerprint();
}

} // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size)
{
    const std::string& path = scratchPath();
    std::FILE* out = std::fopen(path.c_str(), "wb");
    if (!out)
        __builtin_trap();
    std::fwrite(data, 1, size, out);
    std::fclose(out);
    const auto names = plumbline::xlsxSheetNames(path);
    if (!names) {
        (void)names.error().message();
        visitSheet(path, std::nullopt);
        ::unlink(path.c_str());
        return 0;
    }
    for (const auto& name : *names)
        visitSheet(path, name);
    visitSheet(path, "2");
    ::unlink(path.c_str());
    return 0;
}
