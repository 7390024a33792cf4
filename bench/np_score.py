"""numpy peer of `obverse score TABLE --ground G --out DIR` (default options: target 0.99,
median over instances, 1,000 bootstrap replicates over instances, bands 35-65 % and 5-95 %):
python3 np_score.py RESULTS.csv GROUND.csv OUT_DIR
Reads the table column-wise (csv module), sums reads/successes/run time per (instance, setting,
gauge) and per cell with np.bincount, Wilson and Clopper-Pearson intervals per cell (scipy),
per-gauge quantiles, and the bootstrap as one gather of a (replicates x instances) index array;
writes instances.csv and settings.csv. Needs numpy and scipy (benchmarks only)."""
import csv, os, sys
import numpy as np
from scipy.special import betaincinv
from scipy.stats import norm

res, gfile, out = sys.argv[1:4]
os.makedirs(out, exist_ok=True)
with open(res, newline="") as f:
    r = csv.reader(f)
    head = next(r)
    cols = list(zip(*r))
c = {name: cols[k] for k, name in enumerate(head)}
with open(gfile, newline="") as f:
    r = csv.reader(f)
    next(r)
    ground = {a: float(b) for a, b, *_ in r}
inst_names, inst = np.unique(np.array(c["instance"]), return_inverse=True)
set_names, sett = np.unique(np.array(c["setting"]), return_inverse=True)
gauge = np.array(c["gauge"], dtype=np.int64)
energy = np.array([float(x) if x else np.nan for x in c["energy"]])
count = np.array(c["count"], dtype=np.int64)
broken = np.array(c["broken"], dtype=np.int64)
run = np.array(c["run_us"], dtype=np.float64)
g = np.array([ground[x] for x in inst_names])[inst]
succ = np.where(energy <= g + 1e-9 + 1e-9 * np.abs(g), count, 0)
nI, nS = len(inst_names), len(set_names)
nG = gauge.max() + 1
cell = inst * nS + sett
slot = cell * nG + gauge
nC = nI * nS
reads_g = np.bincount(slot, count, nC * nG).reshape(nC, nG)
succ_g = np.bincount(slot, succ, nC * nG).reshape(nC, nG)
reads = reads_g.sum(1)
succs = succ_g.sum(1)
run_mean = np.bincount(cell, run * count, nC) / reads
ans = ~np.isnan(energy)
resid = np.bincount(cell[ans], (energy - g)[ans] * count[ans], nC) / np.bincount(cell[ans], count[ans], nC)
emin = np.full(nC, np.inf)
np.minimum.at(emin, cell[ans], energy[ans])
brk = np.bincount(cell, broken * count, nC) / reads
logmiss = np.log1p(-0.99)


def tts(p, t):
    with np.errstate(divide="ignore"):
        lf = np.log1p(-p)
        return np.where(p <= 0, np.inf, np.where(lf <= logmiss, t, t * logmiss / lf))


p = succs / reads
t = tts(p, run_mean)
z = norm.ppf(0.975)
den = 1 + z * z / reads
mid = (p + z * z / (2 * reads)) / den
half = z * np.sqrt(p * (1 - p) / reads + z * z / (4 * reads * reads)) / den
cp_lo = np.where(succs == 0, 0.0, betaincinv(succs, reads - succs + 1, 0.025))
cp_hi = np.where(succs == reads, 1.0, betaincinv(succs + 1, reads - succs, 0.975))
pg = np.where(reads_g > 0, succ_g / np.maximum(reads_g, 1), np.nan)
pq = np.nanquantile(pg, [0, 0.25, 0.5, 0.75, 1], axis=1)
tg = np.nanmedian(tts(pg, run_mean[:, None]), axis=1)
with open(os.path.join(out, "instances.csv"), "w") as f:
    f.write("instance,setting,reads,successes,p_success,tts_us,p_wilson_low,p_wilson_high,p_cp_low,p_cp_high,"
            "run_us,residual_mean,min_energy,broken_mean,p_gauge_min,p_gauge_q1,p_gauge_median,p_gauge_q3,"
            "p_gauge_max,tts_gauge_median_us\n")
    f.writelines("%s,%s,%d,%d,%.17g,%.17g,%.17g,%.17g,%.17g,%.17g,%.17g,%.17g,%.17g,%.17g,%.17g,%.17g,%.17g,%.17g,%.17g,%.17g\n" % (
        inst_names[k // nS], set_names[k % nS], reads[k], succs[k], p[k], t[k], mid[k] - half[k], mid[k] + half[k],
        cp_lo[k], cp_hi[k], run_mean[k], resid[k], emin[k], brk[k], *pq[:, k], tg[k]) for k in range(nC))
# bootstrap over instances: the same drawn instances serve every setting
rng = np.random.default_rng(1)
idx = rng.integers(0, nI, size=(1000, nI))
T = t.reshape(nI, nS).T
P = p.reshape(nI, nS).T
with open(os.path.join(out, "settings.csv"), "w") as f:
    f.write("setting,instances,tts_us,tts_band_low_us,tts_band_high_us,tts_outer_low_us,tts_outer_high_us,"
            "observed_tts_us,p_success,p_success_band_low,p_success_band_high,p_success_outer_low,"
            "p_success_outer_high,observed_p_success\n")
    for s in range(nS):
        bt = np.median(T[s][idx], axis=1)
        bp = np.median(P[s][idx], axis=1)
        qt = np.quantile(bt, [0.5, 0.35, 0.65, 0.05, 0.95])
        qp = np.quantile(bp, [0.5, 0.35, 0.65, 0.05, 0.95])
        f.write("%s,%d,%.17g,%.17g,%.17g,%.17g,%.17g,%.17g,%.17g,%.17g,%.17g,%.17g,%.17g,%.17g\n" % (set_names[s], nI, *qt, np.median(T[s]), *qp,
                                                              np.median(P[s])))
