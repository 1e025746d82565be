"""Writes diabetes.csv and breast_cancer.csv from the copies shipped in Debian's python3-sklearn.

Run with Debian's system Python: /usr/bin/python3 datasets/open/make_open.py
The numbers are copied as text, digit for digit; only the layout (comma-separated, a header) changes.
"""
import csv
import gzip
import os

import sklearn
from sklearn.datasets import load_breast_cancer

DATA = os.path.join(os.path.dirname(sklearn.__file__), "datasets", "data")
HERE = os.path.dirname(os.path.abspath(__file__))


def diabetes():
    # Column order of diabetes_data_raw.csv.gz: age sex bmi bp s1..s6 (sklearn's load_diabetes
    # feature_names and descr/diabetes.rst); the target file has one value per row.
    with gzip.open(os.path.join(DATA, "diabetes_data_raw.csv.gz"), "rt") as f:
        rows = [line.split() for line in f if line.strip()]
    with gzip.open(os.path.join(DATA, "diabetes_target.csv.gz"), "rt") as f:
        target = [float(line) for line in f if line.strip()]
    assert len(rows) == len(target) == 442 and all(len(r) == 10 for r in rows)
    assert all(t == int(t) for t in target)
    header = ["age", "sex", "bmi", "bp", "s1", "s2", "s3", "s4", "s5", "s6", "progression"]
    with open(os.path.join(HERE, "diabetes.csv"), "w", newline="") as f:
        w = csv.writer(f, lineterminator="\n")
        w.writerow(header)
        for r, t in zip(rows, target):
            w.writerow(r + [str(int(t))])


def breast_cancer():
    # First line of breast_cancer.csv is a count header "569,30,malignant,benign"; the last column
    # is the class, 0 = malignant, 1 = benign (kept as is in the `diagnosis` column).
    with open(os.path.join(DATA, "breast_cancer.csv")) as f:
        lines = [line.strip() for line in f if line.strip()]
    assert lines[0] == "569,30,malignant,benign"
    rows = [line.split(",") for line in lines[1:]]
    assert len(rows) == 569 and all(len(r) == 31 for r in rows)
    names = [n.replace(" ", "_") for n in load_breast_cancer().feature_names]
    with open(os.path.join(HERE, "breast_cancer.csv"), "w", newline="") as f:
        w = csv.writer(f, lineterminator="\n")
        w.writerow(names + ["diagnosis"])
        for r in rows:
            assert r[30] in ("0", "1")
            w.writerow(r)


if __name__ == "__main__":
    diabetes()
    breast_cancer()
