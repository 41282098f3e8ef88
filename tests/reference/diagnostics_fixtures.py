#!/usr/bin/python3
"""Reference values for the diagnostics (tests/diagnostics_test.cpp).

Sources: scipy.stats.levene(center="mean"/"median"), scipy.stats.bartlett, scipy.stats.fligner,
scipy.stats.shapiro, scipy.stats.skew / scipy.stats.kurtosis (bias=False). The 10%-trimmed-mean
Levene test follows Brown & Forsythe 1974 (deviations of every observation from the trimmed
mean); scipy's levene(center="trimmed") instead drops the trimmed observations before taking
deviations, so its reference here is scipy.stats.f_oneway on |y - scipy.stats.trim_mean(y, 0.1)|
(Levene's statistic is by definition the one-way F of the absolute deviations).

Default mode writes tests/data/diagnostics_fixtures.json from a fixed seed;
`--live --out FILE` writes fresh random datasets to FILE.
"""
import argparse
import json
import os
import time

import numpy as np
from scipy import stats


def make_groups(rng, case):
    kind = case % 6
    k = int(rng.integers(2, 6))
    sizes = [int(rng.integers(3, 40)) for _ in range(k)]
    sds = [float(rng.uniform(0.3, 4.0)) for _ in range(k)]
    groups = []
    for n, sd in zip(sizes, sds):
        if kind == 0:
            g = rng.normal(10, sd, n)
        elif kind == 1:
            g = rng.lognormal(0, 0.8, n) * sd
        elif kind == 2:  # ties: a 0-10 scale
            g = np.clip(np.round(rng.normal(5, sd, n)), 0, 10)
        elif kind == 3:  # heavy tails
            g = rng.standard_t(2, n) * sd + 50
        elif kind == 4:  # values with few decimals
            g = np.round(rng.normal(100, sd, n), 1)
        else:
            g = rng.uniform(-sd, sd, n)
        if np.ptp(g) == 0:
            g[0] += 1
        groups.append([float(v) for v in g])
    return groups


def pair(result):
    return {"statistic": float(result[0]), "p_value": float(result[1])}


def levene_trimmed(groups, trim=0.1):
    deviations = [np.abs(np.asarray(g) - stats.trim_mean(g, trim)) for g in groups]
    return pair(stats.f_oneway(*deviations))


def variance_case(groups):
    arrays = [np.asarray(g) for g in groups]
    residuals = np.concatenate([a - a.mean() for a in arrays])
    out = {
        "groups": groups,
        "levene_mean": pair(stats.levene(*arrays, center="mean")),
        "levene_median": pair(stats.levene(*arrays, center="median")),
        "levene_trimmed": levene_trimmed(arrays),
        "bartlett": pair(stats.bartlett(*arrays)),
        "fligner": pair(stats.fligner(*arrays, center="median")),
        "skewness": [float(stats.skew(a, bias=False)) for a in arrays],
        "kurtosis": [float(stats.kurtosis(a, fisher=True, bias=False)) if len(a) >= 4 else None for a in arrays],
        "shapiro": [pair(stats.shapiro(a)) for a in arrays],
        "shapiro_residuals": pair(stats.shapiro(residuals)),
    }
    return out


def shapiro_cases(rng):
    cases = []
    sizes = [3, 4, 5, 6, 7, 11, 12, 13, 20, 35, 50, 100, 500, 5000]
    for n in sizes:
        for dist in ["normal", "exponential", "uniform"] if n <= 500 else ["normal", "exponential"]:
            if dist == "normal":
                x = rng.normal(0, 1, n)
            elif dist == "exponential":
                x = rng.exponential(1, n)
            else:
                x = rng.uniform(0, 1, n)
            w, p = stats.shapiro(x)
            cases.append({"x": [float(v) for v in x], "w": float(w), "p_value": float(p)})
    return cases


def main():
    parser = argparse.ArgumentParser()
    parser.add_argument("--live", action="store_true")
    parser.add_argument("--out")
    args = parser.parse_args()
    seed = int(time.time_ns() % (2**32)) if args.live else 20261201
    rng = np.random.default_rng(seed)
    fixture = {
        "source": "scipy " + __import__("scipy").__version__,
        "seed": seed,
        # The first case is fixed: a symmetric level whose skewness is exactly 0 in scipy (the C++
        # check then needs an absolute floor near zero).
        "variance": [variance_case([[5.0, 6.0, 7.0, 4.0, 5.0, 6.0, 6.0, 5.0], [1.5, 2.5, 2.0, 4.0, 3.5]])] +
                    [variance_case(make_groups(rng, c)) for c in range(30 if not args.live else 12)],
        "shapiro": shapiro_cases(rng),
    }
    out = args.out or os.path.join(os.path.dirname(__file__), "..", "data", "diagnostics_fixtures.json")
    with open(out, "w") as f:
        json.dump(fixture, f)


if __name__ == "__main__":
    main()
