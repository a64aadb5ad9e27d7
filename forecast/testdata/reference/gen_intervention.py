"""Golden values for forecast.FitInterventions with the linear-trend method.

With a linear trend the baseline is a regression, so cleaning a step out of
the history is ordinary least squares with the step dummy as a regressor.
The Nile annual flow (statsmodels.datasets.nile, 1871-1970) has the
well-known level shift from 1899; we regress volume on an intercept, a time
trend and a step dummy that is 1 from 1899 on.

Run with Debian's python3-statsmodels (0.13.5+dfsg on bookworm):
    /usr/bin/python3 forecast/testdata/reference/gen_intervention.py
which writes forecast/testdata/reference/intervention_golden.json.
"""
import json
import os

import numpy as np
import statsmodels
import statsmodels.api as sm

data = sm.datasets.nile.load_pandas().data
y = data["volume"].to_numpy(dtype=float)
years = data["year"].to_numpy(dtype=int)
n = len(y)
t = np.arange(1, n + 1, dtype=float)
step = (years >= 1899).astype(float)
X = np.column_stack([np.ones(n), t, step])
res = sm.OLS(y, X).fit()
out = {
    "source": "statsmodels %s OLS, numpy %s; nile volume ~ 1 + t + step(1899)" % (statsmodels.__version__, np.__version__),
    "y": y.tolist(),
    "first_year": int(years[0]),
    "step_year": 1899,
    "effect": float(res.params[2]),
    "std_error": float(res.bse[2]),
    "intercept": float(res.params[0]),
    "slope": float(res.params[1]),
}
path = os.path.join(os.path.dirname(os.path.abspath(__file__)), "intervention_golden.json")
with open(path, "w") as f:
    json.dump(out, f, indent=1)
    f.write("\n")
print(out["source"], out["effect"], out["std_error"])
