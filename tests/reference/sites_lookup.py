"""Shared helpers for the sites corpus scripts (tests/reference/sites_*.py).

Water pKa look-up in the shared IUPAC sets and atom-map handling for written SMILES.
Needs RDKit and, for look-ups, ../shared/data (only when regenerating the corpus).
"""
import csv
import os
import re
import statistics

from rdkit import Chem

HERE = os.path.dirname(os.path.abspath(__file__))
ROOT = os.path.normpath(os.path.join(HERE, "..", ".."))
SHARED = os.environ.get("ACIDSITE_SHARED_DATA", os.path.normpath(os.path.join(ROOT, "..", "shared", "data")))

CARBON = os.path.join(SHARED, "carbon-acids", "carbon_acids.tsv")
IUPAC = os.path.join(SHARED, "iupac-pka", "iupac_high-confidence_v1_0.csv")
IUPAC_REFS = os.path.join(SHARED, "iupac-pka", "reference_code_translation.csv")

SERJEANT = "IUPAC Digitized pKa Dataset v1.0 (Serjeant)"

# Remarks that mean "not pure water" or "not a plain equilibrium constant in dilute solution".
BAD_REMARK = re.compile(r"%|D2O|dioxan|ethanol|methanol|acetone|DMSO|dimethyl|H_ scale|Ho scale|"
                        r"H- scale|acidity function|aq\. H|aqueous H|excited|hydrate|P=(?!1 \(bar\))\d",
                        re.IGNORECASE)


def temperature(text):
    """Numeric temperature in degrees C from the source text, or None."""
    m = re.match(r"^\s*(-?\d+(?:\.\d+)?)", text or "")
    return float(m.group(1)) if m else None


def number(text):
    try:
        return float(text)
    except (TypeError, ValueError):
        return None


def canon(smiles):
    mol = Chem.MolFromSmiles(smiles)
    if mol is None:
        return None
    return Chem.MolToSmiles(mol, isomericSmiles=False)


def strip_map(mapped):
    """Remove the single atom map :1 from a written SMILES.

    Returns (smiles, site_index). The atom order is unchanged because only the text of the
    mapped bracket atom changes; a bracket atom that the organic subset can write is unbracketed.
    """
    mol = Chem.MolFromSmiles(mapped)
    if mol is None:
        raise ValueError(f"bad SMILES {mapped}")
    sites = [a.GetIdx() for a in mol.GetAtoms() if a.GetAtomMapNum() == 1]
    if len(sites) != 1:
        raise ValueError(f"need exactly one :1 atom in {mapped}")
    site = sites[0]

    def repl(m):
        body = m.group(1)
        plain = re.fullmatch(r"(Cl|Br|B|C|N|O|S|P|F|I|c|n|o|s|p)H?\d*", body)
        if plain:
            return plain.group(1)
        return "[" + body + "]"

    text = re.sub(r"\[([^\]]*?):1\]", repl, mapped)
    mol2 = Chem.MolFromSmiles(text)
    if mol2 is None or canon(text) != canon(re.sub(r":1\]", "]", mapped)):
        # unbracketing changed the hydrogens: keep the bracket
        text = re.sub(r":1\]", "]", mapped)
        mol2 = Chem.MolFromSmiles(text)
    a1 = mol.GetAtomWithIdx(site)
    a2 = mol2.GetAtomWithIdx(site)
    assert a1.GetSymbol() == a2.GetSymbol() and a1.GetTotalNumHs() == a2.GetTotalNumHs(), mapped
    return text, site


_carbon = None
_iupac = None
_refs = None


def _load():
    global _carbon, _iupac, _refs
    if _carbon is None:
        _carbon = {}
        with open(CARBON, newline="") as f:
            for r in csv.DictReader(f, delimiter="\t"):
                if r["dataset"] != SERJEANT or r["solvent"] != "water":
                    continue
                _carbon.setdefault(canon(r["smiles"]), []).append(r)
        _iupac = {}
        with open(IUPAC, newline="") as f:
            for r in csv.DictReader(f):
                c = canon(r["SMILES"])
                if c:
                    _iupac.setdefault(c, []).append(r)
        _refs = {}
        with open(IUPAC_REFS, newline="") as f:
            for r in csv.DictReader(f):
                _refs[r["code"]] = r


def reference_text(code, source):
    _load()
    col = {"serjeant": "serjeant_source", "perrin": "perrin_source", "perrin_supp": "perrin_supp_source"}[source]
    out = []
    for c in re.split(r"[,;]\s*", code or ""):
        r = _refs.get(c.strip())
        if r and r.get(col):
            out.append(f"[{c.strip()}] {r[col]}")
        elif c.strip():
            out.append(f"[{c.strip()}]")
    return " ".join(out)


def record_lookup(ids):
    """References of IUPAC records named by their unique ids (e.g. "serjeant3397"), for rows
    whose water value was cited by hand from those records. Returns dict(refs, ids, dataset) or None."""
    _load()
    want = set(ids)
    refs, found, datasets = [], [], []
    for rows in _iupac.values():
        for r in rows:
            if r["unique_ID"] in want:
                text = reference_text(r["ref"], r["source"])
                if text and text not in refs:
                    refs.append(text)
                found.append(r["unique_ID"])
                name = {"serjeant": "Serjeant", "perrin": "Perrin", "perrin_supp": "Perrin"}[r["source"]]
                if name not in datasets:
                    datasets.append(name)
    if not found:
        return None
    return {"refs": refs, "ids": sorted(set(found)),
            "dataset": f"IUPAC Digitized pKa Dataset v1.0 ({', '.join(datasets)})"}


def _pick(cands):
    """cands: list of (value, T, assessment, remark, ref, id). Returns (median, tier, rows)."""
    good = ("Reliable", "Approximate")
    tiers = [
        ("reliable/approximate, 25 C", lambda v, t, a: a in good and t is not None and abs(t - 25) < 0.6),
        ("reliable/approximate, 20-25 C", lambda v, t, a: a in good and t is not None and 19.9 <= t <= 25.6),
        ("uncertain, 20-25 C", lambda v, t, a: t is not None and 19.9 <= t <= 25.6),
        ("uncertain, temperature not stated", lambda v, t, a: t is None),
    ]
    for name, ok in tiers:
        sel = [c for c in cands if ok(c[0], c[1], c[2])]
        if sel:
            return statistics.median(c[0] for c in sel), name, sel
    return None, None, []


def water_lookup(smiles, kind="acid"):
    """Median aqueous pKa for a molecule from the IUPAC sets.

    kind="acid": Serjeant pK1 rows (acid ionisation of a neutral molecule), from
    carbon_acids.tsv (carbon acids) or the IUPAC file.
    kind="base": Perrin pKAH1 rows for the neutral base (pKa of its conjugate acid).
    Returns dict(value, tier, n, refs, ids, dataset) or None.
    """
    _load()
    c = canon(smiles)
    cands = []
    dataset = None
    if kind == "acid":
        for r in _carbon.get(c, []):
            v = number(r["pKa_numeric"])
            if v is None or r["pka_type"] != "pK1" or BAD_REMARK.search(r["remarks"] or ""):
                continue
            cands.append((v, temperature(r["temperature_C"]), r["assessment"], r["remarks"], r["reference"], r["record_id"]))
        dataset = SERJEANT
        if not cands:
            for r in _iupac.get(c, []):
                if r["source"] != "serjeant" or r["pka_type"] != "pK1":
                    continue
                v = number(r["pka_value"])
                if v is None or BAD_REMARK.search(r["remarks"] or ""):
                    continue
                cands.append((v, temperature(r["T"]), r["assessment"], r["remarks"],
                              reference_text(r["ref"], "serjeant"), r["unique_ID"]))
    else:
        for r in _iupac.get(c, []):
            if r["source"] not in ("perrin", "perrin_supp") or r["pka_type"] != "pKAH1":
                continue
            v = number(r["pka_value"])
            if v is None or BAD_REMARK.search(r["remarks"] or ""):
                continue
            cands.append((v, temperature(r["T"]), r["assessment"], r["remarks"],
                          reference_text(r["ref"], r["source"]), r["unique_ID"]))
        dataset = "IUPAC Digitized pKa Dataset v1.0 (Perrin)"
    med, tier, sel = _pick(cands)
    if med is None:
        return None
    refs = []
    for s in sel:
        if s[4] and s[4] not in refs:
            refs.append(s[4])
    ids = sorted(set(s[5] for s in sel))
    return {"value": round(med, 2), "tier": tier, "n": len(sel), "refs": refs, "ids": ids, "dataset": dataset}
