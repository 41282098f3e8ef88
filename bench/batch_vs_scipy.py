#!/usr/bin/python3
"""P6 side by side: contrasta's batch run and scipy doing the same loop on the same file.

Workload: 10,000 responses x 200 rows x 4 groups; for every response, pooled and Welch t-tests
of all 6 pairs and Levene's test. contrasta: `contrasta compare FILE --group group
--response all-numeric --method pooled,welch --no-effect-sizes --format csv` (its advice step
runs Levene and the other diagnostics for every response). scipy: scipy.stats.ttest_ind
(equal_var True and False) for every pair and scipy.stats.levene per response, CSV rows written.

Usage: bench/batch_vs_scipy.py BUILD_DIR [RESPONSES]
"""
import csv
import io
import itertools
import subprocess
import sys
import time

import numpy as np
from scipy import stats

build = sys.argv[1] if len(sys.argv) > 1 else "build"
responses = int(sys.argv[2]) if len(sys.argv) > 2 else 10000
path = f"/tmp/contrasta_batch_{responses}.csv"
subprocess.run([f"{build}/bench/bench_batch", str(responses), path], check=True, capture_output=True)

runs = []
for _ in range(3):
    t = time.perf_counter()
    subprocess.run([f"{build}/contrasta", "compare", path, "--group", "group", "--response", "all-numeric",
                    "--method", "pooled,welch", "--no-effect-sizes", "--format", "csv", "--quiet", "--seed", "1"],
                   check=True, stdout=subprocess.DEVNULL)
    runs.append(time.perf_counter() - t)
ours = sorted(runs)[1]

t = time.perf_counter()
with open(path) as f:
    header = f.readline().strip().split(",")
data = np.loadtxt(path, delimiter=",", skiprows=1, usecols=range(1, len(header)))
groups = np.array([line.split(",", 1)[0] for line in open(path).read().splitlines()[1:]])
levels = list(dict.fromkeys(groups))
index = [groups == g for g in levels]
out = io.StringIO()
writer = csv.writer(out)
for j in range(data.shape[1]):
    y = data[:, j]
    parts = [y[m] for m in index]
    lev = stats.levene(*parts, center="mean")
    for a, b in itertools.combinations(range(len(levels)), 2):
        for equal in (True, False):
            r = stats.ttest_ind(parts[a], parts[b], equal_var=equal)
            writer.writerow([header[j + 1], f"{levels[a]} - {levels[b]}", "pooled" if equal else "welch",
                             r.statistic, r.pvalue, lev.statistic])
scipy_time = time.perf_counter() - t
print(f"P6 batch, {responses} responses x 200 rows x 4 groups: contrasta {ours:.3f} s (median of 3, whole CLI run), "
      f"scipy loop {scipy_time:.3f} s, ratio {scipy_time / ours:.1f}x")
