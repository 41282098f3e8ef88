#!/usr/bin/env bash
# compare from the command line: every output format and every input variant of interface.md.
# Each input variant encodes the same small dataset, so each must give the same estimates.
set -u
bin="$1"; tests="$2"; data="$tests/../data"
tmp="$(mktemp -d)"; trap 'rm -rf "$tmp"' EXIT
failures=0; count=0
ok() { count=$((count + 1)); }
fail() { count=$((count + 1)); failures=$((failures + 1)); echo "FAIL: $*"; }

# One dataset, many spellings. Levels "high dose" and "no dose", a missing value, a quoted field.
printf 'treatment,yield\nno dose,10.5\nhigh dose,12.25\nno dose,11.0\nhigh dose,13.0\nno dose,NA\nhigh dose,12.75\nno dose,9.5\n' > "$tmp/plain.csv"
printf 'treatment\tyield\nno dose\t10.5\nhigh dose\t12.25\nno dose\t11.0\nhigh dose\t13.0\nno dose\tNA\nhigh dose\t12.75\nno dose\t9.5\n' > "$tmp/tab.tsv"
printf 'treatment;yield\r\nno dose;10,5\r\nhigh dose;12,25\r\nno dose;11,0\r\nhigh dose;13,0\r\nno dose;\r\nhigh dose;12,75\r\nno dose;9,5\r\n' > "$tmp/semicolon.csv"
printf '\xef\xbb\xbf"treatment","yield"\r\n"no dose","10.5"\r\n"high dose",12.25\r\n"no dose",11.0\r\n"high dose",13.0\r\n"no dose",.\r\n"high dose","12.75"\r\n"no dose",9.5' > "$tmp/quoted_bom_crlf.csv"
printf 'high dose,no dose\n12.25,10.5\n13.0,11.0\n12.75,NA\n,9.5\n' > "$tmp/wide.csv"
printf 'treatment,yield,plot\nno dose,10.5,1\nhigh dose,12.25,2\nno dose,11.0,3\nhigh dose,13.0,4\nno dose,missing,5\nhigh dose,12.75,6\nno dose,9.5,7\n' > "$tmp/extra.csv"

estimate() { /usr/bin/python3 -c 'import json,sys; d=json.load(sys.stdin); print(round(d["contrasts"][0]["results"][0]["estimate"], 12))'; }
want="$("$bin" compare "$tmp/plain.csv" -c "[high dose] - [no dose]" --method welch --format json --seed 1 | estimate)"
[ "$want" = "2.333333333333" ] && ok || fail "plain estimate $want"
for variant in "tab.tsv" "semicolon.csv --decimal-comma" "quoted_bom_crlf.csv" "wide.csv --wide" \
               "extra.csv --group treatment --response yield --missing missing"; do
  set -- $variant
  file="$1"; shift
  got="$("$bin" compare "$tmp/$file" "$@" -c "[high dose] - [no dose]" --method welch --format json --seed 1 | estimate)"
  [ "$got" = "$want" ] && ok || fail "variant $variant: estimate $got, want $want"
done
got="$("$bin" compare - -c "[high dose] - [no dose]" --method welch --format json --seed 1 < "$tmp/plain.csv" | estimate)"
[ "$got" = "$want" ] && ok || fail "stdin: $got"

# Missing counts per level, levels in order of first appearance, --levels reorders.
"$bin" compare "$tmp/plain.csv" --format json --seed 1 > "$tmp/out.json"
/usr/bin/python3 - "$tmp/out.json" <<'PY' && ok || fail "JSON keys"
import json, sys
d = json.load(open(sys.argv[1]))
for k in ["tool", "input", "seed", "groups", "anova", "contrasts", "adjust", "recommendation"]:
    assert k in d, k
assert d["tool"]["name"] == "contrasta"
assert d["input"]["levels"] == ["no dose", "high dose"], d["input"]["levels"]
assert d["input"]["n_total"] == 6 and d["input"]["n_missing"] == 1
assert [g["n_missing"] for g in d["groups"]] == [1, 0]
for k in ["level", "n", "n_missing", "mean", "sd", "variance", "median", "trimmed_mean", "winsorized_variance", "min", "max"]:
    assert k in d["groups"][0], k
for k in ["ss_between", "ss_within", "df_between", "df_within", "ms_between", "ms_within", "f", "p_value", "r_squared", "residual_sd"]:
    assert k in d["anova"], k
c = d["contrasts"][0]
assert c["name"] == "no dose - high dose" or c["name"] == "[no dose] - [high dose]", c["name"]
assert c["coefficients"] == {"no dose": 1, "high dose": -1}
for k in ["method", "estimate", "se", "statistic", "df", "p_value", "p_adjusted", "ci_low", "ci_high", "null", "resamples", "exact", "p_interval"]:
    assert k in c["results"][0], k
assert c["results"][0]["p_adjusted"] == c["results"][0]["p_value"]
assert d["adjust"]["method"] == "none"
PY
order="$("$bin" compare "$tmp/plain.csv" --levels "high dose,no dose" --format json --seed 1 | /usr/bin/python3 -c 'import json,sys; print(json.load(sys.stdin)["input"]["levels"])')"
[ "$order" = "['high dose', 'no dose']" ] && ok || fail "--levels order: $order"

# Every format on the demo data; -o writes atomically and the file is complete.
sub="$data/substrate_trial.csv"
for format in table json csv markdown; do
  "$bin" compare "$sub" --group substrate --response fresh_mass_g --contrast-file "$data/substrate_trial.contrasts" \
      --method pooled,welch --adjust holm --format "$format" --seed 7 -o "$tmp/result.$format" || { fail "format $format"; continue; }
  [ -s "$tmp/result.$format" ] && ok || fail "empty $format output"
done
/usr/bin/python3 -c 'import json,sys; json.load(open(sys.argv[1]))' "$tmp/result.json" && ok || fail "json parse"
lines=$(wc -l < "$tmp/result.csv"); [ "$lines" = 7 ] && ok || fail "csv rows: $lines (want header + 3 contrasts x 2 methods)"
head -1 "$tmp/result.csv" | grep -q '^contrast,method,estimate,se,' && ok || fail "csv header"
grep -q '^| contrast | method |' "$tmp/result.markdown" && ok || fail "markdown table"
grep -q "peat-free vs peat" "$tmp/result.table" && grep -q "protects:" "$tmp/result.table" && ok || fail "table content"
grep -q "a p-value is not an" "$tmp/result.table" && ok || fail "table cautions"
ls -A "$tmp" | grep -q 'tmp-' && fail "temporary file left behind" || ok

# Same seed, same output; help texts exist and show an example.
a="$("$bin" compare "$sub" --group substrate --response fresh_mass_g --format json --seed 11)"
b="$("$bin" compare "$sub" --group substrate --response fresh_mass_g --format json --seed 11 --threads 1)"
[ "$a" = "$b" ] && ok || fail "same seed differs"
"$bin" --help | grep -q "Example" && ok || fail "top help example"
"$bin" compare --help | grep -q "Examples:" && ok || fail "compare help example"
"$bin" demo > "$tmp/demo.txt" 2>&1 && grep -q "peat-free vs peat" "$tmp/demo.txt" && ok || fail "demo"

echo "compare formats and inputs: $((count - failures)) passed, $failures failed"
[ "$failures" = 0 ]
