#!/usr/bin/python3
"""Reference values for forecast/bias.go: the Newey-West (1987) HAC
standard error of a mean error and its t test, computed with statsmodels.

Run with Debian's interpreter (python3-statsmodels 0.13.5, numpy 1.24.2,
scipy 1.10.1):

    /usr/bin/python3 gen_bias.py

It writes bias_golden.json beside this script. The errors are drawn from a
seeded numpy generator (no real data).

Model: the mean error is the coefficient of OLS(e, ones). cov_type='HAC'
with maxlags=L is the Bartlett-kernel estimate; use_correction=True
multiplies it by n/(n-1) and use_t=True takes the p-value from Student's t
with n-1 degrees of freedom, as MeanErrorTest does.
"""
import json
import os

import numpy as np
import scipy
import statsmodels
import statsmodels.api as sm


def case(name, e, lag):
    e = np.asarray(e, dtype=float)
    res = sm.OLS(e, np.ones(len(e))).fit(
        cov_type="HAC", cov_kwds={"maxlags": lag, "use_correction": True}, use_t=True)
    assert res.df_resid == len(e) - 1
    return {
        "name": name,
        "errors": e.tolist(),
        "lag": lag,
        "mean": float(res.params[0]),
        "se": float(res.bse[0]),
        "t": float(res.tvalues[0]),
        "p": float(res.pvalues[0]),
    }


def main():
    rng = np.random.default_rng(20260301)
    unbiased = rng.normal(0.0, 1.0, 30)
    low = rng.normal(0.8, 2.0, 19)
    # Serially correlated errors: an AR(1) with coefficient 0.6 around 0.3.
    ar = np.zeros(36)
    shocks = rng.normal(0.0, 1.0, 36)
    for t in range(36):
        ar[t] = (0.6 * ar[t - 1] if t > 0 else 0.0) + shocks[t]
    ar += 0.3
    high = rng.normal(-1.0, 1.5, 25)
    cases = [
        case("unbiased errors, lag 3", unbiased, 3),
        case("19 errors that run low, lag 2", low, 2),
        case("19 errors that run low, lag 0", low, 0),
        case("correlated errors, lag 3", ar, 3),
        case("correlated errors, lag 8", ar, 8),
        case("25 errors that run high, lag 2", high, 2),
    ]
    out = {
        "generator": "gen_bias.py",
        "versions": {"statsmodels": statsmodels.__version__, "numpy": np.__version__, "scipy": scipy.__version__},
        "cases": cases,
    }
    path = os.path.join(os.path.dirname(os.path.abspath(__file__)), "bias_golden.json")
    with open(path, "w") as f:
        json.dump(out, f, indent=1)
        f.write("\n")


if __name__ == "__main__":
    main()
