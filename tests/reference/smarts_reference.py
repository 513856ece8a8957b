#!/usr/bin/env python3
"""Expected SMARTS unique-match counts, computed with RDKit, for tests/smarts_reference.rs.

Writes corpus/smarts/molecules.tsv (the sample), corpus/smarts/expected.tsv
(one line per molecule: id, then the unique match count of every pattern in
corpus/smarts/patterns.tsv, in file order, comma-separated) and
corpus/smarts/anchors.tsv (for each pattern with a :1 atom, the molecule
atoms that atom occupies over all non-uniquified matches).

Molecule model: RDKit reads each SMILES with sanitisation, then every hydrogen
atom (isotopic ones too) is removed into its heavy atom, which is the model
acidsite's molecule core uses (hydrogens folded, no index). Counts are
GetSubstructMatches(pattern, uniquify=True, maxMatches=10**6).

Usage (from the repository root):
    python3 tests/reference/smarts_reference.py [data_dir]
    python3 tests/reference/smarts_reference.py [data_dir] --out DIR --scale K
The second form writes a K-times larger sample to DIR (not committed), for the
ignored test `count_unique_given_large_sample_agrees_with_rdkit`
(SMARTS_REFERENCE_DIR=DIR cargo test --release --test smarts -- smarts_reference:: --ignored).
"""
import csv
import os
import random
import sys

from rdkit import Chem, RDLogger, rdBase

RDLogger.DisableLog("rdApp.*")
HERE = os.path.dirname(os.path.abspath(__file__))
ROOT = os.path.dirname(os.path.dirname(HERE))
CORPUS = os.path.join(ROOT, "corpus", "smarts")
ARGS = sys.argv[1:]
OUT = CORPUS
SCALE = 1
if "--out" in ARGS:
    i = ARGS.index("--out")
    OUT = ARGS[i + 1]
    del ARGS[i : i + 2]
if "--scale" in ARGS:
    i = ARGS.index("--scale")
    SCALE = int(ARGS[i + 1])
    del ARGS[i : i + 2]
DATA = ARGS[0] if ARGS else os.path.join(ROOT, "..", "shared", "data")

# (label, path, smiles column, sample size)
SOURCES = [
    ("chembl", "moleculenet-deepchem/chembl_5thresh_smiles.csv", "smiles", 700),
    ("hiv", "moleculenet-deepchem/hiv.csv", "smiles", 700),
    ("tox21", "moleculenet-deepchem/tox21.csv", "smiles", 600),
    ("muv", "moleculenet-deepchem/muv_smiles.csv", "smiles", 400),
]

# Hand-written edge cases (structures from memory): cages for the ring
# primitives, isotopes, charges, a non-induced match in a small ring.
EXTRA = [
    ("cubane", "C12C3C4C1C5C2C3C45"),
    ("norbornane", "C1CC2CCC1C2"),
    ("bicyclooctane", "C1CC2CCC1CC2"),
    ("adamantane", "C1C2CC3CC1CC(C2)C3"),
    ("spiro", "C1CCC2(C1)CCCC2"),
    ("methyl_cyclopropanecarboxylate", "COC(=O)C1CC1"),
    ("deuterated", "[2H]C([2H])([2H])C(=O)C"),
    ("carbon13", "[13CH3]C(=O)O"),
    ("nitromethane", "C[N+](=O)[O-]"),
    ("sodium_acetate", "CC(=O)[O-].[Na+]"),
    ("dimethyl_malonate", "COC(=O)CC(=O)OC"),
    ("acetylacetone", "CC(=O)CC(=O)C"),
    ("phenylacetylene", "C#Cc1ccccc1"),
    ("trifluoroacetone", "CC(=O)C(F)(F)F"),
    ("dimethyl_sulfone", "CS(C)(=O)=O"),
    ("acetonitrile", "CC#N"),
    ("acrylonitrile", "C=CC#N"),
    ("methyl_vinyl_ketone", "C=CC(C)=O"),
    ("acetic_anhydride", "CC(=O)OC(C)=O"),
    ("acetyl_chloride", "CC(Cl)=O"),
    ("pyrrole", "c1cc[nH]c1"),
    ("imidazole", "c1c[nH]cn1"),
    ("kekule_benzene", "C1=CC=CC=C1"),
    ("thiophenol", "Sc1ccccc1"),
    ("ethanethiol", "CCS"),
    ("propylene_oxide", "CC1CO1"),
    ("ammonium", "[NH4+]"),
    ("dianion", "[O-]S(=O)(=O)[O-]"),
    ("oxide_dianion", "[O-2]"),
    ("selenophene", "c1cc[se]c1"),
    ("tetramethylsilane", "C[Si](C)(C)C"),
    ("dummy_atom", "*C(=O)O"),
    ("explicit_h", "[H]C([H])([H])O[H]"),
    ("tin", "CCCC[Sn](CCCC)(CCCC)Cl"),
    ("fused_tricycle", "c1ccc2cc3ccccc3cc2c1"),
    ("steroid", "CC12CCC3C(CCC4CC(O)CCC34C)C1CCC2O"),
]


def read_patterns():
    out = []
    with open(os.path.join(CORPUS, "patterns.tsv")) as f:
        for line in f:
            line = line.rstrip("\n")
            if not line or line.startswith("#"):
                continue
            name, smarts, group = line.split("\t")
            out.append((name, smarts, group))
    return out


def rdkit_mol(smiles):
    m = Chem.MolFromSmiles(smiles)
    if m is None:
        return None
    p = Chem.RemoveHsParameters()
    p.removeIsotopes = True
    return Chem.RemoveHs(m, p)


def sample():
    rng = random.Random(20261201)
    mols = []
    for label, path, col, k in SOURCES:
        with open(os.path.join(DATA, path), newline="") as f:
            rows = [r[col].strip() for r in csv.DictReader(f) if r.get(col)]
        rows = sorted(set(rows))
        rng.shuffle(rows)
        taken = 0
        k = k * SCALE
        for s in rows:
            if taken == k:
                break
            # Tabs/commas would break our TSV; very large molecules slow the
            # test down without adding coverage.
            if "\t" in s or len(s) > 200:
                continue
            if rdkit_mol(s) is None:
                continue
            taken += 1
            mols.append((f"{label}:{taken}", label, s))
    for name, s in EXTRA:
        mols.append((f"extra:{name}", "extra", s))
    return mols


def main():
    patterns = read_patterns()
    queries = []
    for name, smarts, _ in patterns:
        q = Chem.MolFromSmarts(smarts)
        if q is None:
            sys.exit(f"RDKit cannot parse pattern {name}: {smarts}")
        queries.append(q)
    mols = sample()
    os.makedirs(OUT, exist_ok=True)
    # Patterns with a :1 atom: the molecule atoms that atom can occupy, from
    # all (not uniquified) matches.
    anchored = []
    for k, q in enumerate(queries):
        for a in q.GetAtoms():
            if a.GetAtomMapNum() == 1:
                anchored.append((k, a.GetIdx()))
                break
    fa = open(os.path.join(OUT, "anchors.tsv"), "w")
    fa.write(
        "# id then, for each pattern with a :1 atom ("
        + " ".join(patterns[k][0] for k, _ in anchored)
        + "), the molecule atoms it can occupy, space-separated; patterns separated by ';'\n"
    )
    with open(os.path.join(OUT, "molecules.tsv"), "w") as fm, open(
        os.path.join(OUT, "expected.tsv"), "w"
    ) as fe:
        fm.write("# id\tsource\tsmiles\trdkit_atoms\trdkit_aromatic_atoms\trdkit_aromatic_bonds\n")
        fe.write(f"# RDKit {rdBase.rdkitVersion}; id then unique match counts in patterns.tsv order\n")
        for mid, source, s in mols:
            m = rdkit_mol(s)
            arom = "".join("1" if a.GetIsAromatic() else "0" for a in m.GetAtoms())
            bonds = sorted(
                (min(b.GetBeginAtomIdx(), b.GetEndAtomIdx()), max(b.GetBeginAtomIdx(), b.GetEndAtomIdx()))
                for b in m.GetBonds()
                if b.GetIsAromatic()
            )
            abonds = " ".join(f"{i}-{j}" for i, j in bonds)
            fm.write(f"{mid}\t{source}\t{s}\t{m.GetNumAtoms()}\t{arom}\t{abonds}\n")
            counts = [
                len(m.GetSubstructMatches(q, uniquify=True, maxMatches=10**6)) for q in queries
            ]
            fe.write(mid + "\t" + ",".join(map(str, counts)) + "\n")
            sets = []
            for k, ai in anchored:
                ms = m.GetSubstructMatches(queries[k], uniquify=False, maxMatches=10**6)
                sets.append(" ".join(map(str, sorted({mm[ai] for mm in ms}))))
            fa.write(mid + "\t" + ";".join(sets) + "\n")
    fa.close()
    print(f"{len(mols)} molecules x {len(patterns)} patterns written to {OUT}")


if __name__ == "__main__":
    main()
