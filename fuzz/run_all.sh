#!/usr/bin/env bash
# Run every fuzz target one after another on one core, SECS seconds each (default 600),
# restarting a target after a crash until its time is used up. Logs and a summary go to
# fuzz/logs/ (git-ignored); crashing inputs to fuzz/artifacts/TARGET/.
# usage: fuzz/run_all.sh [SECS] [TARGET...]   (run from the repository root)
# FUZZ_SANITIZER (default none: the library forbids unsafe code, see README.md) picks
# cargo fuzz's --sanitizer, e.g. FUZZ_SANITIZER=address for a memory-checked run.
set -uo pipefail
cd "$(dirname "$0")"
SECS=${1:-600}
shift || true
TARGETS=${*:-"quantity smiles measured_csv fit_points screen_rows"}
SAN=${FUZZ_SANITIZER:-none}
mkdir -p logs
export RUSTC_BOOTSTRAP=1
cargo fuzz build --sanitizer "$SAN" >logs/build.log 2>&1 || { echo "cargo fuzz build failed, see fuzz/logs/build.log" >&2; exit 1; }
BIN=target/$(rustc -vV | sed -n 's/^host: //p')/release
echo "built from $(git rev-parse --short HEAD)$(git diff --quiet HEAD -- .. || echo ' (with uncommitted changes)')" >>logs/summary.txt
# smiles: inputs up to 256 bytes (screen_rows caps its SMILES at 200). The canonical ranking
# costs about n² in atoms on symmetric chains (1,000 carbons 1.8 s, 2,000 carbons 7 s in the
# fuzz build), so longer inputs would measure that known cost rather than look for new faults.
max_len() {
    case $1 in
    smiles) echo "-max_len=256" ;;
    esac
}
for t in $TARGETS; do
    mkdir -p "corpus/$t" "artifacts/$t"
    start=$(date +%s)
    run=0
    while :; do
        left=$((SECS - ($(date +%s) - start)))
        [ "$left" -gt 5 ] || break
        run=$((run + 1))
        # the binaries built above, run directly: `cargo fuzz run` would rebuild from
        # whatever the tree holds by then, so every target tests the same commit
        "$BIN/$t" -artifact_prefix="artifacts/$t/" "corpus/$t" -max_total_time="$left" -timeout=10 \
            $(max_len "$t") \
            -print_final_stats=1 >"logs/$t.$run.log" 2>&1
        rc=$?
        echo "$t run $run exit $rc $(date -u +%H:%M:%S) load $(cut -d' ' -f1-3 /proc/loadavg)" >>logs/progress.txt
        [ "$rc" -ne 0 ] || break
        [ "$run" -lt 30 ] || break
    done
    execs=$(grep -h 'stat::number_of_executed_units' logs/$t.*.log | awk '{s += $2} END {print s + 0}')
    crashes=$(ls "artifacts/$t" 2>/dev/null | wc -l)
    echo "$t: $((($(date +%s) - start))) s, $run run(s), $execs executions, $crashes crash/timeout artifact(s)" | tee -a logs/summary.txt
done
