#!/usr/bin/python3
"""Reference fixtures for pooled and Welch contrasts and the one-way ANOVA.

References: scipy.stats.ttest_ind (equal_var True/False) for two-level contrasts,
statsmodels OLS t_test with the contrast row (cell-means model) for every contrast,
scipy.stats.f_oneway for the ANOVA F. Run with Debian's python3 (scipy 1.10, statsmodels 0.13).

Datasets are written as decimal strings; both sides centre them on the first value exactly
(Python's Decimal here, the C++ reader there), so both compute from identical doubles.

Usage: classical_fixtures.py            -> tests/data/classical_fixtures.json (committed)
       classical_fixtures.py --live --out FILE   fresh random datasets (live differential test)
"""
import argparse
import json
import os
from decimal import Decimal

import numpy as np
import scipy
import statsmodels.api as sm
from scipy import stats


def refined_t_quantile(prob, df):
    # scipy's t.ppf is accurate to ~5e-9 relative (quality.md); polish with Newton steps on t.cdf.
    q = stats.t.ppf(prob, df)
    for _ in range(4):
        if prob > 0.5:
            err = stats.t.sf(q, df) - (1 - prob)
            q += err / stats.t.pdf(q, df)
        else:
            err = stats.t.cdf(q, df) - prob
            q -= err / stats.t.pdf(q, df)
    return float(q)


def make_dataset(rng, index):
    k = int(rng.integers(2, 9))
    if index % 10 == 0:
        k = 2
    sizes = [int(rng.choice([2, 3, 4, 5, 7, 10, 15, 30, 60, 200])) for _ in range(k)]
    sds = [float(10 ** rng.uniform(-1, 1)) for _ in range(k)]  # variance ratios up to 100^2... capped below
    ratio = max(sds) / min(sds)
    if ratio > 10:  # keep the largest/smallest variance ratio within 100
        sds = [min(s, min(sds) * 10) for s in sds]
    offset = float(rng.choice([0, 0, 5, 100, 1e4, 1e6, 1e9]))
    decimals = int(rng.choice([1, 2, 3, 4]))
    ties = index % 7 == 3
    groups = []
    for i in range(k):
        x = rng.normal(offset + rng.normal(0, 2), sds[i], sizes[i])
        if ties:
            x = np.round(x)  # integer scores with many ties
            decimals_i = 0
        else:
            decimals_i = decimals
        groups.append([f"{v:.{decimals_i}f}" for v in x])
    # A constant level has no variance and no Welch or pooled test (the engine refuses it with
    # an error, tested in the CLI corpus); draw again rather than write an undefined reference.
    if any(len(set(g)) < 2 for g in groups):
        return make_dataset(rng, index)
    levels = [f"L{i}" for i in range(k)]
    if index % 9 == 4:
        levels[0] = "high dose"
    return levels, groups


def contrasts_for(rng, k):
    out = [[1.0, -1.0] + [0.0] * (k - 2)]
    if k > 2:
        c = rng.normal(0, 1, k)
        c -= c.mean()
        out.append([float(v) for v in c])
        helm = [1.0] + [-1.0 / (k - 1)] * (k - 1)
        out.append(helm)
        zero_in_middle = [0.0] * k
        zero_in_middle[0], zero_in_middle[-1] = 0.5, -0.5
        out.append(zero_in_middle)
    return out


def references(levels, groups, contrasts, conf):
    ref = Decimal(groups[0][0]) if groups[0] else Decimal(0)
    centred = [np.array([float(Decimal(v) - ref) for v in g]) for g in groups]
    k = len(groups)
    y = np.concatenate(centred)
    labels = np.concatenate([[i] * len(g) for i, g in enumerate(centred)])
    design = np.zeros((len(y), k))
    design[np.arange(len(y)), labels] = 1.0
    fit = sm.OLS(y, design).fit()
    n = np.array([len(g) for g in centred])
    means = np.array([g.mean() for g in centred])
    var = np.array([g.var(ddof=1) for g in centred])
    f = stats.f_oneway(*centred)
    out = {"anova_f": float(f.statistic), "anova_p": float(f.pvalue), "contrasts": []}
    for c in contrasts:
        c = np.array(c)
        tt = fit.t_test(c.reshape(1, -1))
        df_pooled = float(fit.df_resid)
        est = float(np.squeeze(tt.effect))
        se = float(np.squeeze(tt.sd))
        q = refined_t_quantile(1 - (1 - conf) / 2, df_pooled)
        row = {"coefficients": [float(v) for v in c],
               "pooled": {"estimate": est, "se": se, "t": float(np.squeeze(tt.tvalue)),
                          "p": float(np.squeeze(tt.pvalue)), "df": df_pooled,
                          "ci_low": est - q * se, "ci_high": est + q * se}}
        use = c != 0
        if np.all(n[use] >= 2):
            v = c[use] ** 2 * var[use] / n[use]
            se_w = float(np.sqrt(v.sum()))
            df_w = float(v.sum() ** 2 / np.sum(v ** 2 / (n[use] - 1)))  # Satterthwaite 1946
            t_w = est / se_w
            p_w = float(2 * stats.t.sf(abs(t_w), df_w))
            if use.sum() == 2 and sorted(c[use]) == [-1.0, 1.0]:
                a, b = np.where(c == 1.0)[0][0], np.where(c == -1.0)[0][0]
                r = stats.ttest_ind(centred[a], centred[b], equal_var=False)
                t_w, p_w = float(r.statistic), float(r.pvalue)
                rp = stats.ttest_ind(centred[a], centred[b], equal_var=True)
                row["pooled_scipy_k2"] = {"t": float(rp.statistic), "p": float(rp.pvalue)} if k == 2 else None
            qw = refined_t_quantile(1 - (1 - conf) / 2, df_w)
            row["welch"] = {"estimate": est, "se": se_w, "t": t_w, "p": p_w, "df": df_w,
                            "ci_low": est - qw * se_w, "ci_high": est + qw * se_w}
        out["contrasts"].append(row)
    return out


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("--live", action="store_true")
    ap.add_argument("--out")
    ap.add_argument("--count", type=int, default=60)
    args = ap.parse_args()
    seed = int.from_bytes(os.urandom(4), "little") if args.live else 424242
    rng = np.random.default_rng(seed)
    cases = []
    for i in range(args.count):
        levels, groups = make_dataset(rng, i)
        conf = float(rng.choice([0.9, 0.95, 0.99]))
        contrasts = contrasts_for(rng, len(levels))
        cases.append({"levels": levels, "groups": groups, "conf": conf,
                      "reference": references(levels, groups, contrasts, conf)})
    doc = {"source": f"scipy {scipy.__version__}, statsmodels {sm.__version__ if hasattr(sm, '__version__') else ''}",
           "seed": seed, "cases": cases}
    out = args.out or os.path.join(os.path.dirname(__file__), "..", "data", "classical_fixtures.json")
    with open(out, "w") as fh:
        json.dump(doc, fh)


if __name__ == "__main__":
    main()
