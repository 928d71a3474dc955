#!/usr/bin/env bash
# Route-scale benchmark in one command: configure and build bench_route (Release) and run it with
# the scipy pipeline (bench/README.md, "Route-scale import").
#   bash bench/run-route-bench.sh [bench_route arguments...]     e.g. --motors 20, --dir /tmp/route --keep
# BUILD: build folder (default build-route next to this script's repository); JOBS: make jobs (2).
set -euo pipefail
here="$(cd "$(dirname "$0")/.." && pwd)"
build="${BUILD:-$here/build-route}"
cmake -S "$here" -B "$build" -DCMAKE_BUILD_TYPE=Release >/dev/null
cmake --build "$build" --target bench_route -j "${JOBS:-2}"
# Debian's python3 has numpy and scipy; a pyenv python3 on the PATH may not (DEVELOPERS.md).
python="${HUMWISE_PYTHON:-/usr/bin/python3}"
[ -x "$python" ] || python=python3
exec "$build/bench/bench_route" --python "$python" --script "$here/bench/route_pipeline.py" "$@"
