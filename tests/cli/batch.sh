#!/usr/bin/env bash
# Batch mode (several responses): results equal single-response runs exactly; p_adjusted_across
# equals statsmodels.stats.multitest.multipletests across responses (fdr_bh, fdr_by, holm) to
# 1e-12; an all-missing response is reported and skipped, not a failed run; CSV gains `response`.
set -u
bin="$1"; tests="$2"; data="$tests/../data"
tmp="$(mktemp -d)"; trap 'rm -rf "$tmp"' EXIT
panel="$data/cracker_panel.csv"
# An extra response with every value missing.
/usr/bin/python3 - "$panel" "$tmp/panel.csv" <<'PY'
import sys
rows = open(sys.argv[1]).read().splitlines()
with open(sys.argv[2], "w") as f:
    f.write(rows[0] + ",aroma\n")
    for r in rows[1:]:
        f.write(r + ",NA\n")
PY
status=0
for across in bh by holm; do
  "$bin" compare "$tmp/panel.csv" --group recipe --response crisp,salty,overall,aroma --family all-pairs \
    --method pooled,welch --adjust holm --adjust-across "$across" --format json --seed 9 --quiet > "$tmp/batch_$across.json" || status=1
done
for r in crisp salty overall; do
  "$bin" compare "$tmp/panel.csv" --group recipe --response "$r" --family all-pairs --method pooled,welch \
    --adjust holm --format json --seed 9 > "$tmp/single_$r.json" || status=1
done
"$bin" compare "$tmp/panel.csv" --group recipe --response crisp,salty --family all-pairs --method welch --format csv --seed 9 \
  --quiet > "$tmp/batch.csv" || status=1
[ "$status" = 0 ] || { echo "batch: a run failed"; echo "0 passed, 1 failed"; exit 1; }
/usr/bin/python3 - "$tmp" <<'PY'
import json, sys, math
from statsmodels.stats.multitest import multipletests
tmp = sys.argv[1]
passed = failed = 0
def check(ok, what):
    global passed, failed
    if ok: passed += 1
    else:
        failed += 1
        print("FAIL:", what)
batch = json.load(open(f"{tmp}/batch_bh.json"))
check(set(batch) >= {"tool", "seed", "responses"}, "batch keys")
check([r["input"]["response"] for r in batch["responses"]] == ["crisp", "salty", "overall"], "responses in order")
check([s["response"] for s in batch["skipped"]] == ["aroma"], "all-missing response skipped with a note")
# Batch results equal the single-response runs exactly (every key but p_adjusted_across).
for obj in batch["responses"]:
    single = json.load(open(f"{tmp}/single_{obj['input']['response']}.json"))
    for cb, cs in zip(obj["contrasts"], single["contrasts"]):
        for rb, rs in zip(cb["results"], cs["results"]):
            rb = dict(rb); rb.pop("p_adjusted_across")
            check(rb == rs, f"{obj['input']['response']} {cb['name']} {rs['method']} differs from the single run")
    check(obj["groups"] == single["groups"] and obj["anova"] == single["anova"], "summaries equal")
# p_adjusted_across vs statsmodels, per contrast and method, across responses.
for across, sm_name in [("bh", "fdr_bh"), ("by", "fdr_by"), ("holm", "holm")]:
    doc = json.load(open(f"{tmp}/batch_{across}.json"))
    families = {}
    for obj in doc["responses"]:
        for c in obj["contrasts"]:
            for r in c["results"]:
                families.setdefault((c["name"], r["method"]), []).append(r)
    worst = 0.0
    for key, rs in families.items():
        ref = multipletests([r["p_value"] for r in rs], method=sm_name)[1]
        for r, want in zip(rs, ref):
            worst = max(worst, abs(r["p_adjusted_across"] - want) / max(want, 1e-300))
    check(worst <= 1e-12, f"{across}: worst relative error {worst}")
    print(f"p_adjusted_across {across} vs statsmodels {sm_name}: worst relative error {worst:.2e}")
lines = open(f"{tmp}/batch.csv").read().splitlines()
check(lines[0].startswith("response,contrast,method,"), "csv header starts with response")
check(len(lines) == 1 + 2 * 6, f"csv rows {len(lines)}")
print(f"batch mode: {passed} passed, {failed} failed")
sys.exit(1 if failed else 0)
PY
