#pragma once

#include <optional>
#include <span>
#include <string_view>
#include <vector>

namespace plumbline {

enum class BootstrapCi { Percentile, Bca };
std::string_view bootstrapCiName(BootstrapCi method);

// R type-7 quantile (numpy's default linear interpolation) of values sorted ascending.
double sortedQuantile(std::span<const double> sorted, double probability);

// Percentile interval: the α/2 and 1−α/2 type-7 quantiles of the replicates (sorted ascending).
std::pair<double, double> percentileInterval(std::span<const double> sorted, double confidence);

// The standard deviation of the replicates (n − 1 divisor): the bootstrap standard error; 0 for
// fewer than two replicates.
double replicateStandardDeviation(std::span<const double> replicates);

// Efron's acceleration from jackknife-type values θ_(i) (Efron 1987, JASA 82:171):
// a = Σ(θ̄ − θ_(i))³ / (6 [Σ(θ̄ − θ_(i))²]^{3/2}); 0 when all values are equal. With `counts`,
// value i stands for counts[i] patients (grouped data).
double accelerationFromJackknife(std::span<const double> values, std::span<const double> counts = {});

// BCa (Efron 1987): z0 = Φ⁻¹((#{θ* < θ̂} + ½#{θ* = θ̂})/B) — the mid-tie version scipy 1.10
// implements — and the adjusted levels α1, α2 at which the replicates are read.
// nullopt when every replicate lies on one side of θ̂ (z0 infinite).
struct BcaLevels {
    double z0;
    double alpha1;
    double alpha2;
};
std::optional<BcaLevels> bcaLevels(std::span<const double> sorted, double estimate, double acceleration,
                                   double confidence);

} // namespace plumbline
