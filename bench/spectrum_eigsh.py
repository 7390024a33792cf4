"""The peer of `obverse spectrum --problem P --points N --solver lanczos` (illustrative schedule
A = 1 - s, B = s, 4 levels, every option at its default): the same s points solved with scipy's
eigsh (ARPACK) on a sparse H(s) = -(A/2) sum X_i + (B/2) H_P over the full 2^n space -- the
grid scan, then for every dip of the gap a golden-section refinement to 1e-6 and its pause window
by bisection to 1e-4, as spec/spectrum.md describes. Each solve is warm-started from the previous
ground vector. Run with OPENBLAS_NUM_THREADS=1 (one BLAS thread):
    python3 bench/spectrum_eigsh.py P.json N
Prints the minimum gap and the number of solves and H-products."""
import json
import sys

import numpy as np
import scipy.sparse as sp
from scipy.sparse.linalg import eigsh

LEVELS = 4
TOL = 1e-12
S_TOL = 1e-6
PAUSE_TOL = 1e-4
FROM_RATIO, TO_RATIO, DIP_DEPTH = 1.1, 2.0, 1e-3

prob = json.load(open(sys.argv[1]))
points = int(sys.argv[2])
ids = sorted({t[0] for t in prob["h"]} | {t[0] for t in prob["J"]} | {t[1] for t in prob["J"]})
pos = {v: k for k, v in enumerate(ids)}
n = len(ids)
d = 1 << n
b = np.arange(d, dtype=np.int64)
spin = np.array([((b >> k) & 1) * 2 - 1 for k in range(n)], dtype=np.float64)  # bit k set: spin +1
hp = np.full(d, float(prob.get("offset", 0.0)))
for i, h in prob["h"]:
    hp += h * spin[pos[i]]
for i, j, w in prob["J"]:
    hp += w * spin[pos[i]] * spin[pos[j]]
rows = np.concatenate([b] * n)
cols = np.concatenate([b ^ (1 << k) for k in range(n)])
driver = sp.csr_matrix((np.ones(n * d), (rows, cols)), shape=(d, d))
problem = sp.diags(hp).tocsr()
scale = max(1.0, float(np.max(np.abs(hp))))

solves = 0
products = 0
v0 = None


def levels(s):
    global solves, products, v0
    h = (-0.5 * (1 - s)) * driver + (0.5 * s) * problem
    count = [0]

    def mv(x):
        count[0] += 1
        return h @ x

    op = sp.linalg.LinearOperator((d, d), matvec=mv, dtype=np.float64)
    vals, vecs = eigsh(op, k=LEVELS, which="SA", tol=TOL, v0=v0)
    order = np.argsort(vals)
    v0 = vecs[:, order[0]]
    solves += 1
    products += count[0]
    return vals[order]


def gap(s):
    e = levels(s)
    return e[1] - e[0]


grid = np.array([r / (points - 1) if r < points - 1 else 1.0 for r in range(points)])
gaps = np.array([gap(s) for s in grid])


def refine(r):
    lo, hi = grid[max(0, r - 1)], grid[min(points - 1, r + 1)]
    best = [grid[r], gaps[r]]
    inv_phi = (5 ** 0.5 - 1) / 2
    a, bb = lo, hi
    c, e = bb - inv_phi * (bb - a), a + inv_phi * (bb - a)
    fc, fe = gap(c), gap(e)
    for s, g in ((c, fc), (e, fe)):
        if g < best[1]:
            best = [s, g]
    while bb - a > 2 * S_TOL:
        if fc < fe:
            bb, e, fe = e, c, fc
            c = bb - inv_phi * (bb - a)
            fc = gap(c)
            s, g = c, fc
        else:
            a, c, fc = c, e, fe
            e = a + inv_phi * (bb - a)
            fe = gap(e)
            s, g = e, fe
        if g < best[1]:
            best = [s, g]
    return best


def crossing(start, target, last_row):
    prev = start
    for r in range(last_row + 1):
        s = grid[r]
        if s <= start:
            continue
        if gaps[r] >= target:
            lo, hi = prev, s
            if gap(lo) >= target:
                return lo
            while hi - lo > PAUSE_TOL:
                mid = 0.5 * (lo + hi)
                if gap(mid) >= target:
                    hi = mid
                else:
                    lo = mid
            return hi
        prev = s
    return max(start, grid[last_row])


def dips(min_depth):
    out = []
    for r in range(points):
        if r > 0 and gaps[r - 1] <= gaps[r]:
            continue
        end = r
        while end + 1 < points and gaps[end + 1] == gaps[r]:
            end += 1
        if end + 1 < points and gaps[end + 1] < gaps[r]:
            continue
        i, left = r - 1, gaps[r]
        while i >= 0 and gaps[i] >= gaps[r]:
            left = max(left, gaps[i])
            i -= 1
        j, right = r + 1, gaps[r]
        while j < points and gaps[j] >= gaps[r]:
            right = max(right, gaps[j])
            j += 1
        lr, rr = left - gaps[r], right - gaps[r]
        sig = lambda x: x >= min_depth and x > 0
        if j == points and not sig(rr):
            if sig(lr):
                out.append(r)
        elif i < 0 and not sig(lr):
            continue
        elif sig(min(lr, rr)):
            out.append(r)
    return out


found = dips(DIP_DEPTH * float(np.max(gaps)))
global_row = int(np.argmin(gaps))
minimum = refine(global_row)
for k, r in enumerate(found):
    m = minimum if r == global_row else refine(r)
    last_row = points - 1
    if k + 1 < len(found):
        last_row = r
        for q in range(r + 1, found[k + 1]):
            if gaps[q] > gaps[last_row]:
                last_row = q
    start = crossing(m[0], FROM_RATIO * m[1], last_row)
    crossing(start, TO_RATIO * m[1], last_row)
print(f"s* = {minimum[0]:.6f}, gap_min = {minimum[1]:.10f}; {len(found)} dips; "
      f"{solves} solves, {products} products ({products / solves:.0f} a solve)")
