#pragma once

#include "metrics/estimate.hpp"

#include <cstddef>

namespace plumbline {

struct Interval {
    double lower;
    double upper;
};

// Wilson score interval for x/n (Wilson 1927, JASA 22:209); n > 0.
Interval wilsonInterval(std::size_t x, std::size_t n, double confidence);
// Clopper–Pearson exact interval from beta quantiles (Clopper & Pearson 1934, Biometrika 26:404).
Interval clopperPearsonInterval(std::size_t x, std::size_t n, double confidence);
// Either, by method (Wilson unless ClopperPearson is asked for).
Interval binomialInterval(std::size_t x, std::size_t n, double confidence, CiMethod method);

} // namespace plumbline
