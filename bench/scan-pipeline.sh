#!/usr/bin/env bash
# Times winnow scan end to end in one JVM against each stage alone; see ScanPipelineBench.
# Usage: bench/scan-pipeline.sh [candidates] [threads] [reps] [model.wnm]
set -euo pipefail
cd "$(dirname "${BASH_SOURCE[0]}")/.."
mvn -B -q -ntp -Dstyle.color=never -DskipTests -pl bench -am package >&2
exec java -Xmx2g -cp bench/target/benchmarks.jar org.winnow.bench.ScanPipelineBench "$@"
