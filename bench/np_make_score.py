"""Score benchmark data (numpy, outside the test suite): python3 np_make_score.py DIR
Writes DIR/score_results.csv: 300 instances x 4 settings x 20 gauges, 1,000 reads a gauge written
as one row per distinct outcome (about 10: energies at the ground and a few levels above, some reads
unanswered) with its count, and DIR/score_ground.csv (ground energy 0 for every instance)."""
import os, sys
import numpy as np

d = sys.argv[1]
rng = np.random.default_rng(7)
rows = ["instance,setting,gauge,energy,count,broken,run_us\n"]
settings = ["anneal_us=%d" % t for t in (5, 20, 100, 500)]
for i in range(300):
    hard = rng.uniform(0.3, 4.0)                   # instance hardness
    for s, label in enumerate(settings):
        run = (5, 20, 100, 500)[s]
        p = 1 / (1 + np.exp(hard * 2 - s * 0.6))   # ground-state probability of this cell
        for g in range(20):
            pg = np.clip(p * rng.lognormal(0, 0.3), 0, 1)
            probs = np.array([pg] + [(1 - pg) * w for w in (0.3, 0.2, 0.15, 0.1, 0.08, 0.06, 0.05, 0.04, 0.02)])
            counts = rng.multinomial(1000, probs / probs.sum())
            for k, c in enumerate(counts):
                if c:
                    e = "" if k == 9 else "%g" % (0.5 * k)
                    rows.append("inst%04d,%s,%d,%s,%d,%d,%d\n" % (i, label, g, e, c, 1 if k == 9 else 0, run))
open(os.path.join(d, "score_results.csv"), "w").writelines(rows)
open(os.path.join(d, "score_ground.csv"), "w").writelines(
    ["instance,ground_energy\n"] + ["inst%04d,0\n" % i for i in range(300)])
