"""Build corpus/sites/review_2.tsv: the second chemist's review of acidic sites (issue 11).

A working synthetic / process chemist's list of (molecule, site) pairs that are deprotonated in practice and that
are in neither corpus/sites/process_review.tsv nor corpus/sites/literature.tsv: heteroaryl ketones, esters and
nitriles, methyl groups on azines and azoles, propargylic and allylic C-H next to activating groups, fluoroform-type
C-H, selenols, sulfonamides, carbamates, ureas, hydantoins, barbiturates, lactams and lactones, protected amino acid
esters, anilides, azole N-H, oximes, hydroxamic acids, sulfonylureas, amidinium and guanidinium ions, boronic
esters, silyl ethers and acetals beside a carbonyl, vinylogous esters and amides, Hagemann's ester, enoates
(gamma C-H), phosphonium salts and some drug intermediates.

The molecules and expected values were chosen before acidsite was run on them, and no row is dropped because of
how acidsite does on it. Each row gives the DMSO pKa (preferred) and/or the water pKa with its source:
- cited water values: `iupac-serjeant` / `iupac-perrin` (IUPAC Digitized pKa Dataset v1.0 in
  ../shared/data/iupac-pka; the record id and tier are in the note, taken with tests/reference/sites_lookup.py's
  rules) or `datawarrior-epa` (../shared/data/epa-datawarrior-pka, Original_Source_ID in the note);
- `from-memory`: recalled without a source at hand; the note says what it is recalled from, or that it is an
  estimate and how it was reasoned (an estimate is a chemist's expectation, not a measurement).
None of the open data sets has DMSO values, so every DMSO value here is from memory.

The test (tests/sites_review_2.rs) compares the DMSO estimate where a DMSO value is given, else the water one.

Run: python3 tests/reference/sites_review_2.py   (needs RDKit; writes corpus/sites/review_2.tsv)
"""
import os
import sys

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
import sites_lookup as L  # noqa: E402

FM = "from-memory"
SJ = "iupac-serjeant"
PR = "iupac-perrin"
DW = "datawarrior-epa"
B88 = "Bordwell-group DMSO value (Bordwell 1988 Acc. Chem. Res. table and related papers), recalled"
EST = "estimate (no measured value recalled)"

# (mapped smiles, name, chemist's class, pka_dmso or "", dmso source, pka_water or "", water source, note)
ENTRIES = [
    # heteroaryl ketones
    ("[CH3:1]C(=O)c1ccncc1", "4-acetylpyridine", "heteroaryl ketone", 22.0, FM, "", "",
     f"{EST}: acetophenone 24.7 less rho 3.6 x sigma-minus of a 4-aza ring nitrogen (about 0.8, recalled)"),
    ("[CH3:1]C(=O)c1cccnc1", "3-acetylpyridine", "heteroaryl ketone", 23.0, FM, "", "",
     f"{EST}: acetophenone 24.7 less rho 3.6 x sigma of a 3-aza ring nitrogen (about 0.5-0.6, recalled)"),
    ("[CH3:1]C(=O)c1ccco1", "2-acetylfuran", "heteroaryl ketone", 24.0, FM, "", "",
     f"{EST}: 2-furyl is about as withdrawing as phenyl overall (pi donor, sigma acceptor); about acetophenone"),
    ("[CH3:1]C(=O)c1nccs1", "2-acetylthiazole", "heteroaryl ketone", 22.0, FM, "", "",
     f"{EST}: the C2 of thiazole is an azine-like (C=N) position, as 2-acetylpyridine"),
    ("[CH3:1]C(=O)c1cnccn1", "2-acetylpyrazine", "heteroaryl ketone", 21.5, FM, "", "",
     f"{EST}: two ring nitrogens, more withdrawing than a pyridyl"),
    ("[CH3:1]C(=O)c1cccn1C", "2-acetyl-1-methylpyrrole", "heteroaryl ketone", 26.5, FM, "", "",
     f"{EST}: the pyrrole nitrogen donates into the C=O (vinylogous amide), less acidic than acetophenone"),
    # heteroaryl acetates and acetonitriles (ethyl nicotinate's neighbours)
    ("CCOC(=O)[CH2:1]c1cccnc1", "ethyl 3-pyridylacetate", "alpha-heteroaryl ester", 21.0, FM, "", "",
     f"{EST}: ethyl phenylacetate 22.6 with a 3-aza nitrogen (inductive only)"),
    ("CCOC(=O)[CH2:1]c1ccncc1", "ethyl 4-pyridylacetate", "alpha-heteroaryl ester", 19.5, FM, "", "",
     f"{EST}: ethyl phenylacetate 22.6 with a conjugated 4-aza nitrogen (aza-enolate)"),
    ("CCOC(=O)[CH2:1]c1cccs1", "ethyl 2-thienylacetate", "alpha-heteroaryl ester", 22.0, FM, "", "",
     f"{EST}: 2-thienyl slightly more stabilising than phenyl for an adjacent carbanion"),
    ("N#C[CH2:1]c1ccccn1", "2-pyridylacetonitrile", "alpha-heteroaryl nitrile", 18.5, FM, "", "",
     f"{EST}: phenylacetonitrile 21.9 with a conjugated 2-aza nitrogen"),
    ("N#C[CH2:1]c1ccncc1", "4-pyridylacetonitrile", "alpha-heteroaryl nitrile", 16.5, FM, "", "",
     f"{EST}: phenylacetonitrile 21.9 with a conjugated 4-aza nitrogen (like a 4-cyano group, 4-cyanophenylacetonitrile 16.0)"),
    ("N#C[CH2:1]c1cccnc1", "3-pyridylacetonitrile", "alpha-heteroaryl nitrile", 19.5, FM, "", "",
     f"{EST}: phenylacetonitrile 21.9 with a 3-aza nitrogen (inductive only)"),
    ("N#C[CH2:1]c1cccs1", "2-thienylacetonitrile", "alpha-heteroaryl nitrile", 21.0, FM, "", "",
     f"{EST}: as phenylacetonitrile 21.9, thienyl slightly more stabilising"),
    ("CCOC(=O)c1ccc([CH3:1])nc1", "ethyl 6-methylnicotinate (CH3)", "azine methyl, para ester", 28.0, FM, "", "",
     f"{EST}: 2-picoline (34) with the ester conjugated with the picolyl anion (para to the methyl through the ring)"),
    # methyl groups on azines and azoles
    ("[CH3:1]c1cccc(C)n1", "2,6-lutidine", "azine methyl", 35.0, FM, "", "",
     "as 2-picoline 34 (Fraser et al. 1985, lithium scale, as used by the rules) plus a little for the second methyl; recalled"),
    ("[CH3:1]c1ccc2ccccc2n1", "2-methylquinoline (quinaldine)", "azine methyl", 30.0, FM, "", "",
     f"{EST}: below 2-picoline; quinaldine is lithiated by LDA at -78 C"),
    ("[CH3:1]c1ccnc2ccccc12", "4-methylquinoline (lepidine)", "azine methyl", 28.5, FM, "", "",
     f"{EST}: below 4-picoline (32)"),
    ("[CH3:1]c1cnccn1", "2-methylpyrazine", "azine methyl", 31.0, FM, "", "",
     f"{EST}: second ring nitrogen para to the C-N bond of the first; LDA metalates it"),
    ("[CH3:1]c1ccncn1", "4-methylpyrimidine", "azine methyl", 30.0, FM, "", "",
     f"{EST}: conjugated with two ring nitrogens (ortho and para)"),
    ("[CH3:1]c1ncccn1", "2-methylpyrimidine", "azine methyl", 32.0, FM, "", "",
     f"{EST}: two ortho ring nitrogens"),
    ("[CH3:1]c1nc2ccccc2s1", "2-methylbenzothiazole", "azole methyl", 28.0, FM, "", "",
     f"{EST}: lithiated on the methyl by LDA at -78 C; more acidic than 2-picoline"),
    ("[CH3:1]c1nc2ccccc2o1", "2-methylbenzoxazole", "azole methyl", 29.0, FM, "", "",
     f"{EST}: as the benzothiazole, slightly less"),
    ("[CH3:1]c1nccn1C", "1,2-dimethylimidazole (2-CH3)", "azole methyl", 36.0, FM, "", "",
     f"{EST}: the N-methyl donates into the ring; lithiated by n-BuLi"),
    ("Cc1cc[cH:1]s1", "2-methylthiophene (C5-H)", "thiophene C2-H", 33.5, FM, "", "",
     "thiophene C2-H about 33 (Fraser-group THF lithium ion-pair scale, recalled); the methyl changes little; n-BuLi lithiates C5"),
    ("Cc1cc[cH:1]o1", "2-methylfuran (C5-H)", "furan C2-H", 36.0, FM, "", "",
     "furan C2-H about 35.6 (Fraser-group THF lithium ion-pair scale, recalled); n-BuLi lithiates C5"),
    ("Cc1cs[cH:1]n1", "4-methylthiazole (C2-H)", "azole C2-H", 29.0, FM, "", "",
     f"{EST}: as benzothiazole C2-H 27.3, less delocalised without the benzo ring"),
    ("Cn1[cH:1]cc2ccccc21", "1-methylindole (C2-H)", "azole C2-H", 38.0, FM, "", "",
     "N-methylpyrrole C2-H about 39 (recalled, lithium scale), indole C2 slightly more acidic; lithiated by n-BuLi or t-BuLi"),
    # propargylic and allylic C-H next to activating groups
    ("[CH3:1]C#Cc1ccccc1", "1-phenylpropyne (CH3)", "propargylic", 34.0, FM, "", "",
     f"{EST}: propargyl/allenyl anion conjugated with the phenyl; n-BuLi or LDA at low temperature"),
    ("c1ccc([CH2:1]C#Cc2ccccc2)cc1", "1,3-diphenylpropyne (CH2)", "propargylic, benzylic", 28.0, FM, "", "",
     f"{EST}: benzylic and propargylic, between diphenylmethane 32.2 and 1,3-diphenylpropene"),
    ("C#C[CH2:1]S(=O)(=O)c1ccccc1", "propargyl phenyl sulfone (CH2)", "propargylic sulfone", 22.0, FM, "", "",
     f"{EST}: as allyl phenyl sulfone 22.5"),
    ("C(=C/[CH2:1]c1ccccc1)\\c1ccccc1", "1,3-diphenylpropene (CH2)", "allylic, benzylic", 26.0, FM, "", "",
     f"{B88} as about 25.5-26 (less sure)"),
    ("C=C[CH2:1]c1ccccc1", "allylbenzene (CH2)", "allylic, benzylic", 34.0, FM, "", "",
     f"{B88} as about 34 (less sure)"),
    ("C=C[CH2:1]C#N", "3-butenenitrile (allyl cyanide)", "allylic nitrile", 26.0, FM, "", "",
     f"{EST}: acetonitrile 31.3 with a vinyl group (about -5 to -6)"),
    ("C=C[CH2:1]C(=O)OCC", "ethyl 3-butenoate", "allylic ester", 24.0, FM, "", "",
     f"{EST}: ethyl acetate 29.5 with a vinyl group (dienolate)"),
    # fluoroform-type C-H
    ("F[CH:1](F)F", "fluoroform", "fluoroform C-H", "", "", 27.0, FM,
     "water about 25-28 from H/D exchange kinetics (Symons and Clermont 1981, recalled); deprotonated by KHMDS or t-BuOK in DMF/DMSO"),
    ("F[CH:1](F)c1ccccc1", "(difluoromethyl)benzene", "fluoroform-type C-H", 35.0, FM, "", "",
     f"{EST}: alpha-fluorines destabilise the planar benzyl anion; ArCF2H need strong bases with a Lewis acid trap"),
    ("CCOC(=O)[CH:1](F)F", "ethyl difluoroacetate", "alpha,alpha-difluoro ester", 27.0, FM, "", "",
     f"{EST}: ester enolate with two alpha-F (destabilising the planar enolate, but inductively acidifying)"),
    ("O=S(=O)([CH:1](F)F)c1ccccc1", "difluoromethyl phenyl sulfone", "fluoroform-type C-H (sulfonyl)", 24.0, FM, "", "",
     f"{EST}: deprotonated by t-BuOK in DMF (Hu's reagent); a pyramidal sulfonyl carbanion is stabilised by alpha-F"),
    # selenols
    ("[SeH:1]c1ccccc1", "benzeneselenol", "selenol (aryl)", "", "", 5.9, FM, "benzeneselenol about 5.9 in water (recalled)"),
    ("CCC[SeH:1]", "propane-1-selenol", "selenol (alkyl)", "", "", 5.5, FM,
     "alkaneselenols about 5-5.5 in water (recalled from selenocysteine 5.2 and methaneselenol)"),
    # sulfonamides
    ("C[NH:1]S(=O)(=O)c1ccc(C)cc1", "N-methyl-p-toluenesulfonamide", "sulfonamide N-H (N-alkyl)", 17.0, FM, "", "",
     f"{EST}: as benzenesulfonamide 16.1, the N-methyl slightly raising it"),
    ("[NH2:1]S(=O)(=O)c1ccc([N+](=O)[O-])cc1", "4-nitrobenzenesulfonamide", "sulfonamide (aryl)", 14.5, FM, "", "",
     f"{EST}: benzenesulfonamide 16.1 with a para nitro"),
    ("Nc1ccc(S([NH2:1])(=O)=O)cc1", "sulfanilamide (SO2NH2)", "sulfonamide (aryl)", "", "", 10.58, SJ,
     "IUPAC serjeant3336 (reliable/approximate, 20-25 C)"),
    ("Nc1ccc(S(=O)(=O)[NH:1]c2ncccn2)cc1", "sulfadiazine (SO2NH)", "sulfonamide (N-heteroaryl)", "", "", 6.42, DW,
     "DataWarrior/EPA Original_Source_ID 16088 (24 C, apparent)"),
    ("O=S(=O)([NH:1]c1ccccc1)C(F)(F)F", "N-phenyltriflamide", "sulfonamide (N-aryl, triflyl)", "", "", 4.5, FM,
     "about 4.5 in water (recalled)"),
    # carbamates
    ("CC(C)(C)OC(=O)[NH2:1]", "tert-butyl carbamate (BocNH2)", "carbamate N-H", 24.8, FM, "", "", "as ethyl carbamate 24.8 (" + B88 + ")"),
    ("CC(C)(C)OC(=O)[NH:1]c1ccccc1", "tert-butyl N-phenylcarbamate (Boc-aniline)", "carbamate N-H (N-aryl)", 20.5, FM, "", "",
     "as ethyl N-phenylcarbamate, about 20.5 (recalled)"),
    ("O=C(OCc1ccccc1)[NH:1]Cc1ccccc1", "benzyl N-benzylcarbamate (Cbz-NHBn)", "carbamate N-H", 24.5, FM, "", "",
     f"{EST}: as ethyl carbamate 24.8"),
    ("O=C1OC[C@@H](Cc2ccccc2)[NH:1]1", "(S)-4-benzyloxazolidin-2-one (N-H)", "carbamate N-H (cyclic)", 20.5, FM, "", "",
     "as 2-oxazolidinone 20.5 (recalled); acylated after n-BuLi at -78 C (Evans auxiliary)"),
    ("CC(C)(C)OC(=O)NC[CH2:1]C(=O)OC", "methyl N-Boc-beta-alaninate (alpha-C-H)", "ester", 30.0, FM, "", "",
     f"{EST}: as ethyl acetate 29.5 with a beta-substituent; dianion with 2 equiv LDA after the N-H"),
    # ureas
    ("O=C(Nc1ccccc1)[NH:1]c1ccccc1", "1,3-diphenylurea", "urea N-H (N-aryl)", 19.5, FM, "", "", B88 + " (carbanilide)"),
    ("O=C1NCC[NH:1]1", "2-imidazolidinone", "urea N-H (cyclic)", 26.0, FM, "", "",
     f"{EST}: as urea 26.9, ring slightly acidifying"),
    ("CN(C)C(=O)[NH:1]c1ccccc1", "1,1-dimethyl-3-phenylurea (fenuron)", "urea N-H (N-aryl)", 20.5, FM, "", "",
     f"{EST}: as phenylurea 19.5 with less help from the NMe2 side"),
    # hydantoins, barbiturates, oxazolidinediones, uracils
    ("O=C1CNC(=O)[NH:1]1", "hydantoin (N3-H)", "imide N-H (hydantoin)", "", "", 9.04, SJ,
     "IUPAC serjeant2181 (reliable/approximate, 25 C)"),
    ("CC1(C)NC(=O)[NH:1]C1=O", "5,5-dimethylhydantoin (N3-H)", "imide N-H (hydantoin)", "", "", 9.19, DW,
     "DataWarrior/EPA Original_Source_ID 12934 (23.7 C, apparent)"),
    ("CCC1(CC)C(=O)NC(=O)[NH:1]C1=O", "barbital (N-H)", "imide N-H (barbiturate)", "", "", 7.96, SJ,
     "IUPAC serjeant4363 (reliable/approximate, 25 C)"),
    ("CCC1(c2ccccc2)C(=O)NC(=O)[NH:1]C1=O", "phenobarbital (N-H)", "imide N-H (barbiturate)", "", "", 7.43, SJ,
     "IUPAC serjeant5632 (reliable/approximate, 25 C)"),
    ("CCCC(C)C1(CC)C(=O)NC(=O)[NH:1]C1=O", "pentobarbital (N-H)", "imide N-H (barbiturate)", "", "", 8.08, DW,
     "DataWarrior/EPA Original_Source_ID 14884 (25 C, apparent)"),
    ("CN1C(=O)[CH2:1]C(=O)N(C)C1=O", "1,3-dimethylbarbituric acid (C5-H)", "cyclic malonyl urea C-H", "", "", 4.7, FM,
     "about 4.7 in water (recalled)"),
    ("CC1(C)OC(=O)[NH:1]C1=O", "5,5-dimethyloxazolidine-2,4-dione (dimethadione)", "imide N-H", "", "", 6.15, DW,
     "DataWarrior/EPA Original_Source_ID 13137 (24 C, apparent)"),
    ("O=c1cc[nH:1]c(=O)[nH]1", "uracil (N1-H)", "aromatic imide N-H (uracil)", "", "", 9.43, SJ,
     "IUPAC serjeant2347 (reliable/approximate, 25 C); N1 and N3 ionise at similar pH"),
    ("Cc1c[nH:1]c(=O)[nH]c1=O", "thymine (N1-H)", "aromatic imide N-H (uracil)", "", "", 9.9, SJ,
     "IUPAC serjeant2633 (reliable/approximate, 25 C)"),
    ("O=C1[NH:1]C(=O)c2ccccc2N1", "quinazoline-2,4-dione (N3-H)", "imide N-H", "", "", 9.82, SJ,
     "IUPAC serjeant4117 (reliable/approximate, 25 C)"),
    # lactams and lactones of several ring sizes
    ("O=C1CCCC[NH:1]1", "2-piperidinone (N-H)", "amide N-H (lactam)", 26.4, FM, "", "", B88 + " (less sure)"),
    ("O=C1CCCCC[NH:1]1", "caprolactam (N-H)", "amide N-H (lactam)", 26.6, FM, "", "", B88 + " (less sure)"),
    ("O=C1CC[NH:1]1", "azetidin-2-one (N-H)", "amide N-H (beta-lactam)", 25.5, FM, "", "",
     f"{EST}: strained beta-lactam, near the other lactams"),
    ("CN1CCC[CH2:1]C1=O", "1-methylpiperidin-2-one (alpha-C-H)", "lactam alpha-C-H", 34.0, FM, "", "",
     f"{EST}: as N,N-dimethylacetamide 34.5; LDA enolises it"),
    ("O=C1OCCC[CH2:1]1", "delta-valerolactone (alpha-C-H)", "lactone alpha-C-H", 27.0, FM, "", "",
     f"{EST}: between gamma-butyrolactone 25.2 and an open-chain ester (29.5)"),
    ("O=C1[CH2:1]CCCCO1", "epsilon-caprolactone (alpha-C-H)",
     "lactone alpha-C-H", 28.5, FM, "", "", f"{EST}: the seven-ring lactone is less E-locked than the smaller ones"),
    ("CC1C[CH2:1]C(=O)O1", "gamma-valerolactone (alpha-C-H)",
     "lactone alpha-C-H", 25.5, FM, "", "", "as gamma-butyrolactone 25.2 (recalled)"),
    # alpha-aryl esters and nitriles
    ("COC(=O)[CH2:1]c1ccc(Cl)cc1", "methyl 4-chlorophenylacetate", "alpha-aryl ester", 22.0, FM, "", "",
     f"{EST}: ethyl phenylacetate 22.6 with a para chlorine"),
    ("COc1ccc([CH2:1]C#N)cc1", "4-methoxyphenylacetonitrile", "alpha-aryl nitrile", 23.0, FM, "", "",
     "Bordwell ArCH2CN series, 4-OMe about 22.9 (recalled, less sure)"),
    ("COC(=O)[CH:1](C)c1ccc(CC(C)C)cc1", "ibuprofen methyl ester (alpha-C-H)", "alpha-aryl ester", 24.0, FM, "", "",
     f"{EST}: ethyl phenylacetate 22.6 plus an alpha-methyl and a para alkyl"),
    ("CCOC(=O)[CH:1](C)C#N", "ethyl 2-cyanopropanoate", "cyanoacetate", 14.5, FM, "", "",
     f"{EST}: ethyl cyanoacetate 13.1 plus an alpha-methyl"),
    # protected amino acid esters, peptides
    ("COC(=O)[C@@H:1]1CCCN1C(=O)OC(C)(C)C", "Boc-Pro-OMe (alpha-C-H)", "ester (alpha-amino, N-acyl)", 28.0, FM, "", "",
     f"{EST}: ester 29.5 with an alpha carbamate nitrogen; enolised by LDA at -78 C (Seebach-type alkylations)"),
    ("CCOC(=O)C[NH:1]C(=O)OCc1ccccc1", "Cbz-Gly-OEt (N-H)", "carbamate N-H", 24.0, FM, "", "",
     "as ethyl carbamate 24.8 with an electron-poor N-substituent"),
    ("CCOC(=O)C[NH:1]C(=O)c1ccccc1", "ethyl hippurate (N-H)", "amide N-H (aroyl)", 23.0, FM, "", "",
     "as benzamide 23.35 (recalled)"),
    ("CC(C)(C)OC(=O)CNC(=O)OC[CH:1]1c2ccccc2-c2ccccc21", "Fmoc-Gly-OtBu (fluorenyl C9-H)", "fluorene C9-H", 22.0, FM, "", "",
     "as 9-methylfluorene 22.3 (recalled); piperidine removes it (E1cB)"),
    # anilides and N-aryl amides
    ("O=C([NH:1]c1ccccc1)c1ccccc1", "benzanilide (N-H)", "amide N-H (anilide)", 18.8, FM, "", "", B88),
    ("CC(=O)[NH:1]c1ccc(Cl)cc1", "4-chloroacetanilide (N-H)", "amide N-H (anilide)", 20.6, FM, "", "",
     f"{EST}: acetanilide 21.45 with a para chlorine (Hammett, rho about 3)"),
    ("CC(=O)[NH:1]c1ccc([N+](=O)[O-])cc1", "4-nitroacetanilide (N-H)", "amide N-H (anilide)", 17.6, FM, "", "",
     f"{EST}: acetanilide 21.45 with a para nitro (sigma-minus)"),
    ("COc1ccc([NH:1]C(C)=O)cc1", "4-methoxyacetanilide (N-H)", "amide N-H (anilide)", 22.0, FM, "", "",
     f"{EST}: acetanilide 21.45 with a para methoxy"),
    ("O=C([NH:1]c1ccccc1)C(F)(F)F", "2,2,2-trifluoroacetanilide (N-H)", "amide N-H (anilide, trifluoroacetyl)", 15.0, FM, "", "",
     f"{EST}: trifluoroacetyl about 5-6 below acetyl"),
    # indoles, pyrroles
    ("Cc1c[nH:1]c2ccccc12", "3-methylindole (N-H)", "indole N-H", 21.5, FM, "", "", "as indole 21.0 (recalled)"),
    ("Cc1cc2ccccc2[nH:1]1", "2-methylindole (N-H)", "indole N-H", 21.5, FM, "", "", "as indole 21.0 (recalled)"),
    ("O=Cc1c[nH:1]c2ccccc12", "indole-3-carbaldehyde (N-H)", "indole N-H (3-acyl)", 17.5, FM, "", "",
     f"{EST}: vinylogous amide, the anion conjugated with the formyl group"),
    ("Cc1ccc(C)[nH:1]1", "2,5-dimethylpyrrole (N-H)", "pyrrole N-H", 24.0, FM, "", "", "as pyrrole 23.0 (recalled), methyls raise it"),
    ("COC(=O)c1ccc[nH:1]1", "methyl pyrrole-2-carboxylate (N-H)", "pyrrole N-H (2-acyl)", 19.5, FM, "", "",
     f"{EST}: pyrrole 23.0 with a conjugated ester"),
    ("Brc1ccc2[nH:1]c3ccc(Br)cc3c2c1", "3,6-dibromocarbazole (N-H)", "carbazole N-H", 18.5, FM, "", "",
     f"{EST}: carbazole 19.9 with two bromines para to the nitrogen-bearing ring bonds"),
    # imidazoles, triazoles, tetrazoles
    ("Cc1[nH:1]cc[nH+]1", "2-methylimidazolium (N-H)", "azolium N-H", "", "", 7.86, PR,
     "IUPAC perrin1411 / perrin_supp5450 (pKAH1 of 2-methylimidazole, reliable/approximate, 25 C)"),
    ("Cc1ncc[nH:1]1", "2-methylimidazole (N-H)", "imidazole N-H", 19.5, FM, "", "", "as imidazole 18.6 (recalled), the methyl raises it"),
    ("O=[N+]([O-])c1c[nH:1]cn1", "4-nitroimidazole (N-H)", "imidazole N-H", "", "", 9.3, FM, "about 9.3 in water (recalled)"),
    ("c1c[nH:1]nn1", "1H-1,2,3-triazole (N-H)", "triazole N-H", 13.9, FM, 9.3, FM, B88 + "; water about 9.3 (recalled)"),
    ("c1ccc(-c2nn[nH:1]n2)cc1", "5-phenyltetrazole (N-H)", "tetrazole N-H", "", "", 4.28, DW,
     "DataWarrior/EPA Original_Source_ID 13747 (25 C, apparent)"),
    ("Cc1nn[nH:1]n1", "5-methyltetrazole (N-H)", "tetrazole N-H", "", "", 5.5, FM, "about 5.5 in water (recalled)"),
    # oximes, hydroxamic acids
    ("CC(C)=N[OH:1]", "acetone oxime (O-H)", "oxime O-H", "", "", 12.42, SJ, "IUPAC serjeant2228 (uncertain, 20-25 C)"),
    ("[OH:1]/N=C/c1ccccc1", "(E)-benzaldehyde oxime (O-H)", "oxime O-H", "", "", 10.7, FM, "aldoximes about 10.5-11 in water (recalled)"),
    ("O=C(N[OH:1])c1ccccc1", "benzohydroxamic acid (O-H)", "hydroxamic acid", "", "", 8.71, DW,
     "DataWarrior/EPA Original_Source_ID 11684 (22 C, apparent); the IUPAC serjeant3661 pK1 of 1.85 is not this ionisation"),
    # sulfonylureas, acyl sulfonamides
    ("CCCCNC(=O)[NH:1]S(=O)(=O)c1ccc(C)cc1", "tolbutamide (SO2NH)", "sulfonylurea N-H", "", "", 5.3, DW,
     "DataWarrior/EPA Original_Source_ID 15612 (20 C, apparent)"),
    ("CCCNC(=O)[NH:1]S(=O)(=O)c1ccc(Cl)cc1", "chlorpropamide (SO2NH)", "sulfonylurea N-H", "", "", 4.9, FM, "about 4.8-5.0 in water (recalled)"),
    # amidinium, guanidinium
    ("[NH2+:1]=C(N)c1ccccc1", "benzamidinium", "amidinium N-H", "", "", 11.6, PR, "IUPAC perrin0671 (pKAH1 of benzamidine)"),
    ("CN(C)C(=[NH2+:1])N(C)C", "1,1,3,3-tetramethylguanidinium", "guanidinium N-H", "", "", 13.6, FM, "TMG conjugate acid about 13.6 in water (recalled)"),
    ("[NH2+:1]=C(Nc1ccccc1)Nc1ccccc1", "1,3-diphenylguanidinium", "guanidinium N-H", "", "", 10.1, FM, "about 10.1 in water (recalled)"),
    # boronic esters beside C-H
    ("COC(=O)[CH2:1]c1ccc(B2OC(C)(C)C(C)(C)O2)cc1", "methyl 4-(Bpin)phenylacetate", "alpha-aryl ester", 22.3, FM, "", "",
     f"{EST}: ethyl phenylacetate 22.6 with a para Bpin (sigma-para about 0.1)"),
    ("[CH3:1]C(=O)c1ccc(B2OC(C)(C)C(C)(C)O2)cc1", "4-acetylphenylboronic acid pinacol ester", "aryl ketone", 24.3, FM, "", "",
     f"{EST}: acetophenone 24.7 with a para Bpin"),
    ("CC1(C)OB([CH2:1]c2ccccc2)OC1(C)C", "benzylboronic acid pinacol ester (CH2)", "alpha-boryl benzylic", 32.0, FM, "", "",
     f"{EST}: the boron p orbital (damped by the pinacolate oxygens) helps the benzyl anion; LiTMP metalates it"),
    # silyl ethers, acetals beside carbonyls
    ("[CH3:1]C(=O)CCO[Si](C)(C)C(C)(C)C", "4-(TBSO)butan-2-one (CH3)", "ketone", 26.5, FM, "", "", "as acetone 26.5 (kinetic side, LDA)"),
    ("[CH3:1]C(=O)c1ccc(O[Si](C)(C)C(C)(C)C)cc1", "4'-(TBSO)acetophenone", "aryl ketone", 25.5, FM, "", "",
     "as 4-methoxyacetophenone 25.7 (recalled)"),
    ("CCOC(=O)[CH:1](C)O[Si](C)(C)C(C)(C)C", "ethyl 2-(TBSO)propanoate (alpha-C-H)", "ester (alpha-silyloxy)", 28.5, FM, "", "",
     f"{EST}: ester 29.5 with an alpha-alkoxy (-1.9) and an alpha-methyl"),
    ("COC(OC)C(=O)[CH3:1]", "1,1-dimethoxyacetone (CH3)", "ketone beside an acetal", 26.0, FM, "", "",
     f"{EST}: acetone 26.5, the acetal inductively withdrawing; LDA enolises the methyl"),
    ("CCOC(OCC)[CH2:1]C(=O)OCC", "ethyl 3,3-diethoxypropanoate (alpha-C-H)", "ester beside an acetal", 28.5, FM, "", "",
     f"{EST}: ester 29.5 with an inductively withdrawing beta acetal"),
    # vinylogous esters and amides, Hagemann's ester, enol ethers, enoates
    ("CCOC1=CC(=O)[CH2:1]CC1", "3-ethoxycyclohex-2-enone (C6-H)", "vinylogous ester alpha'", 28.0, FM, "", "",
     f"{EST}: the ethoxy donates into the C=O, less acidic than cyclohexanone 26.4; LDA at -78 C (Stork-Danheiser)"),
    ("CN(C)C1=CC(=O)[CH2:1]CC1", "3-(dimethylamino)cyclohex-2-enone (C6-H)", "vinylogous amide alpha'", 30.0, FM, "", "",
     f"{EST}: a stronger donor than the vinylogous ester"),
    ("CCOC(=O)[CH:1]1CCC(=O)C=C1C", "Hagemann's ester (C1-H)", "vinylogous beta-keto ester", 16.0, FM, "", "",
     f"{EST}: ester and the enone's gamma position on one carbon, a vinylogous ethyl acetoacetate (14.2); NaOEt or t-BuOK"),
    ("CC1=CC(=O)[CH2:1]C(C)(C)C1", "isophorone (C6-H)", "ketone (enone alpha')", 27.0, FM, "", "",
     f"{EST}: as cyclohexanone 26.4 (alpha' of an enone, kinetic, LDA)"),
    ("CCO[CH:1]=C", "ethyl vinyl ether (alpha vinyl C-H)", "vinyl C-H (enol ether)", 41.0, FM, "", "",
     f"{EST}: ethylene 44 less the alkoxy's inductive and coordinating help; t-BuLi at -78 C"),
    ("COC(=O)/C=C/[CH3:1]", "methyl crotonate (gamma-C-H)", "enoate gamma C-H", 27.0, FM, "", "",
     f"{EST}: extended dienolate; LDA with HMPA, alkylation at alpha (deconjugative)"),
    ("CCOC(=O)C=C(C)[CH3:1]", "ethyl 3-methylbut-2-enoate (gamma-C-H)", "enoate gamma C-H", 28.0, FM, "", "",
     f"{EST}: as the crotonate, the beta-methyl raising it a little"),
    # phosphonium salts
    ("c1ccc([CH2:1][P+](c2ccccc2)(c2ccccc2)c2ccccc2)cc1", "benzyltriphenylphosphonium", "phosphonium", 17.4, FM, "", "", B88),
    ("C[CH2:1][P+](c1ccccc1)(c1ccccc1)c1ccccc1", "ethyltriphenylphosphonium", "phosphonium", 23.0, FM, "", "",
     f"{EST}: methyltriphenylphosphonium 22.4 plus an alpha-methyl"),
    ("CCOC(=O)[CH2:1][P+](c1ccccc1)(c1ccccc1)c1ccccc1", "(ethoxycarbonylmethyl)triphenylphosphonium", "phosphonium (ester-stabilised)",
     8.5, FM, "", "", B88 + " (less sure, about 8.5-9)"),
    ("N#C[CH2:1][P+](c1ccccc1)(c1ccccc1)c1ccccc1", "(cyanomethyl)triphenylphosphonium", "phosphonium (nitrile-stabilised)",
     7.0, FM, "", "", B88 + " (less sure)"),
    ("CO[CH2:1][P+](c1ccccc1)(c1ccccc1)c1ccccc1", "(methoxymethyl)triphenylphosphonium", "phosphonium", 22.0, FM, "", "",
     f"{EST}: as methyltriphenylphosphonium 22.4; ylide made with KOtBu or NaHMDS (homologation)"),
    # imidates, drug intermediates
    ("[CH3:1]C1=NC(C)(C)CO1", "2,4,4-trimethyl-2-oxazoline (CH3)", "imidate alpha-C-H", 31.0, FM, "", "",
     f"{EST}: aza-enolate as an imine (31); n-BuLi or LDA (Meyers)"),
]

COLUMNS = ["smiles", "name", "site_atom", "element", "class", "pka_dmso", "dmso_source", "pka_water", "water_source", "note"]


def fmt(v):
    return f"{float(v):g}" if v != "" else ""


def main():
    from rdkit import Chem
    rows = []
    seen = set()
    for mapped, name, cls, dmso, dsrc, water, wsrc, note in ENTRIES:
        smiles, site = L.strip_map(mapped)
        atom = Chem.MolFromSmiles(smiles).GetAtomWithIdx(site)
        assert atom.GetTotalNumHs() > 0, (name, "site atom has no hydrogen")
        assert dmso != "" or water != "", (name, "no expected value")
        key = (L.canon(smiles), name)
        assert key not in seen, name
        seen.add(key)
        rows.append([smiles, name, str(site), atom.GetSymbol(), cls, fmt(dmso), dsrc if dmso != "" else "",
                     fmt(water), wsrc if water != "" else "", note])
    path = os.path.join(L.ROOT, "corpus", "sites", "review_2.tsv")
    with open(path, "w") as f:
        f.write("# acidsite corpus/sites/review_2.tsv: second chemist's review of acidic sites (issue 11), molecules in\n")
        f.write("# neither process_review.tsv nor literature.tsv. One row per (molecule, site a chemist would deprotonate);\n")
        f.write("# class = the chemist's description (free text, not a rule class). Values chosen before acidsite was run on\n")
        f.write("# the molecules. pka_dmso / pka_water with dmso_source / water_source: cited (iupac-serjeant, iupac-perrin,\n")
        f.write("# datawarrior-epa: record in the note) or from-memory (the note says what is recalled, or that it is an\n")
        f.write("# estimate and how it was reasoned). Hand-chosen entries written by tests/reference/sites_review_2.py;\n")
        f.write("# read by tests/sites_review_2.rs (DMSO compared where given, else water).\n")
        f.write("\t".join(COLUMNS) + "\n")
        for r in rows:
            f.write("\t".join(r) + "\n")
    print(f"{len(rows)} rows, {sum(bool(r[5]) for r in rows)} with a DMSO value, {sum(bool(r[7]) for r in rows)} with a water value")


if __name__ == "__main__":
    main()
