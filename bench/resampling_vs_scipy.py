#!/usr/bin/python3
"""Runs contrasta's resampling benchmark and scipy on the same data in the same run, and prints
the speed ratios of quality.md P1-P4.

    /usr/bin/python3 bench/resampling_vs_scipy.py BUILD/bench/bench_resampling [--runs 5]
        [--scipy-resamples 100000] [--resamples 1000000]

scipy is timed at its fastest settings named in quality.md: permutation_test(vectorized=True,
batch=10000) and bootstrap(method="BCa", vectorized=True, batch=10000). Ratios are per
resample (scipy's time per resample over contrasta's), each time the median of --runs runs.
scipy's P1 run uses --scipy-resamples (its cost per resample is flat beyond a few batches), so
that the script finishes in reasonable time; P3 uses 1e5 resamples on both sides.
"""
import argparse
import os
import re
import subprocess
import sys
import tempfile
import time

import numpy as np
from scipy import stats


def median_time(runs, f):
    """Median wall and process CPU seconds of `runs` calls."""
    wall, cpu = [], []
    for _ in range(runs):
        t0, c0 = time.perf_counter(), time.process_time()
        f()
        wall.append(time.perf_counter() - t0)
        cpu.append(time.process_time() - c0)
    return float(np.median(wall)), float(np.median(cpu))


def welch_t(c):
    c = np.asarray(c, dtype=float)

    def statistic(*samples, axis=-1):
        d = sum(ci * np.mean(s, axis=axis) for ci, s in zip(c, samples))
        v = sum(ci * ci * np.var(s, axis=axis, ddof=1) / s.shape[axis] for ci, s in zip(c, samples))
        return np.abs(d / np.sqrt(v))
    return statistic


def mean_difference(x, y, axis=-1):
    return np.mean(x, axis=axis) - np.mean(y, axis=axis)


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("bench")
    ap.add_argument("--runs", type=int, default=5)
    ap.add_argument("--scipy-runs", type=int, default=3)
    ap.add_argument("--scipy-resamples", type=int, default=100000)
    ap.add_argument("--resamples", type=int, default=1000000)
    args = ap.parse_args()

    rng = np.random.default_rng(20261201)
    p1 = [10 + sd * rng.standard_normal(50) for sd in (1.0, 2.0, 3.0, 4.0)]
    p3 = [np.exp(sd * 0.5 * rng.standard_normal(100)) for sd in (1.0, 1.5)]
    with tempfile.TemporaryDirectory() as tmp:
        f1, f3 = os.path.join(tmp, "p1.txt"), os.path.join(tmp, "p3.txt")
        for path, groups in ((f1, p1), (f3, p3)):
            with open(path, "w") as fh:
                for g in groups:
                    fh.write(" ".join(repr(float(x)) for x in g) + "\n")
        out = subprocess.run([args.bench, "--p1", f1, "--p3", f3, "--runs", str(args.runs),
                              "--resamples", str(args.resamples), "--calibration", "0"],
                             check=True, capture_output=True, text=True).stdout
    print(out, end="")

    def number(pattern):
        m = re.search(pattern, out)
        if not m:
            sys.exit(f"bench output lacks {pattern!r}")
        return float(m.group(1))

    ours_p1 = number(r"P1 .*?: [0-9.]+ s wall \(([0-9.]+) us per resample\)")
    ours_p1_cpu = number(r"P1 .*?us per resample\), ([0-9.]+) s cpu") * 1e6 / args.resamples
    ours_p1_one_cpu = number(r"P1-1thread: .*?, ([0-9.]+) s cpu") * 1e6 / args.resamples
    ours_p3_cpu = number(r"P3 .*?us per resample\), ([0-9.]+) s cpu") * 1e6 / 100000
    ours_p3_one_cpu = number(r"P3-1thread: .*?, ([0-9.]+) s cpu") * 1e6 / 100000
    ours_p1_one = number(r"P1-1thread: [0-9.]+ s wall \(([0-9.]+) us per resample\)")
    ours_p2 = number(r"P2 .*?: ([0-9.]+) s wall")
    ours_p3 = number(r"P3 .*?: [0-9.]+ s wall \(([0-9.]+) us per resample\)")

    # scipy on the same data
    stat = welch_t([1, 1, -1, -1])
    m = args.scipy_resamples
    t_p1 = median_time(args.scipy_runs, lambda: stats.permutation_test(
        p1, stat, permutation_type="independent", vectorized=True, n_resamples=m, batch=10000,
        alternative="greater", random_state=np.random.default_rng(1)))
    scipy_p1, scipy_p1_cpu = 1e6 * t_p1[0] / m, 1e6 * t_p1[1] / m
    t_p3 = median_time(args.scipy_runs, lambda: stats.bootstrap(
        p3, mean_difference, vectorized=True, n_resamples=100000, batch=10000, method="BCa",
        random_state=np.random.default_rng(1)))
    scipy_p3, scipy_p3_cpu = 1e6 * t_p3[0] / 100000, 1e6 * t_p3[1] / 100000

    print(f"scipy P1 permutation_test(vectorized, batch=10000): {scipy_p1:.4f} us per resample ({m} resamples)")
    print(f"scipy P3 bootstrap(BCa, vectorized, batch=10000): {scipy_p3:.4f} us per resample")
    print(f"P1 ratio scipy/contrasta per resample (2 threads): {scipy_p1 / ours_p1:.1f}x (bar >= 50x)")
    print(f"P2 exact 15 vs 15 on 2 threads: {ours_p2:.3f} s (bar < 1 s)")
    print(f"P3 ratio scipy/contrasta per resample: {scipy_p3 / ours_p3:.1f}x (bar >= 20x)")
    print(f"P4 2 threads over 1 thread on P1: {ours_p1_one / ours_p1:.2f}x (bar >= 1.8x)")
    # On a shared machine other processes take cores away from a two-thread run more than from
    # scipy's single thread; CPU time per resample shows the work each side does.
    print(f"load average {os.getloadavg()[0]:.1f} on {os.cpu_count()} cores")
    print(f"CPU time per resample: P1 scipy {scipy_p1_cpu:.4f} us, contrasta 1 thread {ours_p1_one_cpu:.4f} us "
          f"(ratio {scipy_p1_cpu / ours_p1_one_cpu:.1f}x single-core work), 2 threads {ours_p1_cpu:.4f} us; "
          f"P3 scipy {scipy_p3_cpu:.4f} us, contrasta 1 thread {ours_p3_one_cpu:.4f} us "
          f"(ratio {scipy_p3_cpu / ours_p3_one_cpu:.1f}x)")
    return 0


if __name__ == "__main__":
    sys.exit(main())
