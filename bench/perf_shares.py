#!/usr/bin/env python3
"""Where an import's time goes, from a perf profile with call stacks (bench/README.md).

Usage:
    perf record -F 250 --call-graph dwarf,16384 -o import.data -- \\
        build/app/cli/humwise-cli import WALKDOWN --db STORE
    perf script -i import.data -F comm,tid,ip,sym,dso > import.txt
    python3 bench/perf_shares.py import.txt

Prints, over all samples of the process: the share of samples whose stack holds analyseMotor
(the analysis), the writer's store calls and the commit; and, within the analysis, the share by
library of the sampled instruction (FFTW single and double precision, Humwise's own code, the
kernel, libc/libm) and by stage (the first known function found walking up from the leaf).
Shares of samples are shares of CPU time at the sampling rate; with two analysis threads they
add up CPU time of both cores.
"""

import collections
import re
import sys

STAGES = [
    "fastKurtogram", "envelopeSpectrum", "harmonicAnalysis", "phasorAt", "zoomSpectrum", "ZoomTransform::of",
    "ZoomTransform::band", "RecordSpectrum::RecordSpectrum",
    "estimateSupplyFrequency", "averagedSpectrum", "findPeaks", "assessQuality",
    "waveformStatistics", "analyseVibration", "analysePhaseSet",
]
# A phase is a sample whose stack holds one of its functions (readFileBytes is often inlined into
# its caller, leaving readAllBytes on the stack).
PHASES = [("analysis", ("analyseMotor",)), ("commit", ("Transaction::commit",)),
          ("store raw files", ("storeSourceFile",)), ("file hashing", ("sha256",)),
          ("file reading", ("readFileBytes", "readAllBytes"))]


def library(frame):
    m = re.search(r"\(([^)]*)\)\s*$", frame)
    if not m:
        return "?"
    name = m.group(1).split("/")[-1]
    if name.startswith("libfftw3f"):
        return "FFTW single"
    if name.startswith("libfftw3"):
        return "FFTW double"
    if name in ("[kernel.kallsyms]",):
        return "kernel"
    if name.startswith("libc.") or name.startswith("libm."):
        return "libc/libm"
    if name.startswith("libsqlite3"):
        return "SQLite"
    return "Humwise" if name in ("humwise-cli", "inlined", "bench_route") else name


def samples(path):
    with open(path, errors="replace") as f:
        for block in f.read().split("\n\n"):
            lines = [line for line in block.strip().split("\n") if line.strip()]
            if len(lines) >= 2:
                yield lines[1:]


def percent(part, whole):
    return f"{100.0 * part / whole:5.1f} %" if whole else "  -"


def main(path):
    total = 0
    phases = collections.Counter()
    by_library = collections.Counter()
    by_stage = collections.Counter()
    in_analysis = 0
    for frames in samples(path):
        total += 1
        for name, keys in PHASES:
            if any(key in f for f in frames for key in keys):
                phases[name] += 1
                break
        if not any("analyseMotor" in f for f in frames):
            continue
        in_analysis += 1
        by_library[library(frames[0])] += 1
        stage = next((s for f in frames for s in STAGES if s in f), "other")
        by_stage[stage] += 1
    print(f"{total} samples")
    for name, _ in PHASES:
        print(f"  {name:<20} {percent(phases[name], total)}")
    print(f"  {'other':<20} {percent(total - sum(phases.values()), total)}")
    print(f"analysis ({in_analysis} samples) by library:")
    for name, n in by_library.most_common():
        print(f"  {name:<20} {percent(n, in_analysis)}")
    print("analysis by stage:")
    for name, n in by_stage.most_common():
        print(f"  {name:<24} {percent(n, in_analysis)}")


if __name__ == "__main__":
    if len(sys.argv) != 2:
        sys.exit(__doc__)
    main(sys.argv[1])
