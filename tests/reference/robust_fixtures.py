#!/usr/bin/python3
"""Reference values for Yuen's trimmed-mean contrasts (tests/robust_test.cpp), from Debian's scipy.

Default: writes tests/data/robust_fixtures.json from a fixed seed.
--live --out FILE: fresh random datasets (the live differential test).

Sources: scipy.stats.trim_mean; scipy.stats.mstats.winsorize then numpy var(ddof=1) for the
winsorized variance (both cut int(gamma n) per side, which is checked here to equal the exact
decimal floor(gamma n) for every case written); scipy.stats.ttest_ind(trim=gamma,
equal_var=False) for pairs; for general contrasts the Yuen-Welch formula of Yuen (1974) written
out below over those scipy pieces, with t quantiles refined by Newton steps on scipy.stats.t.sf
(quality.md: t.isf is good to ~5e-9 only).
"""
import argparse
import json
import math
import os
import warnings
from fractions import Fraction

import numpy as np
from scipy import stats
from scipy.stats import mstats


def refined_t_isf(tail, df):
    q = stats.t.isf(tail, df)
    for _ in range(4):
        q = q + (stats.t.sf(q, df) - tail) / stats.t.pdf(q, df)
    return q


def pieces(x, trim):
    n = len(x)
    g = int(trim * n)
    assert g == math.floor(Fraction(str(trim)) * n), (trim, n)   # scipy's int() is the decimal floor here
    tm = float(stats.trim_mean(x, trim))
    w = np.asarray(mstats.winsorize(np.asarray(x), limits=(trim, trim)))
    wv = float(np.var(w, ddof=1))
    return n, g, tm, wv


def sample(rng, kind, n):
    if kind == "normal":
        return rng.normal(50, 5, n)
    if kind == "heavy":        # t with 2 df: outliers
        return 50 + 5 * rng.standard_t(2, n)
    if kind == "skewed":
        return rng.lognormal(1, 0.8, n)
    if kind == "scores":
        return rng.integers(0, 11, n).astype(float)
    raise ValueError(kind)


def side_p(t, df, side):
    if side == "two-sided":
        return 2 * stats.t.sf(abs(t), df)
    if side == "greater":
        return stats.t.sf(t, df)
    return stats.t.cdf(t, df)


def interval(est, se, df, side, conf):
    tail = (1 - conf) / 2 if side == "two-sided" else 1 - conf
    q = refined_t_isf(tail, df)
    low = est - q * se if side != "less" else -math.inf
    high = est + q * se if side != "greater" else math.inf
    return low, high


def yuen(groups, coefficients, trim, side, conf):
    est = var = den = 0.0
    for x, c in zip(groups, coefficients):
        if c == 0:
            continue
        n, g, tm, wv = pieces(x, trim)
        h = n - 2 * g
        d = (n - 1) * wv / (h * (h - 1))     # Yuen 1974
        est += c * tm
        var += c * c * d
        den += (c * c * d) ** 2 / (h - 1)
    se = math.sqrt(var)
    df = var * var / den
    t = est / se
    low, high = interval(est, se, df, side, conf)
    return {"estimate": est, "se": se, "statistic": t, "df": df, "p": side_p(t, df, side),
            "low": low, "high": high}


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("--live", action="store_true")
    ap.add_argument("--out")
    a = ap.parse_args()
    warnings.simplefilter("ignore", RuntimeWarning)
    seed = int.from_bytes(os.urandom(4), "little") if a.live else 20261201
    rng = np.random.default_rng(seed)

    samples = []
    for n in (1, 2, 5, 7, 10, 13, 20, 33, 64):
        for trim in (0.0, 0.1, 0.2, 0.25, 0.3, 0.45):
            for kind in ("normal", "heavy", "scores"):
                x = sample(rng, kind, n)
                n_, g, tm, wv = pieces(x, trim)
                samples.append({"x": x.tolist(), "trim": trim, "trimmed_per_side": g,
                                "trimmed_mean": tm, "winsorized_variance": wv if n > 1 else None})

    pairs = []
    for m, n in ((10, 12), (8, 20), (25, 15), (6, 6), (40, 9)):
        for trim in (0.1, 0.2, 0.25):
            for kind in ("normal", "heavy", "skewed", "scores"):
                x = sample(rng, kind, m) + 2
                y = sample(rng, kind, n) * 1.3
                for side in (("two-sided", "greater", "less") if kind == "normal" else ("two-sided",)):
                    res = stats.ttest_ind(x, y, equal_var=False, trim=trim, alternative=side)
                    mine = yuen([x, y], [1, -1], trim, side, 0.95)
                    # the written-out formula reproduces scipy's Yuen test
                    assert abs(mine["statistic"] - res.statistic) <= 1e-12 * abs(res.statistic)
                    mine.update({"x": x.tolist(), "y": y.tolist(), "trim": trim, "alternative": side,
                                 "conf": 0.95, "statistic": float(res.statistic), "p": float(res.pvalue)})
                    pairs.append(mine)

    contrasts = []
    designs = [((10, 12, 9), [1, -0.5, -0.5]), ((15, 15, 15, 15), [3, -1, -1, -1]),
               ((8, 20, 11, 30), [1, -1, 1, -1]), ((12, 7, 16), [0, 1, -1]), ((20, 20, 20), [-1, 0, 1])]
    for sizes, coefficients in designs:
        for trim in (0.0, 0.2, 0.3):
            for kind in ("normal", "heavy", "skewed"):
                groups = [sample(rng, kind, n) + i for i, n in enumerate(sizes)]
                for side, conf in ((("two-sided", 0.95), ("greater", 0.9), ("less", 0.99)) if kind == "heavy"
                                   else (("two-sided", 0.95),)):
                    r = yuen(groups, coefficients, trim, side, conf)
                    r.update({"groups": [g.tolist() for g in groups], "coefficients": coefficients,
                              "trim": trim, "alternative": side, "conf": conf})
                    contrasts.append(r)
    # trim = 0 is Welch: cross-check the formula with scipy's Welch test on a pair
    x, y = sample(rng, "normal", 9), sample(rng, "normal", 14)
    welch = stats.ttest_ind(x, y, equal_var=False)
    assert abs(yuen([x, y], [1, -1], 0.0, "two-sided", 0.95)["statistic"] - welch.statistic) <= 1e-12 * abs(welch.statistic)

    data = {"source": "scipy " + __import__("scipy").__version__, "seed": seed,
            "samples": samples, "pairs": pairs, "contrasts": contrasts}
    out = a.out or os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", "data", "robust_fixtures.json")
    with open(out, "w") as f:
        json.dump(data, f, indent=1)
    print("wrote", out, "seed", seed)


if __name__ == "__main__":
    main()
