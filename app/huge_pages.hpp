#pragma once

namespace plumbline {

// Large cohorts hold columns of tens of megabytes, and the analysis allocates and fills arrays of
// that size many times. Faulted in 4 KiB pages, that costs a third of a ten-million-row run on a
// virtual machine; in 2 MiB pages it costs little. glibc's allocator asks the kernel for such
// (transparent huge) pages only when its `glibc.malloc.hugetlb` tunable is set, and tunables are
// read when a process starts. So each entry point, first thing, re-runs itself once with the
// tunable added to GLIBC_TUNABLES — only where the kernel gives huge pages on request
// ("madvise" mode), never twice, and not at all when PLUMBLINE_SMALL_PAGES is set. If the
// re-run cannot start, the program simply continues with small pages.
void restartWithHugePages(char** argv);

} // namespace plumbline
