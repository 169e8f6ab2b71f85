#include "metrics/score_order.hpp"

#include <array>
#include <cstring>
#include <thread>

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
    return ascendingOrder(score, 1);
}

ScoreOrder ascendingOrder(std::span<const double> score, unsigned threads)
{
    // LSD radix sort, 16 bits a pass, on (key, row) pairs: stable, so equal scores stay in row
    // order, and linear in n — a comparison sort of a million rows cost several times more.
    // Passes whose digit is the same for every row (common: risks share their top bits) are skipped.
    // On two threads each pass counts and places the two halves of the rows at once: the first
    // half's rows of a digit go before the second half's, which is where one thread puts them.
    const std::size_t n = score.size();
    const std::size_t parts = threads >= 2 && n >= (std::size_t{1} << 16) ? 2 : 1;
    const std::size_t half = parts == 2 ? n / 2 : n;
    std::vector<std::uint64_t> keys(n);
    ScoreOrder order(n);
    std::vector<std::uint64_t> keysOut(n);
    ScoreOrder orderOut(n);
    std::array<std::vector<std::size_t>, 2> counts{std::vector<std::size_t>(1 << 16), std::vector<std::size_t>(parts == 2 ? 1 << 16 : 0)};
    auto inParts = [&](auto&& work) {
        if (parts == 1) {
            work(0, 0, n);
            return;
        }
        std::jthread second(work, 1, half, n);
        work(0, 0, half);
    };
    inParts([&](std::size_t, std::size_t from, std::size_t to) {
        for (std::size_t i = from; i < to; ++i) {
            keys[i] = orderedKey(score[i]);
            order[i] = static_cast<std::uint32_t>(i);
        }
    });
    for (int shift = 0; shift < 64; shift += 16) {
        inParts([&](std::size_t part, std::size_t from, std::size_t to) {
            std::vector<std::size_t>& mine = counts[part];
            std::fill(mine.begin(), mine.end(), 0);
            for (std::size_t i = from; i < to; ++i)
                ++mine[(keys[i] >> shift) & 0xFFFF];
        });
        const std::size_t firstDigit = n == 0 ? 0 : (keys[0] >> shift) & 0xFFFF;
        if (n == 0 || counts[0][firstDigit] + (parts == 2 ? counts[1][firstDigit] : 0) == n)
            continue; // every row has this digit: the pass would not change the order
        std::size_t total = 0;
        for (std::size_t digit = 0; digit < counts[0].size(); ++digit)
            for (std::size_t part = 0; part < parts; ++part) {
                const std::size_t here = counts[part][digit];
                counts[part][digit] = total;
                total += here;
            }
        inParts([&](std::size_t part, std::size_t from, std::size_t to) {
            std::vector<std::size_t>& next = counts[part];
            for (std::size_t i = from; i < to; ++i) {
                const std::size_t at = next[(keys[i] >> shift) & 0xFFFF]++;
                keysOut[at] = keys[i];
                orderOut[at] = order[i];
            }
        });
        keys.swap(keysOut);
        order.swap(orderOut);
    }
    return order;
}

} // namespace plumbline
