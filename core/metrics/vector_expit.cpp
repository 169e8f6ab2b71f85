#include "metrics/vector_expit.hpp"

#include <cstdint>
#include <cstring>

namespace plumbline {

namespace {

using Lanes = double __attribute__((vector_size(4 * sizeof(double))));
using LaneBits = std::int64_t __attribute__((vector_size(4 * sizeof(double))));
constexpr std::size_t laneCount = 4;

// 2^51 + 2^52: added to a double of magnitude below 2^51, it leaves the nearest integer in the
// low bits of the sum (exact, and the same in every rounding of this program: round to nearest).
constexpr double roundingShift = 6755399441055744.0;

// Every helper takes and gives its vectors by reference and is always inlined into the two builds
// of vectorExpit: a 256-bit vector passed by value to a function built without AVX would change
// the calling convention (clang refuses it).

// floor, exact for |v| < 2^51 (here |v| ≤ 1025): round to nearest, then step down where that
// went up. Eigen's baseline floor does the same; any exact floor gives the same double.
[[gnu::always_inline]] inline void floorOf(const Lanes& v, Lanes& out)
{
    const Lanes rounded = (v + roundingShift) - roundingShift;
    const LaneBits above = rounded > v;
    out = rounded - Lanes(above & LaneBits(Lanes{1.0, 1.0, 1.0, 1.0}));
}

// The integer value of an integer-valued double v (|v| < 2^51), as a 64-bit integer.
[[gnu::always_inline]] inline void integerOf(const Lanes& v, LaneBits& out)
{
    const Lanes shifted = v + roundingShift;
    LaneBits bits;
    std::memcpy(&bits, &shifted, sizeof bits);
    std::int64_t shiftBits;
    std::memcpy(&shiftBits, &roundingShift, sizeof shiftBits);
    out = bits - shiftBits;
}

// x times 2^e for integer e in the normal range.
[[gnu::always_inline]] inline void timesPowerOfTwo(Lanes& x, const LaneBits& e)
{
    const LaneBits bits = (e + 1023) << 52;
    Lanes power;
    std::memcpy(&power, &bits, sizeof power);
    x = x * power;
}

[[gnu::always_inline]] inline void clamp(Lanes& x, double low, double high)
{
    x = x < high ? x : Lanes{} + high;
    x = x > low ? x : Lanes{} + low;
}

// exp as Eigen's pexp_double, in place: clamp, x = g + n·log 2 with n = floor(x·log2 e + ½), g by
// two subtractions (log 2 split in C1 + C2), exp(g) = 1 + 2·P(g²)g / (Q(g²) − P(g²)g), then
// times 2^n in four exact factors (Eigen's pldexp), which never overflows part-way.
[[gnu::always_inline]] inline void expInPlace(Lanes& x)
{
    clamp(x, -709.784, 709.784);
    Lanes fx;
    floorOf(x * 1.4426950408889634073599 + 0.5, fx);
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
    clamp(fx, -2099.0, 2099.0);
    LaneBits e;
    integerOf(fx, e);
    const LaneBits quarter = e >> 2;
    timesPowerOfTwo(x, quarter);
    timesPowerOfTwo(x, quarter);
    timesPowerOfTwo(x, quarter);
    timesPowerOfTwo(x, e - quarter - quarter - quarter);
}

// expit(a + b·lp), in place.
[[gnu::always_inline]] inline void expitInPlace(Lanes& x, double a, double b)
{
    x = -(a + b * x);
    expInPlace(x);
    x = 1.0 / (1.0 + x);
}

} // namespace

__attribute__((target_clones("avx2", "default")))
void vectorExpit(const double* lp, std::size_t n, double a, double b, double* out)
{
    std::size_t k = 0;
    for (; k + laneCount <= n; k += laneCount) {
        Lanes x;
        std::memcpy(&x, lp + k, sizeof x);
        expitInPlace(x, a, b);
        std::memcpy(out + k, &x, sizeof x);
    }
    if (k < n) {
        Lanes x{};
        std::memcpy(&x, lp + k, (n - k) * sizeof(double));
        expitInPlace(x, a, b);
        std::memcpy(out + k, &x, (n - k) * sizeof(double));
    }
}

} // namespace plumbline
