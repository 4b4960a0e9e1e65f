#!/usr/bin/env bash
# Cluster mode vs winnow scan on loopback, and bytes per candidate on the wire (not run in CI).
# Usage: bench/cluster-throughput.sh [candidates, default 50000] [scorers, default 2] [--model M --input F]
# WINNOW_BENCH_BUILT=1 skips the build (bench/compare.sh builds once, with the same classpath file).
set -euo pipefail
cd "$(dirname "${BASH_SOURCE[0]}")/.."
if [ -z "${WINNOW_BENCH_BUILT:-}" ]; then
  mvn -B -q -ntp -DskipTests -pl bench -am package dependency:build-classpath -Dmdep.outputFile=target/cluster-cp.txt
fi
java -Xmx2g -cp "bench/target/classes:$(cat bench/target/cluster-cp.txt)" org.winnow.bench.ClusterThroughput "$@"
