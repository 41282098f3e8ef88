#!/usr/bin/python3
"""Reference bootstrap intervals for contrasta's bootstrap of a contrast of means.

Source of every interval: scipy.stats.bootstrap (independent resampling within each sample,
vectorized) with method="percentile" and method="BCa", confidence 0.95, on the contrast of the
sample means of the involved levels. The Monte Carlo error of scipy's interval ends is part of
the comparison: the fixture records scipy's n_resamples and bootstrap standard error so that the
C++ test can derive its tolerance. The BCa acceleration is recomputed here by brute force (every
leave-one-out jackknife estimate, Efron & Tibshirani 1993 eq. 14.15 in scipy's multi-sample
form) for an exact check of contrasta's closed form.

Default mode writes tests/data/bootstrap_fixtures.json; --live --out FILE writes fresh random
designs for the live differential test.
"""
import argparse
import json
import os
import sys
import time

import numpy as np
from scipy import stats

RESAMPLES = 100000


def contrast_statistic(coefficients):
    c = np.asarray(coefficients, dtype=float)

    def statistic(*samples, axis=-1):
        return sum(ci * np.mean(s, axis=axis) for ci, s in zip(c, samples))
    return statistic


def jackknife_acceleration(samples, coefficients):
    stat = contrast_statistic(coefficients)
    nums, dens = [], []
    for j, s in enumerate(samples):
        n = len(s)
        theta_i = []
        for i in range(n):
            reduced = list(samples)
            reduced[j] = np.delete(s, i)
            theta_i.append(stat(*reduced))
        theta_i = np.asarray(theta_i)
        u = (n - 1) * (theta_i.mean() - theta_i)
        nums.append((u ** 3).sum() / n ** 3)
        dens.append((u ** 2).sum() / n ** 2)
    return sum(nums) / (6 * sum(dens) ** 1.5)


def case(name, levels, groups, coefficients, seed, centre=0.0):
    involved = [i for i, c in enumerate(coefficients) if c != 0]
    samples = [np.asarray(groups[i], dtype=float) for i in involved]
    coef = [coefficients[i] for i in involved]
    stat = contrast_statistic(coef)
    out = {"name": name, "levels": levels, "groups": [list(map(float, g)) for g in groups],
           "coefficients": [float(c) for c in coefficients], "centre": centre,
           "estimate": float(stat(*samples)), "resamples": RESAMPLES,
           "acceleration": float(jackknife_acceleration(samples, coef))}
    for method in ["percentile", "BCa"]:
        res = stats.bootstrap(samples, stat, vectorized=True, n_resamples=RESAMPLES, batch=10000,
                              method=method, confidence_level=0.95,
                              random_state=np.random.default_rng(seed))
        out[method.lower()] = [float(res.confidence_interval.low), float(res.confidence_interval.high)]
        out["standard_error"] = float(res.standard_error)
    return out


def fixed_cases():
    rng = np.random.default_rng(1201)
    out = []
    a = np.round(rng.exponential(2.0, 14), 3)
    b = np.round(rng.exponential(3.5, 17) + 0.5, 3)
    out.append(case("two skewed groups 14 vs 17", ["a", "b"], [a, b], [1, -1], 1))
    g = [np.round(rng.lognormal(m, 0.6, n), 2) for m, n in [(1.0, 10), (1.3, 12), (1.1, 9)]]
    out.append(case("three groups (a + b)/2 - c", ["a", "b", "c"], g, [0.5, 0.5, -1], 2))
    f = [np.round(rng.normal(m, s, n), 1) for m, s, n in [(20, 2, 9), (23, 3, 16), (21, 1, 8), (25, 4, 11)]]
    out.append(case("b - d inside four groups", ["a", "b", "c", "d"], f, [0, 1, 0, -1], 3))
    # a general linear combination (coefficients summing to 1: the mean of level b) on data far
    # from zero: contrasta's centred values must add centre * sum(c) back
    big = [np.round(1e6 + rng.gamma(2.0, 1.5, n), 3) for n in (12, 15)]
    out.append(case("mean of b on data near 1e6", ["a", "b"], big, [0, 1], 4))
    # large normal samples: the bootstrap-t interval and test agree with Welch's t to O(1/n)
    # (Hall 1988, Ann. Stat. 16:927-953); reference: scipy.stats.ttest_ind(equal_var=False) and
    # the Welch interval with scipy.stats.t.ppf at the Welch-Satterthwaite df
    x = rng.normal(10, 1, 200)
    y = rng.normal(10.2, 2, 300)
    big_case = case("large normal pair", ["x", "y"], [x, y], [1, -1], 5)
    tt = stats.ttest_ind(x, y, equal_var=False)
    vx, vy = x.var(ddof=1) / 200, y.var(ddof=1) / 300
    df = (vx + vy) ** 2 / (vx ** 2 / 199 + vy ** 2 / 299)
    half = stats.t.ppf(0.975, df) * np.sqrt(vx + vy)
    d = x.mean() - y.mean()
    big_case["welch_p"] = float(tt.pvalue)
    big_case["welch_ci"] = [float(d - half), float(d + half)]
    out.append(big_case)
    return out


def live_cases(seed):
    rng = np.random.default_rng(seed)
    out = []
    for i in range(3):
        k = int(rng.integers(2, 4))
        groups = [np.round(rng.gamma(rng.uniform(1, 4), rng.uniform(0.5, 3), int(rng.integers(8, 30))), 3)
                  for _ in range(k)]
        coefficients = [1.0, -1.0] if k == 2 else [1.0, -0.5, -0.5]
        out.append(case(f"live {seed} #{i}", [f"g{j}" for j in range(k)], groups, coefficients, seed + i))
    return out


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("--live", action="store_true")
    ap.add_argument("--out")
    args = ap.parse_args()
    version = __import__("scipy").__version__
    if args.live:
        seed = int(time.time())
        doc = {"source": f"scipy {version} stats.bootstrap, live seed {seed}", "cases": live_cases(seed)}
    else:
        doc = {"source": f"scipy {version} stats.bootstrap (percentile, BCa)", "cases": fixed_cases()}
    out = args.out or os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", "data",
                                   "bootstrap_fixtures.json")
    with open(out, "w") as fh:
        json.dump(doc, fh, indent=1)
    return 0


if __name__ == "__main__":
    sys.exit(main())
