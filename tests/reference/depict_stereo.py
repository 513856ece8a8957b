#!/usr/bin/env python3
"""Independent check of the stereo drawing (issue 12) with RDKit.

1. `sample` picks a fixed sample of ChEMBL SMILES with stereo marks (`@`,
   `/` or `\\`) from the shared DeepChem ChEMBL file and writes
   corpus/stereo/sample.tsv (with attribution). RDKit must read each, with
   no hydrogen written as an atom (so RDKit's atom order is acidsite's).
2. `check` draws every sample SMILES with `acidsite draw`, reads the drawn
   coordinates (`data-x`, `data-y` of each `data-atom`) and the wedges
   (`data-stereo="wedge|hash"`, narrow end `data-narrow`) from the SVG,
   writes a V2000 molblock of the molecule with exactly those coordinates
   and wedges (every double bond whose configuration the input does not
   give is marked "either", stereo 3, so RDKit does not read one from the
   drawing), lets RDKit assign stereo from the molblock and compares
   RDKit's canonical isomeric SMILES of it with RDKit's canonical isomeric
   SMILES of the input. Rows whose non-isomeric SMILES already differ (the
   molblock round trip changed something else) are counted apart.
   Writes corpus/stereo/rdkit_check.tsv (one row per SMILES) and
   corpus/stereo/rdkit_summary.txt, whose figures tests/depict_stereo.rs
   checks against its threshold.

3. `molfiles` writes the first 100 sample molecules as molfiles drawn and
   wedged by RDKit (rdDepictor.Compute2DCoords, MolToMolBlock's wedging;
   80 as V2000, 20 as V3000; the title line is the SMILES) into
   corpus/stereo/rdkit_molfiles.sdf, for tests/mol_stereo.rs to check that
   acidsite reads the same stereo from them as from the SMILES.

Run (from the repository root, after `cargo build --release`):
  /work/venv/bin/python tests/reference/depict_stereo.py sample ../shared/data
  /work/venv/bin/python tests/reference/depict_stereo.py check
  /work/venv/bin/python tests/reference/depict_stereo.py molfiles
"""
import csv
import random
import re
import subprocess
import sys
from pathlib import Path

from rdkit import Chem, RDLogger, rdBase
from rdkit.Geometry import Point3D

RDLogger.DisableLog("rdApp.*")

SEED = 12  # issue number; fixed so the sample never changes
SIZE = 400
MAX_HEAVY = 70
OUT = Path("corpus/stereo")


def sample(data):
    path = Path(data) / "moleculenet-deepchem" / "chembl_5thresh_smiles.csv"
    with open(path, newline="") as f:
        rows = [r["smiles"] for r in csv.DictReader(f) if r.get("smiles")]
    marked = [s for s in rows if re.search(r"[@/\\]", s)]
    rng = random.Random(SEED)
    rng.shuffle(marked)
    out = []
    for s in marked:
        if re.search(r"\[\d*H[\]:+\-]", s):
            continue  # hydrogen written as an atom: atom orders would differ
        m = Chem.MolFromSmiles(s)
        if m is None or m.GetNumAtoms() > MAX_HEAVY:
            continue
        out.append(s)
        if len(out) == SIZE:
            break
    OUT.mkdir(parents=True, exist_ok=True)
    with open(OUT / "sample.tsv", "w") as f:
        f.write(
            "# stereo drawing sample (issue 12): ChEMBL SMILES with stereo marks, seed "
            f"{SEED}; source DeepChem datasets/chembl_5thresh.csv.gz (commit fbe3b91) via "
            "/work/shared/data/moleculenet-deepchem; ChEMBL data CC BY-SA 3.0, this file is "
            "shared under the same licence\n"
        )
        f.write("smiles\n")
        for s in out:
            f.write(s + "\n")
    print(f"{len(out)} SMILES written to {OUT / 'sample.tsv'}")


ATOM = re.compile(r'data-atom="(\d+)" data-x="([-0-9.]+)" data-y="([-0-9.]+)"')
WEDGE = re.compile(
    r'data-atoms="(\d+) (\d+)" data-stereo="(wedge|hash)" data-narrow="(\d+)"'
)


def drawn(smiles):
    out = subprocess.run(
        ["target/release/acidsite", "draw", smiles],
        capture_output=True,
        text=True,
        timeout=60,
    )
    if out.returncode != 0:
        return None
    pts = {int(i): (float(x), float(y)) for i, x, y in ATOM.findall(out.stdout)}
    wedges = []
    for i, j, kind, narrow in WEDGE.findall(out.stdout):
        i, j, narrow = int(i), int(j), int(narrow)
        far = j if narrow == i else i
        wedges.append((narrow, far, kind))
    return pts, wedges


def molblock(m, pts, wedges, specified):
    """V2000 molblock of `m` (stereo removed) at `pts` with `wedges`."""
    m2 = Chem.Mol(m)
    Chem.RemoveStereochemistry(m2)
    conf = Chem.Conformer(m2.GetNumAtoms())
    for i in range(m2.GetNumAtoms()):
        x, y = pts[i]
        conf.SetAtomPosition(i, Point3D(x / 36.0, -y / 36.0, 0.0))
    m2.RemoveAllConformers()
    m2.AddConformer(conf, assignId=True)
    block = Chem.MolToMolBlock(m2, includeStereo=False, kekulize=True)
    lines = block.split("\n")
    counts = lines[3]
    na, nb = int(counts[0:3]), int(counts[3:6])
    wedge_of = {}
    for narrow, far, kind in wedges:
        wedge_of[frozenset((narrow, far))] = (narrow, far, 1 if kind == "wedge" else 6)
    for k in range(nb):
        ln = 4 + na + k
        line = lines[ln]
        a, b, order = int(line[0:3]) - 1, int(line[3:6]) - 1, int(line[6:9])
        stereo = 0
        key = frozenset((a, b))
        if key in wedge_of:
            a, b, stereo = wedge_of[key]
        elif order == 2 and key not in specified:
            stereo = 3
        lines[ln] = f"{a + 1:>3}{b + 1:>3}{order:>3}{stereo:>3}" + line[12:]
    return "\n".join(lines)


def check():
    rows = [
        l.strip()
        for l in open(OUT / "sample.tsv")
        if l.strip() and not l.startswith("#") and l.strip() != "smiles"
    ]
    results = []
    agree = compared = apart = 0
    for s in rows:
        m = Chem.MolFromSmiles(s)
        ref = Chem.MolToSmiles(m)
        d = drawn(s)
        if d is None or len(d[0]) != m.GetNumAtoms():
            results.append((s, "skipped", "draw failed or atom count differs"))
            apart += 1
            continue
        pts, wedges = d
        specified = {
            frozenset((b.GetBeginAtomIdx(), b.GetEndAtomIdx()))
            for b in m.GetBonds()
            if b.GetStereo() != Chem.BondStereo.STEREONONE
        }
        got_mol = Chem.MolFromMolBlock(molblock(m, pts, wedges, specified))
        if got_mol is None:
            results.append((s, "skipped", "molblock not read back"))
            apart += 1
            continue
        got = Chem.MolToSmiles(got_mol)
        flat = lambda x: Chem.MolToSmiles(x, isomericSmiles=False)
        if flat(got_mol) != flat(m):
            results.append((s, "skipped", "round trip changed the molecule"))
            apart += 1
            continue
        compared += 1
        if got == ref:
            agree += 1
            results.append((s, "agree", ""))
        else:
            results.append((s, "differ", got))
    with open(OUT / "rdkit_check.tsv", "w") as f:
        f.write(f"# RDKit {rdBase.rdkitVersion}: stereo read from acidsite's drawing vs the input\n")
        f.write("smiles\tresult\tdetail\n")
        for r in results:
            f.write("\t".join(r) + "\n")
    share = 100.0 * agree / compared if compared else 0.0
    with open(OUT / "rdkit_summary.txt", "w") as f:
        f.write(
            f"RDKit {rdBase.rdkitVersion} canonical isomeric SMILES from acidsite's drawn "
            "coordinates and wedges vs from the input\n"
        )
        f.write(f"compared {compared}\n")
        f.write(f"agree {agree}\n")
        f.write(f"apart {apart}\n")
        f.write(f"share {share:.2f} %\n")
    print(f"agree {agree} of {compared} ({share:.2f} %), {apart} apart")


def molfiles():
    from rdkit.Chem import rdDepictor

    rows = [
        l.strip()
        for l in open(OUT / "sample.tsv")
        if l.strip() and not l.startswith("#") and l.strip() != "smiles"
    ][:100]
    with open(OUT / "rdkit_molfiles.sdf", "w") as f:
        for k, s in enumerate(rows):
            m = Chem.MolFromSmiles(s)
            rdDepictor.Compute2DCoords(m)
            m.SetProp("_Name", s)
            f.write(Chem.MolToMolBlock(m, forceV3000=k >= 80))
            f.write("$$$$\n")
    print(f"{len(rows)} molfiles written (RDKit {rdBase.rdkitVersion})")


if __name__ == "__main__":
    if sys.argv[1:2] == ["sample"]:
        sample(sys.argv[2] if len(sys.argv) > 2 else "../shared/data")
    elif sys.argv[1:2] == ["check"]:
        check()
    elif sys.argv[1:2] == ["molfiles"]:
        molfiles()
    else:
        print(__doc__)
        sys.exit(2)
