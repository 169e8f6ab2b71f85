#pragma once

#include <algorithm>
#include <bit>
#include <cstddef>
#include <cstdint>
#include <span>
#include <utility>
#include <vector>

namespace plumbline {

// R's type-7 quantile (numpy's default) of a multiset given as values with counts, by weighted
// selection in expected linear time. Counts are whole numbers; values are reordered.
double weightedQuantileType7(std::vector<std::pair<double, double>>& valueCounts, double probability);

// Counts of values spread over ordered buckets: a value's bucket never decreases as the value
// grows, so the bucket holding a rank is found from the cumulative counts. Buckets follow the
// bits of a double (256 per power of two, from 2^-30 to 2^15; smaller and negative values share
// the first, larger ones the last), so no bound on the values is needed beforehand and the counts
// can be gathered while the values are being made (the loess fills them as it measures each
// point's distance from the curve).
class QuantileBuckets {
public:
    static constexpr int binadeBits = 8;
    static constexpr int lowestExponent = -30, highestExponent = 15;
    static constexpr std::size_t size = std::size_t(highestExponent - lowestExponent) << binadeBits;
    static std::size_t of(double value)
    {
        // For non-negative doubles the bit pattern, read as an integer, grows with the value.
        constexpr int shift = 52 - binadeBits;
        constexpr std::uint64_t first = std::bit_cast<std::uint64_t>(0x1p-30) >> shift;
        static_assert(lowestExponent == -30);
        if (!(value >= 0.0))
            return 0; // negative (NaN is not expected; it goes first rather than anywhere undefined)
        const std::uint64_t top = std::bit_cast<std::uint64_t>(value) >> shift;
        return top < first ? 0 : std::min<std::size_t>(size - 1, std::size_t(top - first));
    }

    void clear();
    // Adds counts run by run: neighbouring values usually share a bucket, so their counts are
    // summed in a register and stored once per run. A local object, so that the compiler keeps
    // the run in registers while the caller stores doubles elsewhere. Whole numbers: exact in any
    // order. finish() after the last value.
    class Filler {
    public:
        explicit Filler(QuantileBuckets& buckets) : m_weight(buckets.m_weight.data()) {}
        void add(double value, double count)
        {
            const std::size_t b = of(value);
            if (b != m_run) {
                m_weight[m_run] += m_inRun;
                m_run = b;
                m_inRun = 0.0;
            }
            m_inRun += count;
        }
        void finish()
        {
            m_weight[m_run] += m_inRun;
            m_inRun = 0.0;
        }

    private:
        double* m_weight;
        std::size_t m_run = 0;
        double m_inRun = 0.0;
    };
    double weight(std::size_t bucket) const { return m_weight[bucket]; }

private:
    std::vector<double> m_weight = std::vector<double>(size, 0.0);
};

// The same quantiles, several at once, of values with whole-number counts (entries with a zero
// count are not in the multiset), without moving the values: the counts are spread over the
// buckets above in one pass (or were gathered by the caller: `gathered`, over exactly these
// values and counts), and only the few buckets holding a wanted rank are then sorted. Each value
// at a rank is unique, so the result equals the selection above exactly. `total` is the sum of
// the counts; `out` gets one value per probability.
void weightedQuantilesType7(std::span<const double> values, std::span<const double> counts, double total,
                            std::span<const double> probabilities, std::span<double> out,
                            const QuantileBuckets* gathered = nullptr);

} // namespace plumbline
