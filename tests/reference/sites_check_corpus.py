"""Validate the sites corpus files with RDKit.

Checks, for every data row of corpus/sites/*.tsv that has a site_atom column:
  - the SMILES parses in RDKit;
  - site_atom is an integer within range (0-based, written order, no explicit [H] atoms);
  - the site atom carries at least one hydrogen;
  - element matches the site atom's symbol;
  - ids are unique within a file; split is train|holdout; pKa values are numbers or empty;
  - every citation key resolves in fragments/sources.tsv.
Also checks fragments/sigma.tsv (SMILES fragments with one attachment point [*]).
Exit status 1 on any problem. Usage: python3 tests/reference/sites_check_corpus.py
"""
import csv
import glob
import os
import sys

from rdkit import Chem, RDLogger

RDLogger.DisableLog("rdApp.*")
ROOT = os.path.normpath(os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", ".."))


def read_tsv(path):
    with open(path, newline="") as f:
        lines = [(i, line) for i, line in enumerate(f, 1) if line.strip() and not line.startswith("#")]
    header = lines[0][1].rstrip("\n").split("\t")
    rows = []
    for lineno, line in lines[1:]:
        cells = line.rstrip("\n").split("\t")
        if len(cells) != len(header):
            rows.append((lineno, None, f"{len(cells)} cells, header has {len(header)}"))
            continue
        rows.append((lineno, dict(zip(header, cells)), None))
    return header, rows


def source_keys():
    keys = set()
    with open(os.path.join(ROOT, "fragments", "sources.tsv")) as f:
        for line in f:
            if line.startswith("#") or not line.strip():
                continue
            keys.add(line.split("\t")[0])
    keys.discard("key")
    return keys


def is_number(text):
    try:
        float(text)
        return True
    except ValueError:
        return False


def check_sites_file(path, keys, problems):
    header, rows = read_tsv(path)
    ids = set()
    n = 0
    for lineno, row, err in rows:
        where = f"{os.path.relpath(path, ROOT)}:{lineno}"
        if err:
            problems.append(f"{where}: {err}")
            continue
        n += 1
        rid = row.get("id", "")
        if rid in ids:
            problems.append(f"{where}: duplicate id {rid}")
        ids.add(rid)
        mol = Chem.MolFromSmiles(row["smiles"])
        if mol is None:
            problems.append(f"{where}: {rid}: SMILES does not parse: {row['smiles']}")
            continue
        if any(a.GetAtomicNum() == 1 for a in mol.GetAtoms()):
            problems.append(f"{where}: {rid}: explicit hydrogen atom in SMILES (indices would shift)")
        try:
            site = int(row["site_atom"])
        except ValueError:
            problems.append(f"{where}: {rid}: site_atom not an integer: {row['site_atom']!r}")
            continue
        if not 0 <= site < mol.GetNumAtoms():
            problems.append(f"{where}: {rid}: site_atom {site} out of range (0..{mol.GetNumAtoms() - 1})")
            continue
        atom = mol.GetAtomWithIdx(site)
        if atom.GetTotalNumHs() < 1:
            problems.append(f"{where}: {rid}: site atom {site} ({atom.GetSymbol()}) has no hydrogen")
        if atom.GetSymbol() != row["element"]:
            problems.append(f"{where}: {rid}: element {row['element']} but atom {site} is {atom.GetSymbol()}")
        if "split" in row and row["split"] not in ("train", "holdout"):
            problems.append(f"{where}: {rid}: split must be train or holdout, got {row['split']!r}")
        for value_col, source_col in (("pka_dmso", "dmso_source"), ("pka_water", "water_source")):
            if value_col not in row:
                continue
            value, source = row[value_col], row.get(source_col, "")
            if value and not is_number(value):
                problems.append(f"{where}: {rid}: {value_col} not a number: {value!r}")
            if value and not source:
                problems.append(f"{where}: {rid}: {value_col} without {source_col}")
            if source and source not in keys:
                problems.append(f"{where}: {rid}: unknown citation key {source!r}")
        if not row.get("class"):
            problems.append(f"{where}: {rid}: empty class")
    return n


def check_sigma(path, keys, problems):
    if not os.path.exists(path):
        return 0
    header, rows = read_tsv(path)
    n = 0
    for lineno, row, err in rows:
        where = f"{os.path.relpath(path, ROOT)}:{lineno}"
        if err:
            problems.append(f"{where}: {err}")
            continue
        n += 1
        mol = Chem.MolFromSmiles(row["substituent_smiles"])
        if mol is None:
            problems.append(f"{where}: fragment does not parse: {row['substituent_smiles']}")
            continue
        dummies = [a for a in mol.GetAtoms() if a.GetAtomicNum() == 0]
        if len(dummies) != 1 or dummies[0].GetDegree() != 1:
            problems.append(f"{where}: fragment needs exactly one [*] attachment point with one bond")
        for col in ("sigma_meta", "sigma_para", "sigma_para_minus"):
            if row[col] and not is_number(row[col]):
                problems.append(f"{where}: {col} not a number")
        if row["source"] not in keys:
            problems.append(f"{where}: unknown citation key {row['source']!r}")
    return n


def main():
    keys = source_keys()
    problems = []
    counts = {}
    for path in sorted(glob.glob(os.path.join(ROOT, "corpus", "sites", "*.tsv"))):
        with open(path) as f:
            head = next((line for line in f if not line.startswith("#")), "")
        if "site_atom" not in head.split("\t"):
            continue
        counts[os.path.relpath(path, ROOT)] = check_sites_file(path, keys, problems)
    rho = os.path.join(ROOT, "corpus", "sites", "rho.tsv")
    if os.path.exists(rho):
        _, rows = read_tsv(rho)
        for lineno, row, err in rows:
            if err:
                problems.append(f"corpus/sites/rho.tsv:{lineno}: {err}")
            elif row["source"] not in keys:
                problems.append(f"corpus/sites/rho.tsv:{lineno}: unknown citation key {row['source']!r}")
    counts["fragments/sigma.tsv"] = check_sigma(os.path.join(ROOT, "fragments", "sigma.tsv"), keys, problems)
    for name, n in counts.items():
        print(f"{name}: {n} rows checked")
    for p in problems:
        print("PROBLEM", p)
    print(f"{len(problems)} problems")
    return 1 if problems else 0


if __name__ == "__main__":
    sys.exit(main())
