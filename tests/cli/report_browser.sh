#!/usr/bin/env bash
# Renders the demo report in a real browser (Debian's headless chromium): the dumped DOM must
# hold the plots and tables, a level named <script>alert(1)</script> must arrive as text, and
# the screenshot must not be blank. Installs nothing. Without chromium: fails when CI=true,
# skips with a message otherwise.
# $1 = contrasta binary, $2 = tests directory.
set -euo pipefail
contrasta=$1
tests=$2
data="$tests/../data"
browser=/usr/bin/chromium

if [[ ! -x $browser ]]; then
  if [[ ${CI:-} == true ]]; then
    echo "FAIL: $browser is missing; the CI setup must install Debian's chromium package" >&2
    exit 1
  fi
  echo "SKIP: $browser not found (apt-get install chromium to run this test)"
  exit 0
fi

work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT

fail() {
  echo "FAIL: $*" >&2
  exit 1
}

# A fresh profile for every run, and nothing that talks to the network.
render() {
  timeout 120 "$browser" --headless --no-sandbox --disable-gpu --disable-quic --no-first-run \
    --disable-background-networking --disable-component-update --disable-sync \
    --user-data-dir="$(mktemp -d "$work/profile.XXXXXX")" --hide-scrollbars "$@" 2>>"$work/browser.log"
}

"$contrasta" report "$data/substrate_trial.csv" --group substrate --response fresh_mass_g \
  --contrast-file "$data/substrate_trial.contrasts" --method all --adjust holm --seed 20261201 \
  --quiet -o "$work/demo.html"

render --dump-dom "file://$work/demo.html" >"$work/dom.html" || fail "chromium could not load the report (see $work/browser.log)"
dom=$(cat "$work/dom.html")
svgs=$(grep -o '<svg' <<<"$dom" | wc -l)
(( svgs >= 2 )) || fail "the rendered page has $svgs SVG plots, expected at least 2"
for needle in 'id="figure-observations"' 'id="figure-forest-data"' '<table class="groups">' \
  '<table class="results">' '<table class="agreement">' 'peat-free vs peat' 'coir vs wood fibre' \
  'Reproduce this report' 'Cautions'; do
  grep -qF "$needle" <<<"$dom" || fail "the rendered page lacks $needle"
done

# Escaping: the hostile level name must be text in the DOM, never an element.
{
  echo 'treatment,yield'
  printf '%s\n' 'control,10.1' 'control,11.3' 'control,9.8' 'control,10.6' \
  '<script>alert(1)</script>,12.2' '<script>alert(1)</script>,13.0' '<script>alert(1)</script>,12.7' \
  '<script>alert(1)</script>,11.9'
} >"$work/hostile.csv"
"$contrasta" report "$work/hostile.csv" --method pooled,welch --seed 1 --quiet -o "$work/hostile.html"
render --dump-dom "file://$work/hostile.html" >"$work/hostile-dom.html" || fail "chromium could not load the hostile report"
grep -q '<script' "$work/hostile-dom.html" && fail "a <script> element reached the DOM"
grep -qF '&lt;script&gt;alert(1)&lt;/script&gt;' "$work/hostile-dom.html" || fail "the level name is not shown as text"

render --window-size=1000,2400 --screenshot="$work/demo.png" "file://$work/demo.html" >/dev/null ||
  fail "chromium could not take a screenshot"
[[ -s $work/demo.png ]] || fail "no screenshot was written"

# Not blank: decode the PNG with zlib alone and count pixels that differ from the most common
# (background) colour and pixels dark enough to be text.
/usr/bin/python3 - "$work/demo.png" <<'PY' || fail "the screenshot looks blank"
import struct, sys, zlib
from collections import Counter
data = open(sys.argv[1], "rb").read()
assert data[:8] == b"\x89PNG\r\n\x1a\n", "not a PNG"
pos, idat, width, height, channels = 8, b"", 0, 0, 0
while pos < len(data):
    length, kind = struct.unpack(">I4s", data[pos:pos + 8])
    body = data[pos + 8:pos + 8 + length]
    if kind == b"IHDR":
        width, height, depth, colour = struct.unpack(">IIBB", body[:10])
        assert depth == 8 and colour in (2, 6), "unexpected PNG format"
        channels = 3 if colour == 2 else 4
    elif kind == b"IDAT":
        idat += body
    pos += 12 + length
raw = zlib.decompress(idat)
stride = width * channels
previous = bytearray(stride)
pixels = Counter()
dark = 0
for y in range(height):
    line = raw[y * (stride + 1):(y + 1) * (stride + 1)]
    kind, row = line[0], bytearray(line[1:])
    for i in range(stride):
        a = row[i - channels] if i >= channels else 0
        b = previous[i]
        c = previous[i - channels] if i >= channels else 0
        if kind == 1: row[i] = (row[i] + a) & 255
        elif kind == 2: row[i] = (row[i] + b) & 255
        elif kind == 3: row[i] = (row[i] + (a + b) // 2) & 255
        elif kind == 4:
            p = a + b - c
            pa, pb, pc = abs(p - a), abs(p - b), abs(p - c)
            row[i] = (row[i] + (a if pa <= pb and pa <= pc else b if pb <= pc else c)) & 255
    previous = row
    if y % 2:  # every other row is plenty for a count
        continue
    for x in range(0, stride, channels):
        rgb = bytes(row[x:x + 3])
        pixels[rgb] += 1
        if sum(rgb) < 300:
            dark += 1
total = sum(pixels.values())
background = pixels.most_common(1)[0][1]
other = (total - background) / total
print(f"screenshot {width}x{height}: {other:.1%} of pixels differ from the background, {dark} dark pixels")
sys.exit(0 if other > 0.05 and dark > 2000 else 1)
PY
echo "report renders in chromium: $svgs plots, tables present, escaping holds, screenshot not blank"
