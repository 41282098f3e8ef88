#!/usr/bin/python3
"""Reference values for the overall tests (tests/overall_test.cpp).

Sources: scipy.stats.f_oneway (classical F), statsmodels.stats.oneway.anova_oneway with
use_var="unequal" (Welch 1951) and use_var="bf" (Brown & Forsythe 1974 F*), scipy.stats
.alexandergovern, scipy.stats.kruskal (tie-corrected H).

statsmodels 0.13's headline Brown-Forsythe p-value uses Mehrotra's fractional df1; the published
F* refers to F(k-1, df2), which statsmodels reports as `pvalue2`/`df2`. This script checks that
statsmodels' Welch and F* statistics and df match the published formulas (written out below in
numpy) before it records them, so the fixture is the published variant.

Default mode writes tests/data/overall_fixtures.json from a fixed seed;
`--live --out FILE` writes fresh random datasets to FILE.
"""
import argparse
import json
import os
import time

import numpy as np
from scipy import stats
from statsmodels.stats.oneway import anova_oneway


def welch_published(groups):
    # Welch 1951, Biometrika 38:330-336.
    n = np.array([len(g) for g in groups], float)
    m = np.array([np.mean(g) for g in groups])
    v = np.array([np.var(g, ddof=1) for g in groups])
    k = len(groups)
    w = n / v
    mw = np.sum(w * m) / np.sum(w)
    lam = np.sum((1 - w / np.sum(w)) ** 2 / (n - 1))
    f = np.sum(w * (m - mw) ** 2) / (k - 1) / (1 + 2 * (k - 2) / (k * k - 1) * lam)
    return f, (k * k - 1) / (3 * lam)


def bf_published(groups):
    # Brown & Forsythe 1974, Technometrics 16:129-132.
    n = np.array([len(g) for g in groups], float)
    m = np.array([np.mean(g) for g in groups])
    v = np.array([np.var(g, ddof=1) for g in groups])
    N = n.sum()
    grand = np.sum(n * m) / N
    denom = np.sum((1 - n / N) * v)
    c = (1 - n / N) * v / denom
    return np.sum(n * (m - grand) ** 2) / denom, 1 / np.sum(c * c / (n - 1))


def close(a, b, tol=1e-9):
    assert abs(a - b) <= tol * max(abs(b), 1e-300), (a, b)


def make_groups(rng, case):
    kind = case % 4
    k = int(rng.integers(2, 7))
    groups = []
    for _ in range(k):
        n = int(rng.integers(2, 35))
        sd = float(rng.uniform(0.2, 5))
        shift = float(rng.normal(0, 1)) * (case % 3)
        if kind == 0:
            g = rng.normal(20 + shift, sd, n)
        elif kind == 1:
            g = np.round(rng.normal(5 + shift, sd, n))  # ties
        elif kind == 2:
            g = rng.exponential(sd, n) + shift
        else:
            g = np.round(rng.normal(1000 + shift, sd, n), 2)
        if np.ptp(g) == 0:
            g[0] += 1
        groups.append([float(x) for x in g])
    return groups


def case_of(groups):
    arrays = [np.asarray(g) for g in groups]
    k = len(arrays)
    f = stats.f_oneway(*arrays)
    welch = anova_oneway(arrays, use_var="unequal", welch_correction=True)
    bf = anova_oneway(arrays, use_var="bf")
    wf, wdf = welch_published(arrays)
    close(welch.statistic, wf)
    close(welch.df[1], wdf)
    bff, bfdf = bf_published(arrays)
    close(bf.statistic, bff)
    close(bf.df2[1], bfdf)
    assert bf.df2[0] == k - 1
    ag = stats.alexandergovern(*arrays)
    kw = stats.kruskal(*arrays)
    return {
        "groups": groups,
        "anova_f": {"statistic": float(f.statistic), "df1": k - 1, "df2": float(sum(map(len, arrays)) - k),
                    "p_value": float(f.pvalue)},
        "welch_f": {"statistic": float(welch.statistic), "df1": float(welch.df[0]), "df2": float(welch.df[1]),
                    "p_value": float(welch.pvalue)},
        "brown_forsythe_f": {"statistic": float(bf.statistic), "df1": float(bf.df2[0]), "df2": float(bf.df2[1]),
                             "p_value": float(bf.pvalue2)},
        "alexander_govern": {"statistic": float(ag.statistic), "df1": k - 1, "p_value": float(ag.pvalue)},
        "kruskal_wallis": {"statistic": float(kw.statistic), "df1": k - 1, "p_value": float(kw.pvalue)},
    }


def main():
    parser = argparse.ArgumentParser()
    parser.add_argument("--live", action="store_true")
    parser.add_argument("--out")
    args = parser.parse_args()
    seed = int(time.time_ns() % (2**32)) if args.live else 20261202
    rng = np.random.default_rng(seed)
    fixture = {
        "source": "scipy " + __import__("scipy").__version__ + ", statsmodels " + __import__("statsmodels").__version__,
        "seed": seed,
        "cases": [case_of(make_groups(rng, c)) for c in range(40 if not args.live else 15)],
    }
    out = args.out or os.path.join(os.path.dirname(__file__), "..", "data", "overall_fixtures.json")
    with open(out, "w") as f:
        json.dump(fixture, f)


if __name__ == "__main__":
    main()
