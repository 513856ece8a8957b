"""Build the SD-file reference corpus with RDKit (our reference library).

Takes the molecules of corpus/mol/{chembl,hiv,tox21,clintox,freesolv}.tsv
that RDKit reads (samples of open datasets; sources and terms in
corpus/mol/ATTRIBUTION.md), writes each as a molfile with RDKit in one of
five forms, reads the molfile back with RDKit and stores what RDKit makes of
it as SD data fields of the record:

  > <source>          dataset of the SMILES
  > <smiles>          the SMILES the molfile was written from
  > <form>            v2000_kekule | v2000_aromatic (bond type 4) |
                      v3000 | v2000_explicit_h | v3000_explicit_h
  > <rdkit_formula>   Hill formula without charge (RDKit CalcMolFormula)
  > <rdkit_total_h>   all hydrogens, explicit hydrogen atoms included

Output: corpus/mol/sdf/reference.sdf.gz (gzip, so the reader's gzip path is
exercised too). Run from the repository root with a Python that has RDKit:
  python3 tests/reference/mol_sdf_reference.py
"""
import gzip
import os
import re

from rdkit import Chem, RDLogger, rdBase
from rdkit.Chem import rdMolDescriptors

RDLogger.DisableLog("rdApp.*")
ROOT = os.path.dirname(os.path.dirname(os.path.dirname(os.path.abspath(__file__))))
SRC = os.path.join(ROOT, "corpus", "mol")
OUT = os.path.join(SRC, "sdf", "reference.sdf.gz")
NAMES = ["chembl", "hiv", "tox21", "clintox", "freesolv"]
FORMS = ["v2000_kekule", "v2000_aromatic", "v3000", "v2000_explicit_h", "v3000_explicit_h"]


def molblock(m, form):
    if form.endswith("explicit_h"):
        m = Chem.AddHs(m)
    if form == "v2000_aromatic":
        return Chem.MolToMolBlock(m, kekulize=False)
    return Chem.MolToMolBlock(m, forceV3000=form.startswith("v3000"))


def facts(m):
    formula = re.sub(r"[+-]\d*$", "", rdMolDescriptors.CalcMolFormula(m))
    total_h = sum(a.GetTotalNumHs() for a in m.GetAtoms()) + sum(
        1 for a in m.GetAtoms() if a.GetAtomicNum() == 1
    )
    return formula, total_h


def main():
    n = 0
    with gzip.open(OUT, "wt", encoding="utf-8", compresslevel=9) as out:
        for name in NAMES:
            with open(os.path.join(SRC, name + ".tsv"), encoding="utf-8") as f:
                rows = [l.rstrip("\n").split("\t") for l in f if not l.startswith("#")]
            for row in rows[1:]:
                if len(row) < 2 or row[1] != "ok":
                    continue
                m = Chem.MolFromSmiles(row[0])
                if m is None:
                    continue
                form = FORMS[n % len(FORMS)]
                try:
                    block = molblock(m, form)
                except Exception:  # RDKit cannot write it (rare): skip
                    continue
                back = Chem.MolFromMolBlock(block, removeHs=False)
                if back is None:
                    continue
                formula, total_h = facts(back)
                title = f"{name}-{n + 1}"
                lines = block.split("\n")
                lines[0] = title
                out.write("\n".join(lines))
                if not block.endswith("\n"):
                    out.write("\n")
                for key, value in [("source", name), ("smiles", row[0]), ("form", form),
                                   ("rdkit_formula", formula), ("rdkit_total_h", total_h)]:
                    out.write(f"> <{key}>\n{value}\n\n")
                out.write("$$$$\n")
                n += 1
    print(f"{n} records written to {OUT} with RDKit {rdBase.rdkitVersion}")


if __name__ == "__main__":
    main()
