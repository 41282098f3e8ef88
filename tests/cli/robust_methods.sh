#!/usr/bin/env bash
# The robust and rank methods from the command line, in every output format.
# $1 = contrasta binary, $2 = tests directory. Reference values: scipy 1.10.1 on the demo data
# data/cracker_panel.csv (crisp, seeded vs rye): mannwhitneyu U = 60.5, p = 0.438457500033;
# brunnermunzel W = -0.80809087288197, p = 0.42974368387; ttest_ind(trim=0.2, equal_var=False)
# t = 0.885614885540, p = 0.396666335786.
set -u
bin="$1"
data="$2/../data/cracker_panel.csv"
fail=0
check() {  # check NAME COMMAND... ; fails unless the command succeeds
  if ! "${@:2}" >/dev/null 2>&1; then echo "FAIL: $1"; fail=1; fi
}
out=$("$bin" compare "$data" --group recipe --response crisp -c "seeded - rye" \
  --method trimmed,mann-whitney,brunner-munzel,dunn --format csv --quiet) || { echo "FAIL: csv run"; exit 1; }
check "mann-whitney U" grep -q "seeded - rye,mann-whitney,1,,U,60.5,,0.438457500033" <<<"$out"
check "brunner-munzel W" grep -q "brunner-munzel,[^,]*,[^,]*,W,-0.808090872881" <<<"$out"
check "trimmed t" grep -q "trimmed,[^,]*,[^,]*,t,0.885614885540" <<<"$out"
check "dunn row" grep -q "seeded - rye,dunn," <<<"$out"
# The rank contrast: exact for two levels of 10 (184756 arrangements), scipy.stats.permutation_test
# over rankdata with |Welch t| gives p = 0.462101366126 on these data.
rank=$("$bin" compare "$data" --group recipe --response crisp -c "seeded - rye" --method rank --format csv --quiet --seed 1)
check "rank exact p" grep -q "seeded - rye,rank,[^,]*,[^,]*,t,[^,]*,,0.462101366126" <<<"$rank"
check "rank exact flag" grep -q ",true," <<<"$rank"
for format in table json csv markdown; do
  check "format $format" "$bin" compare "$data" --group recipe --response crisp --family all-pairs \
    --method trimmed,mann-whitney,brunner-munzel,dunn,rank --adjust holm --resamples 999 --seed 2 --format "$format" --quiet
done
json=$("$bin" compare "$data" --group recipe --response crisp -c "seeded - rye" --method brunner-munzel --format json --quiet)
check "json null hypothesis in words" grep -q '"null": "the two distributions are stochastically equal' <<<"$json"
# --trim out of range is refused.
if "$bin" compare "$data" --group recipe --response crisp --method trimmed --trim 0.5 >/dev/null 2>&1; then
  echo "FAIL: --trim 0.5 accepted"; fail=1
fi
exit $fail
