#!/usr/bin/env bash
# Enumeration throughput and memory, through the CLI (plain timing, no JMH):
#   bench/enumerate.sh [DIM] [RULES] [MAX_ROWS]      defaults: 3 base (all rows)
# Prints configurations/s on one process, then on two processes running shards 0/2 and 1/2 at
# once (two cores), and the peak resident memory of runs over growing parts of the space.
set -euo pipefail
here="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
dim="${1:-3}"
rules="${2:-base}"
rows="${3:-}"
jar="$here/app/target/winnow.jar"
"$here/winnow" --version >/dev/null   # builds the jar when sources changed
run=(java -Xmx512m -jar "$jar" enumerate --dim "$dim" --rules "$rules" ${rows:+--max-rows "$rows"} --count)

seconds() { date +%s.%N; }
total_of() { awk '/^total:/ {print $2}' "$1"; }

t0=$(seconds)
"${run[@]}" > /tmp/winnow-enum-1.txt
t1=$(seconds)
n=$(total_of /tmp/winnow-enum-1.txt)
echo "one process:   $n configurations in $(echo "$t1 - $t0" | bc) s = $(echo "$n / ($t1 - $t0)" | bc) /s (JVM start included)"

t0=$(seconds)
"${run[@]}" --shard 0/2 > /tmp/winnow-enum-a.txt &
"${run[@]}" --shard 1/2 > /tmp/winnow-enum-b.txt &
wait
t1=$(seconds)
a=$(total_of /tmp/winnow-enum-a.txt)
b=$(total_of /tmp/winnow-enum-b.txt)
echo "two processes: $a + $b = $((a + b)) configurations in $(echo "$t1 - $t0" | bc) s = $(echo "($a + $b) / ($t1 - $t0)" | bc) /s"
[ "$((a + b))" = "$n" ] || { echo "shard totals do not add up to $n" >&2; exit 1; }

# memory: peak RSS when writing every line (not counting), for growing row limits
for m in 4 7 10 "${rows:-$((5 * dim > 16 ? 16 : 5 * dim))}"; do
  /usr/bin/time -f "max-rows $m: peak RSS %M kB, %e s" \
    java -Xmx512m -jar "$jar" enumerate --dim "$dim" --rules "$rules" --max-rows "$m" > /dev/null
done
