"""The script an analyst would write in Python for the same job, kept as a yardstick
for `npm run bench -- peers` (bench/peers.bench.ts). Not part of Plotrate.

What it fits, per site-year (Site and Year columns), yield against N rate in the
file's own units, blocks ignored:
  - quadratic          y = a + b x + c x^2                numpy.polyfit
  - linear-plateau     y = a + b min(x, x0)               scipy.optimize.curve_fit
  - quadratic-plateau  y = a + b x + c x^2 up to x0 = -b/(2c), flat after
                                                          scipy.optimize.curve_fit
Starts as in the R script beside it: a = mean yield at the lowest rate, b = slope
between the two lowest rate means, x0 = the middle tested rate; the
quadratic-plateau starts from the quadratic. A fit that fails is recorded as such
(no retries). It writes one CSV row per site and model with the parameters, the
residual sum of squares and whether the fit converged. No quality checks, no ANOVA,
no optimum, no intervals, no across-site work: Plotrate does all of those on top of
six models, so the comparison flatters this script.

Usage: python3 bench/peers/plateau_fits.py trial.csv out.csv
"""
import csv
import sys
import warnings

import numpy as np
from scipy.optimize import OptimizeWarning, curve_fit

warnings.simplefilter("ignore", OptimizeWarning)


def linear_plateau(x, a, b, x0):
    return a + b * np.minimum(x, x0)


def quadratic_plateau(x, a, b, c):
    x0 = -b / (2 * c)
    return np.where(x < x0, a + b * x + c * x**2, a - b**2 / (4 * c))


def fit_site(x, y):
    rates = np.unique(x)
    means = np.array([y[x == r].mean() for r in rates])
    a0 = means[0]
    b0 = max((means[1] - means[0]) / (rates[1] - rates[0]), 1e-3)
    x00 = rates[(len(rates) - 1) // 2]
    rows = []
    c, b, a = np.polyfit(x, y, 2)
    rows.append(("quadratic", a, b, c, None, float(np.sum((y - (a + b * x + c * x**2)) ** 2)), True))
    try:
        p, _ = curve_fit(linear_plateau, x, y, p0=[a0, b0, x00], maxfev=2000)
        sse = float(np.sum((y - linear_plateau(x, *p)) ** 2))
        rows.append(("linear-plateau", p[0], p[1], None, p[2], sse, True))
    except (RuntimeError, ValueError):
        rows.append(("linear-plateau", None, None, None, None, None, False))
    try:
        p, _ = curve_fit(quadratic_plateau, x, y, p0=[a, b, min(c, -1e-6)], maxfev=2000)
        sse = float(np.sum((y - quadratic_plateau(x, *p)) ** 2))
        rows.append(("quadratic-plateau", p[0], p[1], p[2], -p[1] / (2 * p[2]), sse, True))
    except (RuntimeError, ValueError):
        rows.append(("quadratic-plateau", None, None, None, None, None, False))
    return rows


def main(src, dst):
    with open(src, newline="") as f:
        reader = csv.reader(f)
        header = next(reader)
        col = {h: i for i, h in enumerate(header)}
        rate = next(i for h, i in col.items() if "rate" in h.lower())
        yld = next(i for h, i in col.items() if "yield" in h.lower())
        sites = {}
        for r in reader:
            sites.setdefault(f"{r[col['Site']]} {r[col['Year']]}", []).append((float(r[rate]), float(r[yld])))
    failed = 0
    with open(dst, "w", newline="") as f:
        w = csv.writer(f)
        w.writerow(["site", "model", "a", "b", "c", "x0", "sse", "converged"])
        for key, plots in sites.items():
            xy = np.array(plots)
            for row in fit_site(xy[:, 0], xy[:, 1]):
                failed += not row[-1]
                w.writerow([key, *row])
    print(f"{len(sites)} site-years, {3 * len(sites)} fits, {failed} did not converge")


if __name__ == "__main__":
    main(sys.argv[1], sys.argv[2])
