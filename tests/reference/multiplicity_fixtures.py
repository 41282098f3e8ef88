#!/usr/bin/python3
"""Reference values for the multiplicity concept (studentized range, Dunnett, adjustments,
Tukey-Kramer, Games-Howell, trend contrasts), computed with Debian's scipy, statsmodels and numpy.

Default mode writes tests/data/multiplicity_fixtures.json (fixed seeds). `--live --out FILE`
writes fresh random cases to FILE for the live differential run of multiplicity_test.
`--mpmath` prints the high-precision upper-tail values of the studentized range that
studentized_range_test uses (slow: minutes).
"""
import argparse
import json
import math
import os
import sys

import numpy as np
from scipy import stats
from statsmodels.stats.multitest import multipletests

ADJUST = {"bonferroni": "bonferroni", "holm": "holm", "sidak": "sidak", "hochberg": "simes-hochberg",
          "bh": "fdr_bh", "by": "fdr_by"}


def num(x):
    return float(x)  # json writes infinity as Infinity, which tests/fixture.hpp reads


def studentized_range_grid(rng, live):
    # scipy.stats.studentized_range integrates with epsabs 1e-11: a reference to ~1e-10 absolute.
    out = []
    if live:
        cases = [(int(rng.integers(2, 12)), float(rng.choice([3, 7, 15, 40, 200, np.inf])), float(rng.uniform(0.5, 7)))
                 for _ in range(6)]
    else:
        cases = [(k, df, q) for k in (2, 3, 5, 10, 20) for df in (2, 5, 10, 30, 120, np.inf) for q in (1.0, 3.5, 6.0)]
    for k, df, q in cases:
        out.append({"k": k, "df": num(df), "q": q, "cdf": float(stats.studentized_range.cdf(q, k, df))})
    return out


def studentized_range_quantiles(rng, live):
    cases = [(3, 10, 0.95), (5, 20, 0.99), (10, 60, 0.95), (2, 5, 0.5), (4, np.inf, 0.95)]
    if live:
        cases = [(int(rng.integers(2, 8)), float(rng.choice([6, 25, 100])), 0.95)]
    return [{"k": k, "df": num(df), "p": p, "q": float(stats.studentized_range.ppf(p, k, df))} for k, df, p in cases]


def multiple_tests(rng, live):
    out = []
    for case in range(4 if live else 8):
        m = int(rng.integers(1, 25))
        p = rng.uniform(0, 1, m) ** rng.uniform(1, 6)
        if case % 3 == 0:
            p[: m // 2] = rng.uniform(0, 1e-6, m // 2)
        if case % 4 == 1 and m > 2:
            p[1] = p[0]  # ties
        entry = {"p": [float(x) for x in p], "adjusted": {}}
        for ours, theirs in ADJUST.items():
            entry["adjusted"][ours] = [float(x) for x in multipletests(p, method=theirs)[1]]
        out.append(entry)
    return out


def random_groups(rng, k, equal_var):
    groups = []
    for i in range(k):
        n = int(rng.integers(3, 15))
        sd = 1.0 if equal_var else float(rng.uniform(0.3, 4))
        groups.append([float(round(x, 3)) for x in rng.normal(10 + 0.5 * rng.normal(), sd, n)])
    return groups


def tukey_cases(rng, live):
    # scipy.stats.tukey_hsd: Tukey-Kramer p-values and 95% simultaneous intervals.
    out = []
    for _ in range(2 if live else 4):
        k = int(rng.integers(3, 7))
        groups = random_groups(rng, k, True)
        res = stats.tukey_hsd(*groups)
        ci = res.confidence_interval(0.95)
        # Scheffe (1953) for the contrast first - mean of the others, pooled: p = P(F > t^2/(k-1))
        # with scipy.stats.f, critical |t| = sqrt((k-1) F_{0.95; k-1, N-k}).
        n = np.array([len(g) for g in groups], float)
        means = np.array([np.mean(g) for g in groups])
        dfw = n.sum() - k
        mse = sum(((np.array(g) - np.mean(g)) ** 2).sum() for g in groups) / dfw
        c = np.full(k, -1.0 / (k - 1))
        c[0] = 1
        psi = float(c @ means)
        se = math.sqrt(mse * np.sum(c ** 2 / n))
        t = psi / se
        scheffe = {"coefficients": c.tolist(), "p": float(stats.f.sf(t * t / (k - 1), k - 1, dfw)),
                   "critical": math.sqrt((k - 1) * stats.f.isf(0.05, k - 1, dfw)), "estimate": psi, "se": se}
        out.append({"groups": groups, "pvalue": res.pvalue.tolist(), "low": ci.low.tolist(), "high": ci.high.tolist(),
                    "scheffe": scheffe})
    return out


def games_howell_cases(rng, live):
    # The Games-Howell formula (Games & Howell 1976) evaluated with scipy.stats.studentized_range.
    out = []
    for _ in range(2 if live else 3):
        k = int(rng.integers(3, 6))
        groups = random_groups(rng, k, False)
        rows = []
        for i in range(k):
            for j in range(i + 1, k):
                a, b = np.array(groups[i]), np.array(groups[j])
                vi, vj = a.var(ddof=1) / len(a), b.var(ddof=1) / len(b)
                df = (vi + vj) ** 2 / (vi ** 2 / (len(a) - 1) + vj ** 2 / (len(b) - 1))
                diff = a.mean() - b.mean()
                se = math.sqrt((vi + vj) / 2)
                q = abs(diff) / se
                p = float(stats.studentized_range.sf(q, k, df))
                crit = float(stats.studentized_range.ppf(0.95, k, df))
                rows.append({"i": i, "j": j, "df": float(df), "p": p, "low": diff - crit * se, "high": diff + crit * se})
        out.append({"groups": groups, "pairs": rows})
    return out


def dunnett_monte_carlo(rng, live):
    # Monte Carlo of the many-to-one multivariate t: Z_i = lambda_i X + sqrt(1 - lambda_i^2) Y_i,
    # T_i = Z_i / sqrt(chi2_df / df); fraction with max |T_i| > c (two-sided) and max T_i > c.
    configs = [([8, 8, 8], 8, 21.0, 2.5), ([5, 12, 20, 7], 10, 40.0, 2.3), ([30, 4], 3, 34.0, 2.1)]
    if live:
        configs = [([int(x) for x in rng.integers(3, 20, int(rng.integers(2, 5)))], int(rng.integers(3, 15)),
                    float(rng.integers(10, 60)), float(rng.uniform(1.8, 3)))]
    out = []
    draws = 1_000_000 if live else 4_000_000
    for treatment_n, control_n, df, c in configs:
        lam = np.sqrt(np.array(treatment_n, float) / (np.array(treatment_n, float) + control_n))
        tau = np.sqrt(1 - lam ** 2)
        hits2 = hits1 = 0
        done = 0
        while done < draws:
            b = min(500_000, draws - done)
            x = rng.standard_normal(b)
            y = rng.standard_normal((b, len(lam)))
            s = np.sqrt(rng.chisquare(df, b) / df)
            t = (lam[None, :] * x[:, None] + tau[None, :] * y) / s[:, None]
            hits2 += int(np.sum(np.max(np.abs(t), axis=1) > c))
            hits1 += int(np.sum(np.max(t, axis=1) > c))
            done += b
        out.append({"treatment_n": treatment_n, "control_n": control_n, "df": df, "c": c, "draws": draws,
                    "two_sided": hits2 / draws, "one_sided": hits1 / draws})
    return out


def dunnett_normal(rng, live):
    # Known variance: scipy.stats.multivariate_normal.cdf (Genz's method) over the box [-c, c]^m.
    configs = [([6, 9], 6, 2.2), ([4, 10, 16], 8, 2.4)]
    out = []
    for treatment_n, control_n, c in configs:
        lam = np.sqrt(np.array(treatment_n, float) / (np.array(treatment_n, float) + control_n))
        cov = np.outer(lam, lam)
        np.fill_diagonal(cov, 1)
        mvn = stats.multivariate_normal(mean=np.zeros(len(lam)), cov=cov, allow_singular=False)
        mvn.abseps = 1e-10
        p = float(mvn.cdf(np.full(len(lam), c), lower_limit=np.full(len(lam), -c)))
        out.append({"treatment_n": treatment_n, "control_n": control_n, "c": c, "two_sided_cdf": p})
    return out


def trend_cases(rng, live):
    # Orthogonal polynomial contrasts from numpy.linalg.qr of the (weighted) Vandermonde matrix:
    # columns of W^(1/2) V are orthonormalised; the polynomial values are W^(-1/2) Q. Unweighted:
    # W = I, coefficients c = p. n-weighted: W = diag(n), coefficients c_i = n_i p(x_i), which are
    # orthogonal in the design sense sum c_i d_i / n_i = 0. Each column is scaled to sum |c| = 2
    # with a positive last coefficient.
    cases = [([1, 2, 3, 4], [5, 5, 5, 5]), ([0, 1, 2, 4, 8], [3, 7, 4, 10, 6]), ([10, 20, 40], [4, 9, 6])]
    if live:
        k = int(rng.integers(3, 7))
        cases = [(sorted(rng.choice(50, k, replace=False).tolist()), rng.integers(2, 20, k).tolist())]
    out = []
    for x, n in cases:
        x = np.array(x, float)
        n = np.array(n, float)
        entry = {"x": x.tolist(), "n": n.tolist()}
        for name, w in (("unweighted", np.ones_like(n)), ("weighted", n)):
            v = np.vander(x, len(x), increasing=True)
            q, _ = np.linalg.qr(np.sqrt(w)[:, None] * v)
            p = q / np.sqrt(w)[:, None]
            coef = p * (w[:, None] if name == "weighted" else 1.0)
            rows = []
            for j in range(1, len(x)):
                c = coef[:, j]
                c = c / (np.sum(np.abs(c)) / 2)
                if c[-1] < 0:
                    c = -c
                rows.append(c.tolist())
            entry[name] = rows
        out.append(entry)
    return out


def welch_t(groups, c):
    psi = sum(ci * np.mean(g) for ci, g in zip(c, groups) if ci != 0)
    v = sum(ci * ci * np.var(g, ddof=1) / len(g) for ci, g in zip(c, groups) if ci != 0)
    return psi / math.sqrt(v) if v > 0 else (0.0 if psi == 0 else math.copysign(math.inf, psi))


def maxt_exact(rng, live):
    # Westfall & Young (1993) max-T over all pairs, two-sided, from every distinct reassignment
    # of the pooled observations to groups of the observed sizes (itertools enumeration), with
    # the Welch t of each pair; single-step and step-down adjusted p-values.
    import itertools
    sizes = [3, 3, 4] if not live else [3, 3, 3]
    groups = [[float(round(x, 2)) for x in rng.normal(0, 1 + i, n) + (0.8 if i == 2 else 0)] for i, n in enumerate(sizes)]
    k = len(groups)
    pairs = [(i, j) for i in range(k) for j in range(i + 1, k)]
    coefs = []
    for i, j in pairs:
        c = [0.0] * k
        c[i], c[j] = 1.0, -1.0
        coefs.append(c)
    pooled = np.concatenate([np.array(g) for g in groups])
    n_total = len(pooled)
    observed = np.array([abs(welch_t(groups, c)) for c in coefs])
    rows = []
    idx = set(range(n_total))
    for first in itertools.combinations(sorted(idx), sizes[0]):
        rest = sorted(idx - set(first))
        for second in itertools.combinations(rest, sizes[1]):
            third = sorted(set(rest) - set(second))
            g = [pooled[list(first)], pooled[list(second)], pooled[third]]
            rows.append([abs(welch_t(g, c)) for c in coefs])
    rows = np.array(rows)
    tol = lambda t: t - 1e-12 * abs(t)
    single = [float(np.mean(rows.max(axis=1) >= tol(t))) for t in observed]
    order = np.argsort(-observed, kind="stable")
    down = np.zeros(len(coefs))
    running = 0.0
    for pos, j in enumerate(order):
        m = rows[:, order[pos:]].max(axis=1)
        running = max(running, float(np.mean(m >= tol(observed[j]))))
        down[j] = running
    return {"groups": groups, "coefficients": coefs, "arrangements": len(rows), "single_step": single,
            "step_down": down.tolist()}


def mpmath_tail():
    import mpmath as mp
    mp.mp.dps = 30

    def sf_inf(q, k):
        f = lambda z: k * mp.npdf(z) * (mp.ncdf(z) ** (k - 1) - (mp.ncdf(z) - mp.ncdf(z - q)) ** (k - 1))
        pts = sorted(set([-12, -4, 0, q / 2 - 4, q / 2, q / 2 + 4, q + 4, max(12, q / 2 + 12)]))
        return mp.quad(f, pts)

    def sf(q, k, df):
        if df == mp.inf:
            return sf_inf(q, k)
        df = mp.mpf(df)
        logc = (df / 2) * mp.log(df / 2) - mp.loggamma(df / 2) + mp.log(2)
        dens = lambda s: mp.exp(logc + (df - 1) * mp.log(s) - df * s * s / 2)
        pts = sorted(set([0] + [t / q for t in (0.5, 1, 2, 4, 8, 16, 32)] + [0.5, 1, 2, 4, 8]))
        return mp.quad(lambda s: dens(s) * sf_inf(q * s, k), [p for p in pts if p <= 8])

    for q, k, df in [(9, 2, mp.inf), (6, 4, mp.inf), (10, 3, 10), (8, 5, 20), (15, 10, 5), (100, 4, 1), (6, 3, 30)]:
        print(q, k, df, mp.nstr(sf(mp.mpf(q), k, df), 20), flush=True)


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("--live", action="store_true")
    ap.add_argument("--out")
    ap.add_argument("--mpmath", action="store_true")
    args = ap.parse_args()
    if args.mpmath:
        mpmath_tail()
        return
    rng = np.random.default_rng(None if args.live else 20261201)
    fixture = {
        "source": "scipy %s, statsmodels multipletests, numpy %s" % (stats.__name__ and __import__("scipy").__version__, np.__version__),
        "studentized_range": studentized_range_grid(rng, args.live),
        "studentized_range_quantiles": studentized_range_quantiles(rng, args.live),
        "multipletests": multiple_tests(rng, args.live),
        "tukey_hsd": tukey_cases(rng, args.live),
        "games_howell": games_howell_cases(rng, args.live),
        "dunnett_monte_carlo": dunnett_monte_carlo(rng, args.live),
        "dunnett_normal": dunnett_normal(rng, args.live),
        "trends": trend_cases(rng, args.live),
        "maxt_exact": maxt_exact(rng, args.live),
    }
    out = args.out or os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", "data", "multiplicity_fixtures.json")
    with open(out, "w") as f:
        json.dump(fixture, f, indent=1)


if __name__ == "__main__":
    main()
