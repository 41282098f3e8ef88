#!/usr/bin/python3
"""How often the heavy-tail rule R3 of the recommendation (docs/diagnostics.md) fires on normal
data (a false alarm) and on heavy-tailed or skewed data (a hit), for a few designs.

R3 fires when (a) a level holds a value with modified z-score |0.6745 (y - median)/MAD| > 3.5 and
that level's bias-corrected excess kurtosis is >= 4, or (b) the pooled standardized residuals
(y - mean_i)/s_i have |G1| >= 1 or G2 >= 3. For comparison the plain modified z-score rule
(any |z| > 3.5) is shown too. Uses Debian's numpy/scipy; prints one line per design.
"""
import numpy as np
from scipy import stats

rng = np.random.default_rng(20261201)


def fires(groups):
    plain = confirmed = 0
    for g in groups:
        med = np.median(g)
        mad = np.median(np.abs(g - med))
        z = np.max(0.6745 * np.abs(g - med) / mad) if mad > 0 else 0
        plain |= z > 3.5
        confirmed |= z > 3.5 and len(g) >= 4 and stats.kurtosis(g, bias=False) >= 4
    r = np.concatenate([(g - g.mean()) / g.std(ddof=1) for g in groups])
    shape = abs(stats.skew(r, bias=False)) >= 1 or stats.kurtosis(r, bias=False) >= 3
    return plain, confirmed or shape


def rates(sizes, draw, reps=4000):
    plain = r3 = 0
    for _ in range(reps):
        a, b = fires([draw(n) for n in sizes])
        plain += a
        r3 += b
    return plain / reps, r3 / reps


designs = [(12, 8, 6, 10), (5, 5, 5), (6, 30, 30), (10, 10, 10, 10), (15, 15, 15), (50, 50)]
for name, draw in [("normal", lambda n: rng.normal(0, 1, n)), ("t(3)", lambda n: rng.standard_t(3, n)),
                   ("lognormal(0,1)", lambda n: rng.lognormal(0, 1, n))]:
    for sizes in designs:
        plain, r3 = rates(sizes, draw)
        print(f"{name:15s} n = {str(sizes):18s} any |z| > 3.5: {plain:6.3f}   R3 fires: {r3:6.3f}")
