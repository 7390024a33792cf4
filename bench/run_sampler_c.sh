#!/bin/bash
# The C yardstick of the exact Metropolis kernel (spec/sampling.md, "Measured speed"):
#   bench/run_sampler_c.sh [SWEEPS]   (after mvn -B -Pbench -DskipTests package)
# Builds bench/metropolis.c with gcc -O3 -march=native, writes the two benchmark glasses
# (16 x 16 K4,4 cells, +-1 and Gaussian couplings) and runs each kernel three times
# (table2: the table loop on two reads interleaved, as obverse's sampler sweeps integer problems;
# free, free2: obverse's branch-free integer algorithm written in C, one read and two;
# table4, free4: four reads, the plain loop and obverse's four-read kernel with packed fields).
set -eu
here="$(cd "$(dirname "${BASH_SOURCE[0]}")" && pwd)"
sweeps=${1:-4000}
work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT
gcc -O3 -march=native -o "$work/metropolis" "$here/metropolis.c" -lm
java -cp "$here/../target/obverse-bench.jar" org.obverse.bench.SamplerProblemFile "$work"
for round in 1 2 3; do
  echo "pm1      $("$work/metropolis" "$work/pm1.txt" table "$sweeps")"
  echo "pm1      $("$work/metropolis" "$work/pm1.txt" table2 "$sweeps")"
  echo "pm1      $("$work/metropolis" "$work/pm1.txt" free "$sweeps")"
  echo "pm1      $("$work/metropolis" "$work/pm1.txt" free2 "$sweeps")"
  echo "pm1      $("$work/metropolis" "$work/pm1.txt" table4 "$sweeps")"
  echo "pm1      $("$work/metropolis" "$work/pm1.txt" free4 "$sweeps")"
  echo "pm1      $("$work/metropolis" "$work/pm1.txt" exp "$sweeps")"
  echo "gaussian $("$work/metropolis" "$work/gaussian.txt" exp "$sweeps")"
  echo "gaussian $("$work/metropolis" "$work/gaussian.txt" bracket "$sweeps")"
done
