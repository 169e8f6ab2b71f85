#include "metrics/vector_expit.hpp"

#include <cstdint>
#include <cstring>

// The helpers below pass 256-bit vectors by value. They are always inlined into the two builds of
// vectorExpit, so no call ever uses the vector ABI the warning is about.
#pragma GCC diagnostic ignored "-Wpsabi"

namespace plumbline {

namespace {

using Lanes = double __attribute__((vector_size(4 * sizeof(double))));
using LaneBits = std::int64_t __attribute__((vector_size(4 * sizeof(double))));
constexpr std::size_t laneCount = 4;

// 2^51 + 2^52: added to a double of magnitude below 2^51, it leaves the nearest integer in the
// low bits of the sum (exact, and the same in every rounding of this program: round to nearest).
constexpr double roundingShift = 6755399441055744.0;

[[gnu::always_inline]] inline Lanes roundToInteger(Lanes v)
{
    return (v + roundingShift) - roundingShift;
}

// floor, exact for |v| < 2^51 (here |v| ≤ 1025): round to nearest, then step down where that
// went up. Eigen's baseline floor does the same; any exact floor gives the same double.
[[gnu::always_inline]] inline Lanes floorOf(Lanes v)
{
    const Lanes r = roundToInteger(v);
    const LaneBits above = r > v;
    return r - Lanes(above & LaneBits(Lanes{1.0, 1.0, 1.0, 1.0}));
}

// The integer value of an integer-valued double v (|v| < 2^51), as a 64-bit integer.
[[gnu::always_inline]] inline LaneBits integerOf(Lanes v)
{
    const Lanes shifted = v + roundingShift;
    LaneBits bits;
    std::memcpy(&bits, &shifted, sizeof bits);
    std::int64_t shiftBits;
    std::memcpy(&shiftBits, &roundingShift, sizeof shiftBits);
    return bits - shiftBits;
}

// 2^e for integer e in the normal range.
[[gnu::always_inline]] inline Lanes powerOfTwo(LaneBits e)
{
    const LaneBits bits = (e + 1023) << 52;
    Lanes out;
    std::memcpy(&out, &bits, sizeof out);
    return out;
}

[[gnu::always_inline]] inline Lanes lanesMin(Lanes a, Lanes b)
{
    return a < b ? a : b;
}
[[gnu::always_inline]] inline Lanes lanesMax(Lanes a, Lanes b)
{
    return a > b ? a : b;
}

// exp as Eigen's pexp_double: clamp, x = g + n·log 2 with n = floor(x·log2 e + ½), g by two
// subtractions (log 2 split in C1 + C2), exp(g) = 1 + 2·P(g²)g / (Q(g²) − P(g²)g), then
// times 2^n in four exact factors (Eigen's pldexp), which never overflows part-way.
[[gnu::always_inline]] inline Lanes expOf(Lanes x)
{
    x = lanesMax(lanesMin(x, Lanes{} + 709.784), Lanes{} - 709.784);
    Lanes fx = x * 1.4426950408889634073599 + 0.5;
    fx = floorOf(fx);
    x = x - fx * 0.693145751953125;
    x = x - fx * 1.42860682030941723212e-6;
    const Lanes x2 = x * x;
    Lanes px = Lanes{} + 1.26177193074810590878e-4;
    px = px * x2 + 3.02994407707441961300e-2;
    px = px * x2 + 9.99999999999999999910e-1;
    px = px * x;
    Lanes qx = Lanes{} + 3.00198505138664455042e-6;
    qx = qx * x2 + 2.52448340349684104192e-3;
    qx = qx * x2 + 2.27265548208155028766e-1;
    qx = qx * x2 + 2.00000000000000000009e0;
    x = px / (qx - px);
    x = 2.0 * x + 1.0;
    const LaneBits e = integerOf(lanesMax(lanesMin(fx, Lanes{} + 2099.0), Lanes{} - 2099.0));
    const LaneBits quarter = e >> 2;
    Lanes out = x * powerOfTwo(quarter) * powerOfTwo(quarter) * powerOfTwo(quarter);
    return out * powerOfTwo(e - quarter - quarter - quarter);
}

[[gnu::always_inline]] inline Lanes expitOf(Lanes lp, double a, double b)
{
    return 1.0 / (1.0 + expOf(-(a + b * lp)));
}

} // namespace

__attribute__((target_clones("avx2", "default")))
void vectorExpit(const double* lp, std::size_t n, double a, double b, double* out)
{
    std::size_t k = 0;
    for (; k + laneCount <= n; k += laneCount) {
        Lanes x;
        std::memcpy(&x, lp + k, sizeof x);
        const Lanes p = expitOf(x, a, b);
        std::memcpy(out + k, &p, sizeof p);
    }
    if (k < n) {
        Lanes x{};
        std::memcpy(&x, lp + k, (n - k) * sizeof(double));
        const Lanes p = expitOf(x, a, b);
        std::memcpy(out + k, &p, (n - k) * sizeof(double));
    }
}

} // namespace plumbline
