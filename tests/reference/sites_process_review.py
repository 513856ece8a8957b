"""Build corpus/sites/process_review.tsv: molecules a process chemist deprotonates every week (issue 11).

Each entry: the SMILES with the site a chemist would deprotonate mapped ":1", a name, the expected class (the
class name of the fragments/rules.tsv row that should describe it), the DMSO pKa where one is recalled (empty
where no value is known: site detection and class only), its source key and a note. Values are recalled
Bordwell-group DMSO figures (from-memory, no source consulted) unless the key says otherwise. These rows set no
rule value (the rules they touch were set from their own parents, named in the rule notes); the check is the
issue's criterion: the site is found, as an activated (not background) site, within 2 units of the value.

Run: python3 tests/reference/sites_process_review.py   (needs RDKit; read by tests/sites_process_review.rs)
"""
import os
import sys

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
import sites_lookup as L  # noqa: E402

FM = "from-memory"
CP = "common-practice"

# (mapped smiles, name, expected class, pka_dmso or "", source, note)
ENTRIES = [
    # protected amino esters: the carbamate N-H goes first, the alpha-C-H needs a second equivalent
    ("COC(=O)C[NH:1]C(=O)OC(C)(C)C", "Boc-Gly-OMe (N-H)", "carbamate N-H", 24.8, FM, "as ethyl carbamate 24.8"),
    ("COC(=O)[CH2:1]NC(=O)OC(C)(C)C", "Boc-Gly-OMe (alpha-C-H)", "ester", "", "", "dianion with 2 equiv LDA (common practice)"),
    ("COC(=O)[C@@H](C)[NH:1]C(=O)OCc1ccccc1", "Cbz-Ala-OMe (N-H)", "carbamate N-H", 24.8, FM, "as ethyl carbamate"),
    ("COC(=O)[C@@H](Cc1ccccc1)[NH:1]C(=O)OC(C)(C)C", "Boc-Phe-OMe (N-H)", "carbamate N-H", 24.8, FM, "as ethyl carbamate"),
    ("CC(C)(C)OC(=O)[CH2:1]N=C(c1ccccc1)c1ccccc1", "tert-butyl N-(diphenylmethylene)glycinate", "glycine ester benzophenone imine", 18.7, FM, "O'Donnell phase-transfer substrate; as the ethyl ester"),
    ("O=C(OCC1c2ccccc2-c2ccccc21)NCC[CH2:1]C(=O)O", "Fmoc-GABA (acid alpha-C-H)", "carboxylic acid alpha-CH (of the carboxylate)", "", "", "site detection only"),
    ("O=C(OC[CH:1]1c2ccccc2-c2ccccc21)NCCC(=O)O", "Fmoc-GABA (fluorenyl C9-H)", "fluorene", "", "", "the C9-H that piperidine removes in Fmoc cleavage (E1cB, common practice)"),
    # ketones with protecting groups, heteroaryl ketones, steroids, enones
    ("O=C1[CH2:1]CN(C(=O)OC(C)(C)C)CC1", "N-Boc-4-piperidone", "ketone", 26.4, FM, "as cyclohexanone 26.4; the ring N keeps it off the all-carbon cyclohexanone row"),
    ("CC(C)(C)C1CCC(=O)[CH2:1]C1", "4-tert-butylcyclohexanone", "ketone (cyclohexanone)", 26.4, FM, "as cyclohexanone"),
    ("[CH3:1]C(=O)c1cccs1", "2-acetylthiophene", "ketone (aryl ketone)", "", "", "site detection only"),
    ("[CH3:1]C(=O)c1ccccn1", "2-acetylpyridine", "ketone (2-azinyl or azol-2-yl ketone)", "", "", "site detection only; class since rule set 2026.12-5 (review 2: azinyl ketones have their own rows)"),
    ("C[CH2:1]C(=O)c1ccccc1", "propiophenone", "ketone (aryl ketone)", 24.4, FM, ""),
    ("O=C1[CH2:1]CCC=C1", "cyclohex-2-enone (alpha')", "ketone", "", "", "kinetic side (LDA, -78 C; common practice)"),
    ("O=C1CC[CH2:1]C=C1", "cyclohex-2-enone (gamma)", "vinylogous ketone (enone gamma C-H)", "", "", "thermodynamic dienolate (common practice)"),
    ("[CH3:1]C(=O)[C@H]1CC[C@H]2[C@@H]3CCC4=CC(=O)CC[C@]4(C)[C@H]3CC[C@]12C", "progesterone (C21 methyl)", "ketone", "", "", "site detection only"),
    ("CCOC(=O)[CH:1]1CCCCC1=O", "ethyl 2-oxocyclohexanecarboxylate", "beta-keto ester", "", "", "site detection only"),
    ("CC(=O)[CH2:1]C(=O)OC(C)(C)C", "tert-butyl acetoacetate", "beta-keto ester", 14.2, FM, "as ethyl acetoacetate 14.2"),
    # esters, nitriles, amides, imides
    ("[CH3:1]C(=O)OC(C)(C)C", "tert-butyl acetate", "ester", 30.3, FM, "Bordwell value recalled with less certainty"),
    ("COC(=O)[CH2:1]c1ccccc1", "methyl phenylacetate", "ester", 22.7, FM, "as ethyl phenylacetate"),
    ("C[CH:1](C)C(=O)OCC", "ethyl isobutyrate", "ester", "", "", "site detection only"),
    ("COC(=O)[CH2:1]c1ccccn1", "methyl 2-pyridylacetate", "ester (alpha-2-azinyl)", "", "", "site detection only; class since rule set 2026.12-5 (review 2)"),
    ("N#C[CH2:1]c1ccccc1", "phenylacetonitrile", "nitrile", 21.9, FM, ""),
    ("C[CH:1](C#N)c1ccccc1", "2-phenylpropionitrile", "nitrile", 23.0, FM, ""),
    ("CCC[CH2:1]C#N", "valeronitrile", "nitrile", "", "", "site detection only"),
    ("CON(C)C(=O)[CH2:1]C", "N-methoxy-N-methylpropanamide (Weinreb)", "N-alkoxy amide (Weinreb amide)", "", "", "LDA or LiHMDS at -78 C (common practice)"),
    ("C[CH2:1]C(=O)N1C(=O)OC[C@@H]1Cc1ccccc1", "(S)-4-benzyl-3-propionyl-oxazolidin-2-one", "imide alpha C-H (N-acyl amide, N-acyl oxazolidinone)", "", "", "NaHMDS or LDA at -78 C (Evans 1982, common practice)"),
    ("COc1ccc([CH2:1]C(=O)N(C)C)cc1", "N,N-dimethyl-4-methoxyphenylacetamide", "tertiary amide", "", "", "site detection only"),
    ("CN1CC[CH2:1]C1=O", "N-methylpyrrolidin-2-one", "lactam", "", "", "site detection only"),
    ("O=C1CCC[NH:1]1", "2-pyrrolidinone (N-H)", "amide N-H (lactam)", 24.2, FM, ""),
    ("O=C1CCC(=O)[NH:1]1", "succinimide", "imide", 14.7, FM, ""),
    ("O=C1c2ccccc2C(=O)[NH:1]1", "phthalimide", "imide", 13.4, FM, "lower than the succinimide row; within 2"),
    ("CC(=O)[NH:1]c1ccccc1", "acetanilide", "amide N-H (anilide)", 21.45, FM, ""),
    # sulfonamides, sulfones (Julia), sulfoxides
    ("CS(=O)(=O)[NH:1]c1ccccc1", "methanesulfonanilide", "sulfonamide (N-aryl)", 12.9, FM, "as N-phenylbenzenesulfonamide 12.9"),
    ("Cc1ccc(S([NH2:1])(=O)=O)cc1", "p-toluenesulfonamide", "sulfonamide (aryl)", 16.1, FM, "as benzenesulfonamide 16.1"),
    ("O=S(=O)([NH:1]Cc1ccccc1)c1ccccc1[N+](=O)[O-]", "N-benzyl-2-nitrobenzenesulfonamide (Ns)", "sulfonamide (aryl)", "", "", "Fukuyama alkylation with K2CO3 (common practice)"),
    ("[CH3:1]S(=O)(=O)c1ccccc1", "methyl phenyl sulfone", "sulfone (aryl)", 29.0, FM, ""),
    ("O=S(=O)([CH2:1]c1ccccc1)c1ccccc1", "benzyl phenyl sulfone", "sulfone (aryl)", 23.4, FM, "Julia olefination substrate"),
    ("C[CH2:1]S(=O)(=O)c1nnnn1-c1ccccc1", "ethyl 1-phenyltetrazol-5-yl sulfone (PT)", "sulfone (aryl)", "", "", "Julia-Kocienski; KHMDS at -78 C (common practice); no value known"),
    ("[CH3:1][S+](C)[O-]", "dimethyl sulfoxide (charge-separated)", "sulfoxide", 35.1, "matthews1975", "abstract, p. 7006 (the CS(C)=O form is literature row lit-059)"),
    # phosphonates (Horner-Wadsworth-Emmons), dithianes
    ("CCOC(=O)[CH2:1]P(=O)(OCC)OCC", "triethyl phosphonoacetate", "phosphonoacetate", 18.6, FM, ""),
    ("CCOC(=O)[CH:1](C)P(=O)(OCC)OCC", "triethyl 2-phosphonopropionate", "phosphonoacetate", "", "", "site detection only"),
    ("COC(=O)[CH2:1]P(=O)(OCC(F)(F)F)OCC(F)(F)F", "Still-Gennari phosphonate", "phosphonoacetate", "", "", "KHMDS, 18-crown-6 (stillgennari1983)"),
    ("CCOP(=O)([CH2:1]c1ccccc1)OCC", "diethyl benzylphosphonate", "phosphonate", 27.6, FM, ""),
    ("CCOP(=O)([CH2:1]C#N)OCC", "diethyl cyanomethylphosphonate", "phosphonoacetonitrile", 16.4, FM, ""),
    ("c1ccc([CH:1]2SCCCS2)cc1", "2-phenyl-1,3-dithiane", "1,3-dithiane C2-H", 30.7, FM, "the aryl increment of the thio family"),
    ("C[CH:1]1SCCCS1", "2-methyl-1,3-dithiane", "1,3-dithiane C2-H", "", "", "n-BuLi, THF (corey1965)"),
    # nitro, alkyne
    ("[CH3:1][N+](=O)[O-]", "nitromethane", "nitroalkane", 17.2, FM, ""),
    ("C[Si](C)(C)C#[CH:1]", "trimethylsilylacetylene", "terminal alkyne", "", "", "site detection only"),
]

COLUMNS = ["smiles", "name", "site_atom", "element", "class", "pka_dmso", "dmso_source", "note"]


def main():
    from rdkit import Chem
    rows = []
    for mapped, name, cls, dmso, src, note in ENTRIES:
        smiles, site = L.strip_map(mapped)
        atom = Chem.MolFromSmiles(smiles).GetAtomWithIdx(site)
        rows.append([smiles, name, str(site), atom.GetSymbol(), cls,
                     f"{float(dmso):g}" if dmso != "" else "", src if dmso != "" else "", note])
    path = os.path.join(L.ROOT, "corpus", "sites", "process_review.tsv")
    with open(path, "w") as f:
        f.write("# acidsite corpus/sites/process_review.tsv: molecules a process chemist deprotonates every week\n")
        f.write("# (issue 11 review). One row per (molecule, site a chemist would deprotonate). pka_dmso: DMSO value\n")
        f.write("# recalled (from-memory) or cited (key in fragments/sources.tsv), empty = site and class check only.\n")
        f.write("# Generated by tests/reference/sites_process_review.py; read by tests/sites_process_review.rs.\n")
        f.write("\t".join(COLUMNS) + "\n")
        for r in rows:
            f.write("\t".join(r) + "\n")
    print(f"{len(rows)} rows, {sum(bool(r[5]) for r in rows)} with a DMSO value")


if __name__ == "__main__":
    main()
