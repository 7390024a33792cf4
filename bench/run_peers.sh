#!/bin/bash
# Whole-process timings, obverse against the numpy peers, interleaved, three rounds:
#   bench/run_peers.sh DIR [OLD.jar]   (DIR prepared as DEVELOPERS.md "Speed against numpy" says)
# Appends "<job> <wall> wall <user> user <sys> sys" lines to DIR/times.log; take medians of user + sys.
set -u
here="$(cd "$(dirname "${BASH_SOURCE[0]}")" && pwd)"
jar="$here/../target/obverse-cli.jar"
dir=$1
old=${2:-}
cd "$dir"
t() { local name=$1; shift; /usr/bin/time -f "$name %e wall %U user %S sys" "$@" >/dev/null 2>>times.err; tail -1 times.err >> times.log; }
for round in 1 2 3; do
  rm -rf e_*.npy u_o u_n u_p
  [ -n "$old" ] && t energy-old java -jar "$old" energy --problem prob.json --samples big200k.npy --out e_o.npy
  t energy java -jar "$jar" energy --problem prob.json --samples big200k.npy --out e_n.npy
  t energy-np python3 "$here/np_energy.py" prob.json big200k.npy e_p.npy
  [ -n "$old" ] && t ungauge-old java -jar "$old" ungauge --manifest gauges/manifest.json --samples raw --out u_o
  t ungauge java -jar "$jar" ungauge --manifest gauges/manifest.json --samples raw --out u_n
  t ungauge-np python3 "$here/np_ungauge.py" gauges/manifest.json raw u_p
  [ -n "$old" ] && t audit-old java -jar "$old" audit --manifest gauges/manifest.json --samples raw
  t audit java -jar "$jar" audit --manifest gauges/manifest.json --samples raw
  t audit-np python3 "$here/np_audit.py" gauges/manifest.json raw
done
