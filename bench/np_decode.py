"""numpy peer of `obverse decode --rule majority`:
python3 np_decode.py PHYSICAL LOGICAL CHAINS READS.npy OUT_DIR
Writes OUT_DIR/logical.npy, kept.npy, broken.npy, energies.npy and chains.csv like the command
(majority vote per chain; a tie takes -sign of its local field over the logical neighbours, tied
chains not yet settled counting 0, in ascending logical id; a zero field takes one of its own
qubits at random). Chains of one length are voted together by a gather and a sum over the chain
axis; reads go in chunks that stay in cache."""
import json, os, sys
import numpy as np
from np_common import load_problem, energies

pids = load_problem(sys.argv[1])[0]
lids, h, u, v, j, off = load_problem(sys.argv[2])
chains = {int(c[0]): [int(q) for q in c[1]] for c in json.load(open(sys.argv[3]))["chains"]}
raw = np.load(sys.argv[4], mmap_mode="r")
out = sys.argv[5]
os.makedirs(out, exist_ok=True)
ppos = {q: k for k, q in enumerate(pids)}
nL, n = len(lids), raw.shape[0]
lengths = np.array([len(chains[l]) for l in lids])
groups = []                                   # (logical positions, physical columns [len, L]) per length
for L in sorted(set(lengths.tolist())):
    pos = np.nonzero(lengths == L)[0]
    groups.append((pos, np.array([[ppos[q] for q in chains[lids[p]]] for p in pos])))
# logical neighbours for the tie rule
nbr = [[] for _ in range(nL)]
for e in range(len(u)):
    nbr[u[e]].append((v[e], j[e]))
    nbr[v[e]].append((u[e], j[e]))
nbr_idx = [np.array([a for a, _ in x], dtype=np.int64) for x in nbr]
nbr_j = [np.array([b for _, b in x]) for x in nbr]
rng = np.random.default_rng(0)
logical = np.lib.format.open_memmap(os.path.join(out, "logical.npy"), mode="w+", dtype=np.int8, shape=(n, nL))
broken = np.empty(n, dtype=np.int32)
chain_broken = np.zeros(nL, dtype=np.int64)
en = np.empty(n)
chunk = 4096
for a in range(0, n, chunk):
    x = np.asarray(raw[a:a + chunk])
    m = x.shape[0]
    s = np.empty((m, nL), dtype=np.int8)
    br = np.zeros((m, nL), dtype=bool)
    for pos, cols in groups:
        g = x[:, cols]                                  # m x chains x L
        t = g.sum(axis=2, dtype=np.int16)
        s[:, pos] = np.sign(t).astype(np.int8)
        br[:, pos] = np.abs(t) != cols.shape[1]
    tied = s == 0
    if tied.any():
        for c in np.nonzero(tied.any(axis=0))[0]:        # ascending logical id
            rows = np.nonzero(tied[:, c])[0]
            f = h[c] + s[np.ix_(rows, nbr_idx[c])].astype(np.float64) @ nbr_j[c]
            val = -np.sign(f).astype(np.int8)
            zero = val == 0
            if zero.any():
                qc = np.array([ppos[q] for q in chains[lids[c]]])
                val[zero] = x[rows[zero], qc[rng.integers(0, len(qc), zero.sum())]]
            s[rows, c] = val
    logical[a:a + m] = s
    broken[a:a + m] = br.sum(axis=1)
    chain_broken += br.sum(axis=0)
    en[a:a + m] = energies(s, h, u, v, j, off)
logical.flush()
del logical
np.save(os.path.join(out, "kept.npy"), np.ones(n, dtype=bool))
np.save(os.path.join(out, "broken.npy"), broken)
np.save(os.path.join(out, "energies.npy"), en)
with open(os.path.join(out, "chains.csv"), "w") as f:
    f.write("logical_id,length,broken_reads,broken_fraction\n")
    f.writelines("%d,%d,%d,%r\n" % (lids[k], lengths[k], chain_broken[k], float(chain_broken[k] / n)) for k in range(nL))
