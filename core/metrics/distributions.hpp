#pragma once

namespace plumbline {

// Thin wrappers over Boost.Math (kept in one translation unit: its headers are slow to compile).
double normalQuantile(double p);
double normalCdf(double z);
double twoSidedNormalP(double z);               // 2(1 − Φ(|z|))
double chiSquaredUpperTail(double x, double df); // P(χ²_df > x)
double chiSquaredQuantile(double p, double df);
double betaQuantile(double a, double b, double p);
double studentTQuantile(double p, double df);    // Student t with df degrees of freedom

// z for a two-sided interval at the given confidence (0.95 → 1.959963984540054).
double zForConfidence(double confidence);

} // namespace plumbline
