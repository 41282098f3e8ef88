#!/usr/bin/python3
"""Reference values for standardized contrasts (tests/effect_size_test.cpp).

- standardized contrast d = psi' / sqrt(MSE) with coefficients scaled to sum |c| = 2, and its
  interval by inverting scipy.stats.nct in the noncentrality with scipy.optimize.brentq
  (Steiger & Fouladi 1997): cdf(t_obs; df, ncp_low) = (1 + conf)/2, cdf(t_obs; df, ncp_high) = (1 - conf)/2.
- Bonett 2008 (Psychol. Methods 13:99-109) unequal-variance standardized contrast, its formula
  written out here from the paper's between-subjects case: sigma*^2 = mean of the k variances,
  var = phi^2 sum(s^4/(n-1)) / (2 k^2 sigma*^4) + sum(c^2 s^2/(n-1)) / sigma*^2, phi +- z sqrt(var).

Default mode writes tests/data/effect_size_fixtures.json from a fixed seed; --live --out FILE
draws fresh cases.
"""
import argparse
import json
import math
import os
import time

import numpy as np
from scipy import optimize, stats


def ncp_at(t, df, prob):
    f = lambda ncp: stats.nct.cdf(t, df, ncp) - prob
    lo, hi = t - 10 - abs(t), t + 10 + abs(t)
    return optimize.brentq(f, lo, hi, xtol=1e-14, rtol=1e-15, maxiter=500)


def case(rng, i):
    k = int(rng.integers(2, 6))
    n = rng.integers(3, 25, size=k)
    means = rng.normal(20, 3, size=k)
    sds = rng.uniform(0.5, 4, size=k)
    groups = [np.round(rng.normal(m, s, size=int(m_n)), 3) for m, s, m_n in zip(means, sds, n)]
    c = rng.integers(-3, 4, size=k).astype(float)
    c -= c.mean()
    if not np.any(c):
        c[0], c[1] = 1.0, -1.0
    conf = float(rng.choice([0.9, 0.95, 0.99]))
    side = ["two-sided", "greater", "less"][i % 3]
    scaled = 2 * c / np.sum(np.abs(c))
    ybar = np.array([g.mean() for g in groups])
    var = np.array([g.var(ddof=1) for g in groups])
    nn = np.array([len(g) for g in groups], dtype=float)
    df = float(np.sum(nn) - k)
    mse = float(np.sum((nn - 1) * var) / df)
    psi = float(np.sum(scaled * ybar))
    d = psi / math.sqrt(mse)
    root = math.sqrt(float(np.sum(scaled**2 / nn)))
    t = d / root
    if side == "two-sided":
        low, high = ncp_at(t, df, (1 + conf) / 2) * root, ncp_at(t, df, (1 - conf) / 2) * root
    elif side == "greater":
        low, high = ncp_at(t, df, conf) * root, None
    else:
        low, high = None, ncp_at(t, df, 1 - conf) * root
    sigma2 = float(np.mean(var))
    phi = psi / math.sqrt(sigma2)
    se = math.sqrt(phi**2 * np.sum(var**2 / (nn - 1)) / (2 * k**2 * sigma2**2) + np.sum(scaled**2 * var / (nn - 1)) / sigma2)
    tail = (1 - conf) / 2 if side == "two-sided" else 1 - conf
    z = stats.norm.isf(tail)
    return {"groups": [g.tolist() for g in groups], "coefficients": c.tolist(), "conf": conf,
            "alternative": side, "scaled_contrast": psi, "standardized": d, "standardized_low": low,
            "standardized_high": high, "df": df, "bonett": phi, "bonett_se": se,
            "bonett_low": None if side == "less" else phi - z * se,
            "bonett_high": None if side == "greater" else phi + z * se}


def main():
    parser = argparse.ArgumentParser()
    parser.add_argument("--live", action="store_true")
    parser.add_argument("--out")
    args = parser.parse_args()
    seed = int(time.time() * 1000) % (2**32) if args.live else 20261202
    rng = np.random.default_rng(seed)
    cases = [case(rng, i) for i in range(12 if args.live else 30)]
    out = args.out or os.path.join(os.path.dirname(__file__), "..", "data", "effect_size_fixtures.json")
    with open(out, "w") as f:
        json.dump({"seed": seed, "cases": cases}, f, indent=1)


if __name__ == "__main__":
    main()
