#!/bin/bash
# Command-line checks of `contrasta plan` and `contrasta layout`.
# $1 = the contrasta binary, $2 = the tests directory.
set -u
bin="$1"
tests="$2"
data="$tests/../data"
work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT
failures=0
fail() { echo "FAIL: $*"; failures=$((failures + 1)); }
PY=/usr/bin/python3

# Reads a JSON file and evaluates a Python expression on it as `j`; prints the result.
json_get() { "$PY" -c "import json,sys; j=json.load(open(sys.argv[1])); print($2)" "$1"; }

expect_status() {  # expected status, description, command...
  local want=$1 what=$2
  shift 2
  "$@" >"$work/out" 2>"$work/err"
  local got=$?
  [ "$got" -eq "$want" ] || fail "$what: exit $got, expected $want ($(head -c 300 "$work/err"))"
  if [ "$want" -ne 0 ]; then
    grep -q '^error: ' "$work/err" || fail "$what: no 'error:' line on standard error"
    [ "$(wc -l <"$work/err")" -eq 1 ] || fail "$what: more than one line on standard error"
  fi
}

# 1. Power of a pair: d = 1, n = 8 per group, pooled two-sided alpha 0.05. With a third level
#    in the trial the pooled df is N - k = 24 - 3 = 21; scipy.stats.nct with df 21 and ncp 2
#    gives 0.4794494936037287.
expect_status 0 "power json" "$bin" plan --means "a=10,b=12,c=11" --sd 2 --n 8 -c "b - a" --method pooled --format json -o "$work/p.json"
if [ -s "$work/p.json" ]; then
  got=$(json_get "$work/p.json" "abs(j['plans'][0]['power'] - 0.4794494936037287) < 1e-9 and j['plans'][0]['df'] == 21")
  [ "$got" = "True" ] || fail "pooled power/df of b - a: $(json_get "$work/p.json" "j['plans'][0]")"
  for key in contrast method alpha n df ncp power; do
    [ "$(json_get "$work/p.json" "'$key' in j['plans'][0]")" = "True" ] || fail "JSON plan lacks key $key"
  done
fi
# The same with only the two levels: df 14; statsmodels TTestIndPower().power(1.0, 8, 0.05)
# = 0.4612388495041602.
"$bin" plan --means "a=10,b=12" --sd 2 --n 8 -c "b - a" --method pooled --format json >"$work/p2.json" 2>/dev/null
[ "$(json_get "$work/p2.json" "abs(j['plans'][0]['power'] - 0.4612388495041602) < 1e-6")" = "True" ] ||
  fail "two-level pooled power differs from statsmodels"

# 2. Sample size: Cohen 1988 table 2.4.1 (from memory): d = 0.5, power 0.80, two-sided 0.05
#    needs 64 per group (statsmodels solve_power: 63.77).
"$bin" plan --means "a=0.5,b=0" --sd 1 --power 0.8 -c "a - b" --method pooled --format json >"$work/n.json" 2>"$work/err" ||
  fail "sample size run failed: $(cat "$work/err")"
[ "$(json_get "$work/n.json" "j['plans'][0]['n'] == {'a': 64, 'b': 64} and j['plans'][0]['power_one_less'] < 0.8 <= j['plans'][0]['power']")" = "True" ] ||
  fail "sample size for d = 0.5 is not 64 per group"

# 3. Ratios from --ns are kept: 2:1:1.
"$bin" plan --means "peat=47,coir=49,bark=44" --sd 3 --power 0.9 --ns "peat=2,coir=1,bark=1" -c "coir - peat" --format json >"$work/r.json" 2>/dev/null
[ "$(json_get "$work/r.json" "(lambda n: n['peat'] == 2 * n['coir'] and n['coir'] == n['bark'])(j['plans'][0]['n'])")" = "True" ] ||
  fail "--ns ratios not respected"

# 4. Allocation of a fixed total: SDs 1 and 3 for a pair split 40 units 10 : 30 (n proportional to sigma).
"$bin" plan --means "a=10,b=12" --sds "a=1,b=3" --total 40 -c "b - a" --format json >"$work/a.json" 2>/dev/null
[ "$(json_get "$work/a.json" "j['plans'][0]['n'] == {'a': 10, 'b': 30}")" = "True" ] || fail "allocation of 40 is not 10 : 30"

# 5. Several contrasts: the common design covers every contrast's own requirement.
"$bin" plan --means "a=10,b=12,c=11" --sd 2 --power 0.8 --family all-pairs --format json >"$work/f.json" 2>/dev/null
[ "$(json_get "$work/f.json" "all(p >= 0.8 for p in [x['power'] for x in j['design']['powers']]) and len(j['plans']) == 3")" = "True" ] ||
  fail "the common design does not serve every contrast"

# 6. Pilot data: SDs from the demo substrate trial; every format runs.
for format in table json csv markdown; do
  expect_status 0 "from-data $format" "$bin" plan --from-data "$data/substrate_trial.csv" --group substrate --response fresh_mass_g \
    --contrast-file "$data/substrate_trial.contrasts" --means pilot --power 0.8 --format "$format"
  [ -s "$work/out" ] || fail "from-data $format: empty output"
done
head -1 "$work/out" | grep -q '^# Trial plan' || fail "markdown output lacks its title"

# 7. --simulate reports a simulated power whose 99% interval is close to the analytic value.
"$bin" plan --means "a=10,b=12,c=11" --sd 2 --n 10 -c "b - a" --method pooled --simulate --simulations 4000 --seed 3 \
  --format json >"$work/s.json" 2>/dev/null
[ "$(json_get "$work/s.json" "(lambda p: p['simulation']['low'] <= p['power'] <= p['simulation']['high'])(j['plans'][0]) and j['seed'] == 3")" = "True" ] ||
  fail "simulated power interval misses the analytic power: $(json_get "$work/s.json" "j['plans'][0]")"

# 8. Errors: one line, the right exit status.
expect_status 2 "no SD" "$bin" plan --means "a=1,b=2" --n 5 -c "a - b"
expect_status 2 "unknown level in --sds" "$bin" plan --means "a=1,b=2" --sds "a=1,x=2" --n 5 -c "a - b"
expect_status 2 "power below alpha" "$bin" plan --means "a=1,b=2" --sd 1 --power 0.01 -c "a - b"
expect_status 4 "unknown level in contrast" "$bin" plan --means "a=1,b=2" --sd 1 --n 5 -c "a - z"
expect_status 4 "welch with one unit" "$bin" plan --means "a=1,b=2" --sd 1 --n 1 -c "a - b"
expect_status 4 "equal means, solve for n" "$bin" plan --means "a=1,b=1" --sd 1 --power 0.8 -c "a - b"
expect_status 3 "missing pilot file" "$bin" plan --from-data "$work/none.csv" --n 5
expect_status 2 "bad --means" "$bin" plan --means "a=1,b" --sd 1 --n 5

# ---- layout ----
# 9. The golden plan (tests/data/layout_golden_seed5.csv, from an independent Python implementation).
"$bin" layout --treatments a,b,c --replicates 4 --seed 5 >"$work/l.csv" 2>"$work/err" || fail "layout failed: $(cat "$work/err")"
grep -v '^#' "$work/l.csv" >"$work/l_rows.csv"
diff -q "$work/l_rows.csv" "$tests/data/layout_golden_seed5.csv" >/dev/null || fail "layout for seed 5 differs from the golden file"
grep -q '^# seed: 5$' "$work/l.csv" || fail "layout header does not record the seed"
grep -q '^# treatments: a=4,b=4,c=4' "$work/l.csv" || fail "layout header does not record the design"

# 10. Unequal replication, unit labels, determinism and every format.
printf 'bench1-east\nbench1-west\n\n# spare bench below\nbench2-east\nbench2-west\nbench3-east\nbench3-west\n' >"$work/units.txt"
"$bin" layout --replicates "peat=2,coir=3,bark=1" --units "$work/units.txt" --seed 11 --format json >"$work/u1.json" 2>/dev/null
"$bin" layout --replicates "peat=2,coir=3,bark=1" --units "$work/units.txt" --seed 11 --format json >"$work/u2.json" 2>/dev/null
cmp -s "$work/u1.json" "$work/u2.json" || fail "layout is not deterministic for a seed"
[ "$(json_get "$work/u1.json" "sorted(x['treatment'] for x in j['plan']) == ['bark','coir','coir','coir','peat','peat'] and j['plan'][2]['label'] == 'bench2-east'")" = "True" ] ||
  fail "unequal layout with labels is wrong"
for format in csv table json markdown; do
  expect_status 0 "layout $format" "$bin" layout --treatments x,y --replicates 3 --seed 1 --format "$format"
  [ -s "$work/out" ] || fail "layout $format: empty output"
done
expect_status 0 "layout to file" "$bin" layout --treatments x,y --replicates 3 --seed 1 -o "$work/plan.csv"
[ "$(grep -vc '^#' "$work/plan.csv")" -eq 7 ] || fail "layout -o file does not hold header + 6 units"
"$bin" layout --treatments x,y --replicates 3 >"$work/drawn.csv" 2>/dev/null
grep -q '^# seed: [0-9]' "$work/drawn.csv" || fail "a drawn seed is not recorded"

expect_status 2 "layout without replicates" "$bin" layout --treatments a,b
expect_status 2 "layout with duplicate treatment" "$bin" layout --treatments a,a --replicates 2
expect_status 2 "layout unit count mismatch" "$bin" layout --treatments a,b --replicates 4 --units "$work/units.txt"
expect_status 2 "layout zero replicates" "$bin" layout --replicates "a=0,b=2"
expect_status 3 "layout missing unit file" "$bin" layout --treatments a,b --replicates 3 --units "$work/none.txt"

if [ "$failures" -ne 0 ]; then
  echo "$failures check(s) failed"
  exit 1
fi
echo "all plan/layout command-line checks passed"
