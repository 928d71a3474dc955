#!/usr/bin/env bash
# Compares two builds of humwise-cli on the same walkdown, paired: each round imports the walkdown
# with both builds AT THE SAME TIME, each into a fresh store of its own, so that both meet the same
# moment of the machine. Run one after the other, two imports minutes apart on a shared virtual
# machine differ by up to 15 %; run side by side, the ratio of their processor times (user + system)
# moved by 3 % (bench/README.md, "Comparing two builds").
#
# usage: bench/ab-import.sh OLD_CLI NEW_CLI ROUTE_DIR [ROUNDS]
#   ROUTE_DIR holds fleet.json and walkdown/ (bench_route --keep leaves both).
# Prints each round's wall and CPU seconds and peak RSS of both, then the medians of the new/old
# ratios of CPU and wall time.
set -euo pipefail

if [[ $# -lt 3 ]]; then
    sed -n '2,11p' "$0"
    exit 2
fi
old=$(realpath "$1")
new=$(realpath "$2")
route=$(realpath "$3")
rounds=${4:-6}
for f in "$old" "$new"; do [[ -x $f ]] || { echo "ab-import: $f is not an executable" >&2; exit 2; }; done
[[ -f $route/fleet.json && -d $route/walkdown ]] || { echo "ab-import: $route needs fleet.json and walkdown/" >&2; exit 2; }
[[ $rounds =~ ^[1-9][0-9]*$ ]] || { echo "ab-import: ROUNDS must be a whole number of 1 or more, got '$rounds'" >&2; exit 2; }

work=$(mktemp -d)
pids=()
cleanup() {
    for p in "${pids[@]}"; do kill "$p" 2>/dev/null || true; done
    rm -rf "$work"
}
trap cleanup EXIT

: >"$work/rounds"
for ((i = 1; i <= rounds; i++)); do
    rm -f "$work"/*.db "$work"/*.db-*
    for tag in old new; do
        "${!tag}" fleet import "$route/fleet.json" --db "$work/$tag.db" >/dev/null
    done
    # The two start in turn, first one then the other, so that neither always has the head start.
    order=(old new)
    ((i % 2 == 0)) && order=(new old)
    pids=()
    for tag in "${order[@]}"; do
        /usr/bin/time -f "%e %U %S %M" -o "$work/$tag.time" "${!tag}" import "$route/walkdown" --db "$work/$tag.db" >/dev/null &
        pids+=($!)
    done
    for p in "${pids[@]}"; do
        wait "$p" || { echo "ab-import: an import failed in round $i (see above)" >&2; exit 1; }
    done
    pids=()
    echo "$(tail -n 1 "$work/old.time") $(tail -n 1 "$work/new.time")" >>"$work/rounds"
done
python3 - "$work/rounds" <<'PY'
import statistics, sys
rows = [list(map(float, line.split())) for line in open(sys.argv[1]) if line.strip()]
cpu, wall = [], []
for i, (ow, ou, os_, om, nw, nu, ns, nm) in enumerate(rows, 1):
    print(f"round {i}: old {ow:.2f} s wall, {ou + os_:.2f} s CPU, {om / 1024:.0f} MiB | "
          f"new {nw:.2f} s wall, {nu + ns:.2f} s CPU, {nm / 1024:.0f} MiB")
    cpu.append((nu + ns) / (ou + os_))
    wall.append(nw / ow)
print(f"new / old, median of {len(rows)}: CPU {statistics.median(cpu):.3f} (from {min(cpu):.3f} to {max(cpu):.3f}), "
      f"wall {statistics.median(wall):.3f} (from {min(wall):.3f} to {max(wall):.3f})")
PY
