#!/usr/bin/env python3
"""Extract the aqueous pKa rows (25 C) of the conjugate acids of catalogue
bases from the IUPAC Digitized pKa Dataset v1.0 into corpus/advice/.

Usage (from the repository root):
    python3 tests/reference/advice_base_water.py ../shared/data/iupac-pka/iupac_high-confidence_v1_0.csv

Needs RDKit (structures are matched by canonical SMILES).
"""
import csv
import statistics
import sys

from rdkit import Chem

# Catalogue name -> SMILES of the neutral compound whose pKa row we need, and
# the IUPAC constant type: pKAH1 (conjugate acid of an amine) or pK1 (acid).
WANTED = [
    ("Et3N", "CCN(CC)CC", "pKAH1"),
    ("pyridine", "c1ccncc1", "pKAH1"),
    ("DMAP", "CN(C)c1ccncc1", "pKAH1"),
    ("piperidine", "C1CCNCC1", "pKAH1"),
    ("TMG", "CN(C)C(=N)N(C)C", "pKAH1"),
    ("NaOAc", "CC(=O)O", "pK1"),
    ("NaOEt", "CCO", "pK1"),
    ("NaOMe", "CO", "pK1"),
    ("KOtBu", "CC(C)(C)O", "pK1"),
]


def canon(smiles):
    m = Chem.MolFromSmiles(smiles)
    return Chem.MolToSmiles(m) if m else None


def main(path):
    index = {canon(s): (name, kind) for name, s, kind in WANTED}
    found = {name: [] for name, _, _ in WANTED}
    with open(path, newline="", encoding="utf-8") as f:
        for row in csv.DictReader(f):
            c = canon(row["SMILES"]) if row["SMILES"] else None
            if c not in index:
                continue
            name, kind = index[c]
            if row["pka_type"] != kind:
                continue
            t = row["T"].split(" ")[0]
            if t not in ("25", "25.0", "25.1", "24.5", "25+1"):
                continue
            rem = row["remarks"]
            # Keep ordinary-pressure, non-isotopic, low-ionic-strength rows.
            if ("P=" in rem and "P=1 (bar)" not in rem) or "-d" in rem or "I=0.5" in rem:
                continue
            try:
                v = float(row["pka_value"])
            except ValueError:
                continue
            found[name].append((v, row["assessment"], row["unique_ID"]))
    out = sys.stdout
    out.write("# acidsite corpus/advice/base_water_iupac.tsv, version 1\n")
    out.write("# Aqueous pKa (25 C) of conjugate acids of catalogue bases, from the IUPAC Digitized pKa\n")
    out.write("# Dataset v1.0 (see ATTRIBUTION.md). One row per base: median of the 25 C rows.\n")
    out.write("# Columns: base, median_pka, rows, assessments, entries\n")
    out.write("base\tmedian_pka\trows\tassessments\tentries\n")
    for name, _, _ in WANTED:
        rows = found[name]
        if not rows:
            continue
        med = statistics.median(v for v, _, _ in rows)
        assess = ",".join(sorted({a or "-" for _, a, _ in rows}))
        ids = ",".join(sorted({i for _, _, i in rows}))
        out.write(f"{name}\t{med:.3f}\t{len(rows)}\t{assess}\t{ids}\n")


if __name__ == "__main__":
    main(sys.argv[1])
