// libFuzzer harness of the analysis-file reader: any bytes as a *.plumbline.json. Nothing may
// crash, hang, leak or escape as an exception; whatever is accepted must pass the settings check.
#include "files/analysis_file.hpp"
#include "files/settings_check.hpp"

#include <cstddef>
#include <cstdint>
#include <string>
#include <vector>

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size)
{
    using namespace plumbline;
    auto file = TextFile::fromBytes("fuzz/a.plumbline.json", std::string(reinterpret_cast<const char*>(data), size));
    if (!file)
        return 0;
    std::vector<std::string> warnings;
    const auto analysis = readAnalysisFile(*file, warnings, {});
    if (analysis && !checkAnalysisSettings(*analysis, SettingsSource::AnalysisFile, "fuzz").has_value())
        __builtin_trap(); // accepted settings that the shared check refuses
    if (!analysis)
        (void)analysis.error().message();
    return 0;
}
