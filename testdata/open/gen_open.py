#!/usr/bin/python3
"""Export the open monthly and quarterly series that ship inside statsmodels.

Run from the repository root with Debian's interpreter:

    /usr/bin/python3 testdata/open/gen_open.py

It writes, beside this script, monthly.csv and quarterly.csv in forelay's
long history layout (columns series, period, value; periods labelled 2001-03
and 2001-Q1) and open.json, which records the library versions, each series'
source, first and last period and length, and the months that were filled.
Nothing is downloaded: every dataset is loaded from the installed package.
forecast/evaluate measures band coverage and accuracy on these files.

Reference: statsmodels 0.13.5+dfsg (Debian bookworm package
python3-statsmodels) with numpy 1.24.2 and pandas 1.5.3; the versions in use
are recorded in open.json.

Series, named by their statsmodels module (and column):
  * co2                 - sm.datasets.co2: weekly readings (Saturdays,
                          1958-03-29 to 2001-12-29) averaged over each
                          calendar month (resample('MS').mean()); the 5
                          months without a reading are filled by linear
                          interpolation (listed in open.json). Monthly.
  * elec_equip          - sm.datasets.elec_equip, its one column, indexed
                          by the first day of each month, 1995-01 to 2016-05.
  * elnino              - sm.datasets.elnino: one row per YEAR (1950-2010)
                          with the twelve columns JAN..DEC, read year by
                          year into one monthly series, 1950-01 to 2010-12.
  * macrodata.COLUMN    - sm.datasets.macrodata, the columns realgdp,
                          realcons, realinv, realgovt, realdpi, cpi, m1,
                          tbilrate, unemp, pop, infl and realint, with the
                          year and quarter columns giving the period,
                          1959-Q1 to 2009-Q3 (as the dataset's notes say).
  * interest_inflation.COLUMN - sm.datasets.interest_inflation, the columns
                          Dp and R, year and quarter columns, 1972-Q2 to
                          1998-Q4 (as the dataset's notes say).

Every series is checked to run without a gap from the first period its
dataset documents to the last one, and to hold finite numbers only. Values
are written with Python's shortest round-trip repr.
"""
import csv
import json
import math
import os
import platform
import sys

import numpy as np
import pandas as pd
import statsmodels
from statsmodels.datasets import co2, elec_equip, elnino, interest_inflation, macrodata

MACRO_COLUMNS = ["realgdp", "realcons", "realinv", "realgovt", "realdpi", "cpi", "m1",
                 "tbilrate", "unemp", "pop", "infl", "realint"]
MONTHS = ["JAN", "FEB", "MAR", "APR", "MAY", "JUN", "JUL", "AUG", "SEP", "OCT", "NOV", "DEC"]

# The first and last period each dataset documents (its NOTE, or the dates
# in its index), checked against what is exported.
DOCUMENTED = {
    "co2": ("1958-03", "2001-12"),
    "elec_equip": ("1995-01", "2016-05"),
    "elnino": ("1950-01", "2010-12"),
    "macrodata": ("1959-Q1", "2009-Q3"),
    "interest_inflation": ("1972-Q2", "1998-Q4"),
}


def month_label(ts):
    return f"{ts.year:04d}-{ts.month:02d}"


def monthly():
    """Returns [(name, dataset, [(label, value)]), ...] and the filled months."""
    out, filled = [], []
    weekly = co2.load_pandas().data["co2"]
    means = weekly.resample("MS").mean()
    filled = [month_label(ts) for ts in means.index[means.isna()]]
    means = means.interpolate()
    out.append(("co2", "co2", [(month_label(ts), float(v)) for ts, v in means.items()]))

    ee = elec_equip.load_pandas().data.iloc[:, 0]
    if pd.infer_freq(ee.index) != "MS":
        sys.exit("elec_equip: index is not one date per month start")
    out.append(("elec_equip", "elec_equip", [(month_label(ts), float(v)) for ts, v in ee.items()]))

    en = elnino.load_pandas().data
    rows = []
    for _, r in en.iterrows():
        year = int(r["YEAR"])
        for i, mon in enumerate(MONTHS):
            rows.append((f"{year:04d}-{i + 1:02d}", float(r[mon])))
    out.append(("elnino", "elnino", rows))
    return out, filled


def quarterly():
    out = []
    md = macrodata.load_pandas().data
    labels = [f"{int(y):04d}-Q{int(q)}" for y, q in zip(md["year"], md["quarter"])]
    for c in MACRO_COLUMNS:
        out.append(("macrodata." + c, "macrodata", list(zip(labels, md[c].astype(float)))))
    ii = interest_inflation.load_pandas().data
    labels = [f"{int(y):04d}-Q{int(q)}" for y, q in zip(ii["year"], ii["quarter"])]
    for c in ["Dp", "R"]:
        out.append(("interest_inflation." + c, "interest_inflation", list(zip(labels, ii[c].astype(float)))))
    return out


def index(label):
    """Months or quarters since year 0, for the contiguity check."""
    y, rest = label.split("-")
    if rest.startswith("Q"):
        return int(y) * 4 + int(rest[1:]) - 1
    return int(y) * 12 + int(rest) - 1


def check(series):
    for name, dataset, rows in series:
        first, last = DOCUMENTED[dataset]
        if rows[0][0] != first or rows[-1][0] != last:
            sys.exit(f"{name}: runs {rows[0][0]} to {rows[-1][0]}, documented {first} to {last}")
        for (a, _), (b, _) in zip(rows, rows[1:]):
            if index(b) != index(a) + 1:
                sys.exit(f"{name}: {a} is followed by {b}")
        for lab, v in rows:
            if not math.isfinite(v):
                sys.exit(f"{name}: {lab} is {v}")


def write(path, series):
    with open(path, "w", newline="") as f:
        w = csv.writer(f, lineterminator="\n")
        w.writerow(["series", "period", "value"])
        for name, _, rows in series:
            for lab, v in rows:
                w.writerow([name, lab, repr(v)])


def main():
    here = os.path.dirname(os.path.abspath(__file__))
    mon, filled = monthly()
    qua = quarterly()
    check(mon)
    check(qua)
    write(os.path.join(here, "monthly.csv"), mon)
    write(os.path.join(here, "quarterly.csv"), qua)
    meta = {
        "generator": "testdata/open/gen_open.py",
        "python": platform.python_version(),
        "statsmodels": statsmodels.__version__,
        "numpy": np.__version__,
        "pandas": pd.__version__,
        "co2_filled_months": filled,
        "series": [{"name": n, "module": "statsmodels.datasets." + d, "file": f,
                    "first": r[0][0], "last": r[-1][0], "length": len(r)}
                   for f, group in (("monthly.csv", mon), ("quarterly.csv", qua))
                   for n, d, r in group],
    }
    with open(os.path.join(here, "open.json"), "w") as f:
        json.dump(meta, f, indent=1)
        f.write("\n")
    print("wrote", len(mon), "monthly and", len(qua), "quarterly series to", here, file=sys.stderr)


if __name__ == "__main__":
    main()
