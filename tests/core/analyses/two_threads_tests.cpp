#include "analyses/two_threads.hpp"

#include <catch2/catch.hpp>

#include <atomic>
#include <stdexcept>
#include <vector>

using namespace plumbline;

TEST_CASE("Work shared between two threads visits every index once", "[threads]")
{
    for (const std::size_t count : {0u, 1u, 2u, 7u}) {
        std::vector<std::atomic<int>> visits(count);
        onTwoThreads(count, [&](std::size_t i) { ++visits[i]; });
        for (std::size_t i = 0; i < count; ++i)
            CHECK(visits[i] == 1);
    }
}

TEST_CASE("A failure in either thread reaches the caller after both have stopped", "[threads]")
{
    // Index 0 runs on the calling thread, index 1 on the other one.
    for (const std::size_t failing : {0u, 1u}) {
        std::atomic<int> finished = 0;
        CHECK_THROWS_WITH(onTwoThreads(6,
                                       [&](std::size_t i) {
                                           if (i == failing)
                                               throw std::runtime_error("index failed");
                                           ++finished;
                                       }),
                          "index failed");
        // The failing thread stops at its failure; the other one does all of its indices.
        CHECK(finished == 3);
    }
}
