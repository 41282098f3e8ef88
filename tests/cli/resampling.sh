#!/bin/bash
# compare --method permutation,bootstrap from the command line, in every output format.
# $1 = contrasta binary, $2 = tests directory.
set -u
bin="$1"
data="$2/../data/substrate_trial.csv"
contrasts="$2/../data/substrate_trial.contrasts"
work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT
failures=0
seed=11
contrast_args=(--contrast-file "$contrasts")
fail() { echo "FAIL: $*" >&2; failures=$((failures + 1)); }

run() {  # run NAME ARGS...: runs compare, keeps stdout in $work/NAME
  local name="$1"
  shift
  "$bin" compare "$data" --group substrate --response fresh_mass_g ${contrast_args[@]+"${contrast_args[@]}"} \
    --method permutation,bootstrap --resamples 4999 --seed "$seed" "$@" >"$work/$name" 2>"$work/$name.err"
  local rc=$?
  [ "$rc" -eq 0 ] || fail "$name: exit status $rc: $(head -c 300 "$work/$name.err")"
}

for format in table json csv markdown; do
  run "$format" --format "$format"
  grep -q permutation "$work/$format" || fail "$format output lacks the permutation rows"
  grep -q bootstrap "$work/$format" || fail "$format output lacks the bootstrap rows"
done

# JSON: well formed, with the resampling keys of the interface (resamples, exact, p_interval)
if /usr/bin/python3 -c 'import json' 2>/dev/null; then
  /usr/bin/python3 - "$work/json" <<'PY' || fail "JSON resampling fields"
import json, sys
doc = json.load(open(sys.argv[1]))
assert doc["seed"] == 11, doc["seed"]
seen = set()
for c in doc["contrasts"]:
    for r in c["results"]:
        seen.add(r["method"])
        assert isinstance(r["resamples"], int) and r["resamples"] > 0, r
        assert isinstance(r["exact"], bool), r
        lo, hi = r["p_interval"]
        assert lo <= r["p_value"] <= hi, r
        if r["exact"]:
            assert lo == hi == r["p_value"], r
        assert 0 < r["p_value"] <= 1, r
        assert r["null"], r
        if r["method"] == "bootstrap":
            assert r["ci_low"] < r["estimate"] < r["ci_high"], r
        else:
            assert r["ci_low"] is None and r["ci_high"] is None, r
assert seen == {"permutation", "bootstrap"}, seen
# "coir vs wood fibre" (8 and 10 observations, C(18,8) = 43,758 reassignments) is exact by default
pair = [c for c in doc["contrasts"] if c["name"] == "coir vs wood fibre"][0]
perm = [r for r in pair["results"] if r["method"] == "permutation"][0]
assert perm["exact"] and perm["resamples"] == 43758, perm
PY
fi

# The same seed gives the same output for any thread count, and again on a second run.
run threads1 --format json --threads 1
run threads2 --format json --threads 2
run threads8 --format json --threads 8
cmp -s "$work/threads1" "$work/threads2" || fail "--threads 1 and 2 differ"
cmp -s "$work/threads1" "$work/threads8" || fail "--threads 1 and 8 differ"
cmp -s "$work/threads1" "$work/json" || fail "a second run with the same seed differs"
seed=12 run seed12 --format json
cmp -s "$work/threads1" "$work/seed12" && fail "a different seed gave identical output"

# Options of the resampling engine
run never --format csv --exact never
grep -q "coir vs wood fibre,permutation,.*,4999,false" "$work/never" || fail "--exact never did not give 4999 Monte Carlo resamples"
contrast_args=(-c "coir - peat")
run always --format csv --exact always
contrast_args=(--contrast-file "$contrasts")
grep -q "coir - peat,permutation,.*,75582,true" "$work/always" || fail "--exact always did not enumerate C(19,8) = 75582 reassignments"
run small --format csv --max-arrangements 100
grep -q "coir vs wood fibre,permutation,.*,false" "$work/small" || fail "--max-arrangements 100 still enumerated"
for interval in percentile bca studentized; do
  run "interval_$interval" --format csv --interval "$interval"
done
cmp -s "$work/interval_percentile" "$work/interval_studentized" && fail "--interval made no difference"
run raw --format csv --statistic raw
grep -q "coir vs wood fibre,permutation,.*,psi," "$work/raw" || fail "--statistic raw not reported as psi"
run greater --format csv --alternative greater

# -o writes the file; the terminal gets no progress line when output is redirected
"$bin" compare "$data" --group substrate --response fresh_mass_g --method permutation,bootstrap --resamples 999 \
  --seed 3 --format json -o "$work/out.json" 2>"$work/out.err" || fail "-o run failed"
[ -s "$work/out.json" ] || fail "-o did not write the file"
[ -s "$work/out.err" ] && fail "unexpected standard error output: $(head -c 200 "$work/out.err")"

# A group of one cannot be studentized: one error line, exit status 4
printf 'g,y\na,1\nb,2\nb,3\nb,4\n' >"$work/one.csv"
"$bin" compare "$work/one.csv" --method permutation >"$work/one.out" 2>"$work/one.err"
rc=$?
[ "$rc" -eq 4 ] || fail "group of one: exit status $rc, expected 4"
grep -q '^error:' "$work/one.err" || fail "group of one: no error line"

[ "$failures" -eq 0 ] && echo "resampling CLI checks passed"
exit "$failures"
