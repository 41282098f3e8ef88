#!/usr/bin/env bash
# Bad-input corpus (quality.md, reliability): every case must exit with the documented status
# (2 usage, 3 input data, 4 analysis) and print exactly one line on standard error, beginning
# "error:" and containing the expected hint. Common practice: no stack trace, no crash.
set -u
bin="$1"; tests="$2"; bad="$tests/bad"
tmp="$(mktemp -d)"; trap 'rm -rf "$tmp"' EXIT
failures=0; count=0

expect() {  # expect STATUS "text in message" ARGS...
  local want="$1" text="$2"; shift 2
  count=$((count + 1))
  "$bin" "$@" >"$tmp/out" 2>"$tmp/err" </dev/null
  local got=$?
  local lines; lines=$(wc -l <"$tmp/err")
  if [ "$got" != "$want" ] || ! grep -q -F -- "$text" "$tmp/err" || [ "$lines" != 1 ] || ! head -c 7 "$tmp/err" | grep -q '^error: '; then
    echo "FAIL: contrasta $* -> status $got (want $want), stderr:"; sed 's/^/    /' "$tmp/err"
    failures=$((failures + 1))
  fi
}

expect 3 "is empty" compare "$bad/empty.csv"
expect 3 "is empty" compare "$bad/bom_only.csv"
expect 3 "no data rows" compare "$bad/header_only.csv"
expect 4 "at least two" compare "$bad/one_group.csv"
expect 4 "at least two observations" compare "$bad/group_of_one.csv" --method welch
expect 4 "no observations" compare "$bad/all_missing_group.csv" -c "bark - peat" --method welch
expect 4 "constant" compare "$bad/constant_groups.csv" --method welch
expect 4 "constant" compare "$bad/constant_groups.csv" --method pooled
expect 3 "is not a number" compare "$bad/nan_text.csv"
expect 3 "infinite" compare "$bad/inf_text.csv"
expect 3 "too large" compare "$bad/huge_number.csv"
expect 4 "unknown level 'z'" compare "$bad/two_levels.csv" -c "x - z"
expect 4 "did you mean 'x'" compare "$bad/two_levels.csv" -c "X - y"
expect 4 "sum to" compare "$bad/two_levels.csv" -c "x + y"
expect 4 "closing ')'" compare "$bad/two_levels.csv" -c "x - (y"
expect 4 "multiplied" compare "$bad/two_levels.csv" -c "x*y - y"
expect 4 "every coefficient zero" compare "$bad/two_levels.csv" -c "x - x"
expect 4 "gives 3 numbers for 2 levels" compare "$bad/two_levels.csv" --coefficients "k: 1,-1,0"
expect 3 "fields where the header has" compare "$bad/ragged.csv"
expect 3 "quoted field is not closed" compare "$bad/unclosed_quote.csv"
expect 3 "not valid UTF-8" compare "$bad/invalid_utf8.csv"
expect 3 "--group" compare "$bad/three_columns.csv"
expect 3 "no column named 'nope'" compare "$bad/three_columns.csv" --group substrate --response nope
expect 3 "is not a number" compare "$bad/not_a_number.csv"
expect 3 "--decimal-comma" compare "$bad/decimal_comma.csv"
expect 3 "two columns are named" compare "$bad/duplicate_header.csv"
expect 3 "not a finite number" compare "$bad/wide_bad_cell.csv" --wide
expect 3 "the level is empty" compare "$bad/empty_level.csv"
expect 3 "cannot open" compare "$bad/does_not_exist.csv"
expect 3 "cannot open contrast file" compare "$bad/two_levels.csv" --contrast-file "$bad/no_such.contrasts"
expect 3 "is empty" compare -
expect 2 "is not known" compare "$bad/two_levels.csv" --method nonsense
expect 2 "alternative" compare "$bad/two_levels.csv" --alternative sideways
expect 2 "--trim" compare "$bad/two_levels.csv" --trim 0.6
expect 2 "--family" compare "$bad/two_levels.csv" --family everything
expect 2 "contrasta compare --help" compare "$bad/two_levels.csv" --no-such-option
expect 2 "not in range" compare "$bad/two_levels.csv" --conf 1.5

# Generated inputs: a million levels, a 100 MB field, a number with 400 digits.
/usr/bin/env python3 - "$tmp" <<'PY'
import sys, os
d = sys.argv[1]
with open(os.path.join(d, "many_levels.csv"), "w") as f:
    f.write("level,y\n")
    for i in range(1_000_000):
        f.write(f"L{i},{i % 17}.5\n")
with open(os.path.join(d, "big_field.csv"), "w") as f:
    f.write("level,y\na,1\na,2\nb,3\nb,")
    f.write("9" * 50 + "x" * (100 * 1024 * 1024))
    f.write("\n")
with open(os.path.join(d, "long_number.csv"), "w") as f:
    f.write("level,y\na,1\na,2\nb,3\nb," + "7" * 400 + "\n")
PY
expect 4 "pairs" compare "$tmp/many_levels.csv"
expect 3 "is not a number" compare "$tmp/big_field.csv"
expect 3 "too large" compare "$tmp/long_number.csv"

# An output file is never left half-written: a failing run leaves no file and no temporary.
"$bin" compare "$bad/constant_groups.csv" --method welch -o "$tmp/out.json" --format json 2>/dev/null
count=$((count + 1))
if [ -e "$tmp/out.json" ] || ls -A "$tmp" | grep -q 'tmp-'; then
  echo "FAIL: a failed run left an output file behind"; failures=$((failures + 1))
fi

echo "bad-input corpus: $((count - failures)) passed, $failures failed"
[ "$failures" = 0 ]
