#include "resampling/random_stream.hpp"

#include <cmath>
#include <numbers>

namespace plumbline {

namespace {

std::uint64_t splitMix64(std::uint64_t& x)
{
    std::uint64_t z = (x += 0x9E3779B97F4A7C15ULL);
    z = (z ^ (z >> 30)) * 0xBF58476D1CE4E5B9ULL;
    z = (z ^ (z >> 27)) * 0x94D049BB133111EBULL;
    return z ^ (z >> 31);
}

} // namespace

RandomStream::RandomStream(std::uint64_t seed, std::uint64_t stream)
{
    // Mix the stream number into the seed so streams (e.g. bootstrap replicates) are unrelated.
    std::uint64_t x = seed;
    std::uint64_t mixed = splitMix64(x) ^ (stream * 0xD1B54A32D192ED03ULL);
    for (auto& word : m_state)
        word = splitMix64(mixed);
}

double RandomStream::uniform()
{
    return static_cast<double>(nextU64() >> 11) * 0x1.0p-53;
}

double RandomStream::normal()
{
    if (m_hasSpare) {
        m_hasSpare = false;
        return m_spare;
    }
    double u1 = 0.0;
    do {
        u1 = uniform();
    } while (u1 <= 0.0);
    const double u2 = uniform();
    const double radius = std::sqrt(-2.0 * std::log(u1));
    const double angle = 2.0 * std::numbers::pi * u2;
    m_spare = radius * std::sin(angle);
    m_hasSpare = true;
    return radius * std::cos(angle);
}

} // namespace plumbline
