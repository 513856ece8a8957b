"""Build the molecule-core reference corpus with RDKit (our reference library).

Samples real molecules from the open datasets in ../shared/data (path given
by ACIDSITE_DATA, default ../shared/data relative to the repository root),
keeps every SMILES RDKit rejects in those files, and writes one TSV per
source to corpus/mol/ with RDKit's answers:

  smiles  rdkit  formula  total_h  aromatic_atoms  sssr  smallest_rings

rdkit: "ok" or "error"; formula: Hill formula without charge, isotopes
folded; total_h: all hydrogens; aromatic_atoms: aromatic heavy atoms;
sssr: size of the smallest set of smallest rings; smallest_rings: for each
non-hydrogen atom in written order, the size of its smallest ring (0: none),
comma-separated.

Run from the repository root: python3 tests/reference/mol_reference.py
"""
import csv
import os
import random
import re
import sys

from rdkit import Chem, RDLogger, rdBase
from rdkit.Chem import rdMolDescriptors

RDLogger.DisableLog("rdApp.*")
ROOT = os.path.dirname(os.path.dirname(os.path.dirname(os.path.abspath(__file__))))
DATA = os.environ.get("ACIDSITE_DATA", os.path.join(ROOT, "..", "shared", "data"))
OUT = os.path.join(ROOT, "corpus", "mol")
SEED = 20261201

# (name, file, smiles column, delimiter, how many to sample)
SOURCES = [
    ("chembl", "moleculenet-deepchem/chembl_5thresh_smiles.csv", "smiles", ",", 700),
    ("hiv", "moleculenet-deepchem/hiv.csv", "smiles", ",", 700),
    ("tox21", "moleculenet-deepchem/tox21.csv", "smiles", ",", 500),
    ("clintox", "moleculenet-deepchem/clintox.csv", "smiles", ",", 400),
    ("freesolv", "freesolv/freesolv_database_v0.52.tsv", "smiles", "\t", 200),
]


def interesting(s):
    """Charges, salts, stereo, isotopes, wildcards, explicit H."""
    return bool(re.search(r"[+\-]\]|\.|@|/|\\|\*|\[\d|\[H\]|\[2H\]", s))


def expectations(smiles):
    m = Chem.MolFromSmiles(smiles)
    if m is None:
        return ["error", "", "", "", "", ""]
    formula = rdMolDescriptors.CalcMolFormula(m)
    formula = re.sub(r"[+-]\d*$", "", formula)  # drop the charge suffix
    total_h = sum(a.GetTotalNumHs() for a in m.GetAtoms()) + sum(
        1 for a in m.GetAtoms() if a.GetAtomicNum() == 1
    )
    aromatic = sum(1 for a in m.GetAtoms() if a.GetIsAromatic())
    ri = m.GetRingInfo()
    sssr = len(Chem.GetSSSR(m))
    smallest = []
    for a in m.GetAtoms():
        if a.GetAtomicNum() == 1:
            continue
        smallest.append(str(ri.MinAtomRingSize(a.GetIdx())))
    return ["ok", formula, str(total_h), str(aromatic), str(sssr), ",".join(smallest)]


def full(out_path):
    """Every molecule of the sources (plus MUV) in one TSV, for the ignored
    large comparison test (ACIDSITE_MOL_FULL=<file> cargo test -- --ignored)."""
    extra = [("muv", "moleculenet-deepchem/muv_smiles.csv", "smiles", ",", 0)]
    with open(out_path, "w") as out:
        out.write("# all molecules; expectations from RDKit %s\n" % rdBase.rdkitVersion)
        out.write("smiles\trdkit\tformula\ttotal_h\taromatic_atoms\tsssr\tsmallest_rings\n")
        for name, path, col, delim, _ in SOURCES + extra:
            with open(os.path.join(DATA, path), newline="") as f:
                rows = [r[col].strip() for r in csv.DictReader(f, delimiter=delim)]
            for s in dict.fromkeys(x for x in rows if x):
                out.write("\t".join([s] + expectations(s)) + "\n")


def main():
    if len(sys.argv) == 3 and sys.argv[1] == "--full":
        full(sys.argv[2])
        return
    rng = random.Random(SEED)
    os.makedirs(OUT, exist_ok=True)
    total = 0
    for name, path, col, delim, k in SOURCES:
        with open(os.path.join(DATA, path), newline="") as f:
            rows = [r[col].strip() for r in csv.DictReader(f, delimiter=delim)]
        rows = [s for s in rows if s]
        unique = list(dict.fromkeys(rows))
        rejected = [s for s in unique if Chem.MolFromSmiles(s) is None]
        special = [s for s in unique if interesting(s) and s not in rejected]
        plain = [s for s in unique if not interesting(s) and s not in rejected]
        # Half of the sample from the "interesting" rows where there are enough.
        k_special = min(len(special), k // 2)
        chosen = rng.sample(special, k_special) + rng.sample(plain, min(len(plain), k - k_special))
        # Every SMILES with a wildcard atom, as they are few.
        wild = [s for s in unique if "*" in s and s not in rejected and s not in chosen]
        chosen = rejected + wild + chosen
        out = os.path.join(OUT, name + ".tsv")
        with open(out, "w", newline="") as f:
            f.write("# source: %s (see ATTRIBUTION.md); expectations from RDKit %s\n" % (path, rdBase.rdkitVersion))
            f.write("smiles\trdkit\tformula\ttotal_h\taromatic_atoms\tsssr\tsmallest_rings\n")
            for s in chosen:
                f.write("\t".join([s] + expectations(s)) + "\n")
        total += len(chosen)
        print("%s: %d rows (%d rejected by RDKit)" % (name, len(chosen), len(rejected)), file=sys.stderr)
    print("total %d" % total, file=sys.stderr)


if __name__ == "__main__":
    main()
