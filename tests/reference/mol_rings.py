"""Build corpus/mol/rings.tsv, the ring-set reference of the molecule core,
with RDKit (our reference library).

Reads every SMILES of the ChEMBL, HIV, ClinTox and Tox21 files in
../shared/data/moleculenet-deepchem (path given by ACIDSITE_DATA, default
../shared/data relative to the repository root) and keeps those where the
ring set is more than a plain SSSR: RDKit's ring count exceeds the cycle
rank (cages, bridged systems, symmetric macrocycles), or a dative bond joins
two ring-bond atoms. Then adds synthetic cages (prismanes, Moebius ladders,
a hypercube graph, a square torus) written by this script. Columns:

  smiles  source  rings  atom_rings  smallest_rings

rings: RingInfo.NumRings(); atom_rings: NumAtomRings per atom in written
order; smallest_rings: MinAtomRingSize per atom (0: none); both
comma-separated.

Run from the repository root: python3 tests/reference/mol_rings.py
"""
import csv
import os

from rdkit import Chem, RDLogger, rdBase
from rdkit.Chem import RWMol

RDLogger.DisableLog("rdApp.*")
ROOT = os.path.dirname(os.path.dirname(os.path.dirname(os.path.abspath(__file__))))
DATA = os.environ.get("ACIDSITE_DATA", os.path.join(ROOT, "..", "shared", "data"))
OUT = os.path.join(ROOT, "corpus", "mol", "rings.tsv")
FILES = [
    ("chembl", "chembl_5thresh_smiles.csv"),
    ("hiv", "hiv.csv"),
    ("clintox", "clintox.csv"),
    ("tox21", "tox21.csv"),
]


def smiles_of(n, edges):
    """SMILES of an all-carbon graph: atoms in index order, a chain bond to
    the next atom where there is one, ring closures (labels reused) for the
    other bonds, '.' where the chain breaks."""
    adj = {i: set() for i in range(n)}
    for a, b in edges:
        adj[a].add(b)
        adj[b].add(a)
    free = list(range(99, 0, -1))
    open_labels = {}
    out = []
    label = lambda k: "%%%02d" % k if k > 9 else str(k)
    for i in range(n):
        tok = "C"
        for (a, b), k in list(open_labels.items()):
            if b == i:
                tok += label(k)
                free.append(k)
                del open_labels[(a, b)]
        for j in sorted(adj[i]):
            if j > i + 1:
                k = free.pop()
                open_labels[(i, j)] = k
                tok += label(k)
        if i > 0:
            out.append("" if (i - 1) in adj[i] else ".")
        out.append(tok)
    return "".join(out)


def prism(n):
    e = []
    for i in range(n):
        e += [(i, (i + 1) % n), (n + i, n + (i + 1) % n), (i, n + i)]
    return smiles_of(2 * n, e)


def moebius(n):
    e = [(i, (i + 1) % (2 * n)) for i in range(2 * n)] + [(i, i + n) for i in range(n)]
    return smiles_of(2 * n, e)


def hypercube(d):
    return smiles_of(2**d, [(i, i ^ (1 << k)) for i in range(2**d) for k in range(d) if i ^ (1 << k) > i])


def torus(w, h):
    idx = lambda i, j: (i % w) * h + (j % h)
    e = set()
    for i in range(w):
        for j in range(h):
            e.add(tuple(sorted((idx(i, j), idx(i + 1, j)))))
            e.add(tuple(sorted((idx(i, j), idx(i, j + 1)))))
    return smiles_of(w * h, sorted(e))


def row(smiles, source):
    m = Chem.MolFromSmiles(smiles)
    if m is None:
        return None
    ri = m.GetRingInfo()
    n = m.GetNumAtoms()
    return "\t".join([
        smiles,
        source,
        str(ri.NumRings()),
        ",".join(str(ri.NumAtomRings(i)) for i in range(n)),
        ",".join(str(ri.MinAtomRingSize(i)) for i in range(n)),
    ])


def interesting(m):
    ri = m.GetRingInfo()
    ring_bonds = sum(1 for b in m.GetBonds() if ri.NumBondRings(b.GetIdx()) > 0)
    ring_atoms = sum(1 for a in m.GetAtoms() if ri.NumAtomRings(a.GetIdx()) > 0)
    frags = len(Chem.GetMolFrags(m)) if ring_atoms else 0
    # cycle rank over ring bonds: bonds - atoms + ring systems
    systems = 0
    if ring_atoms:
        seen = set()
        for a in m.GetAtoms():
            i = a.GetIdx()
            if i in seen or ri.NumAtomRings(i) == 0:
                continue
            systems += 1
            stack = [i]
            seen.add(i)
            while stack:
                x = stack.pop()
                for b in m.GetAtomWithIdx(x).GetBonds():
                    if ri.NumBondRings(b.GetIdx()) == 0:
                        continue
                    y = b.GetOtherAtomIdx(x)
                    if y not in seen:
                        seen.add(y)
                        stack.append(y)
    rank = ring_bonds - ring_atoms + systems
    dative_in_ring = any(
        b.GetBondType() == Chem.BondType.DATIVE
        and ri.NumAtomRings(b.GetBeginAtomIdx()) > 0
        and ri.NumAtomRings(b.GetEndAtomIdx()) > 0
        for b in m.GetBonds()
    )
    return ri.NumRings() > rank or dative_in_ring


def main():
    lines = []
    seen = set()
    for source, name in FILES:
        with open(os.path.join(DATA, "moleculenet-deepchem", name)) as f:
            for r in csv.DictReader(f):
                s = r.get("smiles") or r.get("SMILES")
                if not s or s in seen:
                    continue
                seen.add(s)
                m = Chem.MolFromSmiles(s)
                if m is None or m.GetNumAtoms() > 400 or not interesting(m):
                    continue
                lines.append(row(s, source))
    cages = [prism(n) for n in range(3, 13)] + [moebius(n) for n in (4, 5, 8)]
    cages += [hypercube(4), torus(12, 12)]
    for s in cages:
        lines.append(row(s, "synthetic"))
    with open(OUT, "w") as f:
        f.write("# RDKit %s RingInfo; see tests/reference/mol_rings.py and ATTRIBUTION.md\n" % rdBase.rdkitVersion)
        f.write("smiles\tsource\trings\tatom_rings\tsmallest_rings\n")
        for l in lines:
            if l:
                f.write(l + "\n")
    print(len(lines), "rows")


main()
