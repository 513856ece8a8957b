#!/usr/bin/env python3
"""Baseline for the acidsite benchmark: the class-SMARTS lookup a chemist would
script with RDKit.

For each molecule: parse the SMILES, match a list of acid-class SMARTS (the
acidic atom labelled :1), give every hydrogen-bearing anchor atom the DMSO pKa
of the most acidic class that matches it, rank, and write one JSON line per
input record (or an error record). No increments, no symmetry grouping, no
advice: it is the simple approach acidsite is compared with for speed.

Class values are typical DMSO pKa figures recalled from memory (Bordwell-scale
orders of magnitude, common practice); they serve the timing, not accuracy.

Usage: rdkit_class_lookup.py INPUT.{csv,smi} [OUTPUT]
CSV input must have a column named SMILES (any case); .smi is "SMILES [id]".
"""

import csv
import json
import sys

from rdkit import Chem, RDLogger

RDLogger.DisableLog("rdApp.*")

# (class, SMARTS with the acidic atom mapped :1, DMSO pKa) -- values from memory.
CLASSES = [
    ("carboxylic acid O-H", "[OX2H1:1]C(=O)", 12.3),
    ("phenol O-H", "[OX2H1:1]c", 18.0),
    ("alcohol O-H", "[OX2H1:1][CX4]", 29.0),
    ("thiol S-H", "[SX2H1:1]", 17.0),
    ("sulfonamide N-H", "[NX3H1,NX3H2:1]S(=O)=O", 16.0),
    ("imide N-H", "[NX3H1:1](C=O)C=O", 14.7),
    ("amide N-H", "[NX3H1,NX3H2:1]C=O", 25.5),
    ("azole N-H", "[nH:1]", 21.0),
    ("amine N-H", "[NX3H1,NX3H2;!$(NC=O);!$(NS=O):1]", 41.0),
    ("ammonium N-H", "[NX4+;H1,H2,H3:1]", 10.5),
    ("malononitrile", "[CX4;H1,H2:1](C#N)C#N", 11.1),
    ("1,3-diketone", "[CX4;H1,H2:1](C(=O)[#6])C(=O)[#6]", 13.3),
    ("beta-keto ester", "[CX4;H1,H2:1](C(=O)[#6])C(=O)O", 14.2),
    ("cyanoacetate", "[CX4;H1,H2:1](C#N)C(=O)O", 13.1),
    ("malonate", "[CX4;H1,H2:1](C(=O)O)C(=O)O", 16.4),
    ("nitroalkane", "[CX4;H1,H2,H3:1][N+](=O)[O-]", 17.2),
    ("aryl ketone", "[CX4;H1,H2,H3:1]C(=O)c", 24.7),
    ("ketone", "[CX4;H1,H2,H3:1]C(=O)[#6]", 26.5),
    ("aldehyde", "[CX4;H1,H2,H3:1][CH1]=O", 16.7),
    ("ester", "[CX4;H1,H2,H3:1]C(=O)O[#6]", 29.5),
    ("amide", "[CX4;H1,H2,H3:1]C(=O)N", 34.5),
    ("nitrile", "[CX4;H1,H2,H3:1]C#N", 31.3),
    ("sulfone", "[CX4;H1,H2,H3:1]S(=O)(=O)[#6]", 31.1),
    ("sulfoxide", "[CX4;H1,H2,H3:1][SX3](=O)", 35.1),
    ("fluorene", "[CX4;H1,H2:1]1c2ccccc2-c2ccccc12", 22.6),
    ("cyclopentadiene", "[CX4;H2:1]1C=CC=C1", 18.0),
    ("terminal alkyne", "[CH1:1]#C", 28.8),
    ("diarylmethane", "[CX4;H1,H2:1](c)c", 32.2),
    ("benzylic", "[CX4;H1,H2,H3:1]c", 43.0),
    ("allylic", "[CX4;H1,H2,H3:1]C=C", 44.0),
]


def compile_classes():
    out = []
    for name, smarts, pka in CLASSES:
        patt = Chem.MolFromSmarts(smarts)
        if patt is None:
            raise SystemExit(f"bad SMARTS for {name}: {smarts}")
        anchor = next(a.GetIdx() for a in patt.GetAtoms() if a.GetAtomMapNum() == 1)
        out.append((name, patt, anchor, pka))
    return out


def records(path):
    """Yield (line number, id, smiles) from a .csv (SMILES column) or .smi file."""
    with open(path, newline="") as f:
        if path.endswith(".csv"):
            reader = csv.reader(f)
            header = next(reader)
            col = next(i for i, h in enumerate(header) if h.lower() == "smiles")
            for n, row in enumerate(reader, start=2):
                yield n, None, row[col] if col < len(row) else ""
        else:
            for n, line in enumerate(f, start=1):
                line = line.strip()
                if not line or line.startswith("#"):
                    continue
                parts = line.split(None, 1)
                yield n, (parts[1] if len(parts) > 1 else None), parts[0]


def analyse(mol, classes):
    best = {}
    for name, patt, anchor, pka in classes:
        for match in mol.GetSubstructMatches(patt, uniquify=True):
            a = match[anchor]
            if mol.GetAtomWithIdx(a).GetTotalNumHs() == 0:
                continue
            if a not in best or pka < best[a][1]:
                best[a] = (name, pka)
    sites = [
        {"atom": a, "class": name, "pka_dmso": pka}
        for a, (name, pka) in sorted(best.items(), key=lambda kv: kv[1][1])
    ]
    return sites


def main():
    if len(sys.argv) < 2:
        raise SystemExit(__doc__)
    classes = compile_classes()
    out = open(sys.argv[2], "w") if len(sys.argv) > 2 else sys.stdout
    n = failed = 0
    for line, ident, smiles in records(sys.argv[1]):
        n += 1
        mol = Chem.MolFromSmiles(smiles)
        if mol is None:
            failed += 1
            rec = {"line": line, "id": ident, "input": smiles, "ok": False}
        else:
            rec = {
                "line": line,
                "id": ident,
                "input": smiles,
                "ok": True,
                "sites": analyse(mol, classes),
            }
        out.write(json.dumps(rec) + "\n")
    print(f"rdkit_class_lookup: {n} records, {failed} failed", file=sys.stderr)


if __name__ == "__main__":
    main()
