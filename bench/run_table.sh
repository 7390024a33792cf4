#!/bin/bash
# The whole table of DEVELOPERS.md "Speed against numpy": every job as a whole process, obverse
# (through the ./obverse launcher, and the plain `java -jar` of the same jar) against its numpy
# peer and, given OLD.jar, the jar of an earlier commit; interleaved, ROUNDS rounds (default 3).
#   bench/run_table.sh DIR [OLD.jar] [ROUNDS] [PEER_ROUNDS]
# PEER_ROUNDS (default ROUNDS): rounds that also run the slow numpy peers of energy, ungauge and
# audit (tens of CPU-seconds each; on a busy shared machine one round of them may have to do).
# DIR is made on first use (2,048-qubit 16x16 K4,4 lattice; about 5 GB of files). Needs python3
# with numpy and scipy (the peers only), /usr/bin/time and dd. Appends one line a run to
# DIR/times.log ("job wall W user U sys S load L", L = 1-minute load when the run started) and
# prints medians of user + sys and of wall, and the ratios peer / obverse, from DIR/times.log.
# Outputs are compared with OLD.jar's byte for byte where OLD.jar is given.
set -u
here="$(cd "$(dirname "${BASH_SOURCE[0]}")" && pwd)"
jar="$(cd "$here/.." && pwd)/target/obverse-cli.jar"
dir=$1
old=${2:-}
rounds=${3:-3}
peer_rounds=${4:-$rounds}
mkdir -p "$dir"
[ -n "$old" ] && old=$(readlink -f "$old")
cd "$dir"
# A private copy of the jar, so a rebuild during the run changes nothing; the launcher runs it.
cp "$jar" bench-new.jar
export OBVERSE_JAR=$PWD/bench-new.jar
ob="$here/../obverse"
jar_run=(java -jar "$OBVERSE_JAR")
new() { "${jar_run[@]}" "$@"; }

if [ ! -f prob.json ]; then
  new device lattice --rows 16 --cols 16 --out dev.json
  python3 "$here/np_make_data.py" .
  new gauge --problem prob.json --device dev.json --count 16 --seed 5 --out gauges
fi
if [ ! -f dec_phys.json ]; then
  python3 "$here/np_make_decode.py" .
  new embed --logical dec_logical.json --chains dec_chains.json --device dev.json --chain-coupling -2 --out dec_phys.json
fi
[ -f score_results.csv ] || python3 "$here/np_make_score.py" .
if [ ! -f raw1/g0000.npy ]; then
  # 1,000,000 reads (2 GB): the 200,000-read file's data five times under a new header.
  new gauge --problem prob.json --device dev.json --count 1 --seed 5 --out gauges1
  mkdir -p raw1
  python3 - <<'EOF'
import numpy as np
a = np.load("big200k.npy", mmap_mode="r")
out = np.lib.format.open_memmap("raw1/g0000.npy", mode="w+", dtype=np.int8, shape=(5 * a.shape[0], a.shape[1]))
for k in range(5):
    out[k * a.shape[0]:(k + 1) * a.shape[0]] = a
out.flush()
EOF
fi

t() {
  local name=$1; shift
  local load; load=$(cut -d' ' -f1 /proc/loadavg)
  if /usr/bin/time -f "$name %e wall %U user %S sys load $load" "$@" >/dev/null 2>>times.err; then
    tail -1 times.err >> times.log
  else
    echo "$name FAILED (see times.err)" >> times.log
  fi
}
same() { cmp -s "$1" "$2" && echo "same $1 $2" >> times.log || echo "DIFFERENT $1 $2" >> times.log; }
np="$here"
dec=(--problem dec_phys.json --logical dec_logical.json --chains dec_chains.json --samples dec_reads.npy --rule majority)
for round in $(seq "$rounds"); do
  rm -rf e_*.npy u_o u_n u_j u_p d_o d_n d_j d_p s_o s_n s_j s_p
  [ -n "$old" ] && t energy-old java -jar "$old" energy --problem prob.json --samples big200k.npy --out e_o.npy
  t energy "$ob" energy --problem prob.json --samples big200k.npy --out e_n.npy
  t energy-jar "${jar_run[@]}" energy --problem prob.json --samples big200k.npy --out e_j.npy
  [ "$round" -le "$peer_rounds" ] && t energy-np python3 "$np/np_energy.py" prob.json big200k.npy e_p.npy
  [ -n "$old" ] && t ungauge-old java -jar "$old" ungauge --manifest gauges/manifest.json --samples raw --out u_o
  t ungauge "$ob" ungauge --manifest gauges/manifest.json --samples raw --out u_n
  t ungauge-jar "${jar_run[@]}" ungauge --manifest gauges/manifest.json --samples raw --out u_j
  [ "$round" -le "$peer_rounds" ] && t ungauge-np python3 "$np/np_ungauge.py" gauges/manifest.json raw u_p
  [ -n "$old" ] && t audit-old java -jar "$old" audit --manifest gauges/manifest.json --samples raw
  t audit "$ob" audit --manifest gauges/manifest.json --samples raw
  t audit-jar "${jar_run[@]}" audit --manifest gauges/manifest.json --samples raw
  [ "$round" -le "$peer_rounds" ] && t audit-np python3 "$np/np_audit.py" gauges/manifest.json raw
  [ -n "$old" ] && t decode-old java -jar "$old" decode "${dec[@]}" --out d_o
  t decode "$ob" decode "${dec[@]}" --out d_n
  t decode-jar "${jar_run[@]}" decode "${dec[@]}" --out d_j
  t decode-np python3 "$np/np_decode.py" dec_phys.json dec_logical.json dec_chains.json dec_reads.npy d_p
  [ -n "$old" ] && t score-old java -jar "$old" score score_results.csv --ground score_ground.csv --out s_o --quiet
  t score "$ob" score score_results.csv --ground score_ground.csv --out s_n --quiet
  t score-jar "${jar_run[@]}" score score_results.csv --ground score_ground.csv --out s_j --quiet
  t score-np python3 "$np/np_score.py" score_results.csv score_ground.csv s_p
  # Streaming: one 2 GB file through a 256 MB heap, against dd of the same bytes; input cached.
  cat raw1/g0000.npy > /dev/null
  rm -rf st_n; OBVERSE_JAVA_OPTS=-Xmx256m t stream "$ob" ungauge --manifest gauges1/manifest.json --samples raw1 --out st_n
  rm -rf st_n; t stream-jar java -Xmx256m -jar "$OBVERSE_JAR" ungauge --manifest gauges1/manifest.json --samples raw1 --out st_n
  rm -f dd.out; t stream-dd dd if=raw1/g0000.npy of=dd.out bs=8M
  rm -rf st_n dd.out
  if [ -n "$old" ] && [ "$round" = 1 ]; then
    same e_o.npy e_n.npy
    for f in u_o/*; do same "$f" "u_n/${f#u_o/}"; done
    for f in d_o/*; do same "$f" "d_n/${f#d_o/}"; done
    for f in s_o/*; do same "$f" "s_n/${f#s_o/}"; done
  fi
done
python3 - <<'EOF'
import collections, statistics
runs = collections.defaultdict(list)
for line in open("times.log"):
    w = line.split()
    if len(w) >= 9 and w[2] == "wall":
        runs[w[0]].append((float(w[3]) + float(w[5]), float(w[1]), float(w[8]) if len(w) > 8 and w[7] == "load" else float("nan")))
med = {k: (statistics.median(c for c, _, _ in v), statistics.median(x for _, x, _ in v),
           statistics.median(l for _, _, l in v), len(v)) for k, v in runs.items()}
print("%-12s %9s %9s %6s %4s" % ("job", "cpu s", "wall s", "load", "runs"))
for k in sorted(med):
    print("%-12s %9.2f %9.2f %6.1f %4d" % (k, *med[k]))
print()
for job in ("energy", "ungauge", "audit", "decode", "score"):
    if job in med and job + "-np" in med:
        print("%-8s numpy/obverse: cpu %.2fx, wall %.2fx" % (job, med[job + "-np"][0] / med[job][0],
                                                             med[job + "-np"][1] / med[job][1]))
if "stream" in med and "stream-dd" in med:
    print("stream   obverse/dd wall %.2f (>= 0.5 wanted: time dd / time obverse)" % (med["stream-dd"][1] / med["stream"][1]))
EOF
