#!/usr/bin/env bash
# Cluster mode vs winnow scan on loopback, and bytes per candidate on the wire (not run in CI).
# Usage: bench/cluster-throughput.sh [candidates, default 50000] [scorers, default 2]
set -euo pipefail
cd "$(dirname "${BASH_SOURCE[0]}")/.."
mvn -B -q -ntp -DskipTests -pl bench -am package dependency:build-classpath -Dmdep.outputFile=target/cluster-cp.txt
java -Xmx2g -cp "bench/target/classes:$(cat bench/target/cluster-cp.txt)" org.winnow.bench.ClusterThroughput "$@"
