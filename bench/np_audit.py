"""numpy peer of the data part of `obverse audit --samples`: python3 np_audit.py MANIFEST RAW_DIR
Per gauge: energies of the raw reads under the gauged problem and of the un-gauged reads under
the source problem, compared bit for bit (problems are parsed; the hashes and redraws are not
re-derived, so this peer does less than the audit)."""
import json, os, sys
import numpy as np
from np_common import load_problem, energies

man = json.load(open(sys.argv[1]))
base = os.path.dirname(os.path.abspath(sys.argv[1]))
ids, h, u, v, j, off = load_problem(os.path.join(base, man["source"]["problem"]["path"]))
pos = {q: k for k, q in enumerate(ids)}
bad = 0
for g in man["gauges"]:
    gi, gh, gu, gv, gj, goff = load_problem(os.path.join(base, g["problem"]))
    sign = np.ones(len(ids), dtype=np.int8)
    sign[[pos[q] for q in g["flipped"]]] = -1
    raw = np.load(os.path.join(sys.argv[2], os.path.splitext(g["problem"])[0] + ".npy"), mmap_mode="r")
    eg = energies(raw, gh, gu, gv, gj, goff)
    es = energies(np.asarray(raw) * sign, h, u, v, j, off)
    bad += int(np.count_nonzero(eg.view(np.int64) != es.view(np.int64)))
print("mismatches", bad)
