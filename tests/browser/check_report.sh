#!/usr/bin/env bash
# Browser test: render the demo report in headless Chromium, screenshot it, and fail if
# Chromium fails, the page is blank, it logs a console error, or it requests any network
# resource (Chromium's own log). The blank check is first shown to fire on an empty page.
set -euo pipefail
cd "$(dirname "$0")/../.."
BIN="${EBULLIO:-target/debug/ebullio}"
WORK="$(mktemp -d)"
trap 'rm -rf "$WORK"' EXIT
"$BIN" demo --output "$WORK/demo" >/dev/null
printf '<!doctype html><html><head><meta charset="utf-8"><title>empty</title></head><body></body></html>\n' >"$WORK/empty.html"
CHROME="$(command -v chromium || command -v chromium-browser)"
shoot() { # shoot PAGE PNG LOG
  local status=0
  "$CHROME" --headless --no-sandbox --disable-gpu --no-first-run --disable-background-networking \
    --disable-component-update --disable-sync --disable-quic --user-data-dir="$WORK/profile-$(basename "$2")" \
    --enable-logging=stderr --v=1 --window-size=1200,2400 --hide-scrollbars \
    --screenshot="$2" "file://$1" 2>"$3" || status=$?
  if [ "$status" -ne 0 ]; then
    echo "FAIL: chromium exited with status $status on $1"; tail -20 "$3"; exit 1
  fi
  test -s "$2" || { echo "FAIL: no screenshot of $1"; tail -20 "$3"; exit 1; }
}
shoot "$WORK/empty.html" "$WORK/empty.png" "$WORK/empty.log"
shoot "$WORK/demo/report.html" "$WORK/shot.png" "$WORK/chrome.log"
python3 - "$WORK/shot.png" "$WORK/chrome.log" "$WORK/empty.png" <<'PY'
import sys, zlib, struct, re

def pixels(path):
    """Decode an 8-bit RGB or RGBA PNG (what Chromium writes) into rows of pixels."""
    data = open(path, "rb").read()
    assert data[:8] == b"\x89PNG\r\n\x1a\n", "not a PNG"
    pos, idat, w = 8, b"", 0
    while pos < len(data):
        n, kind = struct.unpack(">I4s", data[pos:pos + 8])
        body = data[pos + 8:pos + 8 + n]
        if kind == b"IHDR":
            w, h, depth, ctype = struct.unpack(">IIBB", body[:10])
            assert depth == 8 and ctype in (2, 6), f"PNG type {ctype}/{depth}"
            bpp = 3 if ctype == 2 else 4
        elif kind == b"IDAT":
            idat += body
        pos += 12 + n
    raw, stride, prev, rows = zlib.decompress(idat), w * bpp, None, []
    for y in range(h):
        f, line = raw[y * (stride + 1)], bytearray(raw[y * (stride + 1) + 1:(y + 1) * (stride + 1)])
        prev = prev or bytearray(stride)
        for i in range(stride):
            a = line[i - bpp] if i >= bpp else 0
            b, c = prev[i], prev[i - bpp] if i >= bpp else 0
            if f == 1: line[i] = (line[i] + a) & 255
            elif f == 2: line[i] = (line[i] + b) & 255
            elif f == 3: line[i] = (line[i] + (a + b) // 2) & 255
            elif f == 4:
                p = a + b - c; pa, pb, pc = abs(p - a), abs(p - b), abs(p - c)
                line[i] = (line[i] + (a if pa <= pb and pa <= pc else b if pb <= pc else c)) & 255
        rows.append(bytes(line)); prev = line
    return [r[i:i + 3] for r in rows[::4] for i in range(0, len(r), bpp * 4)]

def blank(path):
    """Blank: under 2 % of (sampled) pixels differ from the commonest one, or under 8 colours."""
    px = pixels(path)
    counts = {}
    for p in px: counts[p] = counts.get(p, 0) + 1
    ink = 1 - max(counts.values()) / len(px)
    return ink < 0.02 or len(counts) < 8, ink, len(counts)

shot, log, empty = sys.argv[1], open(sys.argv[2], errors="replace").read(), sys.argv[3]
is_blank, ink, colours = blank(empty)
assert is_blank, f"the blank check missed an empty page ({ink:.3f} ink, {colours} colours)"
fail = []
is_blank, ink, colours = blank(shot)
print(f"report page: {100 * ink:.1f} % of pixels off the background, {colours} colours")
if is_blank:
    fail.append("page looks blank")
if re.search(r"CONSOLE.*(error|Uncaught)|:ERROR:CONSOLE", log, re.I):
    fail.append("console error")
net = [l for l in log.splitlines() if re.search(r"(https?|wss?)://(?!www\.w3\.org/2000/svg)", l) and re.search(r"url_request|URLLoader|Requesting|navigat", l, re.I)]
if net:
    fail.append("network request: " + net[0][:200])
if fail:
    print("FAIL:", "; ".join(fail)); sys.exit(1)
print("browser: report rendered, not blank, no console error, no network request")
print("1 passed, 0 failed")
PY
if [ -n "${SCREENSHOT_TO:-}" ]; then cp "$WORK/shot.png" "$SCREENSHOT_TO"; fi
