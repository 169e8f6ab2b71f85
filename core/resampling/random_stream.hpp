#pragma once

#include <cstdint>

namespace plumbline {

// A reproducible random stream: xoshiro256** (Blackman & Vigna 2018) seeded by SplitMix64.
// Every mapping to bounded integers, uniforms and normals is our own, because the C++ standard
// fixes engines but not distributions: the same (seed, stream) gives the same numbers with any
// compiler, standard library or thread count.
class RandomStream {
public:
    RandomStream(std::uint64_t seed, std::uint64_t stream = 0);

    std::uint64_t nextU64();
    // Uniform integer in [0, bound), bound > 0, without modulo bias (Lemire 2019, multiply-shift
    // with rejection).
    std::uint64_t below(std::uint64_t bound);
    // Uniform double in [0, 1) with 53 random bits.
    double uniform();
    // Standard normal by the Box–Muller transform (one value per call; the pair's twin is kept).
    double normal();

private:
    std::uint64_t m_state[4];
    bool m_hasSpare = false;
    double m_spare = 0.0;
};

} // namespace plumbline
