"""numpy peer of `obverse ungauge`: python3 np_ungauge.py MANIFEST RAW_DIR OUT_DIR
Un-gauges every gauge's samples in chunks (multiply by the gauge's signs) and writes the
device-frame moment tables (magnetisation.csv, correlations.csv)."""
import json, os, sys
import numpy as np
from np_common import load_problem

man = json.load(open(sys.argv[1]))
base = os.path.dirname(os.path.abspath(sys.argv[1]))
ids, h, u, v, j, off = load_problem(os.path.join(base, man["source"]["problem"]["path"]))
pos = {q: k for k, q in enumerate(ids)}
os.makedirs(sys.argv[3], exist_ok=True)
mag, cor = ["qubit,gauge,reads,sum_spin,sign\n"], ["qubit_a,qubit_b,gauge,reads,sum_product,sign\n"]
chunk = 4096
for g in man["gauges"]:
    sign = np.ones(len(ids), dtype=np.int8)
    sign[[pos[q] for q in g["flipped"]]] = -1
    raw = np.load(os.path.join(sys.argv[2], os.path.splitext(g["problem"])[0] + ".npy"), mmap_mode="r")
    out = np.lib.format.open_memmap(os.path.join(sys.argv[3], os.path.splitext(g["problem"])[0] + ".npy"), mode="w+", dtype=np.int8,
                                    shape=raw.shape)
    up = np.zeros(len(ids), dtype=np.int64)
    prod = np.zeros(len(u), dtype=np.int64)
    for a in range(0, raw.shape[0], chunk):
        x = np.asarray(raw[a:a + chunk])
        out[a:a + chunk] = x * sign
        up += x.sum(axis=0, dtype=np.int64)
        prod += (x[:, u] * x[:, v]).sum(axis=0, dtype=np.int64)
    out.flush()
    del out
    n = raw.shape[0]
    mag += ["%d,%d,%d,%d,%d\n" % (ids[k], g["index"], n, up[k], sign[k]) for k in range(len(ids))]
    cor += ["%d,%d,%d,%d,%d,%d\n" % (ids[u[e]], ids[v[e]], g["index"], n, prod[e], sign[u[e]] * sign[v[e]])
            for e in range(len(u))]
open(os.path.join(sys.argv[3], "magnetisation.csv"), "w").writelines(mag)
open(os.path.join(sys.argv[3], "correlations.csv"), "w").writelines(cor)
