#!/usr/bin/python3
"""Runs bench_robust_rank and scipy on the same data in the same run and prints the ratios.

Usage: /usr/bin/python3 bench/robust_rank.py BUILD_DIR [N]
Workloads (two levels of N each, normal with unequal SDs, one decimal: ties):
  mann-whitney + Hodges-Lehmann: scipy.stats.mannwhitneyu + numpy median of all N^2 differences
  brunner-munzel: scipy.stats.brunnermunzel
  trimmed (with preparing the group summaries, and the Yuen step alone given them):
    scipy.stats.ttest_ind(trim=0.2, equal_var=False)
"""
import os
import subprocess
import sys
import tempfile
import time

import numpy as np
from scipy import stats


def median_seconds(f, repetitions=5):
    t = []
    for _ in range(repetitions):
        start = time.perf_counter()
        f()
        t.append(time.perf_counter() - start)
    return sorted(t)[len(t) // 2]


def main():
    build = sys.argv[1]
    n = int(sys.argv[2]) if len(sys.argv) > 2 else 5000
    rng = np.random.default_rng(7)
    a = np.round(rng.normal(10, 1, n), 1)
    b = np.round(rng.normal(10.1, 2, n), 1)
    with tempfile.NamedTemporaryFile("w", suffix=".csv", delete=False) as f:
        for v in a:
            f.write(f"a,{v!r}\n")
        for v in b:
            f.write(f"b,{v!r}\n")
        path = f.name
    out = subprocess.run([os.path.join(build, "bench", "bench_robust_rank"), path], capture_output=True, text=True, check=True).stdout
    os.unlink(path)
    ours = {line.split()[0]: float(line.split()[2]) for line in out.splitlines()}
    theirs = {
        # All N^2 differences in memory: beyond about 2e4 per level that no longer fits.
        "mann-whitney+hodges-lehmann": median_seconds(lambda: (stats.mannwhitneyu(a, b), np.median(np.subtract.outer(a, b))))
        if n <= 20000 else float("nan"),
        "brunner-munzel": median_seconds(lambda: stats.brunnermunzel(a, b)),
        "trimmed(with-summaries)": median_seconds(lambda: stats.ttest_ind(a, b, trim=0.2, equal_var=False)),
        "trimmed(step-only)": median_seconds(lambda: stats.ttest_ind(a, b, trim=0.2, equal_var=False)),
    }
    print(f"n = {n} per level; median of 5 runs; scipy {__import__('scipy').__version__}")
    for k, v in ours.items():
        print(f"{k:30s} contrasta {v:.5f} s   scipy {theirs[k]:.5f} s   ratio {theirs[k] / v:.1f}x")


if __name__ == "__main__":
    main()
