#!/usr/bin/env python3
"""Refreshes the example outputs in README.md: each block between
<!-- begin: NAME --> and <!-- end: NAME --> is replaced by the command of NAME and its output,
run from the repository root with build/contrasta. Run after changing any output."""
import re
import subprocess
import sys
from pathlib import Path

root = Path(__file__).resolve().parent.parent
binary = Path(sys.argv[1]) if len(sys.argv) > 1 else root / "build" / "contrasta"
examples = {
    "compare-substrate": "compare data/substrate_trial.csv --group substrate --response fresh_mass_g "
                         "--contrast-file data/substrate_trial.contrasts --adjust holm --seed 2026",
    "check-substrate": "check data/substrate_trial.csv --group substrate --response fresh_mass_g --seed 2026",
    "check-panel": "check data/cracker_panel.csv --group recipe --response crisp --seed 2026",
    "check-extraction": "check data/extraction_wide.csv --wide --seed 2026",
    "batch-panel": "compare data/cracker_panel.csv --group recipe --response crisp,salty,overall "
                   "--family versus=classic --seed 2026",
    "agreement-panel": "compare data/cracker_panel.csv --group recipe --response crisp "
                       "--contrast-file data/cracker_panel.contrasts --method all --seed 2026 --resamples 19999",
    "plan-substrate": "plan --means \"peat=47,coir=52,bark compost=42,wood fibre=49\" "
                      "--sds \"peat=3,coir=4.5,bark compost=8.5,wood fibre=4.5\" --power 0.8 --method welch "
                      "-c \"peat-free vs peat: (coir + [bark compost] + [wood fibre])/3 - peat\" -c \"coir - [wood fibre]\"",
    "layout-substrate": "layout --treatments \"peat,coir,bark compost,wood fibre\" --replicates 3 --seed 5",
}

def demoted(markdown, source):
    """A doc spliced into the README: headings one level down (outside code blocks) and
    relative links re-rooted at docs/."""
    out, fenced = [], False
    for line in markdown.splitlines():
        if line.startswith("```"):
            fenced = not fenced
        if not fenced and line.startswith("#"):
            line = "#" + line
        out.append(line)
    text = "\n".join(out) + "\n"
    return re.sub(r"\]\((?!https?:|#|docs/)([^)]+)\)", lambda m: f"](docs/{m.group(1)})", text)


text = (root / "README.md").read_text()
for doc in sorted((root / "docs").glob("*.md")):
    name = doc.stem
    pattern = re.compile(rf"(<!-- begin: doc:{name} -->\n)(.*?)(<!-- end: doc:{name} -->)", re.S)
    text = pattern.sub(lambda m: m.group(1) + demoted(doc.read_text(), doc) + m.group(3), text)
for name, args in examples.items():
    pattern = re.compile(rf"(<!-- begin: {name} -->\n)(.*?)(<!-- end: {name} -->)", re.S)
    if not pattern.search(text):
        continue
    run = subprocess.run(f"{binary} {args}", shell=True, cwd=root, capture_output=True, text=True)
    if run.returncode != 0:
        sys.exit(f"{name}: contrasta {args} failed: {run.stderr}")
    block = f"```\n$ contrasta {args}\n\n{run.stdout.rstrip()}\n```\n"
    text = pattern.sub(lambda m: m.group(1) + block + m.group(3), text)
(root / "README.md").write_text(text)
