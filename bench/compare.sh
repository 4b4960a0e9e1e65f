#!/usr/bin/env bash
# Side by side: winnow's scorer against the numpy reference scorer on one candidate file, in one go,
# then the end-to-end scan, the cluster mode on loopback, the h11 estimate's share of both scorers, and
# the forward pass against the machine's FMA rate. Prints candidates/s for each run, the ratios, and a
# summary of `name: value` lines.
#
#   bench/compare.sh            # 10^6 four-fold candidates (lossless rules, 12 rows at most) for winnow, 10^5 of them for numpy
#   bench/compare.sh --quick    # 10^5 (lossless, 7 rows at most) for winnow, 10^4 of them for numpy
#
# The last block is one `name: value` a line; `end-to-end/(scorer + exact invariants)` and
# `winnow/numpy without the estimate` say how much of each ratio is the work the other side skips.
#
# Work files go to bench/target/compare (override with COMPARE_DIR). See bench/README.md.
set -euo pipefail
here="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
count=1000000
numpy_count=100000
max_rows=12
kafka_count=100000
# Two epochs for both: on the toy labels longer training can collapse the learned coordinates (4 epochs
# on the 8-row file left 663 distinct reference embeddings of 7890), and exact ties then send numpy's
# neighbour search to its slow tie-breaking path; the summary prints the count so that this shows.
epochs=2
if [ "${1:-}" = "--quick" ]; then
  count=100000
  numpy_count=10000
  max_rows=7
  kafka_count=10000
  epochs=2
fi
work="${COMPARE_DIR:-$here/bench/target/compare}"
mkdir -p "$work"
log="$work/log.txt"
: > "$log"
say() { echo "$@" >&2; }

# A python3 with numpy: the one on PATH may be a pyenv build with its own numpy, Debian's may lack it.
python=""
for p in python3 /usr/bin/python3; do
  if command -v "$p" >/dev/null 2>&1 && "$p" -c "import numpy" >/dev/null 2>&1; then python="$p"; break; fi
done
if [ -z "$python" ]; then
  say "compare: no python3 with numpy; installing Debian's python3-numpy"
  sudo_=""; [ "$(id -u)" -ne 0 ] && sudo_="sudo"
  $sudo_ apt-get update -q >>"$log" 2>&1 && $sudo_ apt-get install -y -q python3-numpy >>"$log" 2>&1
  python=/usr/bin/python3
  "$python" -c "import numpy" || { say "compare: python3-numpy did not install (see $log)"; exit 2; }
fi
numpy_version="$("$python" -c 'import numpy; print(numpy.__version__)')"
distinct_embeddings() { # weights.json -> number of distinct reference embeddings
  "$python" -c "import json, sys; e = json.load(open(sys.argv[1]))['reference']['embeddings']; print(f'{len({tuple(x) for x in e})} of {len(e)}')" "$1"
}

say "compare: building"
(cd "$here" && mvn -B -q -ntp -Dstyle.color=never -DskipTests -pl bench -am package dependency:build-classpath \
  -Dmdep.outputFile=target/cluster-cp.txt) >>"$log" 2>&1
winnow="$here/app/target/winnow.jar"
bench="$here/bench/target/benchmarks.jar"
java_opts=(-Xmx2g)

# Four-folds: the three-fold space is too small to time a deduplicating scan on (10^5 draws hold
# under 6,000 canonical forms). The producer's enumeration, at an even stride, gives distinct lines.
# The producer's default rule set: under `base` most of the extra matrices are redundant descriptions
# whose first pages are unsettled, and the Hodge engine's time on them would swamp the comparison.
rules="${COMPARE_RULES:-lossless}"
cands="$work/candidates-4-$rules-$max_rows-$count.tsv"
if [ ! -f "$cands" ]; then
  say "compare: generating $count four-fold candidates ($rules rules, at most $max_rows rows)"
  java "${java_opts[@]}" -cp "$bench" org.winnow.bench.GenerateCandidates --dim 4 --rules "$rules" \
    --max-rows "$max_rows" --count "$count" --out "$cands"
fi
count=$(wc -l < "$cands")
model="$work/model-4-$rules-$max_rows-$count.wnm"
if [ ! -f "$model" ]; then
  say "compare: training the bench model (default architecture, 7890 four-folds of the file, toy labels, $epochs epochs)"
  java "${java_opts[@]}" -cp "$bench" org.winnow.bench.BenchModel --from "$cands" --epochs "$epochs" \
    --out "$model" >>"$log" 2>&1
fi
java "${java_opts[@]}" -jar "$winnow" export-weights --model "$model" --out "$work/weights.json"
ref_distinct=$(distinct_embeddings "$work/weights.json")
# numpy's share, at an even stride over the file: the enumeration's order puts the small matrices first.
prefix="$work/candidates-$count-every-$numpy_count.tsv"
awk -v s=$(( count / numpy_count > 0 ? count / numpy_count : 1 )) -v n="$numpy_count" \
  '(NR - 1) % s == 0 && taken < n { print; taken++ }' "$cands" > "$prefix"

# field NAME FILE: the value of NAME=value on the first line of FILE that has it
field() { grep -o "$2=[^ ]*" "$1" | head -1 | cut -d= -f2; }

run_winnow() { # name threads file [warm-up passes]
  say "compare: winnow scorer, $2 thread(s), $(wc -l < "$3") candidates${4:+, after $4 untimed pass(es)}"
  java "${java_opts[@]}" -cp "$bench" org.winnow.bench.ScorerThroughput --model "$model" --candidates "$3" \
    --threads "$2" --warmups "${4:-0}" > "$work/$1.out"
  cat "$work/$1.out" >&2
}
run_numpy() { # name blas-threads file
  say "compare: numpy scorer ($numpy_version), BLAS threads $2, $(wc -l < "$3") candidates"
  OPENBLAS_NUM_THREADS="$2" OMP_NUM_THREADS="$2" MKL_NUM_THREADS="$2" \
    "$python" "$here/bench/numpy_scorer.py" --weights "$work/weights.json" --candidates "$3" --search gemm \
    > "$work/$1.out"
  cat "$work/$1.out" >&2
}

run_winnow winnow1 1 "$cands"
run_winnow winnow2 2 "$cands"
run_winnow winnow1-prefix 1 "$prefix"
# The thread-count ratio once the JIT is done: a one-off run of 10^5 spends about half its CPU compiling
# (cpu_split), which a long scan pays once. On at most 10^5 lines of the file (numpy's share in a full run).
warm_file="$cands"; [ "$count" -gt 100000 ] && warm_file="$prefix"
run_winnow winnow1-warm 1 "$warm_file" 1
run_winnow winnow2-warm 2 "$warm_file" 1
run_numpy numpy1 1 "$prefix"
run_numpy numpy2 2 "$prefix"

# End to end: `winnow scan` (2 threads) against the scorer alone (2 threads) on the file's distinct
# lines (the scan deduplicates, so only those are work for it). The scan is timed as a difference
# between all distinct lines and 1000 of them at an even stride, so that JVM start and model load cancel out.
e2e="not available"
distinct="$work/candidates-$count-distinct.tsv"
awk -F'\t' '!seen[$1]++' "$cands" > "$distinct"
dcount=$(wc -l < "$distinct")
scan_once() { # file [threads] -> "wall-seconds cpu-seconds" on stdout (cpu: user + system of the JVM process)
  rm -rf "$work/scan-out"
  local TIMEFORMAT='%R %U %S' t
  t=$( { time java "${java_opts[@]}" -jar "$winnow" scan --model "$model" --input "$1" --out "$work/scan-out" \
    --threads "${2:-2}" >"$work/scan.out" 2>&1 ; } 2>&1 ) || return 1
  echo "$t" | awk '{ print $1, $2 + $3 }'
}
e2e_cpu="not available"
e2e1="not available"
if java -jar "$winnow" scan --help >/dev/null 2>&1; then
  if [ "$dcount" -eq "$count" ]; then
    cp "$work/winnow2.out" "$work/winnow2-distinct.out"   # every line distinct: the same run
  else
    run_winnow winnow2-distinct 2 "$distinct"
  fi
  say "compare: winnow scan end to end, 2 threads, $dcount distinct candidates"
  awk -v s=$(( dcount / 1000 > 0 ? dcount / 1000 : 1 )) '(NR - 1) % s == 0 && taken < 1000 { print; taken++ }' \
    "$distinct" > "$work/some-1000.tsv"
  if t_small=$(scan_once "$work/some-1000.tsv") && t_full=$(scan_once "$distinct"); then
    grep -v SLF4J "$work/scan.out" >&2
    read -r w_small c_small <<< "$t_small"
    read -r w_full c_full <<< "$t_full"
    e2e=$("$python" -c "print(f'{($dcount - 1000) / ($w_full - $w_small):.1f}')")
    e2e_cpu=$("$python" -c "print(f'{($dcount - 1000) / ($c_full - $c_small):.1f}')")
  else
    e2e="failed (see $work/scan.out)"
  fi
  say "compare: winnow scan end to end, 1 thread, $dcount distinct candidates"
  if t_small=$(scan_once "$work/some-1000.tsv" 1) && t_full=$(scan_once "$distinct" 1); then
    read -r w_small c_small <<< "$t_small"
    read -r w_full c_full <<< "$t_full"
    e2e1=$("$python" -c "print(f'{($dcount - 1000) / ($w_full - $w_small):.1f}')")
  else
    e2e1="failed (see $work/scan.out)"
  fi
fi
# Cluster mode: producer, 2 scorers and sink over a single-node broker on loopback, against
# `winnow scan` on the same lines in the same JVM (bench/cluster-throughput.sh, ClusterThroughput).
kafka_n=$(( kafka_count < dcount ? kafka_count : dcount ))
say "compare: cluster mode on loopback against winnow scan, $kafka_n candidates, 2 scorers"
kafka="failed (see $work/kafka.out)"
if WINNOW_BENCH_BUILT=1 "$here/bench/cluster-throughput.sh" "$kafka_n" 2 --model "$model" --input "$distinct" \
    > "$work/kafka.out" 2>>"$log"; then
  grep -v '^scan_rate' "$work/kafka.out" >&2
  kafka=$("$python" -c "print(f'{$(field "$work/kafka.out" cluster_rate) / $(field "$work/kafka.out" scan_rate):.2f}')")
  [ "$(field "$work/kafka.out" counts_equal)" = "true" ] || kafka="$kafka (counts differ from the scan's!)"
fi

say "compare: forward pass cost"
java "${java_opts[@]}" -cp "$bench" org.winnow.bench.ForwardPassCost --model "$model" --candidates "$prefix" \
  --limit "$numpy_count" --passes 2 > "$work/forward.out"
cat "$work/forward.out" >&2
say "compare: FMA rate (JMH)"
java "${java_opts[@]}" -Djmh.ignoreLock=true -cp "$bench" org.winnow.bench.FlopRate --iterations 3 \
  > "$work/flops.out" 2>>"$log"
tail -1 "$work/flops.out" >&2

agree=no
# The numpy port defers (-1) what winnow settles with its Hodge engine: compare with winnow's view of that.
[ "$(grep '^comparable=' "$work/winnow1-prefix.out" | cut -d= -f2-)" = "$(grep '^histogram=' "$work/numpy1.out" | cut -d= -f2-)" ] && agree=yes

W1=$(field "$work/winnow1.out" rate) W2=$(field "$work/winnow2.out" rate) \
W1W=$(field "$work/winnow1-warm.out" rate) W2W=$(field "$work/winnow2-warm.out" rate) \
SPLIT1="$(grep '^cpu_split=' "$work/winnow1.out" | cut -d= -f2-)" SR=$(field "$work/forward.out" search_rate) \
E2E1="$e2e1" W1C=$(field "$work/winnow1.out" cpu_rate) W2C=$(field "$work/winnow2.out" cpu_rate) \
N1=$(field "$work/numpy1.out" rate) N2=$(field "$work/numpy2.out" rate) \
N1C=$(field "$work/numpy1.out" cpu_rate) N2C=$(field "$work/numpy2.out" cpu_rate) \
ER=$(field "$work/forward.out" estimate_rate) IR=$(field "$work/forward.out" invariants_rate) \
NE1=$(field "$work/numpy1.out" estimate_cpu_seconds) NC1=$(field "$work/numpy1.out" cpu_seconds) \
FM=$(field "$work/forward.out" forward_macs) SM=$(field "$work/forward.out" search_macs) \
FR=$(field "$work/forward.out" forward_rate) RR=$(field "$work/forward.out" full_rate) \
VF=$(field "$work/flops.out" vector_cpu_flops) SF=$(field "$work/flops.out" scalar_cpu_flops) \
VFW=$(field "$work/flops.out" vector_flops) \
W2D=$(field "$work/winnow2-distinct.out" rate 2>/dev/null || echo nan) DCOUNT="$dcount" \
REFD="$ref_distinct" SOURCES="$(grep '^sources=' "$work/winnow1-prefix.out" | cut -d= -f2-)" AR=$(field "$work/forward.out" anchor_rate) E2E="$e2e" E2EC="$e2e_cpu" W2DC=$(field "$work/winnow2-distinct.out" cpu_rate 2>/dev/null || echo nan) KAFKA="$kafka" AGREE="$agree" COUNT="$count" NCOUNT="$numpy_count" LOAD="$(cut -d' ' -f1-3 /proc/loadavg)" \
"$python" - <<'EOF'
import os
e = os.environ
f = lambda k: float(e[k])
w1, w2, n1, n2 = f("W1"), f("W2"), f("N1"), f("N2")
fwd_flops = f("FM") * 2 * f("FR")
# The forward pass as timed includes the features, among them the model's anchor (the first-page
# estimate, or the Hodge engine where it is unsettled: no FLOPs); the network's own time is what
# remains once the anchor's time alone is taken off.
net_seconds = 1 / f("FR") - 1 / f("AR")
net_flops = f("FM") * 2 / net_seconds if net_seconds > 0 else float("nan")
print()
print(f"machine: {os.cpu_count()} cores, load average {e['LOAD']} (wall-clock rates suffer from the load; cpu rates much less)")
print(f"{'run':34s} {'cand/s (wall)':>14s} {'cand/s (cpu)':>14s}")
print(f"{'winnow scorer, 1 thread':34s} {w1:14.0f} {f('W1C'):14.0f}   ({e['COUNT']} candidates)")
print(f"{'winnow scorer, 2 threads':34s} {w2:14.0f} {f('W2C'):14.0f}")
print(f"{'winnow scorer, 1 thread, warm':34s} {f('W1W'):14.0f} {'':>14s}")
print(f"{'winnow scorer, 2 threads, warm':34s} {f('W2W'):14.0f} {'':>14s}")
print(f"{'numpy scorer, 1 BLAS thread':34s} {n1:14.0f} {f('N1C'):14.0f}   ({e['NCOUNT']} of them, even stride)")
print(f"{'numpy scorer, 2 BLAS threads':34s} {n2:14.0f} {f('N2C'):14.0f}")
print(f"{'winnow scan, end to end, 2 threads':34s} {e['E2E']:>14s} {e['E2EC']:>14s}   ({e['DCOUNT']} distinct candidates)")
print(f"{'winnow scan, end to end, 1 thread':34s} {e['E2E1']:>14s}")
print(f"{'winnow scorer, 2 threads, distinct':34s} {f('W2D'):14.0f} {f('W2DC'):14.0f}")
print(f"forward pass: {f('FM'):.0f} multiply-adds per candidate, {f('FR'):.0f} candidates per cpu-second alone"
      f" (features with the anchor, and network), {fwd_flops / 1e9:.2f} GFLOP/s; without the anchor's time"
      f" {net_flops / 1e9:.2f} GFLOP/s; neighbour scan {f('SM'):.0f} multiply-adds; with the vote {f('RR'):.0f}/cpu-s")
print(f"exact cheap invariants alone (InvariantCalculator.compute, one thread; the scan computes them, the"
      f" scorer-alone runs read chi from the file): {f('IR'):.0f} per cpu-second")
print(f"h11 estimate alone (H11Estimator, one thread): {f('ER'):.0f} per cpu-second,"
      f" {1e6 / f('ER'):.2f} us of winnow's {1e6 / f('RR'):.2f} us per candidate;"
      f" numpy's Python estimate {f('NE1'):.2f} of {f('NC1'):.2f} cpu-seconds (1 BLAS thread)")
print(f"FMA limit (cpu time, one core): vector {f('VF') / 1e9:.1f} GFLOP/s, scalar {f('SF') / 1e9:.1f} GFLOP/s;"
      f" JMH wall clock vector {f('VFW') / 1e9:.1f}")
print()
print("summary:")
print(f"load average: {e['LOAD']}")
print(f"winnow/numpy (1 thread): {w1 / n1:.2f}")
print(f"winnow/numpy (2 threads): {w2 / n2:.2f}")
print(f"winnow/numpy (1 thread, cpu time): {f('W1C') / f('N1C'):.2f}")
print(f"winnow/numpy (2 threads, cpu time): {f('W2C') / f('N2C'):.2f}")
print(f"winnow 2 threads/1 thread: {w2 / w1:.2f}")
print(f"winnow 2 threads/1 thread (warm): {f('W2W') / f('W1W'):.2f}")
try:
    print(f"end-to-end 2 threads/1 thread: {float(e['E2E']) / float(e['E2E1']):.2f}")
except ValueError:
    print(f"end-to-end 2 threads/1 thread: {e['E2E']} / {e['E2E1']}")
split = dict((k, float(v)) for k, v in (kv.split(':') for kv in e['SPLIT1'].split(','))) if ':' in e['SPLIT1'] else {}
for kind in ("workers", "jit", "gc", "reader", "vm", "other"):
    if split:
        print(f"cpu share of the 1-thread scorer run/{kind}: {split.get(kind, 0.0) / sum(split.values()):.2f}")
# One thread, CPU time, pre-parsed candidates (ForwardPassCost): the anchor alone, the forward pass with a
# one-point reference (features, anchor, network) less the anchor, the model's search alone on the
# candidates' embeddings, and what the whole score adds beyond those (the vote, novelty).
us = lambda rate: 1e6 / rate
print(f"cost per candidate/invariants (us, cpu): {us(f('IR')):.2f}")
print(f"cost per candidate/anchor (us, cpu): {us(f('AR')):.2f}")
print(f"cost per candidate/network and features (us, cpu): {us(f('FR')) - us(f('AR')):.2f}")
print(f"cost per candidate/search (us, cpu): {us(f('SR')):.2f}")
print(f"cost per candidate/vote and the rest (us, cpu): {us(f('RR')) - us(f('FR')) - us(f('SR')):.2f}")
try:
    print(f"end-to-end/scorer: {float(e['E2E']) / f('W2D'):.2f}")
except ValueError:
    print(f"end-to-end/scorer: {e['E2E']}")
try:
    print(f"end-to-end/scorer (cpu time): {float(e['E2EC']) / f('W2DC'):.2f}")
except ValueError:
    print(f"end-to-end/scorer (cpu time): {e['E2EC']}")
try:
    both = 1 / (1 / f('W2DC') + 1 / f('IR'))
    print(f"end-to-end/(scorer + exact invariants) (cpu time): {float(e['E2EC']) / both:.2f}")
except ValueError:
    print(f"end-to-end/(scorer + exact invariants) (cpu time): {e['E2EC']}")
w_noest = 1 / (1 / f('W1C') - 1 / f('AR'))
n_noest = f('NCOUNT') / (f('NC1') - f('NE1'))
print(f"winnow/numpy without the anchor on either side (1 thread, cpu time): {w_noest / n_noest:.2f}")
print(f"kafka/in-process: {e['KAFKA']}")
print(f"forward pass/FLOP limit: {fwd_flops / f('VF'):.3f}")
print(f"forward pass/scalar FLOP limit: {fwd_flops / f('SF'):.3f}")
print(f"network without anchor/FLOP limit: {net_flops / f('VF'):.3f}")
print(f"estimate share of winnow scorer (cpu time): {f('RR') / f('ER'):.2f}")
print(f"estimate share of numpy scorer (cpu time, 1 BLAS thread): {f('NE1') / f('NC1'):.2f}")
print(f"anchor sources on numpy's candidates (winnow): {e['SOURCES']}")
print(f"anchor alone (RefinedH11Estimator, one thread): {f('AR'):.0f} per cpu-second; share of winnow scorer (cpu time):"
      f" {f('RR') / f('AR'):.2f}")
print(f"distinct reference embeddings: {e['REFD']}")
print(f"predictions agree (histogram of numpy's candidates): {e['AGREE']}")
EOF
