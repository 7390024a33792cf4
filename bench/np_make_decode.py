"""Decode benchmark data (numpy, outside the test suite): python3 np_make_decode.py DIR
Needs DIR/dev.json (the 16x16 K4,4 lattice). Writes DIR/dec_logical.json (300 spin variables,
a coupling +-1 between every two chains that share a working coupler, fields +-0.5),
DIR/dec_chains.json (300 chains of 4 qubits: two per cell, K2,2 each, cells 0..149 in row-major
order) and DIR/dec_reads.npy (100,000 reads of the 1,200 chain qubits, columns ascending: each
chain's value drawn uniformly, then each qubit flipped with probability 0.03, so chains break).
Then `obverse embed --logical dec_logical.json --chains dec_chains.json --device dev.json
--chain-coupling -2 --out dec_phys.json` makes the physical problem."""
import json, os, sys
import numpy as np

d = sys.argv[1]
dev = json.load(open(os.path.join(d, "dev.json")))
shore, cols = 4, dev["meta"]["lattice"]["cols"]
chain_of = {}
chains = []
for cell in range(150):
    for half in (0, 1):
        ks = (2 * half, 2 * half + 1)
        q = [(cell * 2 + side) * shore + k for side in (0, 1) for k in ks]
        for x in q:
            chain_of[x] = len(chains)
        chains.append([len(chains), q])
pairs = sorted({tuple(sorted((chain_of[a], chain_of[b]))) for a, b in dev["couplers"]
                if a in chain_of and b in chain_of and chain_of[a] != chain_of[b]})
rng = np.random.default_rng(21)
h = [[v, float(x)] for v, x in zip(range(300), rng.choice([-0.5, 0.5], 300))]
J = [[a, b, float(x)] for (a, b), x in zip(pairs, rng.choice([-1.0, 1.0], len(pairs)))]
json.dump({"format": "obverse.problem/1", "domain": "spin", "h": h, "J": J, "offset": 0.0},
          open(os.path.join(d, "dec_logical.json"), "w"))
json.dump({"format": "obverse.chains/1", "chains": chains}, open(os.path.join(d, "dec_chains.json"), "w"))
qubits = sorted(chain_of)
col = np.array([chain_of[q] for q in qubits])
n = 100000
out = np.lib.format.open_memmap(os.path.join(d, "dec_reads.npy"), mode="w+", dtype=np.int8, shape=(n, len(qubits)))
for a in range(0, n, 10000):
    v = rng.choice(np.array([-1, 1], dtype=np.int8), size=(10000, 300))
    x = v[:, col]
    flip = rng.random(x.shape) < 0.03
    out[a:a + 10000] = np.where(flip, -x, x)
out.flush()
