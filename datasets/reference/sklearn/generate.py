"""Reference fits from scikit-learn for Lariat's engine tests (tests/engine/reference/sklearn-*.test.ts).

Run with Debian's system Python and its python3-sklearn:
    /usr/bin/python3 datasets/reference/sklearn/generate.py
Writes gaussian-paths.json, logistic-paths.json, logistic-unpenalized.json, separation.json and
longley-inference.json beside this file. Each
fixture records the scikit-learn, numpy and Python versions and the exact calls with their parameters.

Objective scalings (checked against the scikit-learn 1.2.1 doc strings and source):
- ElasticNet(alpha=a, l1_ratio=r) minimizes
      1/(2n) ||y - b0 - Xw||^2 + a r ||w||_1 + a (1 - r)/2 ||w||^2
  which is Lariat's gaussian objective with lambda = a and mix alpha = r.
- LogisticRegression(penalty='l1'|'elasticnet', C=c, l1_ratio=r, solver='saga') minimizes
      c sum_i logloss_i + r ||w||_1 + (1 - r)/2 ||w||^2      (intercept unpenalized)
  (sklearn/linear_model/_logistic.py passes beta = r/C, alpha = (1 - r)/C to sag_solver, which
  divides both by n). Dividing by c n gives Lariat's binomial objective with lambda = 1/(c n).
Standardized cases: X is centred and divided by its population standard deviation (ddof = 0) here,
before scikit-learn sees it, which is what Lariat's standardize = true does internally; the
original-scale coefficients w_j / sd_j and intercept b0 - sum_j mean_j w_j / sd_j are derived here
from scikit-learn's solution.
"""
import hashlib
import json
import os
import platform
import sys
import warnings

import numpy as np
import sklearn
from sklearn.exceptions import ConvergenceWarning
from sklearn.linear_model import ElasticNet, LogisticRegression

HERE = os.path.dirname(os.path.abspath(__file__))
ROOT = os.path.abspath(os.path.join(HERE, "..", "..", ".."))
OPEN = os.path.join(ROOT, "datasets", "open")
SEED = 20240607
PATH_LENGTH = 25
warnings.simplefilter("error", ConvergenceWarning)  # a non-converged reference is a failure here


def versions():
    return {"sklearn": sklearn.__version__, "numpy": np.__version__, "python": platform.python_version()}


def read_csv(name):
    path = os.path.join(OPEN, name)
    with open(path, "rb") as f:
        raw = f.read()
    lines = raw.decode().strip().split("\n")
    header = lines[0].split(",")
    data = np.array([[float(v) for v in line.split(",")] for line in lines[1:]])
    return header, data, hashlib.sha256(raw).hexdigest()


def standardize(X):
    mean = X.mean(axis=0)
    sd = X.std(axis=0)  # population sd (ddof = 0), Lariat's convention
    return (X - mean) / sd, mean, sd


def log_grid(lam_max, ratio, length):
    return list(np.exp(np.linspace(np.log(lam_max), np.log(lam_max * ratio), length)))


def generated_data():
    """n = 200, p = 30: AR(1)-correlated columns (rho 0.8), then scales 0.2..20 and offsets -50..50."""
    rng = np.random.default_rng(SEED)
    n, p = 200, 30
    z = rng.standard_normal((n, p))
    X = np.empty((n, p))
    X[:, 0] = z[:, 0]
    for j in range(1, p):
        X[:, j] = 0.8 * X[:, j - 1] + np.sqrt(1 - 0.8**2) * z[:, j]
    scale = np.exp(rng.uniform(np.log(0.2), np.log(20), p))
    offset = rng.uniform(-50, 50, p)
    X = X * scale + offset
    beta = np.zeros(p)
    beta[[0, 3, 4, 10, 17, 25]] = [2.0, -1.5, 1.0, 0.8, -0.6, 1.2]
    y = 3.0 + ((X - offset) / scale) @ beta + rng.standard_normal(n)
    # Round to 12 significant digits so the JSON text is the exact data both sides use.
    X = np.array([[float(f"{v:.12g}") for v in row] for row in X])
    y = np.array([float(f"{v:.12g}") for v in y])
    terms = [f"g{j + 1:02d}" for j in range(p)]
    return terms, X, y


def gaussian_objective(X, y, b0, w, lam, mix):
    r = y - b0 - X @ w
    return r @ r / (2 * len(y)) + lam * (mix * np.abs(w).sum() + (1 - mix) / 2 * w @ w)


def gaussian_kkt(X, y, b0, w, lam, mix):
    """Largest violation of the optimality conditions (common practice: subgradient of the objective)."""
    n = len(y)
    r = y - b0 - X @ w
    g = -X.T @ r / n + lam * (1 - mix) * w
    viol = np.where(w != 0, np.abs(g + lam * mix * np.sign(w)), np.maximum(np.abs(g) - lam * mix, 0))
    return float(max(viol.max(), abs(r.mean())))


def gaussian_case(name, terms, X, y, standardized, mix):
    Xfit, mean, sd = standardize(X) if standardized else (X, np.zeros(X.shape[1]), np.ones(X.shape[1]))
    n = len(y)
    lam_max = np.abs(Xfit.T @ (y - y.mean())).max() / (n * mix)
    lambdas = log_grid(lam_max, 1e-3, PATH_LENGTH)
    params = {"l1_ratio": mix, "fit_intercept": True, "tol": 1e-13, "max_iter": 1_000_000, "selection": "cyclic"}
    out = {"coef": [], "intercept": [], "nIter": [], "objective": [], "kkt": []}
    for lam in lambdas:
        m = ElasticNet(alpha=lam, **params).fit(Xfit, y)
        w, b0 = m.coef_.copy(), float(m.intercept_)
        out["coef"].append(list(w))
        out["intercept"].append(b0)
        out["nIter"].append(int(m.n_iter_))
        out["objective"].append(float(gaussian_objective(Xfit, y, b0, w, lam, mix)))
        out["kkt"].append(gaussian_kkt(Xfit, y, b0, w, lam, mix))
    case = {
        "id": f"{name}-{'lasso' if mix == 1 else 'elastic-net'}-{'standardized' if standardized else 'raw'}",
        "dataset": name,
        "standardize": standardized,
        "penalty": "lasso" if mix == 1 else "elastic-net",
        "alpha": mix,
        "lambda": lambdas,
        "call": "ElasticNet(alpha=lambda, " + ", ".join(f"{k}={v!r}" for k, v in params.items()) + ").fit(X, y)",
        "sklearnInput": "X centred and divided by its population sd (ddof=0) in numpy" if standardized else "raw X",
        **out,
    }
    if standardized:
        case["coefOriginal"] = [list(np.array(w) / sd) for w in out["coef"]]
        case["interceptOriginal"] = [b0 - float(mean @ (np.array(w) / sd)) for b0, w in zip(out["intercept"], out["coef"])]
        case["columnMean"] = list(mean)
        case["columnSd"] = list(sd)
    return case


def gaussian_fixture():
    header, data, digest = read_csv("diabetes.csv")
    diabetes = (header[:-1], data[:, :-1], data[:, -1])
    gen_terms, gen_X, gen_y = generated_data()
    cases = []
    for name, (terms, X, y) in [("diabetes", diabetes), ("generated", (gen_terms, gen_X, gen_y))]:
        for standardized in (True, False):
            for mix in (1.0, 0.5):
                cases.append(gaussian_case(name, terms, X, y, standardized, mix))
    return {
        "source": "scikit-learn ElasticNet (coordinate descent), an outside reference (Debian python3-sklearn; docs/engine.md, section Outside references in the tests)",
        "generator": "datasets/reference/sklearn/generate.py",
        "versions": versions(),
        "objective": "1/(2n) ||y - b0 - Xw||^2 + lambda (alpha ||w||_1 + (1 - alpha)/2 ||w||^2); lambda = sklearn alpha, alpha = l1_ratio",
        "datasets": {
            "diabetes": {"file": "datasets/open/diabetes.csv", "sha256": digest, "response": header[-1], "terms": header[:-1]},
            "generated": {
                "description": f"numpy default_rng({SEED}): n=200, p=30, AR(1) rho=0.8 columns, scales 0.2..20, offsets -50..50, 6 non-zero effects, unit noise; rounded to 12 digits",
                "terms": gen_terms,
                "x": [list(r) for r in gen_X],
                "y": list(gen_y),
            },
        },
        "cases": cases,
    }


def logistic_objective(X, y, b0, w, lam, mix):
    eta = b0 + X @ w
    nll = np.mean(np.logaddexp(0, eta) - y * eta)
    return nll + lam * (mix * np.abs(w).sum() + (1 - mix) / 2 * w @ w)


def logistic_kkt(X, y, b0, w, lam, mix):
    n = len(y)
    mu = 1 / (1 + np.exp(-(b0 + X @ w)))
    g = X.T @ (mu - y) / n + lam * (1 - mix) * w
    viol = np.where(w != 0, np.abs(g + lam * mix * np.sign(w)), np.maximum(np.abs(g) - lam * mix, 0))
    return float(max(viol.max(), abs((mu - y).mean())))


def logistic_fixture():
    header, data, digest = read_csv("breast_cancer.csv")
    X, y = data[:, :-1], data[:, -1]
    Xs, mean, sd = standardize(X)
    n = len(y)
    cases = []
    for mix in (1.0, 0.5):
        lam_max = np.abs(Xs.T @ (y - y.mean())).max() / (n * mix)
        lambdas = log_grid(lam_max, 0.02, 8)
        penalty = "l1" if mix == 1 else "elasticnet"
        params = {"penalty": penalty, "solver": "saga", "tol": 1e-12, "max_iter": 2_000_000, "fit_intercept": True, "random_state": 0}
        if mix != 1:
            params["l1_ratio"] = mix
        out = {"coef": [], "intercept": [], "nIter": [], "objective": [], "kkt": [], "C": []}
        for lam in lambdas:
            C = 1 / (lam * n)
            m = LogisticRegression(C=C, **params).fit(Xs, y)
            w, b0 = m.coef_[0].copy(), float(m.intercept_[0])
            assert m.n_iter_[0] < params["max_iter"]
            out["coef"].append(list(w))
            out["intercept"].append(b0)
            out["C"].append(C)
            out["nIter"].append(int(m.n_iter_[0]))
            out["objective"].append(float(logistic_objective(Xs, y, b0, w, lam, mix)))
            out["kkt"].append(logistic_kkt(Xs, y, b0, w, lam, mix))
        cases.append({
            "id": f"breast-cancer-{'lasso' if mix == 1 else 'elastic-net'}-standardized",
            "standardize": True,
            "penalty": "lasso" if mix == 1 else "elastic-net",
            "alpha": mix,
            "lambda": lambdas,
            "call": "LogisticRegression(C=1/(lambda*n), " + ", ".join(f"{k}={v!r}" for k, v in params.items()) + ").fit(X, y)",
            "sklearnInput": "X centred and divided by its population sd (ddof=0) in numpy",
            **out,
            "coefOriginal": [list(np.array(w) / sd) for w in out["coef"]],
            "interceptOriginal": [b0 - float(mean @ (np.array(w) / sd)) for b0, w in zip(out["intercept"], out["coef"])],
        })
    return {
        "source": "scikit-learn LogisticRegression with solver='saga', an outside reference (Debian python3-sklearn; docs/engine.md, section Outside references in the tests)",
        "generator": "datasets/reference/sklearn/generate.py",
        "versions": versions(),
        "objective": "-(1/n) sum [y eta - log(1 + exp(eta))] + lambda (alpha ||w||_1 + (1 - alpha)/2 ||w||^2); lambda = 1/(C n), alpha = l1_ratio",
        "dataset": {"file": "datasets/open/breast_cancer.csv", "sha256": digest, "response": header[-1], "terms": header[:-1],
                    "columnMean": list(mean), "columnSd": list(sd)},
        "cases": cases,
    }


UNPENALIZED_TERMS = ["mean_radius", "mean_texture", "mean_smoothness", "mean_symmetry"]


def unpenalized_fixture():
    header, data, digest = read_csv("breast_cancer.csv")
    cols = [header.index(t) for t in UNPENALIZED_TERMS]
    X, y = data[:, cols], data[:, -1]
    params = {"penalty": None, "solver": "newton-cholesky", "tol": 1e-14, "max_iter": 10_000, "fit_intercept": True}
    m = LogisticRegression(**params).fit(X, y)
    w, b0 = m.coef_[0], float(m.intercept_[0])
    # Standard errors: inverse Fisher information (X1' W X1)^-1 at sklearn's estimate, X1 = [1, X].
    X1 = np.column_stack([np.ones(len(y)), X])
    mu = 1 / (1 + np.exp(-(X1 @ np.concatenate([[b0], w]))))
    info = X1.T @ (X1 * (mu * (1 - mu))[:, None])
    se = np.sqrt(np.diag(np.linalg.inv(info)))
    score = X1.T @ (y - mu)
    from scipy.stats import norm

    z = np.concatenate([[b0], w]) / se
    return {
        "source": "scikit-learn LogisticRegression(penalty=None), an outside reference; standard errors from numpy as sqrt(diag((X1' W X1)^-1)) at sklearn's estimate",
        "generator": "datasets/reference/sklearn/generate.py",
        "versions": versions(),
        "dataset": {"file": "datasets/open/breast_cancer.csv", "sha256": digest, "response": header[-1], "terms": UNPENALIZED_TERMS},
        "call": "LogisticRegression(" + ", ".join(f"{k}={v!r}" for k, v in params.items()) + ").fit(X[terms], y)",
        "nIter": int(m.n_iter_[0]),
        "maxAbsScore": float(np.abs(score).max()),
        "intercept": b0,
        "coef": list(w),
        "interceptStandardError": float(se[0]),
        "coefStandardError": list(se[1:]),
        "pValueSource": "two-sided Wald p-values 2 * scipy.stats.norm.sf(|estimate / SE|), intercept first",
        "pValue": [float(v) for v in 2 * norm.sf(np.abs(z))],
    }


def longley_inference_fixture():
    """t statistics and two-sided p-values of NIST's certified Longley estimates (scipy's t distribution)."""
    import scipy
    from scipy.stats import t

    with open(os.path.join(ROOT, "datasets", "reference", "nist", "longley.json")) as f:
        nist = json.load(f)
    est = np.array([float(v) for v in nist["certified"]["estimates"]])
    sd = np.array([float(v) for v in nist["certified"]["standardDeviations"]])
    df = len(nist["y"]) - len(est)
    stat = est / sd
    return {
        "source": "NIST StRD Longley certified estimates and standard deviations (datasets/reference/nist/longley.json); t = estimate / SD, p = 2 * scipy.stats.t.sf(|t|, df)",
        "versions": {**versions(), "scipy": scipy.__version__},
        "residualDf": df,
        "statistic": list(stat),
        "pValue": [float(v) for v in 2 * t.sf(np.abs(stat), df)],
    }


def linearly_separable(X, y):
    """LP feasibility (scipy HiGHS): is there (b0, w) with (2y - 1)(b0 + x'w) >= 1 for every row?"""
    from scipy.optimize import linprog

    Xs = (X - X.mean(axis=0)) / X.std(axis=0)
    sign = 2 * y - 1
    A = -(sign[:, None] * np.column_stack([np.ones(len(y)), Xs]))
    res = linprog(np.zeros(A.shape[1]), A_ub=A, b_ub=-np.ones(len(y)), bounds=[(None, None)] * A.shape[1], method="highs")
    assert res.status in (0, 2), res.message
    return res.status == 0


def separation_fixture():
    header, data, digest = read_csv("breast_cancer.csv")
    X, y = data[:, :-1], data[:, -1]
    subset = [header.index(t) for t in UNPENALIZED_TERMS]
    import scipy

    return {
        "source": "Linear separability decided by a linear program, scipy.optimize.linprog(method='highs'): feasible (b0, w) with (2y - 1)(b0 + x'w) >= 1 on standardized X",
        "versions": {**versions(), "scipy": scipy.__version__},
        "dataset": {"file": "datasets/open/breast_cancer.csv", "sha256": digest, "response": header[-1]},
        "cases": [
            {"terms": header[:-1], "separable": linearly_separable(X, y)},
            {"terms": UNPENALIZED_TERMS, "separable": linearly_separable(X[:, subset], y)},
        ],
    }


def write(name, obj):
    with open(os.path.join(HERE, name), "w") as f:
        json.dump(obj, f, separators=(",", ":"))
        f.write("\n")


def main(out_dir=None):
    global HERE
    if out_dir:
        HERE = out_dir
    write("logistic-unpenalized.json", unpenalized_fixture())
    write("separation.json", separation_fixture())
    write("longley-inference.json", longley_inference_fixture())
    write("gaussian-paths.json", gaussian_fixture())
    write("logistic-paths.json", logistic_fixture())


if __name__ == "__main__":
    main(sys.argv[1] if len(sys.argv) > 1 else None)
