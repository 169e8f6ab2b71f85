#pragma once

#include <cstddef>
#include <exception>
#include <mutex>
#include <thread>

namespace plumbline {

// Calls work(i) for every i < count, the indices shared between the calling thread (0, 2, 4…)
// and one more (1, 3, 5…); a failure in either is rethrown here once both have stopped. Each
// call must write only its own slot, so the result does not depend on the threads.
template <typename Work>
void onTwoThreads(std::size_t count, Work&& work)
{
    std::exception_ptr failure;
    std::mutex failureMutex;
    auto share = [&](std::size_t first) {
        try {
            for (std::size_t i = first; i < count; i += 2)
                work(i);
        } catch (...) {
            const std::lock_guard lock(failureMutex);
            failure = std::current_exception();
        }
    };
    {
        std::jthread second(share, std::size_t{1});
        share(0);
    }
    if (failure)
        std::rethrow_exception(failure);
}

} // namespace plumbline
