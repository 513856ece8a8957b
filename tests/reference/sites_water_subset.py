"""Select a water-scale check set of carbon acids and find the ionising C-H atom.

Source: ../shared/data/carbon-acids/carbon_acids.tsv (derived from the IUPAC Digitized pKa Dataset
v1.0, CC BY-NC 4.0 (c) IUPAC). Only IUPAC Serjeant rows are used (DataWarrior/EPA rows have no clear
data licence; Izutsu rows are in NMP).

Selection (per structure):
  - water (no co-solvent, no acidity-function scale), pK1 rows, numeric value;
  - temperature 20-25 C; assessment Reliable or Approximate;
  - CH_only molecules, or CH_with_XH molecules whose value is <= 10 and that carry no imide or
    aromatic N-H (so the C-H is clearly the most acidic site);
  - the ionising carbon must be found without ambiguity (see find_site);
  - value = median of the selected rows; at most 150 structures (most rows first, then by name).
Output: corpus/sites/water_carbon_acids.tsv. Run: python3 tests/reference/sites_water_subset.py
"""
import csv
import os
import statistics
import sys

from rdkit import Chem, RDLogger

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
import sites_lookup as L  # noqa: E402

RDLogger.DisableLog("rdApp.*")

# Activating groups seen from the acidic carbon: SMARTS whose first atom is the neighbour.
GROUPS = [
    ("nitro", "[N+](=O)[O-]", 4.0),
    ("acid", "[CX3](=O)[OX2H1]", 1.0),
    ("ester", "[CX3](=O)[OX2]", 2.0),
    ("amide", "[CX3](=O)[NX3]", 1.5),
    ("aldehyde", "[CX3H1](=O)", 3.0),
    ("ketone", "[CX3](=O)([#6])[#6]", 3.0),
    ("nitrile", "[CX2]#N", 2.0),
    ("sulfone", "[SX4](=O)(=O)", 2.0),
    ("sulfoxide", "[SX3](=O)", 1.0),
    ("onium", "[N+,P+,S+;!$([N+](=O)[O-])]", 1.5),
    ("imine", "[CX3]=[NX2]", 1.5),
    ("aryl", "a", 0.7),
    ("vinyl", "[CX3]=[CX3]", 0.7),
]
GROUP_PATTERNS = [(n, Chem.MolFromSmarts(s), w) for n, s, w in GROUPS]
IMIDE_OR_NH = Chem.MolFromSmarts("[$([NX3H1](C=O)C=O),$([nH])]")
CP_RING = Chem.MolFromSmarts("[CH2,CH1;R1]1C=CC=C1")
ALKYNE = Chem.MolFromSmarts("[CH1]#C")
HALOFORM = Chem.MolFromSmarts("[CH1]([F,Cl,Br,I])([F,Cl,Br,I])[F,Cl,Br,I]")


MAX_PER_CLASS = 30


def neighbour_groups(mol, atom_idx):
    """Activating groups on the neighbours of atom_idx: list of (name, weight)."""
    found = []
    atom = mol.GetAtomWithIdx(atom_idx)
    for nb in atom.GetNeighbors():
        for name, patt, w in GROUP_PATTERNS:
            if any(m[0] == nb.GetIdx() for m in mol.GetSubstructMatches(patt)):
                found.append((name, w))
                break
    return found


def find_site(mol):
    """Return (site index, groups, note) or (None, None, reason)."""
    cands = []
    for a in mol.GetAtoms():
        if a.GetAtomicNum() != 6 or a.GetTotalNumHs() == 0:
            continue
        if a.GetHybridization() != Chem.HybridizationType.SP3 and not a.IsInRingSize(5):
            continue
        groups = neighbour_groups(mol, a.GetIdx())
        score = sum(w for _, w in groups)
        strong = [g for g in groups if g[0] not in ("aryl", "vinyl")]
        if strong:
            cands.append((score, a.GetIdx(), groups))
    for m in mol.GetSubstructMatches(CP_RING):
        cands.append((5.0, m[0], [("cyclopentadiene", 5.0)]))
    for m in mol.GetSubstructMatches(HALOFORM):
        cands.append((2.5, m[0], [("haloform", 2.5)]))
    if not cands:
        return None, None, "no activated C-H"
    cands.sort(key=lambda c: -c[0])
    ranks = list(Chem.CanonicalRankAtoms(mol, breakTies=False))
    best = cands[0]
    for other in cands[1:]:
        if other[0] == best[0] and ranks[other[1]] != ranks[best[1]]:
            return None, None, f"ambiguous between atoms {best[1]} and {other[1]}"
        if other[0] < best[0]:
            break
    return best[1], best[2], ""


def classify(mol, site, groups):
    names = sorted(g for g, _ in groups if g not in ("aryl", "vinyl"))
    ring_info = mol.GetRingInfo()
    if "cyclopentadiene" in names:
        return "cyclopentadiene"
    if "haloform" in names:
        return "haloform"
    if "nitro" in names:
        return "dinitro" if names.count("nitro") >= 2 else "nitro"
    pair = tuple(names)
    table = {
        ("ketone", "ketone"): "diketone_13",
        ("ester", "ketone"): "ketoester_beta",
        ("ester", "ester"): "malonate",
        ("ester", "nitrile"): "cyanoacetate",
        ("nitrile", "nitrile"): "malononitrile",
        ("ketone", "nitrile"): "ketonitrile_beta",
        ("sulfone", "sulfone"): "bis_sulfone",
        ("amide", "ketone"): "ketoamide_beta",
        ("ketone", "sulfone"): "ketosulfone_beta",
    }
    if pair in table:
        cls = table[pair]
        ring_carbonyls = [nb for nb in mol.GetAtomWithIdx(site).GetNeighbors()
                          if nb.GetAtomicNum() == 6 and ring_info.NumAtomRings(nb.GetIdx()) > 0
                          and any(b.GetBondTypeAsDouble() == 2 and b.GetOtherAtom(nb).GetAtomicNum() == 8
                                  for b in nb.GetBonds())]
        if cls in ("diketone_13", "malonate") and len(ring_carbonyls) == 2:
            ring_o = Chem.MolFromSmarts("[CH2,CH1;R]1C(=O)OC(C)(C)OC1=O")
            if cls == "malonate" and mol.HasSubstructMatch(ring_o):
                return "meldrum"
            return "dione_cyclic_13" if cls == "diketone_13" else cls
        return cls
    if len(names) == 1:
        return names[0]
    return "+".join(names) if names else "other"


def literature_splits():
    """Canonical SMILES -> split of corpus/sites/literature.tsv (rows with a water value; holdout wins)."""
    path = os.path.join(L.ROOT, "corpus", "sites", "literature.tsv")
    with open(path) as f:
        lines = [line.rstrip("\n").split("\t") for line in f if line.strip() and not line.startswith("#")]
    cols = lines[0]
    out = {}
    for cells in lines[1:]:
        row = dict(zip(cols, cells))
        canon = L.canon(row["smiles"])
        if out.get(canon) != "holdout":
            out[canon] = row["split"]
    return out


def main():
    by_smiles = {}
    with open(L.CARBON, newline="") as f:
        for r in csv.DictReader(f, delimiter="\t"):
            if r["dataset"] != L.SERJEANT or r["solvent"] != "water" or r["pka_type"] != "pK1":
                continue
            v = L.number(r["pKa_numeric"])
            t = L.temperature(r["temperature_C"])
            if v is None or t is None or not 19.9 <= t <= 25.6:
                continue
            if r["assessment"] not in ("Reliable", "Approximate"):
                continue
            if L.BAD_REMARK.search(r["remarks"] or ""):
                continue
            by_smiles.setdefault(r["smiles"], []).append((v, r))
    chosen = []
    skipped = []
    for smi, rows in by_smiles.items():
        mol = Chem.MolFromSmiles(smi)
        if mol is None or len(Chem.GetMolFrags(mol)) > 1:
            skipped.append((smi, "parse/fragments"))
            continue
        value = statistics.median(v for v, _ in rows)
        first = rows[0][1]
        if first["ch_class"] == "CH_with_XH" and (value > 10 or mol.HasSubstructMatch(IMIDE_OR_NH)):
            skipped.append((smi, "other X-H may compete"))
            continue
        site, groups, why = find_site(mol)
        if site is None:
            skipped.append((smi, why))
            continue
        cls = classify(mol, site, groups)
        refs = []
        for _, r in rows:
            if r["reference"] not in refs:
                refs.append(r["reference"])
        ids = sorted(set(r["record_id"] for _, r in rows))
        temps = sorted(set(r["temperature_C"] for _, r in rows))
        chosen.append({"smiles": smi, "name": first["name"], "site": site,
                       "element": mol.GetAtomWithIdx(site).GetSymbol(), "class": cls,
                       "value": round(value, 2), "n": len(rows), "refs": refs, "ids": ids,
                       "note": f"median of {len(rows)} rows at {', '.join(temps)} C; "
                               f"groups on site: {', '.join(g for g, _ in groups)}"
                               + ("; other X-H present" if first["ch_class"] == "CH_with_XH" else "")})
    chosen.sort(key=lambda c: (-c["n"], c["name"]))
    # gem-dinitroalkanes dominate the source; keep at most MAX_PER_CLASS of any class
    kept, per_class = [], {}
    for c in chosen:
        per_class[c["class"]] = per_class.get(c["class"], 0) + 1
        if per_class[c["class"]] <= MAX_PER_CLASS:
            kept.append(c)
        else:
            skipped.append((c["smiles"], f"class {c['class']} capped at {MAX_PER_CLASS}"))
    chosen = kept[:150]
    # report labels in the class vocabulary of literature.tsv (the note keeps the groups found)
    relabel = {"dinitro": "nitro", "aldehyde+ketone": "diketone_13", "amide+imine": "other"}
    for c in chosen:
        c["class"] = relabel.get(c["class"], c["class"])
    chosen.sort(key=lambda c: (c["class"], c["value"]))
    path = os.path.join(L.ROOT, "corpus", "sites", "water_carbon_acids.tsv")
    with open(path, "w") as f:
        f.write("# acidsite corpus/sites/water_carbon_acids.tsv, version 1: carbon acids in water for a water-scale MAE check.\n")
        f.write("# Selected by tests/reference/sites_water_subset.py from ../shared/data/carbon-acids (IUPAC Digitized pKa\n")
        f.write("# Dataset v1.0, Serjeant rows only). CC BY-NC 4.0, (c) IUPAC: Reproduced by permission of International Union\n")
        f.write("# of Pure and Applied Chemistry. See ATTRIBUTION.md. One row per structure: median of the pure-water, 20-25 C,\n")
        f.write("# Approximate/Reliable pK1 rows; at most 30 per class (gem-dinitroalkanes are capped). site_atom = ionising carbon\n")
        f.write("# (0-based, written order), found by rule and checked\n")
        f.write("# by eye. No DMSO values. split: every fourth row (by class and value) is holdout, except that a structure\n")
        f.write("# that is also in literature.tsv takes its split there (a parent of a rule or increment is never holdout).\n")
        cols = ["id", "smiles", "name", "site_atom", "element", "class", "pka_dmso", "dmso_source", "pka_water",
                "water_source", "split", "note", "dataset", "record_ids", "reference"]
        f.write("\t".join(cols) + "\n")
        lit_split = literature_splits()
        for i, c in enumerate(chosen, 1):
            split = "holdout" if i % 4 == 0 else "train"
            canon = L.canon(c["smiles"])
            if canon in lit_split and lit_split[canon] != split:
                split = lit_split[canon]
                c["note"] += f"; split {split} as in literature.tsv (issue 11)"
            f.write("\t".join([f"wca-{i:03d}", c["smiles"], c["name"], str(c["site"]), c["element"], c["class"],
                               "", "", f"{c['value']:g}", "iupac-serjeant", split, c["note"], L.SERJEANT,
                               " ".join(c["ids"]), " | ".join(c["refs"])]) + "\n")
    print(f"{len(by_smiles)} structures with eligible rows; {len(chosen)} written; {len(skipped)} skipped")
    for s, why in skipped:
        print("  skipped:", s, "-", why)


if __name__ == "__main__":
    main()
