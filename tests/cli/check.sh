#!/usr/bin/env bash
# contrasta check end to end: $1 = contrasta binary, $2 = tests directory.
set -u
bin="$1"
data="$2/../data"
tmp="$(mktemp -d)"
trap 'rm -rf "$tmp"' EXIT
failures=0
passes=0
fail() { echo "FAIL: $*"; failures=$((failures + 1)); }
pass() { passes=$((passes + 1)); }
expect_status() {  # expected-status description command...
  local want="$1" what="$2"
  shift 2
  "$@" >"$tmp/out" 2>"$tmp/err"
  local got=$?
  if [ "$got" -ne "$want" ]; then fail "$what: exit $got, expected $want; stderr: $(head -c 300 "$tmp/err")"; else pass; fi
}
expect_text() {  # file pattern description
  if grep -q -- "$2" "$1"; then pass; else fail "$3: '$2' not found"; fi
}

substrate=("$data/substrate_trial.csv" --group substrate --response fresh_mass_g)

# Table: every section, in the order of the interface (summaries, diagnostics, overall, advice).
expect_status 0 "check table" "$bin" check "${substrate[@]}" --seed 5
for section in LEVELS SHAPE SPREAD "TIES AND SCALE" OUTLIERS "OVERALL TESTS" ADVICE welch-f brown-forsythe-f \
  alexander-govern kruskal-wallis levene-median fligner "SD ratio" "Zimmerman 2004"; do
  expect_text "$tmp/out" "$section" "check table"
done
order=$(grep -o -e '^LEVELS' -e '^SPREAD' -e '^OVERALL TESTS' -e '^ADVICE' "$tmp/out" | tr '\n' ' ')
[ "$order" = "LEVELS SPREAD OVERALL TESTS ADVICE " ] && pass || fail "section order: $order"

# JSON: the fixed keys of interface.md.
expect_status 0 "check json" "$bin" check "${substrate[@]}" --seed 5 --format json
cp "$tmp/out" "$tmp/check.json"
if [ -x /usr/bin/python3 ]; then
  /usr/bin/python3 - "$tmp/check.json" <<'PY' && pass || fail "check json keys"
import json, sys
d = json.load(open(sys.argv[1]))
for k in ["groups", "anova", "overall", "diagnostics", "recommendation"]:
    assert k in d, k
for k in ["variance", "normality", "sd_ratio", "n_ratio", "outliers"]:
    assert k in d["diagnostics"], k
assert [t["test"] for t in d["overall"]][:2] == ["anova-f", "welch-f"]
assert all(t["df2"] is None for t in d["overall"] if t["test"] == "kruskal-wallis")
assert {"levene-mean", "levene-median", "bartlett", "fligner"} <= {t["test"] for t in d["diagnostics"]["variance"]}
assert d["diagnostics"]["normality"][-1]["level"] is None
assert d["recommendation"]["method"] and d["recommendation"]["reasons"]
assert "calibration" not in d
PY
fi

# The outlier of the wide extraction file, with its row in the input file (row 5 = 4th data line).
expect_status 0 "check wide" "$bin" check "$data/extraction_wide.csv" --wide --seed 5 --format json
if [ -x /usr/bin/python3 ]; then
  /usr/bin/python3 - "$tmp/out" <<'PY' && pass || fail "wide outlier row"
import json, sys
d = json.load(open(sys.argv[1]))
o = d["diagnostics"]["outliers"]
assert any(x["level"] == "microwave" and x["row"] == 5 and abs(x["value"] - 71.4) < 1e-9 for x in o), o
assert "R3 heavy tails or outliers" in d["recommendation"]["rules"]
PY
fi

# The 0-10 panel: the discrete-scale rule.
expect_status 0 "check panel" "$bin" check "$data/cracker_panel.csv" --group recipe --response crisp --seed 5
expect_text "$tmp/out" "whole numbers from" "panel ties"

# Calibration: same seed, same output, whatever the thread count.
expect_status 0 "calibrate 1 thread" "$bin" check "${substrate[@]}" --seed 9 --calibrate --datasets 200 --threads 1 --format json
cp "$tmp/out" "$tmp/one.json"
expect_status 0 "calibrate 2 threads" "$bin" check "${substrate[@]}" --seed 9 --calibrate --datasets 200 --threads 2 --format json
cmp -s "$tmp/one.json" "$tmp/out" && pass || fail "calibration differs between --threads 1 and 2"
expect_text "$tmp/out" '"type1_error"' "calibration json"
expect_status 0 "calibrate table with effect" "$bin" check "${substrate[@]}" --seed 9 --calibrate --datasets 100 --effect 5
expect_text "$tmp/out" "CALIBRATION" "calibration table"
expect_text "$tmp/out" "power" "calibration power"

# CSV (tidy) and Markdown.
expect_status 0 "check csv" "$bin" check "${substrate[@]}" --seed 5 --format csv
head -1 "$tmp/out" | grep -qx "section,name,level,row,quantity,value" && pass || fail "csv header: $(head -1 "$tmp/out")"
expect_text "$tmp/out" "^variance,levene-median,,,p_value," "csv variance row"
expect_status 0 "check markdown" "$bin" check "${substrate[@]}" --seed 5 --format markdown
expect_text "$tmp/out" "^## Advice" "markdown"

# -o writes the file; batch mode over two responses.
expect_status 0 "check -o" "$bin" check "${substrate[@]}" --seed 5 --format json -o "$tmp/written.json"
[ -s "$tmp/written.json" ] && pass || fail "-o wrote nothing"
expect_status 0 "check batch" "$bin" check "$data/substrate_trial.csv" --group substrate --response fresh_mass_g,height_cm --seed 5 --format json
expect_text "$tmp/out" '"responses"' "batch json"

# compare shows the overall tests above its contrasts and marks the advised method.
expect_status 0 "compare" "$bin" compare "${substrate[@]}" --seed 5
overall_line=$(grep -n '^OVERALL TESTS' "$tmp/out" | cut -d: -f1)
contrast_line=$(grep -n '^CONTRASTS' "$tmp/out" | cut -d: -f1)
[ -n "$overall_line" ] && [ -n "$contrast_line" ] && [ "$overall_line" -lt "$contrast_line" ] && pass || fail "compare: overall tests not above contrasts"
expect_text "$tmp/out" "(advised)" "compare advised method"

# Errors: one line beginning error:, with the interface's exit statuses.
expect_status 2 "--effect without --calibrate" "$bin" check "${substrate[@]}" --effect 3
expect_text "$tmp/err" "^error:" "usage error line"
expect_status 2 "unknown calibration method" "$bin" check "${substrate[@]}" --calibrate --calibrate-methods welch,bogus --datasets 20
expect_text "$tmp/err" "^error: calibration method 'bogus' is not known" "unknown calibration method message"
expect_status 3 "missing file" "$bin" check "$tmp/no-such-file.csv"
printf 'g,y\na,1\na,2\na,3\n' >"$tmp/one_level.csv"
expect_status 4 "one level" "$bin" check "$tmp/one_level.csv"
expect_text "$tmp/err" "^error:" "analysis error line"
printf 'g,y\na,1\na,2\nb,3\n' >"$tmp/group_of_one.csv"
expect_status 0 "group of one" "$bin" check "$tmp/group_of_one.csv" --seed 1
expect_text "$tmp/out" "use pooled" "group of one advice"

echo "check.sh: $passes passed, $failures failed"
[ "$failures" -eq 0 ]
