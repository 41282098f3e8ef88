#!/usr/bin/env bash
# Families and adjustments from `compare`: every family with a step-wise adjustment, every
# family procedure on the family it fits, every output format, and the refusals (one error
# line, exit 4) for families a procedure does not fit. Data: the bundled substrate trial.
set -u
bin="$1"; tests="$2"; data="$tests/../data/substrate_trial.csv"
args=(compare "$data" --group substrate --response fresh_mass_g --seed 7)
tmp="$(mktemp -d)"; trap 'rm -rf "$tmp"' EXIT
failures=0; count=0

ok() {  # ok "text expected in the output" ARGS...
  local text="$1"; shift
  count=$((count + 1))
  if ! "$bin" "${args[@]}" "$@" >"$tmp/out" 2>"$tmp/err" </dev/null || ! grep -q -F -- "$text" "$tmp/out"; then
    echo "FAIL: contrasta ${args[*]} $* (want '$text' in the output)"; sed 's/^/    /' "$tmp/err"; failures=$((failures + 1))
  fi
}
refused() {  # refused "text in the message" ARGS...
  local text="$1"; shift
  count=$((count + 1))
  "$bin" "${args[@]}" "$@" >"$tmp/out" 2>"$tmp/err" </dev/null
  local got=$?
  if [ "$got" != 4 ] || ! grep -q -F -- "$text" "$tmp/err" || [ "$(wc -l <"$tmp/err")" != 1 ]; then
    echo "FAIL: contrasta ${args[*]} $* -> status $got (want 4 and '$text')"; sed 's/^/    /' "$tmp/err"; failures=$((failures + 1))
  fi
}

for family in all-pairs versus=peat helmert trend trend=1,2,4,8 trend-weighted adjacent grand-mean; do
  ok '"method": "holm"' --family "$family" --method pooled --adjust holm --format json
done
ok '"name": "linear"' --family trend=1,2,4,8 --method pooled --format json
ok '"name": "cubic (n-weighted)"' --family trend-weighted --method pooled --format json
for adjust in none bonferroni sidak hochberg bh by scheffe; do
  ok "\"method\": \"$adjust\"" --family helmert --method pooled,welch --adjust "$adjust" --format json
done
ok '"simultaneous_low"' --method pooled --adjust tukey --format json
ok 'Tukey-Kramer' --method pooled,welch --adjust tukey
ok 'Games & Howell' --method welch --adjust games-howell --format markdown
ok "'peat'" --family versus=peat --method pooled --adjust dunnett --format json
ok 'simultaneous_low' --family versus=peat --method pooled --adjust dunnett --alternative greater --format csv
ok 'adjusted by Holm instead' --method pooled,welch --adjust dunnett --family versus=peat
ok 'max-T step-down' --method welch,permutation,bootstrap --adjust maxt --resamples 999
ok '"method": "maxt"' --family versus=peat --method welch,pooled --adjust maxt --resamples 999 --format json
refused 'pairwise differences' --family helmert --method pooled --adjust tukey
refused 'many-to-one' --family all-pairs --method pooled --adjust dunnett
refused 'two-sided' --method pooled --adjust scheffe --alternative less

echo "$((count - failures)) passed, $failures failed"
[ "$failures" = 0 ]
