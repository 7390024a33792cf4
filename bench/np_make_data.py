"""Benchmark data (numpy, outside the test suite): python3 np_make_data.py DIR
Needs DIR/dev.json from `obverse device lattice --rows 16 --cols 16 --out DIR/dev.json`.
Writes DIR/prob.json (a +-1 spin glass with fields +-0.25/+-0.5 on every qubit and coupler),
DIR/raw/g0000.npy ... g0015.npy (12,500 random reads each) and DIR/big200k.npy (200,000 reads)."""
import json, os, sys
import numpy as np

d = sys.argv[1]
rng = np.random.default_rng(12)
dev = json.load(open(os.path.join(d, "dev.json")))
q, c = dev["qubits"], dev["couplers"]
h = [[int(i), float(v)] for i, v in zip(q, rng.choice([-0.25, 0.25, 0.5, -0.5], len(q)))]
J = [[int(a), int(b), float(v)] for (a, b), v in zip(c, rng.choice([-1.0, 1.0], len(c)))]
json.dump({"format": "obverse.problem/1", "domain": "spin", "h": h, "J": J, "offset": 0.0},
          open(os.path.join(d, "prob.json"), "w"))
rng = np.random.default_rng(3)
spins = np.array([-1, 1], dtype=np.int8)
os.makedirs(os.path.join(d, "raw"), exist_ok=True)
for g in range(16):
    np.save(os.path.join(d, "raw", "g%04d.npy" % g), rng.choice(spins, size=(12500, len(q))))
np.save(os.path.join(d, "big200k.npy"), rng.choice(spins, size=(200000, len(q))))
