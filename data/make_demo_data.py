#!/usr/bin/python3
"""Generates the invented demo datasets of contrasta (see data/README.md).

Every number is drawn from a seeded pseudo-random generator; no value comes from a real trial.
Run with Debian's python3 (numpy); the committed CSV files are its output.
"""
import numpy as np

rng = np.random.default_rng(20261201)

# 1. Greenhouse substrate trial: basil seedlings in four substrates, fresh mass per pot (g) and
#    height (cm). Unequal group sizes, the largest spread in the smallest group.
design = [("peat", 12, 47.0, 3.0), ("coir", 8, 52.5, 4.5), ("bark compost", 6, 41.0, 9.0), ("wood fibre", 10, 49.0, 3.5)]
rows = []
for name, n, mean, sd in design:
    for _ in range(n):
        mass = rng.normal(mean, sd)
        height = 0.35 * mass + rng.normal(4.0, 1.2)
        rows.append((name, f"{mass:.1f}", f"{height:.1f}"))
order = rng.permutation(len(rows))
rows = [rows[i] for i in order]
rows[5] = (rows[5][0], "NA", rows[5][2])
rows[17] = (rows[17][0], rows[17][1], "")
with open("substrate_trial.csv", "w") as f:
    f.write("pot,substrate,fresh_mass_g,height_cm\n")
    for i, (name, mass, height) in enumerate(rows, 1):
        f.write(f"{i},{name},{mass},{height}\n")

# 2. Sensory panel: four cracker recipes, each tasting scored 0-10 on three attributes.
recipes = [("classic", 6.0, 5.5, 6.5), ("rye", 6.8, 5.0, 6.4), ("seeded", 7.4, 5.2, 7.2), ("low salt", 5.9, 3.6, 5.4)]
rows = []
for name, crisp, salty, overall in recipes:
    for _ in range(10):
        scores = [int(np.clip(np.rint(rng.normal(m, 1.3)), 0, 10)) for m in (crisp, salty, overall)]
        rows.append((name, *scores))
order = rng.permutation(len(rows))
with open("cracker_panel.csv", "w") as f:
    f.write("tasting,recipe,crisp,salty,overall\n")
    for i, j in enumerate(order, 1):
        name, a, b, c = rows[j]
        f.write(f"{i},{name},{a},{b},{c}\n")

# 3. Lab extraction methods, wide layout: recovery (%) of a spiked standard, one column per method,
#    unequal numbers of runs (blank cells), one gross outlier in the microwave runs.
methods = [("soxhlet", 7, 92.0, 1.2), ("ultrasound", 9, 89.5, 2.6), ("microwave", 8, 94.0, 1.5)]
columns = []
for name, n, mean, sd in methods:
    values = list(np.round(rng.normal(mean, sd, n), 2))
    columns.append(values)
columns[2][3] = 71.40
depth = max(len(c) for c in columns)
with open("extraction_wide.csv", "w") as f:
    f.write(",".join(m[0] for m in methods) + "\n")
    for r in range(depth):
        f.write(",".join(f"{c[r]:.2f}" if r < len(c) else "" for c in columns) + "\n")
