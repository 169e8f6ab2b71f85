#include "metrics/weighted_quantile.hpp"

#include <algorithm>
#include <bit>
#include <cstdint>
#include <cmath>

namespace plumbline {

double weightedQuantileType7(std::vector<std::pair<double, double>>& values, double probability)
{
    double total = 0.0;
    for (const auto& [value, count] : values)
        total += count;
    const double position = probability * (total - 1.0);
    const double below = std::floor(position);
    // Value at 0-based rank r of the expanded multiset, by three-way partitioning around a pivot.
    auto select = [&values](double rank) {
        auto lo = values.begin(), hi = values.end();
        for (;;) {
            const double pivot = (lo + (hi - lo) / 2)->first;
            auto lessEnd = std::partition(lo, hi, [pivot](const auto& v) { return v.first < pivot; });
            auto equalEnd = std::partition(lessEnd, hi, [pivot](const auto& v) { return v.first == pivot; });
            double less = 0.0, equal = 0.0;
            for (auto it = lo; it != lessEnd; ++it)
                less += it->second;
            for (auto it = lessEnd; it != equalEnd; ++it)
                equal += it->second;
            if (rank < less) {
                hi = lessEnd;
            } else if (rank < less + equal || equalEnd == hi) {
                return pivot;
            } else {
                rank -= less + equal;
                lo = equalEnd;
            }
        }
    };
    const double low = select(below);
    if (below + 1.0 > total - 1.0)
        return low;
    const double high = select(below + 1.0);
    return low + (position - below) * (high - low);
}

void QuantileBuckets::clear()
{
    std::fill(m_weight.begin(), m_weight.end(), 0.0);
}

void weightedQuantilesType7(std::span<const double> values, std::span<const double> counts, double total,
                            std::span<const double> probabilities, std::span<double> out,
                            const QuantileBuckets* gathered)
{
    constexpr std::size_t buckets = QuantileBuckets::size;
    auto bucketOf = [](double v) { return QuantileBuckets::of(v); };
    thread_local QuantileBuckets own;
    if (!gathered) {
        own.clear();
        QuantileBuckets::Filler filler(own);
        for (std::size_t k = 0; k < values.size(); ++k)
            filler.add(values[k], counts[k]);
        filler.finish();
        gathered = &own;
    }
    const QuantileBuckets& weight = *gathered;
    // The ranks wanted (0-based, in the expanded multiset): two per probability.
    std::vector<double> ranks;
    for (const double p : probabilities) {
        const double below = std::floor(p * (total - 1.0));
        ranks.push_back(below);
        ranks.push_back(std::min(below + 1.0, total - 1.0));
    }
    struct Wanted {
        std::size_t bucket;
        double before; // patients in lower buckets
    };
    std::vector<Wanted> wanted;
    for (const double rank : ranks) {
        double before = 0.0;
        std::size_t b = 0;
        while (b + 1 < buckets && before + weight.weight(b) <= rank)
            before += weight.weight(b++);
        wanted.push_back({b, before});
    }
    // The entries of the wanted buckets (at most two per probability), gathered in one pass and
    // sorted; then the value at each rank.
    thread_local std::vector<int> slotOf;
    slotOf.assign(buckets, -1);
    std::vector<std::vector<std::pair<double, double>>> held;
    for (const Wanted& w : wanted)
        if (slotOf[w.bucket] < 0) {
            slotOf[w.bucket] = int(held.size());
            held.emplace_back();
        }
    for (std::size_t k = 0; k < values.size(); ++k)
        if (const int slot = slotOf[bucketOf(values[k])]; slot >= 0 && counts[k] > 0.0)
            held[std::size_t(slot)].emplace_back(values[k], counts[k]);
    for (auto& entries : held)
        std::sort(entries.begin(), entries.end());
    std::vector<double> atRank(ranks.size(), 0.0);
    for (std::size_t r = 0; r < ranks.size(); ++r) {
        const auto& entries = held[std::size_t(slotOf[wanted[r].bucket])];
        double seen = wanted[r].before;
        for (const auto& [value, count] : entries) {
            atRank[r] = value;
            seen += count;
            if (ranks[r] < seen)
                break;
        }
    }
    for (std::size_t q = 0; q < probabilities.size(); ++q) {
        const double position = probabilities[q] * (total - 1.0);
        const double below = std::floor(position);
        const double low = atRank[2 * q], high = atRank[2 * q + 1];
        out[q] = below + 1.0 > total - 1.0 ? low : low + (position - below) * (high - low);
    }
}

} // namespace plumbline
