#!/usr/bin/env bash
# Browser test: render the demo report in headless Chromium, screenshot it, and fail if the
# page is blank, logs a console error, or requests any network resource (Chromium's own log).
set -euo pipefail
cd "$(dirname "$0")/../.."
BIN="${EBULLIO:-target/debug/ebullio}"
WORK="$(mktemp -d)"
trap 'rm -rf "$WORK"' EXIT
"$BIN" demo --output "$WORK/demo" >/dev/null
CHROME="$(command -v chromium || command -v chromium-browser)"
"$CHROME" --headless --no-sandbox --disable-gpu --no-first-run --disable-background-networking \
  --disable-component-update --disable-sync --disable-quic --user-data-dir="$WORK/profile" \
  --enable-logging=stderr --v=1 --window-size=1200,2400 --hide-scrollbars \
  --screenshot="$WORK/shot.png" "file://$WORK/demo/report.html" 2>"$WORK/chrome.log" || true
test -s "$WORK/shot.png" || { echo "FAIL: no screenshot"; tail -20 "$WORK/chrome.log"; exit 1; }
python3 - "$WORK/shot.png" "$WORK/chrome.log" <<'PY'
import sys, zlib, struct, re
png, log = sys.argv[1], open(sys.argv[2], errors="replace").read()
data = open(png, "rb").read()
assert data[:8] == b"\x89PNG\r\n\x1a\n", "not a PNG"
# Blank check: the compressed image data of a blank page is tiny.
idat = b"".join(data[i+8:i+8+struct.unpack(">I", data[i:i+4])[0]] for i in [m.start()-4 for m in re.finditer(b"IDAT", data)])
raw = zlib.decompress(idat)
distinct = len(set(raw[::97]))
fail = []
if distinct < 4:
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
