"""Reference timing for bench/engine.bench.ts: the same cross-validated lasso path as Lariat's CLI,
with scikit-learn's coordinate descent, as one process reading the same CSV.

Mirrors Lariat's defaults: each fold's training rows are centred and divided by their population
standard deviation, the penalty applies to the standardized coefficients, the lambda grid is given,
and the CV error is the mean over folds of each fold's mean held-out loss. Also fits the full-data
path, as Lariat does. Prints one JSON object.

usage: sklearn_cv.py DATA.csv RESPONSE FOLD_COLUMN GRID.json TOL [raw]   (gaussian lasso only)
`raw`: columns centred only (Lariat's --no-standardize).
"""
import json
import sys
import time

import numpy as np
import sklearn
from sklearn.exceptions import ConvergenceWarning
from sklearn.linear_model import enet_path
import warnings

warnings.simplefilter("ignore", ConvergenceWarning)


STANDARDIZE = True


def standardize(x_train, x_other):
    mu = x_train.mean(axis=0)
    if not STANDARDIZE:
        return x_train - mu, x_other - mu
    sd = x_train.std(axis=0)  # population sd (ddof=0), as Lariat
    sd[sd == 0] = 1.0
    return (x_train - mu) / sd, (x_other - mu) / sd


def gaussian_fold(x_train, y_train, x_test, y_test, grid, tol):
    xs, xt = standardize(x_train, x_test)
    y_mean = y_train.mean()
    # precompute='auto' uses the Gram matrix when n > p, as Lariat's design says.
    _, coefs, _ = enet_path(xs, y_train - y_mean, l1_ratio=1.0, alphas=grid, tol=tol,
                            max_iter=100000, precompute="auto")
    if y_test is None:
        return None
    eta = y_mean + xt @ coefs  # (n_test, n_lambda)
    return ((y_test[:, None] - eta) ** 2).mean(axis=0)


def main():
    global STANDARDIZE
    data, response, fold_column, grid_file, tol = sys.argv[1:6]
    STANDARDIZE = not (len(sys.argv) > 6 and sys.argv[6] == "raw")
    started = time.perf_counter()
    with open(data) as f:
        header = f.readline().strip().split(",")
    table = np.loadtxt(data, delimiter=",", skiprows=1)
    read_seconds = time.perf_counter() - started
    y = table[:, header.index(response)]
    folds = table[:, header.index(fold_column)].astype(int)
    keep = [j for j, name in enumerate(header) if name not in (response, fold_column)]
    x = np.ascontiguousarray(table[:, keep])
    with open(grid_file) as f:
        grid = np.array(json.load(f), dtype=float)
    tol = float(tol)
    gaussian_fold(x, y, x, None, grid, tol)  # the full-data path, as Lariat fits it
    per_fold = []
    for k in np.unique(folds):
        test = folds == k
        per_fold.append(gaussian_fold(x[~test], y[~test], x[test], y[test], grid, tol))
    mean = np.mean(per_fold, axis=0)
    print(json.dumps({
        "sklearn": sklearn.__version__,
        "mean": mean.tolist(),
        "minimumIndex": int(np.argmin(mean)),
        "seconds": time.perf_counter() - started,
        "readSeconds": read_seconds,
    }))


if __name__ == "__main__":
    main()
