#pragma once

#include <cstddef>

namespace plumbline {

// expit(a + b·lp[k]) into out[k] for k < n, in vector lanes, each lane computing exactly what
// Eigen 3.4's vectorised expression (1 + exp(−(a + b·lp)))⁻¹ computes for one element: the
// same Cephes rational approximation of exp with the same operations in the same order, and the
// same exact scaling by 2^n. So a risk is the same double whichever of the two computes it.
// For finite lp, a and b (the fits' logits are clamped, and their coefficients are checked).
// Built for AVX2 and for the baseline; both give the same bits (no fused multiply-add).
void vectorExpit(const double* lp, std::size_t n, double a, double b, double* out);

} // namespace plumbline
