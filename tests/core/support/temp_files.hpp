#pragma once

#include <filesystem>
#include <fstream>
#include <string>

namespace plumbline::test {

// Writes bytes to a fresh file in the temporary folder and returns its path.
inline std::filesystem::path writtenFile(const std::string& name, const std::string& bytes)
{
    const auto path = std::filesystem::temp_directory_path() / name;
    std::ofstream(path, std::ios::binary) << bytes;
    return path;
}

} // namespace plumbline::test
