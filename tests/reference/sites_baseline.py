"""Class-mean baseline for corpus/sites/literature.tsv: predict each holdout row by the mean of the
train rows of its class, per scale. This is the 'class lookup' a chemist would script; the rule engine
should beat it clearly. Needs only the committed corpus. Usage: python3 tests/reference/sites_baseline.py
"""
import os
from collections import defaultdict

ROOT = os.path.normpath(os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", ".."))


def main():
    with open(os.path.join(ROOT, "corpus", "sites", "literature.tsv")) as f:
        lines = [line.rstrip("\n").split("\t") for line in f if line.strip() and not line.startswith("#")]
    rows = [dict(zip(lines[0], cells)) for cells in lines[1:]]
    for col in ("pka_dmso", "pka_water"):
        train = defaultdict(list)
        for r in rows:
            if r["split"] == "train" and r[col]:
                train[r["class"]].append(float(r[col]))
        errors, uncovered = [], 0
        for r in rows:
            if r["split"] != "holdout" or not r[col]:
                continue
            values = train.get(r["class"])
            if not values:
                uncovered += 1
                continue
            errors.append(abs(sum(values) / len(values) - float(r[col])))
        mae = sum(errors) / len(errors) if errors else float("nan")
        print(f"{col}: class-mean baseline, holdout MAE {mae:.2f} over {len(errors)} rows "
              f"({uncovered} holdout rows have no train value in their class)")


if __name__ == "__main__":
    main()
