#!/usr/bin/python3
"""Reference exact permutation p-values for contrasta's permutation tests.

Source of every value: scipy.stats.permutation_test(permutation_type="independent",
n_resamples=np.inf), i.e. complete enumeration of the reassignments of the observations of the
involved groups, on the same statistic as contrasta (the Welch t of the contrast, or the raw
contrast). scipy's "two-sided" is twice the smaller one-sided p, not the abs(T*) >= abs(T)
definition contrasta uses (quality.md, known limits), so two-sided cases pass abs(T) with
alternative="greater".

Default mode writes tests/data/permutation_fixtures.json (fixed designs); --live --out FILE
writes fresh random designs for the live differential test.
"""
import argparse
import json
import os
import sys
import time

import numpy as np
from scipy import stats


def welch_t(coefficients):
    c = np.asarray(coefficients, dtype=float)

    def statistic(*samples, axis=-1):
        means = [np.mean(s, axis=axis) for s in samples]
        vars_ = [np.var(s, axis=axis, ddof=1) / s.shape[axis] for s in samples]
        d = sum(ci * m for ci, m in zip(c, means))
        v = sum(ci * ci * w for ci, w in zip(c, vars_))
        return d / np.sqrt(v)
    return statistic


def raw_contrast(coefficients):
    c = np.asarray(coefficients, dtype=float)

    def statistic(*samples, axis=-1):
        return sum(ci * np.mean(s, axis=axis) for ci, s in zip(c, samples))
    return statistic


def case(name, levels, groups, coefficients, statistic="studentized", alternative="two-sided"):
    involved = [i for i, c in enumerate(coefficients) if c != 0]
    samples = [np.asarray(groups[i], dtype=float) for i in involved]
    coef = [coefficients[i] for i in involved]
    base = welch_t(coef) if statistic == "studentized" else raw_contrast(coef)
    if alternative == "two-sided":
        def stat(*s, axis=-1):
            return np.abs(base(*s, axis=axis))
        alt = "greater"
    else:
        stat, alt = base, alternative
    res = stats.permutation_test(samples, stat, permutation_type="independent", vectorized=True,
                                 n_resamples=np.inf, alternative=alt, batch=20000)
    sizes = [len(s) for s in samples]
    arrangements = 1
    total = 0
    from math import comb
    for n in sizes:
        total += n
        arrangements *= comb(total, n)
    return {"name": name, "levels": levels, "groups": [list(map(float, g)) for g in groups],
            "coefficients": [float(c) for c in coefficients], "statistic": statistic,
            "alternative": alternative, "observed": float(base(*samples)),
            "p_exact": float(res.pvalue), "arrangements": arrangements}


def fixed_cases():
    rng = np.random.default_rng(20261201)
    out = []
    a = np.round(rng.normal(10, 1, 6), 3)
    b = np.round(rng.normal(11.2, 2.5, 7), 3)
    out.append(case("two groups 6 vs 7", ["a", "b"], [a, b], [1, -1]))
    out.append(case("two groups 6 vs 7 greater", ["a", "b"], [a, b], [-1, 1], alternative="greater"))
    out.append(case("two groups 6 vs 7 less, raw", ["a", "b"], [a, b], [1, -1], "raw", "less"))
    # equal sizes: contrasta walks half of the reassignments (mirror symmetry), scipy all
    e1 = np.round(rng.normal(3, 1, 7), 2)
    e2 = np.round(rng.normal(3.8, 2, 7), 2)
    out.append(case("equal sizes 7 vs 7", ["e", "f"], [e1, e2], [1, -1]))
    out.append(case("equal sizes 7 vs 7, raw", ["e", "f"], [e1, e2], [-1, 1], "raw"))
    # panel scores on a 0-10 scale: many ties
    s1 = rng.integers(3, 9, 7)
    s2 = rng.integers(4, 11, 8)
    out.append(case("panel scores with ties 7 vs 8", ["p", "q"], [s1, s2], [1, -1]))
    out.append(case("panel scores with ties, raw", ["p", "q"], [s1, s2], [1, -1], "raw"))
    # three groups, a Helmert-type contrast
    g1 = np.round(rng.normal(5, 1, 4), 2)
    g2 = np.round(rng.normal(6, 2, 5), 2)
    g3 = np.round(rng.normal(6.5, 1.5, 5), 2)
    out.append(case("three groups 4,5,5 contrast 2,-1,-1", ["x", "y", "z"], [g1, g2, g3], [2, -1, -1]))
    out.append(case("three groups 4,5,5 contrast 0.5,0.5,-1 less", ["x", "y", "z"], [g1, g2, g3],
                    [0.5, 0.5, -1], alternative="less"))
    # 16!/(6!5!5!) = 2,018,016 reassignments: contrasta splits the enumeration into two blocks
    h = [np.round(rng.normal(m, sd, n), 2) for m, sd, n in [(1, 1, 6), (1.5, 2, 5), (0.5, 1, 5)]]
    out.append(case("three groups 6,5,5 (several blocks)", ["h1", "h2", "h3"], h, [1, -2, 1]))
    # a contrast inside a larger file: only the two involved levels are reassigned
    f = [np.round(rng.normal(m, s, n), 1) for m, s, n in [(20, 2, 9), (23, 3, 6), (21, 1, 8), (25, 4, 6)]]
    out.append(case("b - d inside four groups", ["a", "b", "c", "d"], f, [0, 1, 0, -1]))
    out.append(case("(a + c)/2 - b inside four groups", ["a", "b", "c", "d"],
                    [f[0][:5], f[1][:4], f[2][:4], f[3]], [0.5, -1, 0.5, 0]))
    return out


def live_cases(seed):
    rng = np.random.default_rng(seed)
    out = []
    for i in range(4):
        k = int(rng.integers(2, 4))
        sizes = [int(x) for x in rng.integers(3, 6 if k == 3 else 9, k)]
        groups = [np.round(rng.normal(rng.normal(0, 1), rng.uniform(0.5, 3), n), int(rng.integers(0, 3)))
                  for n in sizes]
        if k == 2 and i == 0:
            groups[1] = groups[1][:len(groups[0])] if len(groups[1]) >= len(groups[0]) else groups[1]
            groups[0] = groups[0][:len(groups[1])]
        coefficients = [1.0, -1.0] if k == 2 else [1.0, -0.5, -0.5]
        alt = ["two-sided", "greater", "less"][i % 3]
        stat = "studentized" if i % 2 == 0 else "raw"
        out.append(case(f"live {seed} #{i}", [f"g{j}" for j in range(k)], groups, coefficients, stat, alt))
    return out


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("--live", action="store_true")
    ap.add_argument("--out")
    args = ap.parse_args()
    if args.live:
        seed = int(time.time())
        doc = {"source": f"scipy {__import__('scipy').__version__} permutation_test, live seed {seed}",
               "cases": live_cases(seed)}
    else:
        doc = {"source": f"scipy {__import__('scipy').__version__} permutation_test(n_resamples=inf)",
               "cases": fixed_cases()}
    out = args.out or os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", "data",
                                   "permutation_fixtures.json")
    with open(out, "w") as fh:
        json.dump(doc, fh, indent=1)
    return 0


if __name__ == "__main__":
    sys.exit(main())
