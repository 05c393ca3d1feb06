#!/usr/bin/env bash
# `ebullio check` on a generated 10,000,000-row Parquet table (SMILES on every row): throughput
# and peak memory (GNU time), to show that memory follows --batch-rows rather than the table.
# usage: bench/check_large.sh [ROWS] [BATCH_ROWS]   (run from the repository root)
# Needs polars in bench/out/venv (bench/run creates it) to write the Parquet file. Writes under
# bench/out/large/ (git-ignored) and deletes the table and the output afterwards (about 0.4 GB
# of disk at 10,000,000 rows while it runs).
set -euo pipefail
ROWS=${1:-10000000}
BATCH=${2:-65536}
BIN=${BIN:-target/release/ebullio}
PY=${PY:-bench/out/venv/bin/python}
[ -x "$BIN" ] || cargo build --release
DIR=bench/out/large
mkdir -p "$DIR"
trap 'rm -f "$DIR/table.parquet" "$DIR/table.parquet.csv" "$DIR/checked.parquet"' EXIT
echo "generating $ROWS rows ..."
"$PY" bench/gen_check_table.py "$ROWS" "$DIR/table.parquet" --smiles
ls -l "$DIR/table.parquet"
echo "load average before: $(cut -d' ' -f1-3 /proc/loadavg) on $(nproc) cores"
/usr/bin/time -v "$BIN" check "$DIR/table.parquet" --batch-rows "$BATCH" -o "$DIR/checked.parquet" \
    2>"$DIR/time.txt" >/dev/null || true
echo "load average after: $(cut -d' ' -f1-3 /proc/loadavg)"
grep -m1 "^checked" "$DIR/time.txt" || { tail -5 "$DIR/time.txt"; exit 1; }
secs=$(grep "Elapsed (wall clock)" "$DIR/time.txt" | awk '{print $NF}' \
    | awk -F: '{ if (NF==3) print $1*3600+$2*60+$3; else print $1*60+$2 }')
mem=$(grep "Maximum resident" "$DIR/time.txt" | awk '{print $NF}')
cpu=$(awk -F': ' '/User time|System time/ {s += $2} END {print s}' "$DIR/time.txt")
python3 -c "print(f'{$ROWS:,} rows in {$secs:.1f} s = {$ROWS/$secs:,.0f} rows/s, CPU {$cpu:.1f} s, peak RSS {$mem/1024:.0f} MB (--batch-rows $BATCH)')"
