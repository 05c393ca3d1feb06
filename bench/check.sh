#!/usr/bin/env bash
# Throughput and peak memory of `ebullio check` on generated 1,000,000-row tables,
# without and with SMILES on every row. Uses the release binary.
# usage: bench/check.sh [ROWS]   (run from the repository root)
set -euo pipefail
ROWS=${1:-1000000}
BIN=${BIN:-target/release/ebullio}   # BIN=path/to/ebullio compares another build
[ -x "$BIN" ] || cargo build --release
DIR=$(mktemp -d)
trap 'rm -rf "$DIR"' EXIT
python3 bench/gen_check_table.py "$ROWS" "$DIR/plain.csv"
python3 bench/gen_check_table.py "$ROWS" "$DIR/smiles.csv" --smiles
echo "load average before: $(cut -d' ' -f1-3 /proc/loadavg) on $(nproc) cores"
for kind in plain smiles; do
  /usr/bin/time -v "$BIN" check "$DIR/$kind.csv" -o "$DIR/$kind.out.csv" \
    2>"$DIR/$kind.time" >/dev/null || true
  secs=$(grep "Elapsed (wall clock)" "$DIR/$kind.time" | awk '{print $NF}' \
    | awk -F: '{ if (NF==3) print $1*3600+$2*60+$3; else print $1*60+$2 }')
  mem=$(grep "Maximum resident" "$DIR/$kind.time" | awk '{print $NF}')
  cpu=$(awk -F': ' '/User time|System time/ {s += $2} END {print s}' "$DIR/$kind.time")
  rows=$(($(wc -l < "$DIR/$kind.out.csv") - 1))
  python3 -c "print(f'$kind: {$rows} rows in {$secs:.2f} s = {$rows/$secs:,.0f} rows/s, CPU {$cpu:.2f} s, peak RSS {$mem/1024:.0f} MB')"
  grep -m3 -E "^checked|slip-pressure-unit" "$DIR/$kind.time" || true
done
