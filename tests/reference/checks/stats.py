"""Statistics of the tolerance study against numpy and scipy.

Type-7 quantiles (Hyndman & Fan) against numpy.quantile(method="linear") on
samples with ties, wide spreads and extremes; Wilson 95 % score intervals of
an exceedance probability against scipy.stats.binomtest(...).proportion_ci.
"""

import numpy as np
from scipy import stats

from common import guarded


def run(h, rec):
    def quantiles():
        rng = np.random.default_rng(20240611)
        samples = {
            "normal, 1 000": rng.normal(3.0, 0.4, 1000),
            "lognormal, 10 001": rng.lognormal(0.0, 1.5, 10001),
            "ties and a single outlier": np.array([1.0] * 40 + [2.0] * 35 + [1e6]),
            "seven values of mixed sign and scale": np.array([-3.5e-9, 2.0, 2.0, 7.25e3, -1.0, 0.0, 1e-300]),
            "one value": np.array([42.0]),
        }
        ps = [0.0, 0.001, 0.01, 0.05, 0.25, 0.5, 0.75, 0.95, 0.99, 0.999, 1.0]
        for name, s in samples.items():
            got = h.call("stats", sample=[float(x) for x in s], p=ps)
            want = np.quantile(s, ps, method="linear")
            for p, g, w in zip(ps, got["quantiles"], want):
                rec.compare("py.stats.quantile", f"{name}: quantile {p}", g, float(w))
    guarded(rec, "py.stats.quantile", "quantiles", quantiles)

    def wilson():
        pairs = [(0, 10), (1, 10), (5, 10), (10, 10), (3, 1000), (9990, 10000), (0, 10000), (137, 400)]
        got = h.call("stats", binomial=pairs)
        rec.compare("py.stats.wilson", "z for a two-sided 95 % interval", got["z_95"], float(stats.norm.ppf(0.975)))
        for (k, n), g in zip(pairs, got["wilson_95"]):
            ci = stats.binomtest(k, n).proportion_ci(confidence_level=0.95, method="wilson")
            rec.compare("py.stats.wilson", f"{k} of {n}: lower bound", g["low"], float(ci.low))
            rec.compare("py.stats.wilson", f"{k} of {n}: upper bound", g["high"], float(ci.high))
    guarded(rec, "py.stats.wilson", "wilson", wilson)
