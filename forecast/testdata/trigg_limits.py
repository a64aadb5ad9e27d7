#!/usr/bin/python3
"""Tabulate limits for Trigg's smoothed tracking signal by simulation.

Trigg's signal is T_t = E_t / M_t with
    E_t = a e_t + (1-a) E_{t-1}
    M_t = a |e_t| + (1-a) M_{t-1}.
For each smoothing constant a = 0.01, 0.02, ..., 0.50 this script runs the
recursion over independent N(0,1) errors, drops a burn-in of 100/a steps,
and records the steady-state quantiles of |T_t| at the levels below.
The quantile at level p is the limit whose per-period false-alarm share is
1-p.

Written for and run with Debian's python3 (3.11), numpy 1.24.2 and
scipy 1.10.1:
    /usr/bin/python3 forecast/testdata/trigg_limits.py > /tmp/trigg.txt
It prints the Go table pasted into forecast/trigg.go and, on stderr, the
largest standard error over the table (from the spread between replicate
chains). Seeds are fixed, so a rerun prints the same numbers.
"""
import sys

import numpy as np
from scipy.signal import lfilter

LEVELS = [0.90, 0.95, 0.98, 0.99]
ALPHAS = [k / 100 for k in range(1, 51)]
REPS = 8            # independent chains per a
STEPS = 4e6         # total steps per a is STEPS/a, split over the chains
CHUNK = 5_000_000   # steps simulated at a time
BINS = 100_000      # histogram of |T| on [0, 1], bin width 1e-5


def quantiles(counts, levels):
    """Quantiles of a histogram on [0, 1], interpolated inside the bin."""
    cum = np.cumsum(counts)
    total = cum[-1]
    out = []
    for p in levels:
        target = p * total
        i = int(np.searchsorted(cum, target))
        below = cum[i - 1] if i > 0 else 0
        frac = (target - below) / counts[i]
        out.append((i + frac) / BINS)
    return out


def chain(a, n, rng):
    """Histogram of |T_t| over n steady-state steps of one chain."""
    counts = np.zeros(BINS + 1, dtype=np.int64)
    b, den = [a], [1.0, -(1.0 - a)]
    ze = np.array([0.0])
    zm = np.array([(1.0 - a) * np.sqrt(2.0 / np.pi)])
    burn = int(100 / a)
    left = n + burn
    while left > 0:
        m = min(CHUNK, left)
        e = rng.standard_normal(m)
        E, ze = lfilter(b, den, e, zi=ze)
        M, zm = lfilter(b, den, np.abs(e), zi=zm)
        # lfilter returns the next state as (1-a)*y[-1]; keep it as is.
        T = np.abs(E / M)
        if burn > 0:
            drop = min(burn, m)
            T = T[drop:]
            burn -= drop
        counts += np.bincount(np.minimum((T * BINS).astype(np.int64), BINS),
                              minlength=BINS + 1)
        left -= m
    return counts


def main():
    worst = 0.0
    rows = []
    for k, a in enumerate(ALPHAS):
        n = int(STEPS / a / REPS)
        total = np.zeros(BINS + 1, dtype=np.int64)
        per = []
        for r in range(REPS):
            rng = np.random.default_rng([1964, k, r])
            c = chain(a, n, rng)
            total += c
            per.append(quantiles(c, LEVELS))
        q = quantiles(total, LEVELS)
        se = np.std(np.array(per), axis=0, ddof=1) / np.sqrt(REPS)
        worst = max(worst, float(se.max()))
        rows.append((a, q))
        print(f"a={a:.2f} q={['%.4f' % v for v in q]} se={['%.5f' % v for v in se]}",
              file=sys.stderr)
    print("var triggTable = [...][%d]float64{" % (len(LEVELS) + 1))
    for a, q in rows:
        print("\t{%.2f, %s}," % (a, ", ".join("%.4f" % v for v in q)))
    print("}")
    print(f"largest standard error: {worst:.5f}", file=sys.stderr)


if __name__ == "__main__":
    main()
