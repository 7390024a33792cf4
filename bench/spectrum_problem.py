"""Writes the spectrum benchmark's problem: 16 spins with fields on a chain plus random couplers
(invented, seeded): python3 bench/spectrum_problem.py OUT.json"""
import sys
import json, numpy as np
rng = np.random.default_rng(20261203)
n = 16
J = {}
for k in range(1, n):
    J[(k-1, k)] = float(rng.uniform(-1, 1))
while len(J) < n + n // 2 - 1:
    i, j = sorted(int(x) for x in rng.choice(n, 2, replace=False))
    if j - i > 1 and (i, j) not in J:
        J[(i, j)] = float(rng.uniform(-1, 1))
h = [[k, float(rng.uniform(-1, 1))] for k in range(n)]
json.dump({"format": "obverse.problem/1", "domain": "spin", "h": h,
           "J": [[i, j, v] for (i, j), v in sorted(J.items())], "offset": 0.0}, open(sys.argv[1], "w"), indent=1)
