"""Build corpus/sites/literature.tsv and corpus/sites/common_practice.tsv.

Each entry below is written by hand: a SMILES with the ionising atom mapped ":1", a name, the
class, the DMSO pKa with its citation key, and the water pKa (a number with its key, "auto" =
median of the IUPAC Serjeant rows for this molecule, "base:SMILES" = median of the IUPAC Perrin
pKAH1 rows of that neutral base, or empty). See corpus/sites/README.md for the keys.

Run from anywhere: python3 tests/reference/sites_build_literature.py
(needs RDKit and ../shared/data for the "auto" water values; the output is committed.)
"""
import os
import re
import sys

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
import sites_lookup as L  # noqa: E402

FM = "from-memory"
MA = "matthews1975"
B86 = "bordwell1986"
SH12 = "shokri2012"
CP = "common-practice"

# (mapped smiles, name, class, pka_dmso, dmso_source, water, water_source, split T/H, note)
# Never reorder or delete: ids are positional. Append new rows at the end.
ENTRIES = [
    # --- ketones -------------------------------------------------------------
    ("[CH3:1]C(C)=O", "acetone", "ketone", 26.5, FM, "auto", "", "T", ""),
    ("[CH3:1]C(=O)c1ccccc1", "acetophenone", "ketone", 24.7, FM, "auto", "", "T", "aryl ketone"),
    ("C[CH2:1]C(=O)c1ccccc1", "propiophenone", "ketone", 24.4, FM, "", "", "H", "alpha-methyl"),
    ("C[CH:1](C)C(=O)c1ccccc1", "isobutyrophenone", "ketone", 26.3, FM, "", "", "T", "alpha,alpha-dimethyl"),
    ("O=C(c1ccccc1)[CH2:1]c1ccccc1", "deoxybenzoin", "ketone", 17.7, FM, "", "", "T", "alpha-phenyl"),
    ("CC(=O)[CH2:1]c1ccccc1", "phenylacetone (benzylic CH2)", "ketone", 19.9, FM, "", "", "T", "alpha-phenyl; the CH3 side is less acidic"),
    ("O=C([CH2:1]c1ccccc1)Cc1ccccc1", "1,3-diphenylacetone", "ketone", 18.7, FM, "", "", "H", "alpha-phenyl on both sides"),
    ("O=C1[CH2:1]CCCC1", "cyclohexanone", "ketone", 26.4, FM, "", "", "T", "six-ring; recalled"),
    ("O=C1[CH2:1]CCC1", "cyclopentanone", "ketone", 25.8, FM, "", "", "H", "five-ring; recalled"),
    ("CC(C)(C)C(=O)[CH3:1]", "pinacolone", "ketone", 27.7, FM, "", "", "T", "tert-butyl methyl ketone"),
    ("C[CH2:1]C(=O)CC", "3-pentanone", "ketone", 27.1, FM, "", "", "T", "alpha-methyl; DMSO value uncertain"),
    ("C[CH:1](C)C(=O)C(C)C", "2,4-dimethyl-3-pentanone", "ketone", 28.2, FM, "", "", "H", "alpha,alpha-dimethyl"),
    ("CO[CH2:1]C(=O)c1ccccc1", "2-methoxyacetophenone", "ketone", 22.85, FM, "", "", "T", "alpha-alkoxy"),
    ("O=C([CH2:1]Oc1ccccc1)c1ccccc1", "2-phenoxyacetophenone", "ketone", 21.1, FM, "", "", "H", "alpha-aryloxy"),
    ("O=C([CH2:1]Sc1ccccc1)c1ccccc1", "2-(phenylthio)acetophenone", "ketone", 16.9, FM, "", "", "T", "alpha-thio"),
    ("C[N+](C)(C)[CH2:1]C(=O)c1ccccc1", "phenacyltrimethylammonium", "ketone", 14.6, FM, "", "", "H", "alpha-ammonium"),
    ("[CH3:1]C(=O)c1ccc(OC)cc1", "4-methoxyacetophenone", "ketone", 25.7, FM, "", "", "T", "Hammett series ArCOCH3"),
    ("[CH3:1]C(=O)c1ccc(C)cc1", "4-methylacetophenone", "ketone", 25.2, FM, "", "", "T", "Hammett series ArCOCH3"),
    ("[CH3:1]C(=O)c1ccc(Cl)cc1", "4-chloroacetophenone", "ketone", 23.8, FM, "", "", "T", "Hammett series ArCOCH3"),
    ("[CH3:1]C(=O)c1ccc(Br)cc1", "4-bromoacetophenone", "ketone", 23.8, FM, "", "", "T", "Hammett series ArCOCH3"),
    ("[CH3:1]C(=O)c1ccc(C(F)(F)F)cc1", "4-(trifluoromethyl)acetophenone", "ketone", 22.7, FM, "", "", "T", "Hammett series ArCOCH3"),
    ("[CH3:1]C(=O)c1ccc(C#N)cc1", "4-cyanoacetophenone", "ketone", 22.0, FM, "", "", "T", "Hammett series ArCOCH3; value uncertain by ~0.3"),
    ("[CH3:1]C(=O)c1ccc(N(C)C)cc1", "4-(dimethylamino)acetophenone", "ketone", 27.5, FM, "", "", "T", "Hammett series ArCOCH3"),
    ("CC(=O)[CH2:1]Cl", "chloroacetone (CH2Cl side)", "ketone", "", "", "auto", "", "T", "alpha-halo; water value kinetic, rated Uncertain"),
    ("CC(=O)[CH:1](Cl)Cl", "1,1-dichloroacetone (CHCl2 side)", "ketone", "", "", "auto", "", "H", "alpha,alpha-dihalo; water value rated Uncertain"),
    # --- aldehydes -------------------------------------------------------------
    ("[CH3:1]C=O", "acetaldehyde", "aldehyde", "", "", 16.7, FM, "T", "keto form, not the hydrate"),
    ("C[CH:1](C)C=O", "isobutyraldehyde", "aldehyde", "", "", 15.5, FM, "H", "keto form, not the hydrate"),
    # --- esters, lactones, thioesters -----------------------------------------
    ("[CH3:1]C(=O)OCC", "ethyl acetate", "ester", "", "", 25.6, FM, "T", "water value from kinetics (Amyes and Richard); DMSO value not measured directly"),
    ("CCOC(=O)[CH2:1]c1ccccc1", "ethyl phenylacetate", "ester", 22.6, FM, "", "", "T", "alpha-phenyl"),
    ("CCOC(=O)[CH2:1]Sc1ccccc1", "ethyl (phenylthio)acetate", "ester", 21.4, FM, "", "", "H", "alpha-thio"),
    ("O=C1OCC[CH2:1]1", "gamma-butyrolactone", "lactone", 25.2, FM, "", "", "T", "five-ring lactone; recalled"),
    ("CCSC(=O)[CH3:1]", "S-ethyl thioacetate", "thioester", "", "", 21.0, FM, "T", "water value from kinetics"),
    # --- amides (C-H) ----------------------------------------------------------
    ("CN(C)C(=O)[CH3:1]", "N,N-dimethylacetamide", "amide_tertiary", 34.5, FM, "", "", "T", "DMSO value approximate (extrapolated)"),
    ("CN(C)C(=O)[CH2:1]c1ccccc1", "N,N-dimethylphenylacetamide", "amide_tertiary", 26.6, FM, "", "", "T", "alpha-phenyl"),
    ("CN1CC[CH2:1]C1=O", "1-methyl-2-pyrrolidinone (alpha C-H)", "lactam", "", "", "", "", "T", "no measured value known; checks the site is found"),
    ("C[NH:1]C(=O)C", "N-methylacetamide (N-H)", "amide_nh", 25.9, FM, "", "", "T", "secondary amide N-H; DMSO value uncertain"),
    ("CNC(=O)[CH3:1]", "N-methylacetamide (alpha C-H)", "amide_secondary", "", "", "", "", "T", "no measured value known; N-H is more acidic"),
    ("NC(=O)[CH3:1]", "acetamide (alpha C-H)", "amide_primary", "", "", "", "", "T", "no measured value known; N-H is more acidic"),
    # --- carboxylic acid C-H ---------------------------------------------------
    ("OC(=O)[CH3:1]", "acetic acid (alpha C-H)", "carboxylic_acid", "", "", "", "", "T", "no measured value known; O-H is far more acidic"),
    # --- nitriles --------------------------------------------------------------
    ("[CH3:1]C#N", "acetonitrile", "nitrile", 31.3, FM, "", "", "T", ""),
    ("C[CH2:1]C#N", "propionitrile", "nitrile", 32.5, FM, "", "", "H", "alpha-methyl"),
    ("N#C[CH2:1]c1ccccc1", "phenylacetonitrile", "nitrile", 21.9, FM, "", "", "T", "alpha-phenyl; Hammett series ArCH2CN"),
    ("N#C[CH2:1]c1ccc([N+](=O)[O-])cc1", "4-nitrophenylacetonitrile", "nitrile", 12.3, FM, "", "", "T", "Hammett series ArCH2CN (sigma-minus)"),
    ("N#C[CH2:1]c1ccc(C#N)cc1", "4-cyanophenylacetonitrile", "nitrile", 16.0, FM, "", "", "T", "Hammett series ArCH2CN (sigma-minus); value uncertain by ~0.5"),
    ("N#C[CH:1](c1ccccc1)c1ccccc1", "diphenylacetonitrile", "nitrile", 17.5, FM, "", "", "T", "alpha,alpha-diphenyl"),
    ("C[CH:1](C#N)c1ccccc1", "2-phenylpropionitrile", "nitrile", 23.0, FM, "", "", "H", "alpha-phenyl, alpha-methyl"),
    ("N#C[CH2:1]Sc1ccccc1", "(phenylthio)acetonitrile", "nitrile", 20.8, FM, "", "", "T", "alpha-thio"),
    # --- nitroalkanes ----------------------------------------------------------
    ("[CH3:1][N+](=O)[O-]", "nitromethane", "nitro", 17.2, FM, "auto", "", "T", ""),
    ("C[CH2:1][N+](=O)[O-]", "nitroethane", "nitro", 16.7, FM, "auto", "", "T", "alpha-methyl"),
    ("C[CH:1](C)[N+](=O)[O-]", "2-nitropropane", "nitro", 16.9, FM, "auto", "", "H", "alpha,alpha-dimethyl"),
    ("[O-][N+](=O)[CH2:1]c1ccccc1", "phenylnitromethane", "nitro", 12.2, FM, "", "", "T", "alpha-phenyl"),
    # --- sulfones, sulfoxides, sulfonyl derivatives ---------------------------
    ("[CH3:1]S(C)(=O)=O", "dimethyl sulfone", "sulfone", 31.1, FM, "", "", "T", ""),
    ("[CH3:1]S(=O)(=O)c1ccccc1", "methyl phenyl sulfone", "sulfone", 29.0, FM, "", "", "T", ""),
    ("C[CH2:1]S(=O)(=O)c1ccccc1", "ethyl phenyl sulfone", "sulfone", 31.0, FM, "", "", "T", "alpha-methyl; DMSO value uncertain"),
    ("O=S(=O)([CH2:1]c1ccccc1)c1ccccc1", "benzyl phenyl sulfone", "sulfone", 23.4, FM, "", "", "T", "alpha-phenyl"),
    ("O=S(=O)([CH2:1]Cl)c1ccccc1", "chloromethyl phenyl sulfone", "sulfone", 23.8, FM, "", "", "T", "alpha-halo"),
    ("O=S(=O)([CH2:1]Sc1ccccc1)c1ccccc1", "(phenylthio)methyl phenyl sulfone", "sulfone", 20.5, FM, "", "", "H", "alpha-thio"),
    ("C=C[CH2:1]S(=O)(=O)c1ccccc1", "allyl phenyl sulfone", "sulfone", 22.5, FM, "", "", "T", "alpha-vinyl"),
    ("[CH3:1]S(C)=O", "dimethyl sulfoxide", "sulfoxide", 35.1, MA, "", "", "T", ""),
    ("[CH3:1]S(=O)c1ccccc1", "methyl phenyl sulfoxide", "sulfoxide", 33.0, FM, "", "", "H", "DMSO value uncertain"),
    ("COS(=O)(=O)[CH3:1]", "methyl methanesulfonate (alpha C-H)", "sulfonate", "", "", "", "", "T", "no measured value known; checks the site is found"),
    ("CN(C)S(=O)(=O)[CH3:1]", "N,N-dimethylmethanesulfonamide (alpha C-H)", "sulfonamide_alpha", "", "", "", "", "T", "no measured value known; checks the site is found"),
    # --- phosphorus ------------------------------------------------------------
    ("CCOP(=O)([CH2:1]c1ccccc1)OCC", "diethyl benzylphosphonate", "phosphonate", 27.6, FM, "", "", "T", "alpha-phenyl"),
    ("CCOP(=O)([CH2:1]C#N)OCC", "diethyl cyanomethylphosphonate", "phosphonate", 16.4, FM, "", "", "H", "plus alpha-cyano"),
    ("CCOC(=O)[CH2:1]P(=O)(OCC)OCC", "triethyl phosphonoacetate", "phosphonate", 18.6, FM, "", "", "T", "plus alpha-ester"),
    ("[CH3:1][P+](c1ccccc1)(c1ccccc1)c1ccccc1", "methyltriphenylphosphonium", "phosphonium", 22.4, FM, "", "", "T", "salt"),
    ("O=C([CH2:1][P+](c1ccccc1)(c1ccccc1)c1ccccc1)c1ccccc1", "phenacyltriphenylphosphonium", "phosphonium", 6.0, FM, "", "", "H", "plus alpha-benzoyl"),
    # --- doubly activated ------------------------------------------------------
    ("CC(=O)[CH2:1]C(C)=O", "acetylacetone", "diketone_13", 13.3, FM, "auto", "", "T", "water value is the mixed keto/enol constant"),
    ("O=C(c1ccccc1)[CH2:1]C(=O)c1ccccc1", "dibenzoylmethane", "diketone_13", 13.35, FM, "", "", "H", ""),
    ("CC(=O)[CH2:1]C(=O)c1ccccc1", "benzoylacetone", "diketone_13", "", "", "auto", "", "T", ""),
    ("CC(=O)[CH:1](C)C(=O)c1ccccc1", "2-methyl-1-phenyl-1,3-butanedione", "diketone_13", "", "", "auto", "", "T", "alpha-methyl"),
    ("CC(=O)[CH:1](C(C)=O)c1ccccc1", "3-phenylpentane-2,4-dione", "diketone_13", "", "", "auto", "", "T", "alpha-phenyl"),
    ("CC1(C)CC(=O)[CH2:1]C(=O)C1", "dimedone", "dione_cyclic_13", 11.2, FM, "auto", "", "T", ""),
    ("O=C1CCCC(=O)[CH2:1]1", "1,3-cyclohexanedione", "dione_cyclic_13", "", "", "auto", "", "H", ""),
    ("CC1(C)OC(=O)[CH2:1]C(=O)O1", "Meldrum's acid", "meldrum", 7.3, FM, 4.83, FM, "T", ""),
    ("CCOC(=O)[CH2:1]C(C)=O", "ethyl acetoacetate", "ketoester_beta", 14.2, FM, "auto", "", "T", ""),
    ("CCOC(=O)[CH2:1]C(=O)c1ccccc1", "ethyl benzoylacetate", "ketoester_beta", "", "", "auto", "", "T", ""),
    ("CCOC(=O)[CH2:1]C(=O)c1ccc([N+](=O)[O-])cc1", "ethyl 4-nitrobenzoylacetate", "ketoester_beta", "", "", "auto", "", "H", "Hammett series in water"),
    ("CCOC(=O)[CH2:1]C(=O)c1ccc(OC)cc1", "ethyl 4-methoxybenzoylacetate", "ketoester_beta", "", "", "auto", "", "T", "Hammett series in water"),
    ("CCOC(=O)[CH2:1]C(=O)OCC", "diethyl malonate", "malonate", 16.4, FM, "auto", "", "T", "water value rated Uncertain"),
    ("COC(=O)[CH2:1]C(=O)OC", "dimethyl malonate", "malonate", 15.9, FM, "", "", "H", ""),
    ("CCOC(=O)[CH:1](C)C(=O)OCC", "diethyl methylmalonate", "malonate", 18.7, FM, "", "", "T", "alpha-methyl; DMSO value uncertain"),
    ("CCOC(=O)[CH2:1]C#N", "ethyl cyanoacetate", "cyanoacetate", 13.1, FM, "", "", "T", ""),
    ("N#C[CH2:1]C#N", "malononitrile", "malononitrile", 11.1, FM, "auto", "", "T", ""),
    ("N#C[CH:1](C#N)c1ccccc1", "phenylmalononitrile", "malononitrile", 4.2, FM, "", "", "H", "alpha-phenyl"),
    ("N#C[CH2:1]C(=O)c1ccccc1", "benzoylacetonitrile", "ketonitrile_beta", 10.2, FM, "", "", "T", ""),
    ("N#C[CH2:1]S(=O)(=O)c1ccccc1", "(phenylsulfonyl)acetonitrile", "sulfone", 12.0, FM, "", "", "H", "plus alpha-cyano"),
    ("O=C([CH2:1]S(=O)(=O)c1ccccc1)c1ccccc1", "2-(phenylsulfonyl)acetophenone", "ketone", 11.4, FM, "", "", "T", "plus alpha-sulfonyl"),
    ("O=S(=O)([CH2:1]S(=O)(=O)c1ccccc1)c1ccccc1", "bis(phenylsulfonyl)methane", "bis_sulfone", 12.25, FM, "", "", "T", ""),
    ("CS(=O)(=O)[CH2:1]S(C)(=O)=O", "bis(methylsulfonyl)methane", "bis_sulfone", 15.0, FM, "auto", "", "H", ""),
    ("CC(=O)[CH2:1][N+](=O)[O-]", "nitroacetone", "nitro", "", "", "auto", "", "T", "plus alpha-acetyl"),
    ("CCOC(=O)[CH2:1][N+](=O)[O-]", "ethyl nitroacetate", "nitro", "", "", "auto", "", "H", "plus alpha-ester"),
    ("CC(=O)[CH2:1]S(C)(=O)=O", "(methylsulfonyl)acetone", "ketone", "", "", "auto", "", "T", "plus alpha-sulfonyl; water value rated Uncertain"),
    # --- hydrocarbons: fluorene, indene, cyclopentadiene, arylmethanes --------
    ("[CH2:1]1c2ccccc2-c2ccccc21", "fluorene", "fluorene", 22.6, MA, "", "", "T", ""),
    ("c1ccc([CH:1]2c3ccccc3-c3ccccc32)cc1", "9-phenylfluorene", "fluorene", 17.9, B86, "", "", "T", "alpha-phenyl; DMSO value recalled, then read in the bordwell1986 abstract (corpus/sites/dmso_measured.tsv dm-008)"),
    ("C[CH:1]1c2ccccc2-c2ccccc21", "9-methylfluorene", "fluorene", 22.3, FM, "", "", "H", "alpha-methyl"),
    ("CO[CH:1]1c2ccccc2-c2ccccc21", "9-methoxyfluorene", "fluorene", 22.1, FM, "", "", "T", "alpha-alkoxy"),
    ("c1ccc(S[CH:1]2c3ccccc3-c3ccccc32)cc1", "9-(phenylthio)fluorene", "fluorene", 15.4, FM, "", "", "T", "alpha-thio"),
    ("N#C[CH:1]1c2ccccc2-c2ccccc21", "9-cyanofluorene", "fluorene", 8.3, FM, "", "", "H", "plus alpha-cyano"),
    ("COC(=O)[CH:1]1c2ccccc2-c2ccccc21", "methyl fluorene-9-carboxylate", "fluorene", 10.35, FM, "", "", "T", "plus alpha-ester"),
    ("[CH2:1]1C=Cc2ccccc21", "indene", "indene", 20.1, FM, "", "", "T", ""),
    ("[CH2:1]1C=CC=C1", "cyclopentadiene", "cyclopentadiene", 18.0, FM, "auto", "", "T", "water value rated Uncertain"),
    ("[CH2:1](c1ccccc1)c1ccccc1", "diphenylmethane", "diarylmethane", 32.2, FM, "", "", "T", ""),
    ("[CH2:1]1c2ccccc2Oc2ccccc21", "xanthene", "diarylmethane", 30.0, FM, "", "", "H", "bridged diarylmethane"),
    ("[CH:1](c1ccccc1)(c1ccccc1)c1ccccc1", "triphenylmethane", "triarylmethane", 30.6, FM, "", "", "T", ""),
    ("[CH3:1]c1ccccc1", "toluene", "benzylic", 43.0, FM, "", "", "T", "extrapolated estimate"),
    ("[CH3:1]c1ccc([N+](=O)[O-])cc1", "4-nitrotoluene", "benzylic", 20.4, FM, "", "", "T", "para-nitro (sigma-minus); moved from holdout to train (rule set 2026.12-2): it is the only calibration point of the phenylogous-nitro rule C-PHNYL-01, so it no longer checks it independently"),
    ("[CH3:1]C=C", "propene", "allylic", 44.0, FM, "", "", "T", "extrapolated estimate"),
    ("[CH:1]#Cc1ccccc1", "phenylacetylene", "alkyne_terminal", 28.8, FM, "", "", "T", ""),
    ("[cH:1]1nc2ccccc2s1", "benzothiazole (C2-H)", "azole_c2", 27.3, FM, "", "", "T", "DMSO value uncertain"),
    ("Cn1cc[n+](C)[cH:1]1", "1,3-dimethylimidazolium (C2-H)", "azole_c2", "", "", 23.0, FM, "T", "water value from H/D exchange kinetics"),
    ("Cc1cs[cH:1][n+]1C", "3,4-dimethylthiazolium (C2-H)", "azole_c2", "", "", 18.9, FM, "H", "water value from H/D exchange kinetics"),
    # --- alcohols, water --------------------------------------------------------
    ("C[OH:1]", "methanol", "alcohol", 29.0, FM, "auto", "", "T", ""),
    ("CC[OH:1]", "ethanol", "alcohol", 29.8, FM, "auto", "", "T", "water value rated Uncertain"),
    ("CC(C)[OH:1]", "2-propanol", "alcohol", 30.3, FM, "", "", "T", ""),
    ("CC(C)(C)[OH:1]", "tert-butanol", "alcohol", 32.2, FM, "", "", "T", ""),
    ("[OH:1]CC(F)(F)F", "2,2,2-trifluoroethanol", "alcohol", 23.45, FM, "auto", "", "T", ""),
    ("[OH:1]C(C(F)(F)F)C(F)(F)F", "hexafluoro-2-propanol", "alcohol", 18.2, FM, "auto", "", "H", ""),
    # --- phenols ---------------------------------------------------------------
    ("[OH:1]c1ccccc1", "phenol", "phenol", 18.0, FM, "auto", "", "T", ""),
    ("Cc1ccc([OH:1])cc1", "4-methylphenol", "phenol", 18.9, FM, "auto", "", "H", "Hammett series ArOH"),
    ("COc1ccc([OH:1])cc1", "4-methoxyphenol", "phenol", 19.1, FM, "auto", "", "T", "Hammett series ArOH"),
    ("Clc1ccc([OH:1])cc1", "4-chlorophenol", "phenol", 16.75, FM, "auto", "", "T", "Hammett series ArOH"),
    ("N#Cc1ccc([OH:1])cc1", "4-cyanophenol", "phenol", 13.2, FM, "auto", "", "H", "Hammett series ArOH (sigma-minus)"),
    ("O=[N+]([O-])c1ccc([OH:1])cc1", "4-nitrophenol", "phenol", 10.8, FM, "auto", "", "T", "Hammett series ArOH (sigma-minus)"),
    ("O=[N+]([O-])c1cccc([OH:1])c1", "3-nitrophenol", "phenol", "", "", "auto", "", "T", "Hammett series ArOH"),
    ("Clc1cccc([OH:1])c1", "3-chlorophenol", "phenol", "", "", "auto", "", "T", "Hammett series ArOH"),
    # --- thiols ----------------------------------------------------------------
    ("[SH:1]c1ccccc1", "thiophenol", "thiol", 10.3, FM, "auto", "", "T", ""),
    ("CCCC[SH:1]", "1-butanethiol", "thiol", 17.0, FM, "auto", "", "T", ""),
    ("CC[SH:1]", "ethanethiol", "thiol", "", "", "auto", "", "H", ""),
    # --- carboxylic acids --------------------------------------------------------
    ("CC(=O)[OH:1]", "acetic acid", "carboxylic_acid_oh", 12.3, SH12, "auto", "", "T", "DMSO value recalled, then read in the shokri2012 abstract (samet2015 quotes 12.6; dmso_measured.tsv dm-024)"),
    ("O=C([OH:1])c1ccccc1", "benzoic acid", "carboxylic_acid_oh", 11.1, FM, "auto", "", "T", ""),
    ("O=C([OH:1])CCl", "chloroacetic acid", "carboxylic_acid_oh", 8.9, FM, "auto", "", "H", ""),
    ("O=C([OH:1])c1ccc([N+](=O)[O-])cc1", "4-nitrobenzoic acid", "carboxylic_acid_oh", "", "", "auto", "", "T", "Hammett reference series"),
    # --- amide, carbamate N-H ----------------------------------------------------
    ("[NH2:1]C(C)=O", "acetamide (N-H)", "amide_nh", 25.5, FM, "", "", "T", ""),
    ("[NH2:1]C(=O)c1ccccc1", "benzamide (N-H)", "amide_nh", 23.35, FM, "", "", "H", ""),
    ("CC(=O)[NH:1]c1ccccc1", "acetanilide (N-H)", "amide_nh", 21.45, FM, "", "", "T", "N-aryl"),
    ("O=C1CCC[NH:1]1", "2-pyrrolidinone (N-H)", "amide_nh", 24.2, FM, "", "", "T", "lactam N-H"),
    ("[NH2:1]C(N)=O", "urea (N-H)", "amide_nh", 26.9, FM, "", "", "H", ""),
    ("CCOC(=O)[NH2:1]", "ethyl carbamate (N-H)", "carbamate_nh", 24.8, FM, "", "", "T", ""),
    ("O=C1OCC[NH:1]1", "2-oxazolidinone (N-H)", "carbamate_nh", 20.5, FM, "", "", "H", "cyclic carbamate"),
    # --- imides ------------------------------------------------------------------
    ("O=C1CCC(=O)[NH:1]1", "succinimide", "imide", 14.7, FM, "auto", "", "T", ""),
    ("O=C1[NH:1]C(=O)c2ccccc21", "phthalimide", "imide", 13.4, FM, "auto", "", "H", ""),
    # --- sulfonamides N-H ---------------------------------------------------------
    ("[NH2:1]S(=O)(=O)c1ccccc1", "benzenesulfonamide", "sulfonamide_nh", 16.1, FM, "auto", "", "T", ""),
    ("CS(=O)(=O)[NH2:1]", "methanesulfonamide", "sulfonamide_nh", 17.5, FM, "auto", "", "T", ""),
    ("[NH2:1]S(=O)(=O)C(F)(F)F", "trifluoromethanesulfonamide", "sulfonamide_nh", 9.7, FM, "auto", "", "H", ""),
    ("Cc1ccc(S(=O)(=O)[NH2:1])cc1", "p-toluenesulfonamide", "sulfonamide_nh", "", "", "auto", "", "T", ""),
    # --- azole N-H ---------------------------------------------------------------
    ("[nH:1]1cccc1", "pyrrole", "azole_nh", 23.0, FM, 17.51, "iupac-serjeant", "T", "water: IUPAC serjeant2309 pK1, aqueous KOH H_ scale, rated Uncertain"),
    ("[nH:1]1ccc2ccccc21", "indole", "azole_nh", 21.0, FM, 16.97, "iupac-serjeant", "T", "water: IUPAC serjeant3972 pK1(NH), aqueous KOH H_ scale, rated Uncertain"),
    ("c1c[nH:1]cn1", "imidazole (N-H)", "azole_nh", 18.6, FM, 14.5, FM, "T", "the 7.0 in water is the conjugate acid, not this site"),
    ("[nH:1]1cccn1", "pyrazole", "azole_nh", 19.8, FM, 14.21, "iupac-serjeant", "H", "water: IUPAC serjeant2140 pK1, aqueous KOH H_ scale, rated Uncertain"),
    ("c1nc[nH:1]n1", "1,2,4-triazole", "azole_nh", 14.8, FM, 10.26, "iupac-perrin", "T", "water: IUPAC perrin_supp6577 (acid ionisation of the neutral, 20 C, Approximate)"),
    ("[nH:1]1cnc2ccccc21", "benzimidazole (N-H)", "azole_nh", 16.4, FM, 12.8, FM, "H", ""),
    ("[nH:1]1c2ccccc2c2ccccc21", "carbazole", "azole_nh", 19.9, FM, "", "", "T", ""),
    # --- amines N-H --------------------------------------------------------------
    ("[NH2:1]c1ccccc1", "aniline", "amine_nh", 30.6, FM, "", "", "T", ""),
    ("[NH:1](c1ccccc1)c1ccccc1", "diphenylamine", "amine_nh", 25.0, FM, "", "", "T", ""),
    ("[NH2:1]c1ccc([N+](=O)[O-])cc1", "4-nitroaniline", "amine_nh", 20.9, FM, "", "", "H", "sigma-minus"),
    ("[NH3:1]", "ammonia", "amine_nh", 41.0, FM, "", "", "T", ""),
    # --- ammonium, pyridinium ----------------------------------------------------
    ("CC[NH+:1](CC)CC", "triethylammonium", "ammonium", 9.0, FM, "base:CCN(CC)CC", "", "T", ""),
    ("CCCC[NH3+:1]", "n-butylammonium", "ammonium", 11.1, FM, "base:CCCCN", "", "T", ""),
    ("[NH4+:1]", "ammonium", "ammonium", 10.5, FM, 9.25, FM, "H", ""),
    ("C1CC[NH2+:1]CC1", "piperidinium", "ammonium", "", "", "base:C1CCNCC1", "", "T", ""),
    ("C1COCC[NH2+:1]1", "morpholinium", "ammonium", "", "", "base:C1COCCN1", "", "H", ""),
    ("[NH3+:1]c1ccccc1", "anilinium", "ammonium", 3.6, FM, "base:Nc1ccccc1", "", "T", ""),
    ("c1cc[nH+:1]cc1", "pyridinium", "pyridinium", 3.4, FM, "base:c1ccncc1", "", "T", ""),
    ("Cc1cc[nH+:1]cc1", "4-methylpyridinium", "pyridinium", "", "", "base:Cc1ccncc1", "", "H", ""),
    ("c1c[nH+:1]c[nH]1", "imidazolium", "ammonium", "", "", "base:c1c[nH]cn1", "", "T", "either N-H; the two are equivalent"),
    # --- extensions (append below) -----------------------------------------------
    ("CCOC(=O)[CH2:1]C(=O)c1ccc(Cl)cc1", "ethyl 4-chlorobenzoylacetate", "ketoester_beta", "", "", "auto", "", "T", "Hammett series in water"),
    ("CCOC(=O)[CH2:1]C(=O)c1ccc(Br)cc1", "ethyl 4-bromobenzoylacetate", "ketoester_beta", "", "", "auto", "", "H", "Hammett series in water"),
    ("CCOC(=O)[CH2:1]C(=O)c1ccc(C)cc1", "ethyl 4-methylbenzoylacetate", "ketoester_beta", "", "", "auto", "", "T", "Hammett series in water"),
    ("[nH:1]1nnc2ccccc21", "benzotriazole", "azole_nh", 11.9, FM, "", "", "T", ""),
    ("[CH:1]1(c2ccccc2)c2ccccc2Oc2ccccc21", "9-phenylxanthene", "triarylmethane", 27.9, FM, "", "", "H", "bridged; compare xanthene"),
    ("[SH:1]Cc1ccccc1", "phenylmethanethiol", "thiol", 15.4, FM, "auto", "", "T", "DMSO value uncertain"),
    ("[OH:1]Cc1ccccc1", "benzyl alcohol", "alcohol", "", "", "auto", "", "T", "water value rated Uncertain"),
    ("[OH:1]c1ccc2ccccc2c1", "2-naphthol", "phenol", "", "", "auto", "", "H", ""),
    ("O=[N+]([O-])c1ccc([OH:1])c([N+](=O)[O-])c1", "2,4-dinitrophenol", "phenol", "", "", "auto", "", "T", "ortho-nitro"),
    ("O=C([OH:1])C(F)(F)F", "trifluoroacetic acid", "carboxylic_acid_oh", "", "", "auto", "", "T", ""),
    ("C1C[NH+:1]2CCN1CC2", "DABCO-H+ (monoprotonated)", "ammonium", "", "", "base:C1CN2CCN1CC2", "", "T", "first protonation"),
    ("[CH3:1]C(=O)CC", "2-butanone (CH3 side)", "ketone", "", "", "", "", "T", "kinetic side (see regio.tsv); no measured value known"),
    ("CC(=O)[CH2:1]C", "2-butanone (CH2 side)", "ketone", "", "", "", "", "T", "thermodynamic side (see regio.tsv); no measured value known"),
    ("C[CH:1]1CCCCC1=O", "2-methylcyclohexanone (C2-H)", "ketone", "", "", "", "", "T", "thermodynamic side (see regio.tsv)"),
    ("CC1CCC[CH2:1]C1=O", "2-methylcyclohexanone (C6-H2)", "ketone", "", "", "", "", "T", "kinetic side (see regio.tsv)"),
    ("CC(=O)Nc1ccc([OH:1])cc1", "paracetamol (phenol O-H)", "phenol", "", "", 9.5, FM, "T", "drug-like, competing amide N-H"),
    ("CC(=O)[NH:1]c1ccc(O)cc1", "paracetamol (amide N-H)", "amide_nh", "", "", "", "", "T", "less acidic than the phenol; no value"),
    ("[CH3:1]C(=O)Cc1ccccc1", "phenylacetone (CH3 side)", "ketone", "", "", "", "", "T", "less acidic than the benzylic CH2; no measured value"),
    ("C[CH2:1]C(=O)N1CCOC1=O", "3-propanoyl-1,3-oxazolidin-2-one", "imide alpha C-H (N-acyl amide, N-acyl oxazolidinone)", 27.5, FM, "", "", "T", "added with the rule (issue 10); value recalled, no source consulted"),
    ("CON(C)C(=O)[CH2:1]C", "N-methoxy-N-methylpropanamide", "N-alkoxy amide (Weinreb amide)", 33.0, FM, "", "", "T", "added with the rule (issue 10); value recalled, no source consulted"),
    ("[CH2:1]1SCCCS1", "1,3-dithiane", "1,3-dithiane C2-H", 39.0, B86, "", "", "T", "added with the rule (issue 10); value recalled, then read in the bordwell1986 abstract (39 +-2, extrapolated; dmso_measured.tsv dm-009)"),
    ("CCOC(=O)[CH2:1]N=C(c1ccccc1)c1ccccc1", "ethyl N-(diphenylmethylene)glycinate", "glycine ester benzophenone imine", 18.7, FM, "", "", "T", "added with the rule (issue 11); value recalled or estimated, no source consulted"),
    ("CN(C)N=C1[CH2:1]CCCC1", "cyclohexanone N,N-dimethylhydrazone", "hydrazone (N,N-dialkyl)", 35.0, FM, "", "", "T", "added with the rule (issue 11); value recalled or estimated, no source consulted"),
    ("CON=C([CH3:1])C", "acetone O-methyl oxime", "oxime or oxime ether alpha-C-H", 33.0, FM, "", "", "T", "added with the rule (issue 11); value recalled or estimated, no source consulted"),
    ("[CH3:1]C(C)=NC(C)(C)C", "N-tert-butyl acetone imine", "imine alpha-C-H", 31.0, FM, "", "", "T", "added with the rule (issue 11); value recalled or estimated, no source consulted"),
    ("[CH:1]#N", "hydrogen cyanide", "hydrogen cyanide", 12.9, FM, 9.2, FM, "T", "added with the rule (issue 11); value recalled, no source consulted"),
    ("Cl[CH:1](Cl)Cl", "chloroform", "haloform C-H", "", "", 15.5, FM, "T", "added with the rule (issue 11); value recalled, no source consulted"),
    ("O=C1[CH2:1]c2ccccc2N1", "oxindole", "oxindole C3-H", 18.5, FM, "", "", "T", "added with the rule (issue 11); value recalled, no source consulted"),
    ("[NH3+:1]CC(=O)OC", "glycine methyl ester ammonium", "ammonium of an alpha-amino ester", "", "", 7.7, FM, "T", "added with the rule (issue 11); value recalled, no source consulted"),
    ("C[Si](C)(C)[NH:1][Si](C)(C)C", "hexamethyldisilazane", "disilylamine N-H (HMDS)", 30.0, FM, "", "", "T", "added with the rule (issue 11); value recalled, no source consulted"),
    ("[CH4:1]", "methane", "alkane C-H (unactivated)", 56.0, FM, "", "", "T", "added with the background rule (issue 11); extrapolated value recalled, no source consulted"),
    ("[CH3:1]c1ccncc1", "4-methylpyridine", "heteroaryl-methyl", 32.2, FM, "", "", "T", "added with the rule (issue 11); recalled from Fraser, Mansour, Savard, J. Org. Chem. 1985, 50, 3232 (THF lithium ion-pair scale, used for DMSO)"),
    ("[CH3:1]c1ccccn1", "2-methylpyridine", "heteroaryl-methyl", 34.0, FM, "", "", "T", "added with the rule (issue 11); recalled from Fraser et al. 1985 (THF lithium ion-pair scale, used for DMSO)"),
    ("[CH3:1]c1cccnc1", "3-methylpyridine", "heteroaryl-methyl", 37.7, FM, "", "", "T", "added with the rule (issue 11); recalled from Fraser et al. 1985 (THF lithium ion-pair scale, used for DMSO)"),
    ("[OH:1]C(=O)c1ccccc1O", "salicylic acid (CO2H)", "carboxylic acid (salicylic, ortho-hydroxy)", 6.8, FM, 2.98, "iupac-serjeant", "T", "added with the rule (issue 11); water: IUPAC row serjeant3397 pK1 at 25 C; DMSO recalled"),
    ("OC(=O)c1ccccc1[OH:1]", "salicylic acid (phenol O-H, second ionisation)", "phenol of a salicylate (second ionisation)", "", "", 13.6, "iupac-serjeant", "T", "added with the rule (issue 11); IUPAC row serjeant3397 pK2 (12.95-13.9 at 25 C, median 13.6)"),
    ("O=c1cc([OH:1])c2ccccc2o1", "4-hydroxycoumarin", "vinylogous acid (4-hydroxy-2-pyrone, 4-hydroxycoumarin)", "", "", 4.1, FM, "T", "added with the rule (issue 11); value recalled, no source consulted"),
    ("CC1=C([OH:1])COC1=O", "3-methyltetronic acid", "vinylogous acid (tetronic acid)", "", "", 4.15, "iupac-serjeant", "T", "added with the rule (issue 11); IUPAC row serjeant2548 (25 C)"),
    # --- thio rules (issue 11; rows lit-205..208 were appended to the TSV on main, written here so that
    # --- regenerating keeps their ids) ---------------------------------------------------------------------
    ("[CH3:1]Sc1ccccc1", "thioanisole", "thioether (aryl sulfide)", 42.0, FM, "", "", "T", "added with the thio rules (issue 11); value recalled (Bordwell-group DMSO values), no source consulted"),
    ("[CH2:1](Sc1ccccc1)Sc1ccccc1", "bis(phenylthio)methane", "thioacetal (bis(arylthio))", 30.8, FM, "", "", "T", "added with the thio rules (issue 11); value recalled (Bordwell-group DMSO values), no source consulted"),
    ("[CH:1](Sc1ccccc1)(Sc1ccccc1)Sc1ccccc1", "tris(phenylthio)methane", "thioacetal (bis(arylthio))", 22.8, FM, "", "", "T", "added with the thio rules (issue 11); value recalled (Bordwell-group DMSO values), no source consulted"),
    ("[CH:1]1(c2ccccc2)SCCCS1", "2-phenyl-1,3-dithiane", "1,3-dithiane C2-H", 30.7, FM, "", "", "T", "added with the thio rules (issue 11); value recalled (Bordwell-group DMSO values), no source consulted"),
    # --- background C-H rows and the ortho-C=O hydrogen-bonded phenols (issue 11, rule set 2026.12-4) ----
    ("c1cc[cH:1]cc1", "benzene", "aryl C-H", 43.0, FM, "", "", "T", "added with the background rule C-ARYL-01 (issue 11); extrapolated value recalled (Streitwieser, cesium cyclohexylamide scale), no source consulted"),
    ("C=[CH2:1]", "ethylene", "vinyl / iminyl C-H (sp2)", 44.0, FM, "", "", "T", "added with the background rule C-VINYL-01 (issue 11); extrapolated value recalled, no source consulted"),
    ("C1C[CH2:1]1", "cyclopropane", "cyclopropane C-H (unactivated)", 46.0, FM, "", "", "T", "added with the background rule C-CPROP-01 (issue 11); extrapolated value recalled (Streitwieser), no source consulted"),
    ("[cH:1]1cccs1", "thiophene (C2-H)", "heteroaryl C-H next to ring O or S (furan, thiophene C2)", 33.0, FM, "", "", "T", "added with the background rule C-HARYL-01 (issue 11); THF lithium ion-pair figure recalled (Fraser group), used for DMSO, no source consulted"),
    ("[cH:1]1ccco1", "furan (C2-H)", "heteroaryl C-H next to ring O or S (furan, thiophene C2)", 35.6, FM, "", "", "T", "added with the background rule C-HARYL-01 (issue 11); THF lithium ion-pair figure recalled (Fraser group), used for DMSO, no source consulted"),
    ("COC(=O)c1ccccc1[OH:1]", "methyl salicylate (phenol O-H)", "phenol (hydrogen-bonded to an ortho ester C=O)", "", "", "auto", "", "T", "parent of O-PHEHB-01 (issue 11)"),
    ("CCOC(=O)c1ccccc1[OH:1]", "ethyl salicylate (phenol O-H)", "phenol (hydrogen-bonded to an ortho ester C=O)", "", "", "auto", "", "T", "named in the note of O-PHEHB-01 (issue 11)"),
    ("O=Cc1ccccc1[OH:1]", "salicylaldehyde (phenol O-H)", "phenol (hydrogen-bonded to an ortho aldehyde C=O)", "", "", "auto", "", "T", "parent of O-PHEHB-03 (issue 11)"),
    ("NC(=O)c1ccccc1[OH:1]", "salicylamide (phenol O-H)", "phenol", "", "", "auto", "", "T", "named in the note of O-PHEHB-03: no row for ortho amides (issue 11); the IUPAC rows are rated Uncertain"),
    ("CC(=O)c1ccccc1[OH:1]", "2-hydroxyacetophenone (phenol O-H)", "phenol (hydrogen-bonded to an ortho ketone C=O)", "", "", 10.37, "datawarrior-epa", "T", "parent of O-PHEHB-02 (issue 11); DataWarrior/EPA aqueous set, Original_Source_ID 11391 (mean of 4, 23 C); not in the IUPAC set"),
    # --- P-H and H2S (issue 11: no site before rule set 2026.12-5) -----------------------------------------------
    ("[SH2:1]", "hydrogen sulfide", "hydrogen sulfide", "", "", 7.0, FM, "T", "parent of S-HYDSU-01; first ionisation, recalled handbook value"),
    ("c1ccc([PH:1]c2ccccc2)cc1", "diphenylphosphine", "phosphine P-H (diarylphosphine)", 22.9, FM, "", "", "T", "parent of P-PHOS-02; recalled Bordwell-group value, no source consulted"),
    ("c1ccc([PH2:1])cc1", "phenylphosphine", "phosphine P-H (arylphosphine)", 24.5, FM, "", "", "T", "parent of P-PHOS-01; recalled, no source consulted"),
    ("[PH3:1]", "phosphine", "phosphine P-H (alkylphosphine, PH3)", "", "", "", "", "T", "no measured value known; checks the site of P-PHOS-03 is found"),
    ("c1ccc([PH+:1](c2ccccc2)c2ccccc2)cc1", "triphenylphosphonium", "phosphonium P-H (protonated triarylphosphine)", "", "", 2.7, FM, "T", "parent of P-PHOSH-02; recalled, no source consulted"),
    ("[NH:1]=[N+]=[N-]", "hydrazoic acid", "hydrazoic acid", 7.9, FM, 4.7, FM, "T", "parent of N-HN3-01; recalled, no source consulted"),
    ("O=C1CSC(=S)[NH:1]1", "rhodanine (N-H)", "thioimide N-H (rhodanine)", "", "", "auto", "", "T", "parent of N-THIMD-01 (issue 11)"),
    ("O=C1CSC(=O)[NH:1]1", "thiazolidine-2,4-dione (N-H)", "imide N-H (thiazolidine-2,4-dione)", "", "", "auto", "", "T", "parent of N-TZDN-01 (issue 11)"),
    ("CC([NH2:1])=S", "thioacetamide (N-H)", "thioamide N-H", 18.4, FM, "auto", "", "T", "parent of N-THIAM-01 (issue 11); DMSO recalled"),
    ("[NH2:1]C(N)=S", "thiourea", "thiourea N-H", 21.0, FM, "", "", "T", "parent of N-THIUR-01 (issue 11); recalled, no source consulted"),
    ("S=C([NH:1]c1ccccc1)Nc1ccccc1", "N,N'-diphenylthiourea", "thiourea N-H (N-aryl)", 13.4, FM, "", "", "T", "parent of N-THURE-02 (issue 11); recalled, no source consulted"),
    ("CC(=S)[NH:1]c1ccccc1", "thioacetanilide", "thioamide N-H (N-aryl, thioanilide)", "", "", "", "", "T", "no measured value known; checks the site of N-THAMD-02 is found"),
    ("[CH3:1]C(=S)N(C)C", "N,N-dimethylthioacetamide (alpha C-H)", "thioamide alpha-CH", "", "", "", "", "T", "no measured value known; checks the site of C-THAMD-01 is found"),
    ("CCC1(CC)C(=O)[NH:1]C(=O)NC1=O", "barbital (N-H)", "imide N-H (5,5-disubstituted barbiturate)", "", "", "auto", "", "T", "named with N-BARBN-01 (issue 11)"),
    ("CCC1(c2ccccc2)C(=O)[NH:1]C(=O)NC1=O", "phenobarbital (N-H)", "imide N-H (5,5-disubstituted barbiturate)", "", "", "auto", "", "T", "a 5,5-disubstituted barbiturate of N-BARBN-01 (issue 11)"),
    ("O=c1cc[nH]c(=O)[nH:1]1", "uracil (N3-H)", "aromatic imide N-H (uracil N3, quinazolinedione)", "", "", "auto", "", "T", "parent of N-URAC-01 (issue 11)"),
    ("Cn1c(=O)cc[nH:1]c1=O", "3-methyluracil (N1-H)", "aromatic imide N-H (uracil N1)", "", "", "auto", "", "T", "parent of N-URAC-02 (issue 11)"),
    ("Cc1c[nH]c(=O)[nH:1]c1=O", "thymine (N3-H)", "aromatic imide N-H (uracil N3, quinazolinedione)", "", "", "auto", "", "T", "named in the note of N-URAC-01 (issue 11)"),
    ("C#CC(=O)[OH:1]", "propiolic acid", "carboxylic acid (alkynyl, propiolic)", "", "", "auto", "", "T", "parent of O-ACIDY-01 (issue 11)"),
    ("CC#CC(=O)[OH:1]", "2-butynoic acid", "carboxylic acid (alkynyl, propiolic)", "", "", "auto", "", "T", "named in the note of O-ACIDY-01 (issue 11)"),
    ("CC(=O)C(=O)[OH:1]", "pyruvic acid", "carboxylic acid (alpha-oxo: pyruvic, glyoxylic, oxalic)", "", "", "auto", "", "T", "parent of O-ACIDK-01 (issue 11)"),
    ("CC(N)C(=O)[OH:1]", "alanine (CO2H)", "carboxylic acid (alpha-amino acid, as the zwitterion)", "", "", "auto", "", "T", "parent of O-ACIDN-01 (issue 11)"),
    ("NCC(=O)[OH:1]", "glycine (CO2H)", "carboxylic acid (alpha-amino acid, as the zwitterion)", "", "", "auto", "", "T", "named in the note of O-ACIDN-01 (issue 11)"),
    ("OC(=O)CC(=O)[OH:1]", "malonic acid (first CO2H)", "carboxylic acid (malonic, first ionisation)", "", "", "auto", "", "T", "parent of O-ACIDM-01 (issue 11)"),
    ("CCC(CC)(C(=O)O)C(=O)[OH:1]", "2,2-diethylmalonic acid", "carboxylic acid (malonic, first ionisation)", "", "", "auto", "", "T", "named in the note of O-ACIDM-01 (issue 11)"),
    ("CCOC(=O)C[SH:1]", "ethyl thioglycolate", "thiol (alpha to C=O: thioglycolate, mercaptoacetone)", "", "", "auto", "", "T", "parent of S-THIOC-01 (issue 11)"),
    ("CC(=O)C[SH:1]", "mercaptoacetone", "thiol (alpha to C=O: thioglycolate, mercaptoacetone)", "", "", "auto", "", "T", "named in the note of S-THIOC-01 (issue 11)"),
    ("O=C1CCc2cccc([OH:1])c21", "7-hydroxy-1-indanone", "phenol (hydrogen-bonded to an ortho ring ketone C=O)", "", "", "auto", "", "T", "named in the note of O-PHEHB-04 (issue 11): the five-ring ketone's weaker hydrogen bond is not modelled"),
    ("CCC(=O)[OH:1]", "propionic acid", "carboxylic acid", "", "", "auto", "", "T", "parent of I-CA-ALK1 (issue 11)"),
    ("ClCCC(=O)[OH:1]", "3-chloropropionic acid", "carboxylic acid", "", "", "auto", "", "T", "parent of I-CA-ALKX (issue 11)"),
    ("[OH:1]C(=O)Cc1ccccc1", "phenylacetic acid", "carboxylic acid", "", "", "auto", "", "T", "parent of I-CA-ARY1 (issue 11)"),
    ("[OH:1]C(=O)Cc1ccccn1", "2-pyridylacetic acid", "carboxylic acid", "", "", "", "", "T", "no measured value in the IUPAC set under the look-up filter; checks I-CA-HAR1 is applied"),
    ("C=CCC(=O)[OH:1]", "3-butenoic acid", "carboxylic acid", "", "", "auto", "", "T", "parent of I-CA-VIN1 (issue 11)"),
    ("C#CCC(=O)[OH:1]", "3-butynoic acid", "carboxylic acid", "", "", "auto", "", "T", "parent of I-CA-YNE1 (issue 11)"),
    ("COCC(=O)[OH:1]", "methoxyacetic acid", "carboxylic acid", "", "", "auto", "", "T", "parent of I-CA-OME (issue 11)"),
    ("[OH:1]C(=O)COc1ccccc1", "phenoxyacetic acid", "carboxylic acid", "", "", "auto", "", "T", "parent of I-CA-OAR (issue 11)"),
    ("CC(=O)OCC(=O)[OH:1]", "acetoxyacetic acid", "carboxylic acid", "", "", "", "", "T", "no measured value in the IUPAC set under the look-up filter; checks I-CA-OAC is applied"),
    ("[OH:1]C(=O)CS", "thioglycolic acid (CO2H)", "carboxylic acid", "", "", "auto", "", "T", "parent of I-CA-SR (issue 11)"),
    ("CC(=O)NCC(=O)[OH:1]", "N-acetylglycine", "carboxylic acid", "", "", "", "", "T", "no measured value in the IUPAC set under the look-up filter; checks I-CA-NR is applied"),
    ("CC(=O)CC(=O)[OH:1]", "acetoacetic acid", "carboxylic acid", "", "", "auto", "", "T", "parent of I-CA-ACY (issue 11)"),
    ("CCOC(=O)CC(=O)[OH:1]", "monoethyl malonate", "carboxylic acid", "", "", "auto", "", "T", "parent of I-CA-EST (issue 11)"),
    ("N#CCC(=O)[OH:1]", "cyanoacetic acid", "carboxylic acid", "", "", "auto", "", "T", "parent of I-CA-CN (issue 11)"),
    ("[OH:1]C(=O)C[N+](=O)[O-]", "nitroacetic acid", "carboxylic acid", "", "", "auto", "", "T", "parent of I-CA-NO2 (issue 11)"),
    ("CS(=O)(=O)CC(=O)[OH:1]", "(methylsulfonyl)acetic acid", "carboxylic acid", "", "", "", "", "T", "no measured value in the IUPAC set under the look-up filter; checks I-CA-SO2 is applied"),
    ("C[N+](C)(C)CC(=O)[OH:1]", "(trimethylammonio)acetic acid (betaine, acid form)", "carboxylic acid", "", "", "", "", "T", "no measured value in the IUPAC set under the look-up filter; checks I-CA-ONN is applied"),
    ("[OH:1]C(=O)C(F)F", "difluoroacetic acid", "carboxylic acid (alpha-halo)", "", "", "auto", "", "T", "parent of I-CA-F (issue 11)"),
    ("[OH:1]C(=O)C(Cl)Cl", "dichloroacetic acid", "carboxylic acid (alpha-halo)", "", "", "auto", "", "T", "parent of I-CA-CL (issue 11)"),
    ("[OH:1]C(=O)C(Cl)(Cl)Cl", "trichloroacetic acid", "carboxylic acid (alpha-halo)", "", "", "auto", "", "T", "parent of I-CA-CL2 (issue 11)"),
    ("[OH:1]C(=O)C(Br)Br", "dibromoacetic acid", "carboxylic acid (alpha-halo)", "", "", "", "", "T", "no measured value in the IUPAC set under the look-up filter; checks I-CA-BR is applied"),
    ("[OH:1]C(=O)CI", "iodoacetic acid", "carboxylic acid", "", "", "", "", "T", "no measured value in the IUPAC set under the look-up filter; checks I-CA-I is applied"),
    ("C[PH+:1](C)C", "trimethylphosphonium", "phosphonium P-H (protonated alkylphosphine)", "", "", "base:CP(C)C", "", "T", "parent of P-PHOSH-01"),
]

# Where a cited source gives its DMSO value (the dmso_table column). A key not listed here must not be
# used for a DMSO value: a value not looked up in a source is cited from-memory (recalled).
DMSO_TABLE = {
    MA: "abstract, p. 7006",
    B86: "abstract",
    SH12: "abstract",
}

# Split changes of issue 11 (applied on top of the T/H letters above; the reason goes into the note).
# Holdout rows must never have set a rule or increment value: every holdout row whose molecule is the
# parent or named defining compound of a fragments/rules.tsv or fragments/increments.tsv row moved to train.
# New holdout rows are train rows that no rule, increment or Hammett fit (tests/reference/sites_fit_rho.py)
# was set from (their molecule is named in no note of those files). See corpus/sites/README.md.
TO_TRAIN = {
    "lit-003": "I-CO-ALK1 (DMSO) is set from it",
    "lit-009": "parent of C-KETCY-05",
    "lit-012": "I-CO-ALK2 (DMSO) is set from it (diisopropyl ketone)",
    "lit-014": "I-CO-OAR is set from it",
    "lit-027": "the water values of I-CO-ALK1 and I-CO-ALK2 were set on aldehydes in water, and this is the only alpha-alkyl aldehyde row",
    "lit-041": "I-CN-ALK1 is set from it",
    "lit-050": "I-NO-ALK2 is set from it (DMSO and water)",
    "lit-057": "I-SO-SR is set from it",
    "lit-064": "parent of C-PHOCN-01",
    "lit-087": "parent of C-SULCN-01",
    "lit-092": "C-NITRO-CO (water) is set from it and nitroacetone",
    "lit-096": "I-CP-ALK1 is set from it",
    "lit-099": "I-CP-CN is set from it (fluorene-9-carbonitrile)",
    "lit-112": "parent of C-AZOLM-02 (water)",
    "lit-129": "parent of S-THIOL-01 (water)",
    "lit-132": "parent of O-ACIDH-01",
    "lit-135": "parent of N-AMIDB-01",
    "lit-138": "parent of N-UREA-01",
    "lit-140": "N-CARBM-05 was written for it (the rule derives its 20.5 from train rows, but the row named the rule)",
    "lit-145": "parent of N-SULCF-01",
    "lit-150": "parent of N-PYRAZ-01",
    "lit-152": "parent of N-BIMID-01",
    "lit-160": "parent of N-AMMON-04",
}
TO_HOLDOUT = {
    "lit-034": "no rule or increment note names it",
    "lit-070": "no rule or increment note names it (water)",
    "lit-071": "no rule or increment note names it (water)",
    "lit-133": "no rule or increment note names it; its Hammett rho (1, the definition) is not fitted (water)",
    "lit-146": "no rule or increment note names it (water)",
    "lit-161": "no rule or increment note names it (N-AMMON-02 is set from diethylammonium) (water)",
    "lit-173": "no rule or increment note names it (water)",
    "lit-175": "no rule or increment note names it; not in a Hammett fit (ortho substituent) (water)",
    "lit-182": "no rule or increment note names it (water)",
}

COMMON = [
    ("CC[OH:1]", "ethanol", "alcohol", "", "", 16, CP, "T", "about 16 in water"),
    ("C[CH2:1]C=O", "propanal", "aldehyde", "", "", 17, CP, "T", "an aldehyde alpha C-H, about 17"),
    ("[CH3:1]C(C)=O", "acetone", "ketone", "", "", 19.5, CP, "T", "19-20"),
    ("[CH3:1]C(=O)OCC", "ethyl acetate", "ester", "", "", 25, CP, "T", "an ester alpha C-H, about 25"),
    ("CN(C)C(=O)[CH3:1]", "N,N-dimethylacetamide", "amide_tertiary", "", "", 30, CP, "T", "an amide alpha C-H, about 30"),
    ("CC(=O)[CH2:1]C(C)=O", "acetylacetone", "diketone_13", "", "", 9, CP, "T", "a 1,3-diketone, about 9"),
    ("CCOC(=O)[CH2:1]C(C)=O", "ethyl acetoacetate", "ketoester_beta", "", "", 11, CP, "T", "a beta-keto ester, about 11"),
    ("CCOC(=O)[CH2:1]C(=O)OCC", "diethyl malonate", "malonate", "", "", 13, CP, "T", "a malonate, about 13"),
    ("CC(C)[NH:1]C(C)C", "diisopropylamine", "amine_nh", 36, CP, "", "", "T",
     "conjugate acid of LDA: pka_dmso column holds the figure of about 36 quoted for THF; about 40 is also quoted"),
]

COLUMNS = ["id", "smiles", "name", "site_atom", "element", "class", "pka_dmso", "dmso_source",
           "pka_water", "water_source", "split", "note", "dmso_table"]


def fmt(v):
    if v == "" or v is None:
        return ""
    return f"{float(v):g}"


def build(entries, prefix, header_lines, path, allow_lookup=True):
    from rdkit import Chem
    out = []
    attributions = []
    seen = set()
    for i, (mapped, name, cls, dmso, dsrc, water, wsrc, split, note) in enumerate(entries, 1):
        smiles, site = L.strip_map(mapped)
        mol = Chem.MolFromSmiles(smiles)
        atom = mol.GetAtomWithIdx(site)
        ranks = list(Chem.CanonicalRankAtoms(mol, breakTies=False))
        key = (L.canon(smiles), ranks[site])
        if key in seen:
            raise SystemExit(f"duplicate row {mapped}")
        seen.add(key)
        rid = f"{prefix}-{i:03d}"
        notes = [note] if note else []
        if isinstance(water, str) and (water == "auto" or water.startswith("base:")):
            kind, query = ("acid", smiles) if water == "auto" else ("base", water[5:])
            hit = L.water_lookup(query, kind) if allow_lookup else None
            if hit is None:
                print(f"warning: no water value for {rid} {name}", file=sys.stderr)
                water, wsrc = "", ""
            else:
                water = hit["value"]
                wsrc = "iupac-serjeant" if kind == "acid" else "iupac-perrin"
                notes.append(f"water: median of {hit['n']} IUPAC rows ({hit['tier']}; {', '.join(hit['ids'][:4])})")
                attributions.append((rid, name, hit))
        elif wsrc in ("iupac-serjeant", "iupac-perrin") and fmt(water) and allow_lookup:
            # a value cited by hand: its IUPAC record ids are in the note; keep their references
            ids = re.findall(r"\b(?:serjeant|perrin_supp|perrin)\d+\b", note or "")
            hit = L.record_lookup(ids) if ids else None
            if hit is None:
                raise SystemExit(f"{rid} {name}: water cited {wsrc} but no IUPAC record id in the note")
            attributions.append((rid, name, hit))
        if split not in ("T", "H"):
            raise SystemExit(f"bad split {split}")
        if prefix == "lit" and rid in TO_TRAIN:
            if split != "H":
                raise SystemExit(f"{rid} is not a holdout row")
            split = "T"
            notes.append(f"moved from holdout to train (issue 11): {TO_TRAIN[rid]}")
        if prefix == "lit" and rid in TO_HOLDOUT:
            if split != "T":
                raise SystemExit(f"{rid} is not a train row")
            split = "H"
            notes.append(f"moved from train to holdout (issue 11): {TO_HOLDOUT[rid]}")
        table = ""
        if fmt(dmso) and dsrc not in (FM, CP):
            if dsrc not in DMSO_TABLE:
                raise SystemExit(f"{rid}: DMSO source {dsrc} has no table in DMSO_TABLE")
            table = DMSO_TABLE[dsrc]
        out.append([rid, smiles, name, str(site), atom.GetSymbol(), cls, fmt(dmso), dsrc if fmt(dmso) else "",
                    fmt(water), wsrc if fmt(water) else "", "train" if split == "T" else "holdout",
                    "; ".join(notes), table])
    with open(path, "w") as f:
        for h in header_lines:
            f.write("# " + h + "\n")
        f.write("\t".join(COLUMNS) + "\n")
        for row in out:
            f.write("\t".join(row) + "\n")
    return out, attributions


HEADER = [
    "acidsite corpus/sites/literature.tsv, version 1",
    "One row per (molecule, acidic site). Columns: id, smiles, name, site_atom (0-based index in written",
    "order of the atom whose H ionises), element, class, pka_dmso, dmso_source, pka_water, water_source,",
    "split (train|holdout: holdout rows never set a rule or increment value), note, dmso_table.",
    "Citation keys resolve in fragments/sources.tsv. from-memory = recalled, no source consulted (provisional).",
    "DMSO provenance: a pka_dmso is CITED when dmso_source is a citation key; dmso_table then says where the",
    "source gives the value (table and page). It is RECALLED when dmso_source is from-memory (dmso_table empty).",
    "Water provenance: iupac-* keys are cited (IUPAC record ids in the note); from-memory is recalled.",
    "Water values cited iupac-serjeant / iupac-perrin come from the IUPAC Digitized pKa Dataset v1.0",
    "(CC BY-NC 4.0, Reproduced by permission of International Union of Pure and Applied Chemistry);",
    "see corpus/sites/ATTRIBUTION.md. Generated by tests/reference/sites_build_literature.py.",
]

HEADER_CP = [
    "acidsite corpus/sites/common_practice.tsv, version 1",
    "Figures of common synthetic practice (key common-practice, no single source). SCALE-LOOSE: they are",
    "the rounded figures chemists quote (roughly the water scale); use them as sanity checks with a wide",
    "tolerance, not for MAE. Same columns as literature.tsv (dmso_table empty). For diisopropylamine the pka_dmso column holds",
    "the THF figure (about 36; about 40 is also quoted), see its note.",
]

if __name__ == "__main__":
    root = L.ROOT
    rows, attr = build(ENTRIES, "lit", HEADER, os.path.join(root, "corpus", "sites", "literature.tsv"))
    build(COMMON, "cp", HEADER_CP, os.path.join(root, "corpus", "sites", "common_practice.tsv"))
    with open(os.path.join(root, "corpus", "sites", "literature_water_refs.tsv"), "w") as f:
        f.write("# Literature references behind the iupac-serjeant / iupac-perrin water values of literature.tsv\n")
        f.write("# (IUPAC Digitized pKa Dataset v1.0, CC BY-NC 4.0, (c) IUPAC). Columns: id, name, dataset, record_ids, references\n")
        f.write("id\tname\tdataset\trecord_ids\treferences\n")
        for rid, name, hit in attr:
            f.write(f"{rid}\t{name}\t{hit['dataset']}\t{' '.join(hit['ids'])}\t{' | '.join(hit['refs'])}\n")
    n = len(rows)
    print(f"{n} literature rows, {sum(r[10] == 'holdout' for r in rows)} holdout, "
          f"{sum(bool(r[6]) for r in rows)} with DMSO, {sum(bool(r[8]) for r in rows)} with water")
