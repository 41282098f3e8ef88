#!/usr/bin/python3
"""Reference values for the rank methods (tests/rank_test.cpp), from Debian's scipy.

Default: writes tests/data/rank_fixtures.json from fixed seeds.
--live --out FILE: fresh random datasets (the live differential test).

Sources: scipy.stats.mannwhitneyu (exact and asymptotic), scipy.stats.brunnermunzel (statistic
and df; p recomputed as 2*t.sf(|W|, df), see quality.md), scipy.stats.rankdata and
scipy.stats.norm (Dunn, formula check), a brute-force median of all pairwise differences
(Hodges-Lehmann) with the exact null distribution of U counted by the Mann-Whitney recursion
f(m, n, u) = f(m-1, n, u-n) + f(m, n-1, u) in Python integers (checked here against
scipy.stats.mannwhitneyu exact p-values), and scipy.stats.permutation_test over
scipy.stats.rankdata (rank contrasts).
"""
import argparse
import json
import math
import os
import sys
import warnings
from functools import lru_cache

import numpy as np
from scipy import stats


def refined_t_isf(tail, df):
    """t.isf refined by Newton steps on t.sf (scipy's isf is good to ~5e-9 only)."""
    q = stats.t.isf(tail, df)
    for _ in range(4):
        q = q + (stats.t.sf(q, df) - tail) / stats.t.pdf(q, df)
    return q


@lru_cache(maxsize=None)
def u_counts(m, n):
    """Counts of U = 0..mn over the C(m+n, m) arrangements (Mann & Whitney 1947 recursion)."""
    if m == 0 or n == 0:
        return (1,)
    a = u_counts(m - 1, n)   # largest observation in the first sample: U gains n
    b = u_counts(m, n - 1)   # largest in the second sample: U unchanged
    out = [0] * (m * n + 1)
    for u, c in enumerate(a):
        out[u + n] += c
    for u, c in enumerate(b):
        out[u] += c
    return tuple(out)


def u_cdf(m, n):
    counts = u_counts(m, n)
    total = sum(counts)
    run = 0
    out = []
    for c in counts:
        run += c
        out.append(run / total)
    return out


def alt_name(side):
    return {"two-sided": "two-sided", "greater": "greater", "less": "less"}[side]


def sample(rng, kind, n):
    if kind == "normal":
        return rng.normal(10, 2, n)
    if kind == "skewed":
        return rng.lognormal(0, 1, n)
    if kind == "scores":       # integer panel scores 0-10: many ties
        return rng.integers(0, 11, n).astype(float)
    if kind == "coarse":       # one decimal, a few ties
        return np.round(rng.normal(5, 1, n), 1)
    raise ValueError(kind)


def mann_whitney_cases(rng, live):
    cases = []
    shapes = [(5, 7), (8, 12), (3, 4), (12, 15), (30, 25), (6, 40), (1, 5), (9, 9)]
    for i, (m, n) in enumerate(shapes):
        for kind in ("normal", "scores", "coarse"):
            x = sample(rng, kind, m) + (0.5 if i % 2 else 0)
            y = sample(rng, kind, n)
            for side in ("two-sided", "greater", "less"):
                res = stats.mannwhitneyu(x, y, alternative=side, method="auto")
                xy = np.concatenate([x, y])
                ties = len(np.unique(xy)) != len(xy)
                exact = (not ties) and min(m, n) <= 8
                cases.append({"x": x.tolist(), "y": y.tolist(), "alternative": side,
                              "exact": exact, "u": float(res.statistic), "p": float(res.pvalue)})
                if exact:  # the independent recursion agrees with scipy's exact p
                    u1 = res.statistic
                    u_tail = {"greater": u1, "less": m * n - u1, "two-sided": max(u1, m * n - u1)}[side]
                    cdf = u_cdf(m, n)
                    want = min(1.0, (2 if side == "two-sided" else 1) * cdf[int(m * n - u_tail)])
                    assert abs(want - res.pvalue) <= 1e-12 * max(want, 1e-300), (want, res.pvalue)
    # scipy's exact method on request, also checked against the "always" mode
    for m, n in [(10, 12), (15, 9), (20, 20)]:
        x = sample(rng, "normal", m) + 0.8
        y = sample(rng, "normal", n)
        res = stats.mannwhitneyu(x, y, method="exact")
        cases.append({"x": x.tolist(), "y": y.tolist(), "alternative": "two-sided", "exact": True,
                      "mode": "always", "u": float(res.statistic), "p": float(res.pvalue)})
    return cases


def null_cdf_cases():
    out = []
    for m, n in [(1, 1), (2, 3), (4, 4), (5, 8), (8, 3), (7, 11), (12, 12), (3, 40)]:
        out.append({"m": m, "n": n, "cdf": u_cdf(m, n)})
    return out


def hodges_lehmann_cases(rng, live):
    out = []
    shapes = [(5, 6), (8, 8), (2, 2), (4, 3), (20, 17), (40, 33), (7, 60), (1, 9)]
    for m, n in shapes:
        for kind in ("normal", "scores", "skewed"):
            x = sample(rng, kind, m) + 0.7
            y = sample(rng, kind, n)
            d = np.sort(np.subtract.outer(x, y).ravel())   # brute force: all m n differences
            mn = m * n
            estimate = float(np.median(d))
            for side in ("two-sided", "greater", "less"):
                for conf in (0.95, 0.9):
                    tail = (1 - conf) / 2 if side == "two-sided" else 1 - conf
                    exact = min(m, n) <= 8 and kind != "scores"
                    if exact:
                        cdf = u_cdf(m, n)
                        k = sum(1 for c in cdf if c <= tail)   # largest k with P(U <= k-1) <= tail
                    else:
                        sigma = math.sqrt(mn * (m + n + 1) / 12)
                        k = max(0, math.floor(mn / 2 + 0.5 - stats.norm.isf(tail) * sigma))
                    low = float(d[k - 1]) if k > 0 else -math.inf
                    high = float(d[mn - k]) if k > 0 else math.inf
                    if side == "greater":
                        high = math.inf
                    if side == "less":
                        low = -math.inf
                    out.append({"x": x.tolist(), "y": y.tolist(), "alternative": side, "conf": conf,
                                "exact": exact, "estimate": estimate, "order": k,
                                "low": low, "high": high})
    return out


def brunner_munzel_cases(rng, live):
    out = []
    shapes = [(10, 12), (5, 7), (14, 11), (30, 20), (3, 3), (50, 8), (40, 35)]
    for m, n in shapes:
        for kind in ("normal", "scores", "skewed", "coarse", "far"):
            if kind == "far":   # strongly separated levels: p far below 1e-6, where scipy's own p loses digits
                x = rng.normal(0, 1, m)
                y = rng.normal(2.2, 1, n)
            else:
                x = sample(rng, kind, m)
                y = sample(rng, kind, n) * 1.5
            for side in ("two-sided", "greater", "less"):
                res = stats.brunnermunzel(x, y, alternative=side)
                w = float(res.statistic)
                # df from the same formula scipy uses (scipy does not return it)
                r = stats.rankdata(np.concatenate([x, y]))
                rx, ry = r[:m], r[m:]
                sx = np.sum((rx - stats.rankdata(x) - rx.mean() + (m + 1) / 2) ** 2) / (m - 1)
                sy = np.sum((ry - stats.rankdata(y) - ry.mean() + (n + 1) / 2) ** 2) / (n - 1)
                df = (m * sx + n * sy) ** 2 / ((m * sx) ** 2 / (m - 1) + (n * sy) ** 2 / (n - 1))
                # estimate by brute force over all pairs
                less = np.sum(np.less.outer(x, y))
                equal = np.sum(np.equal.outer(x, y))
                estimate = (less + 0.5 * equal) / (m * n)
                se = math.sqrt(sx / (m * n * n) + sy / (m * m * n))
                # quality.md: recompute p from scipy's W and df; check scipy's p where it is accurate
                if side == "two-sided":
                    p = 2 * stats.t.sf(abs(w), df)
                elif side == "greater":
                    p = stats.t.sf(-w, df)
                else:
                    p = stats.t.sf(w, df)
                if res.pvalue > 1e-6:
                    assert abs(p - res.pvalue) <= 1e-9 * res.pvalue, (p, res.pvalue)
                conf = 0.95
                tail = (1 - conf) / 2 if side == "two-sided" else 1 - conf
                q = refined_t_isf(tail, df)
                low = max(0.0, estimate - q * se) if side != "greater" else 0.0
                high = min(1.0, estimate + q * se) if side != "less" else 1.0
                out.append({"x": x.tolist(), "y": y.tolist(), "alternative": side, "conf": conf,
                            "statistic": w, "df": float(df), "p": float(p), "estimate": float(estimate),
                            "se": se, "low": low, "high": high})
    return out


def dunn_cases(rng, live):
    out = []
    for sizes, kind in [((6, 8, 7), "normal"), ((10, 10, 10, 10), "scores"), ((5, 12, 9), "coarse"),
                        ((20, 15, 25, 30), "skewed")]:
        groups = [sample(rng, kind, n) + 0.4 * i for i, n in enumerate(sizes)]
        k = len(groups)
        pooled = np.concatenate(groups)
        r = stats.rankdata(pooled)
        N = len(pooled)
        _, t = np.unique(pooled, return_counts=True)
        s2 = N * (N + 1) / 12 - np.sum(t ** 3 - t) / (12 * (N - 1))
        starts = np.cumsum([0] + list(sizes))
        means = [r[starts[i]:starts[i + 1]].mean() for i in range(k)]
        contrasts = []
        coefficient_sets = []
        for i in range(k):
            for j in range(i + 1, k):
                c = [0.0] * k
                c[i], c[j] = 1.0, -1.0
                coefficient_sets.append(c)
        coefficient_sets.append([1.0] + [-1.0 / (k - 1)] * (k - 1))
        for c in coefficient_sets:
            est = sum(ci * mi for ci, mi in zip(c, means))
            se = math.sqrt(s2 * sum(ci * ci / n for ci, n in zip(c, sizes)))
            z = est / se
            contrasts.append({"coefficients": c, "estimate": est, "se": se, "z": z,
                              "p": 2 * stats.norm.sf(abs(z)), "p_greater": stats.norm.sf(z),
                              "p_less": stats.norm.cdf(z)})
        out.append({"groups": [g.tolist() for g in groups], "contrasts": contrasts})
    return out


def welch_contrast_t(samples, coefficients, axis=-1):
    """Welch t of sum c_i mean_i (vectorized over leading axes), the studentized statistic."""
    est = 0
    var = 0
    for x, c in zip(samples, coefficients):
        est = est + c * np.mean(x, axis=axis)
        var = var + c * c * np.var(x, axis=axis, ddof=1) / x.shape[axis]
    with np.errstate(divide="ignore", invalid="ignore"):
        return est / np.sqrt(var)


def rank_contrast_cases(rng, live):
    """Exact permutation p of the studentized contrast of mid-ranks: scipy.stats.permutation_test
    (n_resamples=inf, permutation_type="independent") over scipy.stats.rankdata of the pooled
    involved levels. Two-sided p uses |T| with alternative="greater" (quality.md)."""
    out = []
    designs = [((5, 6), [1, -1], "scores"), ((6, 7), [1, -1], "normal"), ((4, 4, 5), [1, -0.5, -0.5], "scores"),
               ((4, 5, 4), [2, -1, -1], "coarse"), ((3, 3, 3, 3), [1, 1, -1, -1], "scores"),
               ((7, 5), [1, -1], "coarse")]
    for sizes, coefficients, kind in designs:
        groups = [sample(rng, kind, n) + (0.3 * i if kind != "scores" else 0) for i, n in enumerate(sizes)]
        pooled = np.concatenate(groups)
        ranks = stats.rankdata(pooled)
        starts = np.cumsum([0] + list(sizes))
        rank_groups = [ranks[starts[i]:starts[i + 1]] for i in range(len(sizes))]
        observed = float(welch_contrast_t(rank_groups, coefficients))
        estimate = float(sum(c * g.mean() for c, g in zip(coefficients, rank_groups)))

        def two_sided(*s, axis=-1):
            return np.abs(welch_contrast_t(s, coefficients, axis))

        def signed(*s, axis=-1):
            return welch_contrast_t(s, coefficients, axis)

        kw = dict(permutation_type="independent", n_resamples=np.inf, vectorized=True, axis=-1)
        p2 = stats.permutation_test(rank_groups, two_sided, alternative="greater", **kw)
        pg = stats.permutation_test(rank_groups, signed, alternative="greater", **kw)
        pl = stats.permutation_test(rank_groups, signed, alternative="less", **kw)
        out.append({"groups": [g.tolist() for g in groups], "coefficients": coefficients,
                    "statistic": observed, "estimate": estimate, "p": float(p2.pvalue),
                    "p_greater": float(pg.pvalue), "p_less": float(pl.pvalue),
                    "arrangements": int(len(p2.null_distribution))})
    return out


def main():
    # The no-overlap Brunner-Munzel case divides by zero on purpose (W = inf, df = nan).
    warnings.simplefilter("ignore", RuntimeWarning)
    np.seterr(all="ignore")
    ap = argparse.ArgumentParser()
    ap.add_argument("--live", action="store_true")
    ap.add_argument("--out")
    a = ap.parse_args()
    seed = int.from_bytes(os.urandom(4), "little") if a.live else 20261201
    rng = np.random.default_rng(seed)
    data = {"source": "scipy " + __import__("scipy").__version__, "seed": seed,
            "mann_whitney": mann_whitney_cases(rng, a.live),
            "null_cdf": null_cdf_cases(),
            "hodges_lehmann": hodges_lehmann_cases(rng, a.live),
            "brunner_munzel": brunner_munzel_cases(rng, a.live),
            "dunn": dunn_cases(rng, a.live),
            "rank_contrast": rank_contrast_cases(rng, a.live)}
    out = a.out or os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", "data", "rank_fixtures.json")
    with open(out, "w") as f:
        json.dump(data, f, indent=1)
    print("wrote", out, "seed", seed)


if __name__ == "__main__":
    main()
