#!/usr/bin/env python3
"""Reference figures for the layout quality test (tests/depict_quality.rs, issue 12).

Takes a fixed sample of real molecules from the shared data sets (MOSES test,
ChEMBL, HIV, Tox21; plus every macrocycle and salt found in a fixed slice so
that those are represented), lays each out with RDKit's
rdDepictor.Compute2DCoords and writes, per molecule, three flags:

* clash:    two atoms not bonded to each other closer than 0.4 x the
            median bond length of the drawing;
* crossing: two bonds without a shared atom whose segments properly cross;
* bond:     a bond whose length differs from the median bond length by
            more than 30 % of the median.

Output: corpus/depict/sample.tsv (source, smiles, rdkit_clash, rdkit_crossing,
rdkit_bond) and corpus/depict/rdkit_summary.txt (shares). The Rust test
computes the same three figures for acidsite's layout on the same SMILES.

Run: /work/venv/bin/python tests/reference/depict_rdkit.py ../shared/data
"""
import csv
import random
import statistics
import sys
from pathlib import Path

from rdkit import Chem, RDLogger, rdBase
from rdkit.Chem import rdDepictor

RDLogger.DisableLog("rdApp.*")

SEED = 12  # issue number; fixed so the sample never changes
MAX_HEAVY = 150


def read_column(path, column):
    with open(path, newline="") as f:
        return [row[column] for row in csv.DictReader(f) if row.get(column)]


def flags(mol):
    conf = mol.GetConformer()
    pts = [(conf.GetAtomPosition(i).x, conf.GetAtomPosition(i).y) for i in range(mol.GetNumAtoms())]
    bonds = [(b.GetBeginAtomIdx(), b.GetEndAtomIdx()) for b in mol.GetBonds()]
    if not bonds:
        return False, False, False
    lengths = [dist(pts[a], pts[b]) for a, b in bonds]
    med = statistics.median(lengths)
    bonded = set()
    for a, b in bonds:
        bonded.add((a, b))
        bonded.add((b, a))
    n = len(pts)
    clash = any(
        (i, j) not in bonded and dist(pts[i], pts[j]) < 0.4 * med
        for i in range(n)
        for j in range(i + 1, n)
    )
    crossing = False
    for x in range(len(bonds)):
        a, b = bonds[x]
        for y in range(x + 1, len(bonds)):
            c, d = bonds[y]
            if len({a, b, c, d}) < 4:
                continue
            if cross(pts[a], pts[b], pts[c], pts[d]):
                crossing = True
                break
        if crossing:
            break
    bad_bond = any(abs(l - med) > 0.3 * med for l in lengths)
    return clash, crossing, bad_bond


def dist(p, q):
    return ((p[0] - q[0]) ** 2 + (p[1] - q[1]) ** 2) ** 0.5


def orient(p, q, r):
    return (q[0] - p[0]) * (r[1] - p[1]) - (q[1] - p[1]) * (r[0] - p[0])


def cross(p1, p2, q1, q2):
    # Proper crossing only (strict signs), the same rule as src/depict/quality.rs.
    eps = 1e-9
    o1, o2 = orient(p1, p2, q1), orient(p1, p2, q2)
    o3, o4 = orient(q1, q2, p1), orient(q1, q2, p2)
    return ((o1 > eps and o2 < -eps) or (o1 < -eps and o2 > eps)) and (
        (o3 > eps and o4 < -eps) or (o3 < -eps and o4 > eps)
    )


def main():
    data = Path(sys.argv[1] if len(sys.argv) > 1 else "../shared/data")
    rng = random.Random(SEED)
    sets = [
        ("moses", read_column(data / "moses/moses_test.csv", "SMILES"), 400),
        ("chembl", read_column(data / "moleculenet-deepchem/chembl_5thresh_smiles.csv", "smiles"), 300),
        ("hiv", read_column(data / "moleculenet-deepchem/hiv.csv", "smiles"), 300),
        ("tox21", read_column(data / "moleculenet-deepchem/tox21.csv", "smiles"), 200),
    ]
    chosen = []
    seen = set()
    for name, smiles, k in sets:
        for s in rng.sample(smiles, k):
            if s not in seen:
                seen.add(s)
                chosen.append((name, s))
    # Macrocycles (a ring of 12 or more atoms) and salts / mixtures ('.'),
    # the first 40 of each in a fixed shuffled order of ChEMBL, HIV and Tox21.
    pool = [(n, s) for n, smi, _ in sets[1:] for s in smi]
    rng.shuffle(pool)
    macro, salts = 0, 0
    for name, s in pool:
        if macro >= 40 and salts >= 40:
            break
        if s in seen:
            continue
        m = Chem.MolFromSmiles(s)
        if m is None or m.GetNumHeavyAtoms() > MAX_HEAVY:
            continue
        big = any(len(r) >= 12 for r in m.GetRingInfo().AtomRings())
        if big and macro < 40:
            macro += 1
        elif "." in s and salts < 40:
            salts += 1
        else:
            continue
        seen.add(s)
        chosen.append((name + "-extra", s))

    out = Path(__file__).resolve().parents[2] / "corpus/depict"
    out.mkdir(parents=True, exist_ok=True)
    rows = []
    for name, s in chosen:
        m = Chem.MolFromSmiles(s)
        if m is None or m.GetNumHeavyAtoms() > MAX_HEAVY:
            continue
        rdDepictor.SetPreferCoordGen(False)
        rdDepictor.Compute2DCoords(m)
        c, x, b = flags(m)
        rows.append((name, s, int(c), int(x), int(b)))
    with open(out / "sample.tsv", "w") as f:
        f.write(f"# layout quality sample, seed {SEED}; flags from RDKit {rdBase.rdkitVersion} rdDepictor.Compute2DCoords\n")
        f.write("source\tsmiles\trdkit_clash\trdkit_crossing\trdkit_bond\n")
        for r in rows:
            f.write("\t".join(map(str, r)) + "\n")
    n = len(rows)
    summary = [
        f"RDKit {rdBase.rdkitVersion} rdDepictor.Compute2DCoords on {n} molecules "
        f"({macro} macrocycles, {salts} salts/mixtures added)",
        f"clash    {sum(r[2] for r in rows) / n * 100:.2f} %",
        f"crossing {sum(r[3] for r in rows) / n * 100:.2f} %",
        f"bond     {sum(r[4] for r in rows) / n * 100:.2f} %",
    ]
    (out / "rdkit_summary.txt").write_text("\n".join(summary) + "\n")
    print("\n".join(summary))


if __name__ == "__main__":
    main()
