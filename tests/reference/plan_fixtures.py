#!/usr/bin/python3
"""Reference values for planning (tests/plan_test.cpp).

- two-group power and continuous sample size: statsmodels.stats.power.TTestIndPower
  (statsmodels 0.13; its power is nct.sf(t.isf(alpha/2)) + nct.cdf(t.ppf(alpha/2)) with
  df = n1 + n2 - 2 and noncentrality d sqrt(n1 n2 / (n1 + n2))).
- general contrasts, pooled and Welch: computed here directly with scipy.stats.nct and
  scipy.stats.t, with the Satterthwaite df written out independently of the C++ code.
- detectable contrast: scipy.optimize.brentq on the same nct power.
- the noncentral t cdf itself by quadrature, independent of scipy.stats.nct (which in scipy 1.10
  wraps Boost.Math, the same code the C++ side uses).

Default mode writes tests/data/plan_fixtures.json from a fixed seed; --live --out FILE draws
fresh random cases (seeded from the clock) for the live differential run.
"""
import argparse
import json
import math
import os
import time

import numpy as np
from scipy import integrate, optimize, stats
from statsmodels.stats.power import TTestIndPower

ALTERNATIVES = {"two-sided": "two-sided", "greater": "larger", "less": "smaller"}


def t_critical(alpha, df, side):
    """Upper critical t, refined by Newton steps on t.sf (scipy's t.isf is good to ~5e-9 only)."""
    tail = alpha / 2 if side == "two-sided" else alpha
    q = stats.t.isf(tail, df)
    for _ in range(3):
        q += (stats.t.sf(q, df) - tail) / stats.t.pdf(q, df)
    return q


def nct_power(ncp, df, alpha, side):
    crit = t_critical(alpha, df, side)
    upper = stats.nct.sf(crit, df, ncp)
    lower = stats.nct.cdf(-crit, df, ncp)
    if side == "greater":
        return upper
    if side == "less":
        return lower
    return upper + lower


def design(c, means, sds, n, test):
    c, means, sds, n = map(np.asarray, (c, means, sds, n))
    psi = float(np.sum(c * means))
    if test == "pooled":
        df = float(np.sum(n) - len(n))
        sigma2 = float(np.sum((n - 1) * sds**2) / df)
        se = math.sqrt(sigma2 * np.sum(c**2 / n))
    else:
        v = c**2 * sds**2 / n
        keep = c != 0
        se = math.sqrt(float(np.sum(v)))
        # Satterthwaite 1946: (sum v_i)^2 / sum v_i^2 / (n_i - 1)
        df = float(np.sum(v[keep]) ** 2 / np.sum(v[keep] ** 2 / (n[keep] - 1)))
    return psi, se, df


def two_group_cases(rng, count):
    out = []
    power = TTestIndPower()
    for _ in range(count):
        d = float(rng.choice([0.2, 0.5, 0.8, 1.3]) * rng.uniform(0.7, 1.3))
        n1 = int(rng.integers(3, 60))
        ratio = int(rng.choice([1, 1, 2, 3]))
        alpha = float(rng.choice([0.01, 0.05, 0.1]))
        side = str(rng.choice(list(ALTERNATIVES)))
        sign = -1.0 if side == "less" else 1.0
        p = float(power.power(sign * d, n1, alpha, ratio=ratio, alternative=ALTERNATIVES[side]))
        out.append({"coefficients": [1.0, -1.0], "means": [sign * d, 0.0], "sds": [1.0, 1.0],
                    "n": [n1, n1 * ratio], "alpha": alpha, "alternative": side, "test": "pooled",
                    "power": p, "source": "statsmodels TTestIndPower.power"})
    return out


def two_group_sample_sizes(rng, count):
    """Continuous solution n1 of TTestIndPower.solve_power; the smallest integer n1 is its ceiling."""
    out = []
    power = TTestIndPower()
    while len(out) < count:
        d = float(rng.uniform(0.3, 1.5))
        target = float(rng.choice([0.8, 0.9, 0.95]))
        alpha = float(rng.choice([0.01, 0.05]))
        ratio = int(rng.choice([1, 2]))
        side = str(rng.choice(["two-sided", "greater"]))
        n1 = float(power.solve_power(effect_size=d, nobs1=None, alpha=alpha, power=target, ratio=ratio,
                                     alternative=ALTERNATIVES[side]))
        if abs(n1 - round(n1)) < 1e-4 or n1 < 2:
            continue  # too close to an integer to say which side the ceiling falls
        out.append({"coefficients": [1.0, -1.0], "means": [d, 0.0], "sds": [1.0, 1.0], "ratios": [1.0, float(ratio)],
                    "alpha": alpha, "alternative": side, "test": "pooled", "target": target, "continuous_n1": n1,
                    "smallest_n1": int(math.ceil(n1)), "source": "statsmodels TTestIndPower.solve_power"})
    return out


def contrast_cases(rng, count):
    out = []
    for i in range(count):
        k = int(rng.integers(3, 6))
        c = rng.normal(size=k)
        c -= c.mean()
        if i % 3 == 0:
            c[-1] = 0.0
            c[:-1] -= c[:-1].mean()
        means = rng.normal(10, 2, size=k)
        sds = rng.uniform(0.5, 3, size=k)
        n = rng.integers(3, 30, size=k)
        test = "pooled" if i % 2 == 0 else "welch"
        alpha = float(rng.choice([0.01, 0.05, 0.1]))
        side = str(rng.choice(list(ALTERNATIVES)))
        psi, se, df = design(c, means, sds, n, test)
        ncp = psi / se
        out.append({"coefficients": c.tolist(), "means": means.tolist(), "sds": sds.tolist(),
                    "n": [int(x) for x in n], "alpha": alpha, "alternative": side, "test": test,
                    "power": float(nct_power(ncp, df, alpha, side)), "df": df, "ncp": ncp, "se": se,
                    "source": "scipy.stats.nct with the formula written out here"})
    return out


def detectable_cases(rng, count):
    out = []
    for i in range(count):
        k = int(rng.integers(2, 5))
        c = rng.normal(size=k)
        c -= c.mean()
        sds = rng.uniform(0.5, 3, size=k)
        n = rng.integers(4, 25, size=k)
        test = "pooled" if i % 2 == 0 else "welch"
        alpha = 0.05
        side = str(rng.choice(list(ALTERNATIVES)))
        target = float(rng.choice([0.8, 0.9]))
        _, se, df = design(c, np.zeros(k), sds, n, test)
        sign = -1.0 if side == "less" else 1.0
        lam = optimize.brentq(lambda x: nct_power(sign * x, df, alpha, side) - target, 0, 50, xtol=1e-14, rtol=1e-14)
        out.append({"coefficients": c.tolist(), "sds": sds.tolist(), "n": [int(x) for x in n], "alpha": alpha,
                    "alternative": side, "test": test, "target": target, "detectable": sign * lam * se,
                    "source": "scipy.optimize.brentq on scipy.stats.nct power"})
    return out


def nct_cdf_quadrature(t, df, ncp):
    """The noncentral t cdf without scipy's nct (which wraps Boost, as the C++ code does):
    P((Z + ncp)/sqrt(X/df) <= t) = E[Phi(t sqrt(X/df) - ncp)], X ~ chi-square(df), by adaptive
    quadrature (scipy.integrate.quad) over the chi-square density."""
    f = lambda x: stats.norm.cdf(t * np.sqrt(x / df) - ncp) * stats.chi2.pdf(x, df)
    lo, hi = stats.chi2.ppf(1e-18, df), stats.chi2.isf(1e-18, df)
    value, _ = integrate.quad(f, lo, hi, epsabs=1e-16, epsrel=1e-13, limit=500, points=[df])
    return value


def quadrature_cases(rng, count):
    out = []
    for _ in range(count):
        df = float(rng.uniform(3, 60))
        ncp = float(rng.uniform(-4, 4))
        t = float(ncp + rng.uniform(-2.5, 2.5))
        out.append({"t": t, "df": df, "ncp": ncp, "cdf": nct_cdf_quadrature(t, df, ncp),
                    "source": "scipy.integrate.quad of E[Phi(t sqrt(X/df) - ncp)]"})
    return out


def main():
    parser = argparse.ArgumentParser()
    parser.add_argument("--live", action="store_true")
    parser.add_argument("--out")
    args = parser.parse_args()
    seed = int(time.time() * 1000) % (2**32) if args.live else 20261201
    rng = np.random.default_rng(seed)
    count = 12 if args.live else 30
    fixtures = {
        "seed": seed,
        "two_group_power": two_group_cases(rng, count),
        "two_group_sample_size": two_group_sample_sizes(rng, count // 2),
        "contrast_power": contrast_cases(rng, count),
        "detectable": detectable_cases(rng, count // 2),
        "nct_cdf_quadrature": quadrature_cases(rng, count // 2),
    }
    out = args.out or os.path.join(os.path.dirname(__file__), "..", "data", "plan_fixtures.json")
    with open(out, "w") as f:
        json.dump(fixtures, f, indent=1)


if __name__ == "__main__":
    main()
