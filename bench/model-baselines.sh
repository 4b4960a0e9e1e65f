#!/usr/bin/env bash
# The similarity model against plain baselines on one stratified split of an exactly labelled file;
# see ModelBaselines. Usage: bench/model-baselines.sh [reference.tsv] [fraction] [seed]
set -euo pipefail
cd "$(dirname "${BASH_SOURCE[0]}")/.."
mvn -B -q -ntp -Dstyle.color=never -DskipTests -pl bench -am package >&2
exec java -Xmx2g -cp bench/target/benchmarks.jar org.winnow.bench.model.ModelBaselines "$@"
