#include "huge_pages.hpp"

#include <cstdlib>
#include <fstream>
#include <string>

#include <unistd.h>

namespace plumbline {

namespace {

constexpr const char* tunable = "glibc.malloc.hugetlb=1";

bool kernelGivesHugePagesOnRequest()
{
    std::ifstream mode("/sys/kernel/mm/transparent_hugepage/enabled");
    std::string text;
    std::getline(mode, text);
    return text.find("[madvise]") != std::string::npos;
}

} // namespace

void restartWithHugePages(char** argv)
{
    if (std::getenv("PLUMBLINE_SMALL_PAGES"))
        return;
    const char* current = std::getenv("GLIBC_TUNABLES");
    const std::string tunables = current ? current : "";
    if (tunables.find("glibc.malloc.hugetlb") != std::string::npos || !kernelGivesHugePagesOnRequest())
        return;
    const std::string updated = tunables.empty() ? tunable : tunables + ":" + tunable;
    if (setenv("GLIBC_TUNABLES", updated.c_str(), 1) != 0)
        return;
    execv("/proc/self/exe", argv);
    // Not restarted: carry on as we are, without the tunable.
    if (current)
        setenv("GLIBC_TUNABLES", current, 1);
    else
        unsetenv("GLIBC_TUNABLES");
}

} // namespace plumbline
