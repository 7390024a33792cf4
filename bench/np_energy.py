"""numpy peer of `obverse energy --out`: python3 np_energy.py PROBLEM SAMPLES.npy OUT.npy"""
import sys
import numpy as np
from np_common import load_problem, energies

ids, h, u, v, j, off = load_problem(sys.argv[1])
s = np.load(sys.argv[2], mmap_mode="r")
np.save(sys.argv[3], energies(s, h, u, v, j, off))
