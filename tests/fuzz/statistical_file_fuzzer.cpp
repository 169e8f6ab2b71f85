// libFuzzer harness of the statistical-file reader: any bytes as a SAS data set, SAS transport,
// Stata or SPSS file (the first byte chooses which), opened and visited whole. Nothing may crash,
// hang or leak; every record must have one cell per column at the next position, and every date
// a calendar day. ReadStat itself is Debian's build, not instrumented: its bugs show as crashes.
#include "intake/statistical_file_table.hpp"

#include <cstddef>
#include <cstdint>
#include <cstdio>
#include <fstream>
#include <string>

#include <unistd.h>

namespace {

const char* const extensions[] = {".sas7bdat", ".xpt", ".dta", ".sav"};

} // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size)
{
    using namespace plumbline;
    if (size == 0)
        return 0;
    // One file per process, rewritten each time: the reader takes a path.
    const std::string path = "/tmp/plumbline-fuzz-" + std::to_string(::getpid()) + extensions[data[0] % 4];
    {
        std::ofstream out(path, std::ios::binary | std::ios::trunc);
        out.write(reinterpret_cast<const char*>(data + 1), std::streamsize(size - 1));
    }
    auto table = openStatisticalFile(path);
    if (!table) {
        (void)table.error().message();
        std::remove(path.c_str());
        return 0;
    }
    const std::size_t columns = (*table)->columns().size();
    std::size_t expected = 1;
    const auto visited = (*table)->forEachRecord([&](std::span<const TypedCell> cells, std::size_t position) {
        if (cells.size() != columns || position != expected++)
            __builtin_trap();
        for (const TypedCell& cell : cells)
            if (cell.kind == CellKind::Date && (cell.day < -719162 || cell.day > 2932896))
                __builtin_trap(); // beyond the years 1 to 9999
        return true;
    });
    if (!visited)
        (void)visited.error().message();
    (void)(*table)->fingerprint();
    std::remove(path.c_str());
    return 0;
}
