"""Independent water check of the rule and increment values: corpus/sites/rule_water_iupac.tsv.

For every row of fragments/rules.tsv and fragments/increments.tsv with a pka_water value, PARENTS below
names the parent compound (the molecule the row's note says the value was set from, or the simplest
molecule the row applies to; the ionising atom mapped ":1") and how to look it up in the IUPAC Digitized
pKa Dataset v1.0 (../shared/data/iupac-pka, matched by canonical SMILES via RDKit, as
tests/reference/advice_base_water.py does for the base catalogue):
  "acid" = median of the Serjeant pK1 rows (pure water; tiers of sites_lookup.py),
  "base" = median of the Perrin pKAH1 rows of the neutral base (the pKa of its conjugate acid),
  "none" = no look-up makes sense (reason given): the IUPAC pK1 would belong to another site, or the row
           has no single parent.
The Rust test tests/sites_rule_water.rs estimates each parent with find_sites and compares it with the
IUPAC median; it also fails when a rule or increment with a water value has no row here.

The IUPAC data are CC BY-NC 4.0, (c) IUPAC: "Reproduced by permission of International Union of Pure and
Applied Chemistry". See corpus/sites/ATTRIBUTION.md.

Run: ACIDSITE_SHARED_DATA=/path/to/shared/data python3 tests/reference/sites_rule_water_check.py
"""
import os
import sys

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
import sites_lookup as L  # noqa: E402

# id -> [(mapped parent SMILES, parent name, kind, note)]; several parents per id are allowed.
PARENTS = {
    # --- carbon acids: rules ------------------------------------------------------------------------
    "C-MELD-01": [("CC1(C)OC(=O)[CH2:1]C(=O)O1", "Meldrum's acid", "acid", "")],
    "C-BARB-01": [("O=C1[CH2:1]C(=O)NC(=O)N1", "barbituric acid", "acid", "")],
    "C-DIONE-05": [("O=C1[CH2:1]C(=O)c2ccccc21", "indane-1,3-dione", "acid", "")],
    "C-DIONE-06": [("CC1(C)CC(=O)[CH2:1]C(=O)C1", "dimedone", "acid", "")],
    "C-NITRO-02": [("[CH2:1]([N+](=O)[O-])[N+](=O)[O-]", "dinitromethane", "acid", "")],
    "C-NITRO-CO": [("CC(=O)[CH2:1][N+](=O)[O-]", "nitroacetone", "acid", ""),
                   ("CCOC(=O)[CH2:1][N+](=O)[O-]", "ethyl nitroacetate", "acid", "")],
    "C-DIKET-01": [("CC(=O)[CH2:1]C(C)=O", "pentane-2,4-dione", "acid", "")],
    "C-KETES-01": [("CCOC(=O)[CH2:1]C(C)=O", "ethyl acetoacetate", "acid", "")],
    "C-KETAM-01": [("CC(=O)[CH2:1]C(=O)Nc1ccccc1", "acetoacetanilide", "acid", "")],
    "C-MALON-01": [("CCOC(=O)[CH2:1]C(=O)OCC", "diethyl malonate", "acid", "")],
    "C-MALAM-01": [("NC(=O)[CH2:1]C(N)=O", "malonamide", "acid", "")],
    "C-CYAES-01": [("CCOC(=O)[CH2:1]C#N", "ethyl cyanoacetate", "acid", "")],
    "C-CYAAM-01": [("N#C[CH2:1]C(N)=O", "cyanoacetamide", "acid", "")],
    "C-KETNI-01": [("N#C[CH2:1]C(=O)c1ccccc1", "benzoylacetonitrile", "acid", "")],
    "C-MALNI-01": [("N#C[CH2:1]C#N", "malononitrile", "acid", "")],
    "C-BSULF-01": [("O=S(=O)([CH2:1]S(=O)(=O)c1ccccc1)c1ccccc1", "bis(phenylsulfonyl)methane", "acid", ""),
                   ("CS(=O)(=O)[CH2:1]S(C)(=O)=O", "bis(methylsulfonyl)methane", "acid", "")],
    "C-CPD-01": [("[CH2:1]1C=CC=C1", "cyclopentadiene", "acid", "")],
    "C-NITRO-01": [("[CH3:1][N+](=O)[O-]", "nitromethane", "acid", "")],
    "C-KETCY-06": [("O=C1[CH2:1]CCCC1", "cyclohexanone", "acid", "")],
    "C-KETAR-01": [("[CH3:1]C(=O)c1ccccc1", "acetophenone", "acid", "")],
    "C-KETON-01": [("[CH3:1]C(C)=O", "acetone", "acid", "")],
    "C-ALDEH-01": [("[CH3:1]C=O", "acetaldehyde", "acid", "")],
    "C-THIOE-01": [("CCSC(=O)[CH3:1]", "S-ethyl thioacetate", "acid", "")],
    "C-ESTER-01": [("[CH3:1]C(=O)OCC", "ethyl acetate", "acid", "")],
    "C-ACID-01": [("OC(=O)[CH3:1]", "acetic acid (C-H)", "none",
                   "the IUPAC pK1 of acetic acid is the O-H; the C-H of acetate is not in the set")],
    "C-AMID3-01": [("CN(C)C(=O)[CH3:1]", "N,N-dimethylacetamide", "acid", "")],
    "C-NITRI-01": [("[CH3:1]C#N", "acetonitrile", "acid", "")],
    "C-HCN-01": [("[CH:1]#N", "hydrogen cyanide", "acid", "")],
    "C-HALOF-01": [("Cl[CH:1](Cl)Cl", "chloroform", "acid", "")],
    "C-HFLUO-01": [("F[CH:1](F)F", "fluoroform", "acid", "")],
    "C-ALKYN-01": [("[CH:1]#C", "acetylene", "acid", "")],
    "C-AZOLM-02": [("Cc1cs[cH:1][n+]1C", "3,4-dimethylthiazolium", "none",
                    "a C-H of a cation: no neutral-acid pK1 row; H/D exchange values are not in the set")],
    "C-AZOLM-01": [("Cn1cc[n+](C)[cH:1]1", "1,3-dimethylimidazolium", "none",
                    "a C-H of a cation: no neutral-acid pK1 row; H/D exchange values are not in the set")],
    # --- O-H ----------------------------------------------------------------------------------------
    "O-SULFA-01": [("CS(=O)(=O)[OH:1]", "methanesulfonic acid", "acid", "")],
    "O-PHOSA-01": [("[OH:1]P(=O)(O)O", "phosphoric acid", "acid", "")],
    "O-ACIDA-01": [("O=C([OH:1])c1ccccc1", "benzoic acid", "acid", "")],
    # Rows added by the sites work of issue 11.
    "O-SALIC-01": [("[OH:1]C(=O)c1ccccc1O", "salicylic acid", "acid", "")],
    "O-SALIC-02": [("OC(=O)c1ccccc1[OH:1]", "salicylic acid (phenol O-H)", "none",
                    "second ionisation: the IUPAC pK1 look-up gives the CO2H; pK2 is in the row's note (serjeant3397)")],
    "O-VINAC-05": [("CC1=C([OH:1])COC1=O", "3-methyltetronic acid", "acid", "")],
    "O-VINAC-06": [("O=c1cc([OH:1])c2ccccc2o1", "4-hydroxycoumarin", "acid", "")],
    "C-KETAR-02": [("O=C1[CH2:1]CCc2ccccc21", "1-tetralone", "none",
                    "no cyclic aryl ketone among the IUPAC carbon acids; the water value is acetophenone's with an alkyl increment")],
    "O-ACIDF-01": [("O=C[OH:1]", "formic acid", "acid", "")],
    "O-ACIDF3-01": [("O=C([OH:1])C(F)(F)F", "trifluoroacetic acid", "acid", "")],
    "O-ACIDH-01": [("O=C([OH:1])CCl", "chloroacetic acid", "acid", "")],
    "O-ACID-01": [("CC(=O)[OH:1]", "acetic acid", "acid", "")],
    "O-CARBA-01": [("CNC(=O)[OH:1]", "N-methylcarbamic acid", "acid", "")],
    "O-NHIMD-01": [("O=C1CCC(=O)N1[OH:1]", "N-hydroxysuccinimide", "acid", "")],
    "O-NHAZL-01": [("[OH:1]n1nnc2ccccc21", "1-hydroxybenzotriazole", "acid", "")],
    "O-PERAC-01": [("CC(=O)O[OH:1]", "peracetic acid", "acid", "")],
    "O-HPERO-02": [("O[OH:1]", "hydrogen peroxide", "acid", "")],
    "O-HPERO-01": [("CCO[OH:1]", "ethyl hydroperoxide", "acid", ""),
                   ("CO[OH:1]", "methyl hydroperoxide", "acid", ""),
                   ("CC(C)(C)O[OH:1]", "tert-butyl hydroperoxide", "acid", "")],
    "O-BORAR-01": [("OB([OH:1])c1ccccc1", "phenylboronic acid", "acid", "")],
    "SE-SELAR-01": [("[SeH:1]c1ccccc1", "benzeneselenol", "acid", "")],
    "SE-SELEN-01": [("CC[SeH:1]", "ethaneselenol", "acid", "")],
    "O-BORON-01": [("CB(O)[OH:1]", "methylboronic acid", "acid", ""),
                   ("OB(O)[OH:1]", "boric acid", "acid", "")],
    "O-SILAN-01": [("C[Si](C)(C)[OH:1]", "trimethylsilanol", "acid", "")],
    "O-SULFI-01": [("CS(=O)[OH:1]", "methanesulfinic acid", "acid", ""),
                   ("O=S([OH:1])c1ccccc1", "benzenesulfinic acid", "acid", "")],
    "S-THIAC-01": [("CC(=O)[SH:1]", "thioacetic acid", "acid", "")],
    "O-HYDRX-01": [("CC(=O)N[OH:1]", "acetohydroxamic acid", "acid", "")],
    "O-OXIME-01": [("CC(C)=N[OH:1]", "acetone oxime", "acid", "")],
    "O-PHENO-01": [("[OH:1]c1ccccc1", "phenol", "acid", "")],
    "O-PHENO-02": [("[OH:1]c1ccncc1", "4-hydroxypyridine", "none",
                    "the row is by analogy with phenol; hydroxypyridines ionise as pyridinium first (pK1)")],
    "O-ENOL-01": [("CC([OH:1])=CC(C)=O", "pentane-2,4-dione enol", "none",
                   "provisional row; the IUPAC values of 1,3-dicarbonyls are keto/enol mixtures (C-DIKET-01)")],
    "O-ALCTF-01": [("[OH:1]CC(F)(F)F", "2,2,2-trifluoroethanol", "acid", "")],
    "O-WATER-01": [("[OH2:1]", "water", "none", "15.7 is a convention (Kw / 55.5 M), not a tabulated pK1")],
    "O-ALCME-01": [("C[OH:1]", "methanol", "acid", "")],
    "O-ALC1-01": [("CC[OH:1]", "ethanol", "acid", "")],
    "O-ALC2-01": [("CC(C)[OH:1]", "2-propanol", "acid", "")],
    "O-ALC3-01": [("CC(C)(C)[OH:1]", "tert-butanol", "acid", "")],
    "O-ALC-01": [("C[N:1](C)O", "N,N-dimethylhydroxylamine", "none", "catch-all row without a parent")],
    # --- S-H ----------------------------------------------------------------------------------------
    "S-THIPH-01": [("[SH:1]c1ccccc1", "benzenethiol", "acid", "")],
    "S-THIOB-01": [("[SH:1]Cc1ccccc1", "phenylmethanethiol", "acid", "")],
    "S-THIOL-01": [("CC[SH:1]", "ethanethiol", "acid", "")],
    "N-HN3-01": [("[NH:1]=[N+]=[N-]", "hydrazoic acid", "none", "inorganic: not in the IUPAC organic acid set")],
    "N-URAC-02": [("Cn1c(=O)cc[nH:1]c1=O", "3-methyluracil", "acid", "")],
    "N-URAC-01": [("O=c1cc[nH]c(=O)[nH:1]1", "uracil", "acid", "")],
    "O-ACIDY-01": [("C#CC(=O)[OH:1]", "propiolic acid", "acid", ""), ("CC#CC(=O)[OH:1]", "2-butynoic acid", "acid", "")],
    "O-ACIDK-01": [("CC(=O)C(=O)[OH:1]", "pyruvic acid", "acid", "")],
    "O-ACIDN-01": [("CC(N)C(=O)[OH:1]", "alanine", "acid", "")],
    "O-ACIDM-01": [("OC(=O)CC(=O)[OH:1]", "malonic acid", "acid", "")],
    "S-THIOC-01": [("CCOC(=O)C[SH:1]", "ethyl thioglycolate", "acid", "")],
    "O-PHEHB-04": [("O=C1CCCc2cccc([OH:1])c21", "8-hydroxy-1-tetralone", "none", "value derived from O-PHEHB-02 and the acetyl sigma term; the IUPAC set has only the five-ring 7-hydroxy-1-indanone (8.43, serjeant4529), whose hydrogen bond is weaker (literature.tsv shows that row)")],
    "I-CA-ALK1": [("CCC(=O)[OH:1]", "propionic acid", "acid", "")],
    "I-CA-ALKX": [("ClCCC(=O)[OH:1]", "3-chloropropionic acid", "acid", "")],
    "I-CA-ARY1": [("[OH:1]C(=O)Cc1ccccc1", "phenylacetic acid", "acid", "")],
    "I-CA-HAR1": [("[OH:1]C(=O)Cc1ccccn1", "2-pyridylacetic acid", "acid", "")],
    "I-CA-VIN1": [("C=CCC(=O)[OH:1]", "3-butenoic acid", "acid", "")],
    "I-CA-YNE1": [("C#CCC(=O)[OH:1]", "3-butynoic acid", "acid", "")],
    "I-CA-OME": [("COCC(=O)[OH:1]", "methoxyacetic acid", "acid", "")],
    "I-CA-OAR": [("[OH:1]C(=O)COc1ccccc1", "phenoxyacetic acid", "acid", "")],
    "I-CA-OAC": [("CC(=O)OCC(=O)[OH:1]", "acetoxyacetic acid", "acid", "")],
    "I-CA-SR": [("[OH:1]C(=O)CS", "thioglycolic acid (CO2H)", "acid", "")],
    "I-CA-NR": [("CC(=O)NCC(=O)[OH:1]", "N-acetylglycine", "acid", "")],
    "I-CA-ACY": [("CC(=O)CC(=O)[OH:1]", "acetoacetic acid", "acid", "")],
    "I-CA-EST": [("CCOC(=O)CC(=O)[OH:1]", "monoethyl malonate", "acid", "")],
    "I-CA-CN": [("N#CCC(=O)[OH:1]", "cyanoacetic acid", "acid", "")],
    "I-CA-NO2": [("[OH:1]C(=O)C[N+](=O)[O-]", "nitroacetic acid", "acid", "")],
    "I-CA-SO2": [("CS(=O)(=O)CC(=O)[OH:1]", "(methylsulfonyl)acetic acid", "acid", "")],
    "I-CA-ONN": [("C[N+](C)(C)CC(=O)[OH:1]", "(trimethylammonio)acetic acid (betaine, acid form)", "acid", "")],
    "I-CA-F": [("[OH:1]C(=O)C(F)F", "difluoroacetic acid", "acid", "")],
    "I-CA-CL": [("[OH:1]C(=O)C(Cl)Cl", "dichloroacetic acid", "acid", "")],
    "I-CA-CL2": [("[OH:1]C(=O)C(Cl)(Cl)Cl", "trichloroacetic acid", "acid", "")],
    "I-CA-BR": [("[OH:1]C(=O)C(Br)Br", "dibromoacetic acid", "acid", "")],
    "I-CA-I": [("[OH:1]C(=O)CI", "iodoacetic acid", "acid", "")],
    "S-HYDSU-01": [("[SH2:1]", "hydrogen sulfide", "none", "inorganic: not in the IUPAC organic acid set")],
    "P-PHOSH-02": [("[PH+:1](c1ccccc1)(c1ccccc1)c1ccccc1", "triphenylphosphonium", "base:c1ccc(P(c2ccccc2)c2ccccc2)cc1", "")],
    "P-PHOSH-01": [("C[PH+:1](C)C", "trimethylphosphonium", "base:CP(C)C", "")],
    # --- N-H: ammonium ions (IUPAC Perrin pKAH1 of the neutral base) -------------------------------
    "N-AMMES-01": [("[NH3+:1]CC(=O)OC", "glycine methyl ester", "base:COC(=O)CN", "")],
    "N-AMMON-04": [("[NH4+:1]", "ammonia", "base:N", "")],
    "N-ANILM-01": [("[NH3+:1]c1ccccc1", "aniline", "base:Nc1ccccc1", "")],
    "N-AMMON-03": [("CC[NH+:1](CC)CC", "triethylamine", "base:CCN(CC)CC", "")],
    "N-AMMON-02": [("CC[NH2+:1]CC", "diethylamine", "base:CCNCC", "")],
    "N-AMMON-01": [("CC[NH3+:1]", "ethylamine", "base:CCN", "")],
    "N-GUAN-01": [("NC(N)=[NH2+:1]", "guanidine", "base:NC(N)=N", "")],
    "N-AMIDN-01": [("CC(N)=[NH2+:1]", "acetamidine", "base:CC(=N)N", "")],
    "N-PYRDM-01": [("c1cc[nH+:1]cc1", "pyridine", "base:c1ccncc1", "")],
    "N-AZOLM-01": [("c1c[nH+:1]c[nH]1", "imidazole", "base:c1c[nH]cn1", "")],
    "N-AZOLM-02": [("c1c[nH+]c[nH:1]1", "imidazole", "base:c1c[nH]cn1", "the N-H drawn uncharged")],
    # --- N-H: neutral N-H acids ----------------------------------------------------------------------
    "N-SULAC-01": [("CC(=O)[NH:1]S(=O)(=O)c1ccccc1", "N-acetylbenzenesulfonamide", "acid", "")],
    "N-SULCF-01": [("[NH2:1]S(=O)(=O)C(F)(F)F", "trifluoromethanesulfonamide", "acid", "")],
    "N-SULAR-01": [("O=S(=O)([NH:1]c1ccccc1)c1ccccc1", "N-phenylbenzenesulfonamide", "acid", "")],
    "N-SULFA-02": [("[NH2:1]S(=O)(=O)c1ccccc1", "benzenesulfonamide", "acid", "")],
    "N-SULFA-01": [("CS(=O)(=O)[NH2:1]", "methanesulfonamide", "acid", "")],
    "N-BARBN-01": [("CCC1(CCC(C)C)C(=O)NC(=O)[NH:1]C1=O", "amobarbital", "acid", "")],
    "N-OXZDN-01": [("CCC1(C)OC(=O)[NH:1]C1=O", "5-ethyl-5-methyloxazolidine-2,4-dione", "acid", "")],
    "N-TZDN-01": [("O=C1CSC(=O)[NH:1]1", "2,4-thiazolidinedione", "acid", "")],
    "N-THIMD-01": [("O=C1CSC(=S)[NH:1]1", "rhodanine", "acid", "")],
    "N-SACCH-01": [("O=C1[NH:1]S(=O)(=O)c2ccccc21", "saccharin", "acid", "")],
    "N-SULIM-01": [("O=S(=O)([NH:1]S(=O)(=O)c1ccccc1)c1ccccc1", "dibenzenesulfonimide", "acid", "")],
    "N-THIAR-01": [("[NH2:1]C(=S)c1ccccc1", "thiobenzamide", "acid", "")],
    "N-THIAM-01": [("CC([NH2:1])=S", "thioacetamide", "acid", "")],
    "C-PYRZO-01": [("CC1=NN(c2ccccc2)C(=O)[CH2:1]1", "3-methyl-1-phenyl-2-pyrazolin-5-one (edaravone)", "acid", "")],
    "N-IMIDE-01": [("O=C1CCC(=O)[NH:1]1", "succinimide", "acid", "")],
    "N-TETRZ-01": [("Cc1nnn[nH:1]1", "5-methyltetrazole", "acid", "")],
    "N-BTRZ-01": [("[nH:1]1nnc2ccccc21", "benzotriazole", "acid", "")],
    "N-TRIAZ-01": [("c1c[nH:1]nn1", "1,2,3-triazole", "acid", "")],
    "N-TRIAZ-02": [("c1nc[nH:1]n1", "1,2,4-triazole", "acid", "")],
    "N-PYRDN-01": [("O=c1cccc[nH:1]1", "2-pyridone", "acid", "")],
    "N-BIMID-01": [("[nH:1]1cnc2ccccc21", "benzimidazole", "acid", "")],
    "N-IMIDZ-01": [("c1c[nH:1]cn1", "imidazole", "none",
                    "the Serjeant pK1 of imidazole (7.15) is the imidazolium ion, not this N-H (see N-AZOLM-01)")],
    "N-PYRAZ-01": [("[nH:1]1cccn1", "pyrazole", "acid", "")],
    "N-INDOL-01": [("[nH:1]1ccc2ccccc21", "indole", "acid", "")],
    "N-PYRRL-01": [("[nH:1]1cccc1", "pyrrole", "acid", "")],
    "N-AMIDE-01": [("[NH2:1]C(C)=O", "acetamide", "acid", "")],
    # --- increments (the parent is the simplest molecule the increment applies to) -----------------
    "I-CO-ALK1": [("C[CH2:1]C=O", "propanal", "acid", "")],
    "I-CO-ALK2": [("C[CH:1](C)C=O", "isobutyraldehyde", "acid", "")],
    "I-CO-CL": [("CC(=O)[CH2:1]Cl", "chloroacetone", "acid", "")],
    "I-CO-BR": [("CC(=O)[CH2:1]Br", "bromoacetone", "acid", "")],
    "I-NO-ALK1": [("C[CH2:1][N+](=O)[O-]", "nitroethane", "acid", "")],
    "I-NO-ALK2": [("C[CH:1](C)[N+](=O)[O-]", "2-nitropropane", "acid", "")],
    "I-NO-ARY1": [("[O-][N+](=O)[CH2:1]c1ccccc1", "phenylnitromethane", "acid", "")],
    "I-NO-CL": [("Cl[CH2:1][N+](=O)[O-]", "chloronitromethane", "acid", "")],
    "I-NO-BR": [("Br[CH2:1][N+](=O)[O-]", "bromonitromethane", "acid", "")],
    "I-NO-NO2": [("O=[N+]([O-])[CH:1]([N+](=O)[O-])[N+](=O)[O-]", "trinitromethane", "acid", "")],
    "I-NO-F": [("F[CH:1](Cl)[N+](=O)[O-]", "chlorofluoronitromethane", "acid", "")],
    "I-DC-ALK1": [("CC(=O)[CH:1](C)C(C)=O", "3-methylpentane-2,4-dione", "acid", "")],
    "I-DC-CL": [("CC(=O)[CH:1](Cl)C(C)=O", "3-chloropentane-2,4-dione", "acid", "")],
    "I-DC-BR": [("CC(=O)[CH:1](Br)C(C)=O", "3-bromopentane-2,4-dione", "acid", "")],
    "I-DC-F": [("CC(=O)[CH:1](F)C(C)=O", "3-fluoropentane-2,4-dione", "acid", "")],
    "I-DC-ACY": [("CC(=O)[CH:1](C(C)=O)C(C)=O", "triacetylmethane", "acid", "")],
    "I-DC-EST": [("CCOC(=O)[CH:1](C(C)=O)C(C)=O", "ethyl 2-acetylacetoacetate", "acid", "")],
    "I-DC-OME": [("CO[CH:1](C(C)=O)C(C)=O", "3-methoxypentane-2,4-dione", "acid", "")],
    "I-DN-ALK1": [("C[CH:1]([N+](=O)[O-])[N+](=O)[O-]", "1,1-dinitroethane", "acid", "")],
    "I-DN-ALKX": [("COC[CH:1]([N+](=O)[O-])[N+](=O)[O-]", "1-methoxy-2,2-dinitroethane", "acid", "")],
    "I-DN-CL": [("Cl[CH:1]([N+](=O)[O-])[N+](=O)[O-]", "chlorodinitromethane", "acid", "")],
    "I-CD-ALK1": [("CC1(C)OC(=O)[CH:1](C)C(=O)O1", "5-methyl Meldrum's acid", "acid", "")],
    "I-CD-ALKX": [("CC1(C)CC(=O)[CH:1](C2NC=Nc3nccnc32)C(=O)C1",
                   "2-(3,4-dihydropteridin-4-yl)dimedone", "acid", "")],
    "I-CD-ACY": [("CC(=O)[CH:1]1C(=O)CC(C)(C)CC1=O", "2-acetyldimedone", "acid", "")],
    "O-PHEHB-01": [("COC(=O)c1ccccc1[OH:1]", "methyl salicylate", "acid", ""),
                   ("CCOC(=O)c1ccccc1[OH:1]", "ethyl salicylate", "acid",
                    "a check compound, not the parent: the value was set on methyl salicylate")],
    "O-PHEHB-02": [("CC(=O)c1ccccc1[OH:1]", "2-hydroxyacetophenone", "acid",
                    "the value was set on the DataWarrior/EPA figure 10.37 (Original_Source_ID 11391)")],
    "O-PHEHB-03": [("O=Cc1ccccc1[OH:1]", "salicylaldehyde", "acid", "")],
    "I-AL-FB": [("FCC[OH:1]", "2-fluoroethanol", "acid", "")],
    "I-AL-HETB": [("COCC[OH:1]", "2-methoxyethanol", "acid", "")],
    "I-NH-FB": [("[NH3+:1]CC(F)(F)F", "2,2,2-trifluoroethylamine", "base:NCC(F)(F)F", "")],
    "I-NH-HETB": [("C1C[NH+:1]2CCN1CC2", "DABCO", "base:C1CN2CCN1CC2", ""),
                  ("C1COCC[NH2+:1]1", "morpholine", "base:C1COCCN1",
                   "a check compound, not the parent: the value was set on DABCO")],
}

HEADER = [
    "acidsite corpus/sites/rule_water_iupac.tsv, version 1: independent water check of rule and increment values.",
    "One row per (rule or increment id, parent compound): every row of fragments/rules.tsv and increments.tsv with",
    "a pka_water value has at least one. Columns: id, parent (name), smiles (RDKit-parsable), site_atom (0-based,",
    "written order, the ionising atom), lookup (acid = IUPAC Serjeant pK1 of the molecule; base = IUPAC Perrin pKAH1",
    "of the neutral base named; none = no sensible look-up, reason in note), pka_water_iupac (median of the rows",
    "chosen by tests/reference/sites_lookup.py; empty = not in the set under that filter), n_rows, tier, record_ids,",
    "note. Data: IUPAC Digitized pKa Dataset v1.0 (J. W. Zheng, 2022, doi:10.5281/zenodo.7236453), CC BY-NC 4.0,",
    "Reproduced by permission of International Union of Pure and Applied Chemistry; see corpus/sites/ATTRIBUTION.md.",
    "Generated by tests/reference/sites_rule_water_check.py; read by tests/sites_rule_water.rs.",
]


def water_ids():
    out = []
    for name in ("rules.tsv", "increments.tsv"):
        with open(os.path.join(L.ROOT, "fragments", name)) as f:
            lines = [line.rstrip("\n").split("\t") for line in f if line.strip() and not line.startswith("#")]
        cols = lines[0]
        for cells in lines[1:]:
            row = dict(zip(cols, cells))
            if row.get("pka_water", "").strip():
                out.append(row["id"])
    return out


def main():
    ids = water_ids()
    missing = [i for i in ids if i not in PARENTS]
    if missing:
        raise SystemExit(f"no PARENTS entry for {missing}")
    out = []
    for rid in ids:
        for mapped, name, kind, note in PARENTS[rid]:
            smiles, site = L.strip_map(mapped)
            hit = None
            if kind == "acid":
                hit = L.water_lookup(smiles, "acid")
            elif kind.startswith("base:"):
                hit = L.water_lookup(kind[5:], "base")
            lookup = kind.split(":")[0]
            notes = [note] if note else []
            if hit is None and lookup != "none":
                notes.append("not in the IUPAC set under the look-up filter")
            if hit:
                refs = "; ".join(hit["refs"][:2])
                if refs:
                    notes.append(refs)
            out.append([rid, name, smiles, str(site), lookup,
                        f"{hit['value']:g}" if hit else "", str(hit["n"]) if hit else "",
                        hit["tier"] if hit else "", " ".join(hit["ids"]) if hit else "",
                        " | ".join(notes).replace("\t", " ")])
    path = os.path.join(L.ROOT, "corpus", "sites", "rule_water_iupac.tsv")
    with open(path, "w") as f:
        for h in HEADER:
            f.write("# " + h + "\n")
        f.write("id\tparent\tsmiles\tsite_atom\tlookup\tpka_water_iupac\tn_rows\ttier\trecord_ids\tnote\n")
        for row in out:
            f.write("\t".join(row) + "\n")
    found = sum(1 for r in out if r[5])
    print(f"{len(ids)} ids with a water value, {len(out)} parent rows, {found} with an IUPAC value")


if __name__ == "__main__":
    main()
