"""Cross-check fragments/sigma.tsv against aqueous benzoic-acid pKa values (IUPAC Serjeant set).

sigma(X) = pKa(benzoic acid) - pKa(X-benzoic acid), water, 25 C (rho = 1 by definition).
Writes corpus/sites/sigma_check.tsv (substituent, position, tabulated sigma, sigma from IUPAC data,
difference, IUPAC record ids). Needs RDKit and ../shared/data.
"""
import csv
import os
import sys

from rdkit import Chem, RDLogger

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
import sites_lookup as L  # noqa: E402

RDLogger.DisableLog("rdApp.*")

# Substituents that ionise or protonate themselves near the COOH pKa (amines give zwitterions,
# a second COOH adds a statistical factor): their benzoic-acid pK1 does not measure sigma.
SKIP = {"s-nh2", "s-nme2", "s-cooh", "s-nme3"}


def attach(fragment, position):
    """Benzoic acid carrying the fragment at meta or para (fragment [*] = ring carbon)."""
    ring = {"meta": "OC(=O)c1cccc(*)c1", "para": "OC(=O)c1ccc(*)cc1"}[position]
    frag = Chem.MolFromSmiles(fragment)
    core = Chem.MolFromSmiles(ring)
    combo = Chem.molzip(Chem.MolFromSmiles(ring.replace("*", "[*:1]")),
                        Chem.MolFromSmiles(fragment.replace("[*]", "[*:1]")))
    del frag, core
    return Chem.MolToSmiles(combo)


def main():
    ref = L.water_lookup("OC(=O)c1ccccc1", "acid")
    base = ref["value"]
    out = []
    with open(os.path.join(L.ROOT, "fragments", "sigma.tsv")) as f:
        rows = [line.rstrip("\n").split("\t") for line in f if not line.startswith("#") and line.strip()]
    header = rows[0]
    for cells in rows[1:]:
        row = dict(zip(header, cells))
        if row["id"] in SKIP:
            continue
        for pos, col in (("meta", "sigma_meta"), ("para", "sigma_para")):
            smi = attach(row["substituent_smiles"], pos)
            hit = L.water_lookup(smi, "acid")
            if not hit or not hit["tier"].startswith("reliable"):
                continue
            s = round(base - hit["value"], 2)
            out.append([row["id"], pos, row[col], f"{s:.2f}", f"{s - float(row[col]):+.2f}",
                        str(hit["n"]), " ".join(hit["ids"][:6])])
    path = os.path.join(L.ROOT, "corpus", "sites", "sigma_check.tsv")
    with open(path, "w") as f:
        f.write("# Cross-check of fragments/sigma.tsv: sigma = pKa(PhCOOH) - pKa(X-C6H4COOH), water 25 C,\n")
        f.write(f"# medians of IUPAC Digitized pKa Dataset v1.0 (Serjeant) rows, CC BY-NC 4.0 (c) IUPAC; pKa(PhCOOH) = {base}.\n")
        f.write("id\tposition\tsigma_table\tsigma_iupac\tdifference\tn_rows\trecord_ids\n")
        for r in out:
            f.write("\t".join(r) + "\n")
    diffs = [abs(float(r[4])) for r in out]
    print(f"{len(out)} comparisons; mean |difference| {sum(diffs) / len(diffs):.3f}; max {max(diffs):.2f}")
    for r in out:
        if abs(float(r[4])) > 0.06:
            print("  larger difference:", r[:5])


if __name__ == "__main__":
    main()
