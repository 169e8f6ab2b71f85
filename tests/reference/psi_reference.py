# The population stability index of tests/core/metrics/population_stability_tests.cpp computed
# with numpy (numpy.quantile, linear interpolation; numpy.searchsorted side='left'; shares floored
# at 0.0001). Run with /usr/bin/python3 (Debian 12: numpy 1.24).
import numpy as np

ref = [0.02, 0.05, 0.07, 0.08, 0.10, 0.11, 0.12, 0.12, 0.13, 0.15, 0.16, 0.18, 0.19, 0.21, 0.22,
       0.24, 0.25, 0.27, 0.30, 0.33, 0.35, 0.38, 0.41, 0.45, 0.50]
shifted = [0.04, 0.09, 0.12, 0.14, 0.17, 0.20, 0.23, 0.26, 0.29, 0.31, 0.34, 0.37, 0.40, 0.44,
           0.48, 0.52, 0.55, 0.60, 0.66, 0.72]
high = [0.55, 0.60, 0.70, 0.80]

edges = np.quantile(ref, np.arange(1, 10) / 10)


def shares(x):
    counts = np.bincount(np.searchsorted(edges, x, side='left'), minlength=10) / len(x)
    return np.maximum(counts, 1e-4)


def psi(x):
    a, e = shares(x), shares(ref)
    return float(np.sum((a - e) * np.log(a / e)))


print('edges', [round(float(v), 6) for v in edges])
print('psi shifted %.12f' % psi(shifted))
print('psi high %.12f' % psi(high))
print('psi self %.12f' % psi(ref))
