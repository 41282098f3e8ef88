#!/usr/bin/env bash
# `contrasta report` from the command line: the HTML and Markdown outputs on the demo data,
# every linked SVG file present and well-formed XML, user data escaped, the exit statuses of
# the interface and no partial file after a failed run.
# $1 = contrasta binary, $2 = tests directory.
set -euo pipefail
contrasta=$1
tests=$2
data="$tests/../data"
work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT
fail() {
  echo "FAIL: $*" >&2
  exit 1
}

# Each demo dataset gives a report in both forms.
"$contrasta" report "$data/substrate_trial.csv" --group substrate --response fresh_mass_g \
  --contrast-file "$data/substrate_trial.contrasts" --method pooled,welch --adjust holm --seed 7 --quiet \
  -o "$work/substrate.html"
"$contrasta" report "$data/cracker_panel.csv" --group recipe --response crisp \
  --contrast-file "$data/cracker_panel.contrasts" --seed 7 --quiet -o "$work/cracker.md"
"$contrasta" report "$data/extraction_wide.csv" --wide --contrast-file "$data/extraction_wide.contrasts" \
  --seed 7 --quiet -o "$work/extraction.html"
for f in substrate.html extraction.html; do
  grep -q '<table class="agreement">' "$work/$f" || fail "$f has no agreement table"
  grep -q 'id="figure-observations"' "$work/$f" || fail "$f has no observation plot"
  if grep -qE 'https?:|src=|url\(' "$work/$f"; then fail "$f refers to something outside itself"; fi
done
grep -q -- '--seed 7' "$work/substrate.html" || fail "the reproducing command lacks the seed"
# The mean interval beside each group: scipy.stats.t.ppf(0.975, 7) * s / sqrt(8) around the coir
# mean gives 51.575 [47.7426, 55.4074] (scipy 1.10.1), shown to four digits.
grep -qF 'mean 51.58  [47.74, 55.41]' "$work/substrate.html" || fail "the coir mean interval differs from scipy's"

# Markdown: every linked figure exists beside the file and is well-formed XML.
links=$(grep -o '](cracker-[^)]*\.svg)' "$work/cracker.md" | sed 's/^](//; s/)$//')
[[ -n $links ]] || fail "the Markdown report links no figure"
while IFS= read -r name; do
  [[ -f "$work/$name" ]] || fail "linked figure $name was not written"
  /usr/bin/python3 -c 'import sys, xml.etree.ElementTree as E; E.parse(sys.argv[1])' "$work/$name" ||
    fail "$name is not well-formed XML"
done <<<"$links"
grep -q '^| rye vs classic |' "$work/cracker.md" || fail "the Markdown report lacks the contrast rows"

# A resampling method brings the histogram of its null distribution (Markdown: its own file).
"$contrasta" report "$data/substrate_trial.csv" --group substrate --response fresh_mass_g -c 'coir - peat' \
  --method welch,permutation --resamples 999 --seed 5 --quiet -o "$work/perm.html"
grep -q 'id="figure-null-1"' "$work/perm.html" || fail "a permutation report has no null histogram"
grep -q 'observed t = ' "$work/perm.html" || fail "the null histogram does not mark the observed statistic"
"$contrasta" report "$data/substrate_trial.csv" --group substrate --response fresh_mass_g -c 'coir - peat' \
  --method permutation --resamples 999 --seed 5 --quiet -o "$work/perm.md"
[[ -f $work/perm-null-1.svg ]] || fail "the Markdown report did not write its null histogram"

# A drawn seed is written into the reproducing command.
"$contrasta" report "$data/substrate_trial.csv" --group substrate --response fresh_mass_g --quiet -o "$work/drawn.html"
grep -qE -- '--seed [0-9]+' "$work/drawn.html" || fail "a drawn seed is missing from the reproducing command"

# Hostile names in the data and in the file name stay text.
hostile="$work/<b>trial.csv"
{
  echo 'treatment,yield'
  printf '%s\n' 'control,10.1' 'control,11.3' 'control,9.8' '<img src=x onerror=alert(1)>,12.2' \
    '<img src=x onerror=alert(1)>,13.0' '<img src=x onerror=alert(1)>,12.7'
} >"$hostile"
"$contrasta" report "$hostile" --method welch --seed 1 --quiet -o "$work/hostile.html"
"$contrasta" report "$hostile" --method welch --seed 1 --quiet -o "$work/hostile.md"
# (Inside the Markdown code fence that holds the reproducing command, text is literal by
# definition, so the fence is left out of the check.)
awk '/^```/ { fenced = !fenced; next } !fenced' "$work/hostile.md" >"$work/hostile-unfenced.md"
for f in hostile.html hostile-unfenced.md; do
  if grep -q '<img' "$work/$f"; then fail "$f carries a raw <img> element"; fi
  if grep -q '<b>trial' "$work/$f"; then fail "$f carries the raw file name"; fi
done
grep -qF '&lt;img src=x onerror=alert(1)&gt;' "$work/hostile.html" || fail "the level name is not escaped"

# Errors: exit statuses of the interface, one error line, and no file left behind.
set +e
"$contrasta" report "$data/substrate_trial.csv" --group substrate --response fresh_mass_g -o "$work/x.pdf" 2>"$work/err"
status=$?
set -e
[[ $status -eq 2 ]] || fail "an unknown report format gave exit $status, expected 2"
grep -q '^error: .*\.html or \.md' "$work/err" || fail "the format error does not say what to do"
set +e
"$contrasta" report "$data/substrate_trial.csv" --group substrate --response fresh_mass_g -c 'basalt - peat' \
  -o "$work/failed.html" 2>"$work/err"
status=$?
set -e
[[ $status -eq 4 ]] || fail "a contrast with an unknown level gave exit $status, expected 4"
[[ ! -e $work/failed.html ]] || fail "a failed run left a report behind"
[[ -z $(find "$work" -name '*.tmp-*') ]] || fail "a failed run left a temporary file behind"
set +e
"$contrasta" report "$data/substrate_trial.csv" --group substrate --response fresh_mass_g,height_cm \
  -o "$work/two.html" 2>"$work/err"
status=$?
set -e
# Several responses (batch mode): one complete report per response, named after the response.
[[ $status -eq 0 ]] || fail "two responses gave exit $status, expected 0"
[[ -s $work/two-fresh_mass_g.html && -s $work/two-height_cm.html ]] || fail "batch reports missing"
grep -q "height_cm" "$work/two-height_cm.html" || fail "batch report does not name its response"
[[ ! -e $work/two.html ]] || fail "batch mode wrote the plain file name too"
echo "report command: HTML and Markdown on the demo data, figures, escaping and errors behave"
