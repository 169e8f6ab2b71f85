#include "metrics/score_order.hpp"

#include <array>
#include <cstring>

namespace plumbline {

namespace {

// Maps a double to an unsigned key with the same order (IEEE 754: flip all bits of negatives,
// only the sign bit of positives). -0.0 and +0.0 get different keys, so they are normalised first.
std::uint64_t orderedKey(double value)
{
    if (value == 0.0)
        value = 0.0;
    std::uint64_t bits = 0;
    std::memcpy(&bits, &value, sizeof bits);
    return (bits & 0x8000000000000000ULL) ? ~bits : bits | 0x8000000000000000ULL;
}

} // namespace

ScoreOrder ascendingOrder(std::span<const double> score)
{
    // LSD radix sort, 16 bits a pass, on (key, row) pairs: stable, so equal scores stay in row
    // order, and linear in n — a comparison sort of a million rows cost several times more.
    // Passes whose digit is the same for every row (common: risks share their top bits) are skipped.
    const std::size_t n = score.size();
    std::vector<std::uint64_t> keys(n);
    ScoreOrder order(n);
    for (std::size_t i = 0; i < n; ++i) {
        keys[i] = orderedKey(score[i]);
        order[i] = static_cast<std::uint32_t>(i);
    }
    std::vector<std::uint64_t> keysOut(n);
    ScoreOrder orderOut(n);
    std::vector<std::size_t> counts(1 << 16);
    for (int shift = 0; shift < 64; shift += 16) {
        std::fill(counts.begin(), counts.end(), 0);
        for (std::uint64_t key : keys)
            ++counts[(key >> shift) & 0xFFFF];
        if (n == 0 || counts[(keys[0] >> shift) & 0xFFFF] == n)
            continue; // every row has this digit: the pass would not change the order
        std::size_t total = 0;
        for (auto& count : counts) {
            const std::size_t here = count;
            count = total;
            total += here;
        }
        for (std::size_t i = 0; i < n; ++i) {
            const std::size_t at = counts[(keys[i] >> shift) & 0xFFFF]++;
            keysOut[at] = keys[i];
            orderOut[at] = order[i];
        }
        keys.swap(keysOut);
        order.swap(orderOut);
    }
    return order;
}

} // namespace plumbline
