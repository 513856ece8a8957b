//! Perception tests of the molecule core (issue 2): aromaticity, kekulization
//! errors, valence, rings, components, formula, symmetry, errors.
//!
//! Expected aromatic atom counts and ring facts marked "RDKit" were computed
//! with RDKit 2026.09.1, our reference library; the others are common
//! practice of organic chemistry.

use acidsite::mol::{BondOrder, ErrorKind, MolError, Molecule};

fn mol(s: &str) -> Molecule {
    Molecule::from_smiles(s).unwrap_or_else(|e| panic!("{s}: {e}"))
}

fn err(s: &str) -> MolError {
    match Molecule::from_smiles(s) {
        Ok(_) => panic!("{s}: expected an error"),
        Err(e) => e,
    }
}

fn aromatic_atoms(s: &str) -> usize {
    mol(s).atoms().iter().filter(|a| a.aromatic).count()
}

fn aromatic_bonds(s: &str) -> usize {
    mol(s)
        .bonds()
        .iter()
        .filter(|b| b.order == BondOrder::Aromatic)
        .count()
}

// ----- aromaticity -----

#[test]
fn from_smiles_given_kekule_benzene_equals_aromatic_benzene() {
    let a = mol("C1=CC=CC=C1");
    let b = mol("c1ccccc1");
    let strip = |m: &Molecule| -> Vec<acidsite::mol::Atom> {
        m.atoms()
            .iter()
            .map(|x| acidsite::mol::Atom {
                span: 0..0,
                ..x.clone()
            })
            .collect()
    };
    assert_eq!(strip(&a), strip(&b));
    assert!(a.atoms().iter().all(|x| x.aromatic && x.hydrogens == 1));
    assert!(a.bonds().iter().all(|x| x.order == BondOrder::Aromatic));
    assert_eq!(a.bonds().iter().filter(|x| x.kekule == 2).count(), 3);
    assert_eq!(b.bonds().iter().filter(|x| x.kekule == 2).count(), 3);
    assert_eq!(a.formula(), b.formula());
    assert_eq!(a.symmetry_classes(), b.symmetry_classes());
}

#[test]
fn from_smiles_given_common_aromatic_rings_agrees_with_rdkit() {
    // (SMILES, aromatic atoms, aromatic bonds): RDKit
    let cases = [
        ("c1ccncc1", 6, 6),                    // pyridine
        ("c1cc[nH]c1", 5, 5),                  // pyrrole
        ("N1C=CC=C1", 5, 5),                   // pyrrole, Kekulé input
        ("c1ccoc1", 5, 5),                     // furan
        ("c1ccsc1", 5, 5),                     // thiophene
        ("[se]1cccc1", 5, 5),                  // selenophene
        ("c1ccc2[nH]ccc2c1", 9, 10),           // indole
        ("c1ccc2cc3ccccc3cc2c1", 14, 16),      // anthracene
        ("C1=CC2=CC=CC=CC2=C1", 10, 10),       // azulene: aromatic as a whole
        ("O=c1cccc[nH]1", 6, 6),               // 2-pyridone: exocyclic C=O
        ("O=C1C=CC(=O)C=C1", 0, 0),            // p-benzoquinone
        ("O=C1C=CC=CC=C1", 7, 7),              // tropone
        ("[cH-]1cccc1", 5, 5),                 // cyclopentadienide
        ("[CH+]1C=CC=CC=C1", 7, 7),            // tropylium
        ("C[n+]1ccccc1", 6, 6),                // N-methylpyridinium
        ("c1cc[o+]cc1", 6, 6),                 // pyrylium
        ("[O-][n+]1ccccc1", 6, 6),             // pyridine N-oxide
        ("C1=CC=CC=CC=C1", 0, 0),              // cyclooctatetraene
        ("C1=CC=C1", 0, 0),                    // cyclobutadiene
        ("O=C1NC(=O)C=C1", 0, 0),              // maleimide
        ("c1cnc2[nH]cnc2c1", 9, 10),           // imidazopyridine
        ("Cn1cnc2c1c(=O)n(C)c(=O)n2C", 9, 10), // caffeine
        ("C1=CC=CC1=C", 0, 0),                 // fulvene
        ("c1ccc2c(c1)[nH]c1ccccc12", 13, 15),  // carbazole
        ("O=c1ccc2ccccc2o1", 10, 11),          // coumarin
        ("c1ccc(-c2ccccc2)cc1", 12, 12),       // biphenyl: the link is not aromatic
        ("C1CC2=CC=CC=C2C1", 6, 6),            // indane
        ("B1C=CC=C1", 0, 0),                   // borole
        ("C1=CN=CN1", 5, 5),                   // imidazole, Kekulé input
        ("C=C1C=CC(=C)C=C1", 6, 6),            // p-xylylene (RDKit's model)
        ("*1ccccc1", 6, 6),                    // wildcard in a ring
        ("c1ccc2c(c1)-c1ccccc1-2", 12, 12),    // biphenylene
    ];
    for (s, atoms, bonds) in cases {
        assert_eq!(
            (aromatic_atoms(s), aromatic_bonds(s)),
            (atoms, bonds),
            "{s}"
        );
    }
}

#[test]
fn from_smiles_given_perimidine_leaves_central_atom_out_of_huckel_count() {
    // RDKit: only the naphthalene part of perimidine is aromatic (an atom in
    // three rings of a set does not count, RDKit issue #2895 behaviour).
    assert_eq!(aromatic_atoms("c1cc2cccc3c2c(c1)NC=N3"), 10);
}

// ----- kekulization errors -----

#[test]
fn from_smiles_given_five_aromatic_carbons_is_aromaticity_error() {
    let e = err("c1cccc1");
    assert_eq!(e.kind, ErrorKind::Aromaticity);
    assert!(e.position.is_some_and(|p| p < 7), "{e}");
}

#[test]
fn from_smiles_given_pyrrole_without_nh_points_at_nitrogen() {
    let e = err("c1ccnc1");
    assert_eq!(e.kind, ErrorKind::Aromaticity);
    assert!(e.message.contains("[nH]"), "{e}");
    assert_eq!(e.position, Some(4)); // the n
}

#[test]
fn from_smiles_given_aromatic_atom_outside_ring_is_error() {
    let e = err("c1ccccc1c");
    assert_eq!((e.kind, e.position), (ErrorKind::Aromaticity, Some(8)));
}

#[test]
fn from_smiles_given_odd_fused_aromatic_system_is_error() {
    // 13 aromatic carbons with one H each cannot pair up (fluorene written
    // all-aromatic); RDKit rejects it too.
    assert_eq!(err("c1ccc2c(c1)cc1ccccc12").kind, ErrorKind::Aromaticity);
}

// ----- valence -----

#[test]
fn from_smiles_given_pentavalent_carbon_is_valence_error() {
    let e = err("CC(C)(C)(C)C");
    assert_eq!((e.kind, e.position), (ErrorKind::Valence, Some(1)));
    assert!(e.message.contains("valence 5"), "{e}");
}

#[test]
fn from_smiles_given_hypervalent_main_group_atoms_accepts_them() {
    for s in [
        "CS(=O)(=O)C",          // sulfone
        "OP(=O)(O)O",           // phosphoric acid
        "FS(F)(F)(F)(F)F",      // SF6
        "C[N+](C)(C)C",         // tetramethylammonium
        "C[O+](C)C",            // trimethyloxonium
        "FI(F)F",               // IF3
        "O=[N+]([O-])c1ccccc1", // nitrobenzene
    ] {
        mol(s);
    }
}

#[test]
fn from_smiles_given_pentavalent_nitro_charge_separates_it() {
    // RDKit's clean-up convention: N(=O)=O is read as [N+](=O)[O-].
    let m = mol("CN(=O)=O");
    assert_eq!(m.atoms()[1].charge, 1);
    assert_eq!(m.atoms().iter().map(|a| a.charge as i32).sum::<i32>(), 0);
    assert_eq!(m.formula(), "CH3NO2");
}

#[test]
fn from_smiles_given_neutral_tetravalent_nitrogen_is_error() {
    assert_eq!(err("CN(C)(C)C").kind, ErrorKind::Valence);
}

// ----- rings -----

#[test]
fn ring_accessors_given_naphthalene_mark_fusion_atoms() {
    let m = mol("c1ccc2ccccc2c1");
    assert_eq!(m.sssr_count(), 2);
    let r: Vec<usize> = (0..10).map(|i| m.ring_count(i)).collect();
    assert_eq!(r, vec![1, 1, 1, 2, 1, 1, 1, 1, 2, 1]); // RDKit
    let x: Vec<usize> = (0..10).map(|i| m.ring_bond_count(i)).collect();
    assert_eq!(x, vec![2, 2, 2, 3, 2, 2, 2, 2, 3, 2]); // RDKit
    assert!((0..10).all(|i| m.smallest_ring(i) == 6));
    assert_eq!(
        m.bond_ring_count(m.bond_between(3, 8).unwrap_or(usize::MAX)),
        2
    );
}

#[test]
fn ring_accessors_given_cages_match_rdkit_symmetrized_rings() {
    // cubane: 6 four-membered rings, every atom in 3 (RDKit R3)
    let m = mol("C12C3C4C1C5C2C3C45");
    assert_eq!((m.ring_total(), m.sssr_count()), (6, 5));
    assert!((0..8).all(|i| m.ring_count(i) == 3 && m.smallest_ring(i) == 4));
    // bicyclo[2.2.2]octane: 3 six-membered rings, bridgeheads in 3 (RDKit)
    let m = mol("C1CC2CCC1CC2");
    assert_eq!(m.ring_total(), 3);
    let r: Vec<usize> = (0..8).map(|i| m.ring_count(i)).collect();
    assert_eq!(r, vec![2, 2, 3, 2, 2, 3, 2, 2]);
    // bicyclo[2.1.1]hexane: a 4-ring and two 5-rings (RDKit)
    let m = mol("C1CC2CC1C2");
    let r: Vec<usize> = (0..6).map(|i| m.smallest_ring(i)).collect();
    assert_eq!(r, vec![5, 5, 4, 4, 4, 4]);
    assert_eq!(m.ring_total(), 3);
    // norbornane: two 5-rings only
    assert_eq!(mol("C1CC2CCC1C2").ring_total(), 2);
}

#[test]
fn ring_accessors_given_para_cyclophane_macrocycle_match_rdkit_issue_3() {
    // Issue 3: the ring set must be RDKit's symmetrised SSSR, not the union
    // of all minimum cycle bases (which gives this macrocycle 16 large
    // rings). Values from RDKit 2026.09.1 RingInfo: 4 six-membered and 8
    // equivalent 23-membered rings; NumAtomRings, MinAtomRingSize and
    // NumBondRings per atom and bond as below.
    let m = mol("C1=Nc2ccc(cc2)N=Cc2ccc(cc2)OCc2cccc(n2)COc2ccc1cc2");
    assert_eq!((m.ring_total(), m.sssr_count()), (12, 5));
    let mut sizes: Vec<usize> = m.rings().map(|r| r.len()).collect();
    sizes.sort_unstable();
    assert_eq!(sizes, [6, 6, 6, 6, 23, 23, 23, 23, 23, 23, 23, 23]);
    let r: Vec<usize> = (0..m.atom_count()).map(|i| m.ring_count(i)).collect();
    assert_eq!(
        r,
        [
            8, 8, 9, 5, 5, 9, 5, 5, 8, 8, 9, 5, 5, 9, 5, 5, 8, 8, 9, 1, 1, 1, 9, 9, 8, 8, 9, 5, 5,
            9, 5, 5
        ]
    );
    let s: Vec<usize> = (0..m.atom_count()).map(|i| m.smallest_ring(i)).collect();
    assert_eq!(
        s,
        [
            23, 23, 6, 6, 6, 6, 6, 6, 23, 23, 6, 6, 6, 6, 6, 6, 23, 23, 6, 6, 6, 6, 6, 6, 23, 23,
            6, 6, 6, 6, 6, 6
        ]
    );
    // NumBondRings by the atoms each bond joins (RDKit numbers bonds
    // differently).
    for (x, y, rings) in [
        (0, 1, 8),
        (0, 29, 8),
        (1, 2, 8),
        (2, 3, 5),
        (2, 7, 5),
        (3, 4, 5),
        (4, 5, 5),
        (5, 6, 5),
        (5, 8, 8),
        (6, 7, 5),
        (8, 9, 8),
        (9, 10, 8),
        (10, 11, 5),
        (10, 15, 5),
        (11, 12, 5),
        (12, 13, 5),
        (13, 14, 5),
        (13, 16, 8),
        (14, 15, 5),
        (16, 17, 8),
        (17, 18, 8),
        (18, 19, 1),
        (18, 23, 9),
        (19, 20, 1),
        (20, 21, 1),
        (21, 22, 1),
        (22, 23, 9),
        (22, 24, 8),
        (24, 25, 8),
        (25, 26, 8),
        (26, 27, 5),
        (26, 31, 5),
        (27, 28, 5),
        (28, 29, 5),
        (29, 30, 5),
        (30, 31, 5),
    ] {
        let b = m.bond_between(x, y).unwrap_or(usize::MAX);
        assert_eq!(m.bond_ring_count(b), rings, "bond {x}-{y}");
    }
}

#[test]
fn ring_accessors_given_prismanes_and_moebius_ladder_match_rdkit_issue_3() {
    // Issue 3: cages where a smallest ring shares every bond with the other
    // chosen rings. RDKit 2026.09.1 RingInfo ring sizes, every atom in 3
    // rings (prismanes) or 8 (the Moebius ladder of 10 atoms).
    for (smiles, sizes, per_atom) in [
        // pentaprismane: 5 squares and both pentagons
        ("C12C3C4C1C1C2C2C3C4C12", vec![4, 4, 4, 4, 4, 5, 5], 3),
        // hexaprismane: 6 squares and both hexagons (not the 6-cycles
        // around two adjacent squares)
        (
            "C12C3C4C1C1C4C4C5C3C2C5C14",
            vec![4, 4, 4, 4, 4, 4, 6, 6],
            3,
        ),
        // Moebius ladder: 5 squares and 10 six-membered rings
        (
            "C12C3C4C1C1C4C4C2C3C14",
            vec![4, 4, 4, 4, 4, 6, 6, 6, 6, 6, 6, 6, 6, 6, 6],
            8,
        ),
    ] {
        let m = mol(smiles);
        let mut got: Vec<usize> = m.rings().map(|r| r.len()).collect();
        got.sort_unstable();
        assert_eq!(got, sizes, "{smiles}");
        assert!(
            (0..m.atom_count()).all(|i| m.ring_count(i) == per_atom),
            "{smiles}"
        );
    }
}

#[test]
fn ring_accessors_given_dative_metal_bonds_make_no_rings() {
    // A chelate written with plain bonds: the N-Pt bonds are dative, so the
    // five-membered chelate ring is not a ring (RDKit 2026.09.1: no rings,
    // NumAtomRings 0 everywhere).
    let m = mol("C1C[NH2][Pt](Cl)(Cl)[NH2]1");
    assert_eq!((m.ring_total(), m.sssr_count()), (0, 0));
    assert!((0..m.atom_count()).all(|i| !m.in_ring(i) && m.smallest_ring(i) == 0));
    assert!((0..m.bond_count()).all(|b| !m.bond_in_ring(b)));
}

#[test]
fn ring_accessors_given_spiro_compound_share_one_atom() {
    let m = mol("C1CCC2(CC1)CCCC2");
    let r: Vec<usize> = (0..10).map(|i| m.ring_count(i)).collect();
    assert_eq!(r, vec![1, 1, 1, 2, 1, 1, 1, 1, 1, 1]); // RDKit
    let s: Vec<usize> = (0..10).map(|i| m.smallest_ring(i)).collect();
    assert_eq!(s, vec![6, 6, 6, 5, 6, 6, 5, 5, 5, 5]); // RDKit
    assert_eq!(m.ring_bond_count(3), 4);
}

#[test]
fn ring_accessors_given_chain_have_no_rings() {
    let m = mol("CCC(=O)O");
    assert_eq!(m.ring_total(), 0);
    assert!(!m.in_ring(1));
    assert!(!m.bond_in_ring(0));
    assert_eq!(m.smallest_ring(0), 0);
}

#[test]
fn rings_given_macrocycle_walks_it_in_order() {
    let m = mol("C1CCCCCCCCCCC1");
    let rings: Vec<&[usize]> = m.rings().collect();
    assert_eq!(rings.len(), 1);
    assert_eq!(rings[0].len(), 12);
    let bonds = m.ring_bond_list(0);
    for (k, &b) in bonds.iter().enumerate() {
        let (x, y) = (rings[0][k], rings[0][(k + 1) % 12]);
        assert_eq!(m.bond_between(x, y), Some(b));
    }
}

// ----- components and formula -----

#[test]
fn components_given_sodium_acetate_pick_acetate_as_main() {
    let m = mol("[Na+].[O-]C(C)=O");
    assert_eq!(m.component_count(), 2);
    assert_eq!(m.main_component(), 1);
    assert_eq!(m.main_component_atoms(), vec![1, 2, 3, 4]);
    assert_eq!(m.counter_ions(), vec![vec![0]]);
    assert_eq!(m.formula(), "C2H3NaO2"); // issue 2 example
    assert_eq!(m.formula_of_atoms(&m.main_component_atoms()), "C2H3O2");
    assert_eq!(m.net_charge(), 0);
}

#[test]
fn components_given_largest_inorganic_part_prefer_organic_one() {
    // The sulfate is larger than methylammonium but has no carbon.
    let m = mol("OS(=O)(=O)O.CN");
    assert_eq!(m.main_component_atoms(), vec![5, 6]);
}

#[test]
fn formula_given_common_molecules_is_hill_order() {
    // Hill order: C, H, then alphabetical; without carbon all alphabetical.
    assert_eq!(mol("CC(C)=O").formula(), "C3H6O");
    assert_eq!(mol("ClCCl").formula(), "CH2Cl2");
    assert_eq!(mol("[13CH4]").formula(), "CH4");
    assert_eq!(mol("O").formula(), "H2O");
    assert_eq!(mol("OS(=O)(=O)O").formula(), "H2O4S");
    assert_eq!(mol("[Na+].[Cl-]").formula(), "ClNa");
    // Folded deuterium and tritium are written as D and T after H (issue 11;
    // RDKit's default formula merges them into H).
    assert_eq!(mol("[2H]OC").formula(), "CH3DO");
    assert_eq!(mol("[2H]C([3H])([2H])C(=O)C").formula(), "C3H3D2TO");
    assert_eq!(mol("[2H]O[2H]").formula(), "D2O");
}

// ----- hydrogens and accessors -----

#[test]
fn accessors_given_acetic_acid_count_connections() {
    let m = mol("CC(=O)O");
    assert_eq!(m.degree(1), 3);
    assert_eq!(m.total_connections(0), 4);
    assert_eq!(m.valence(1), 4);
    assert_eq!(m.valence(2), 2);
    assert_eq!(m.implicit_hydrogens(3), 1);
    assert_eq!(m.explicit_hydrogens(3), 0);
    let b = m.bond_between(1, 2).unwrap_or(usize::MAX);
    assert_eq!(m.bonds()[b].order, BondOrder::Double);
    assert_eq!(m.bond_between(0, 3), None);
}

#[test]
fn accessors_given_bracket_hydrogens_report_them_explicit() {
    let m = mol("C[NH3+]");
    assert_eq!(m.explicit_hydrogens(1), 3);
    assert_eq!(m.implicit_hydrogens(1), 0);
    assert_eq!(m.valence(1), 4);
}

#[test]
fn accessors_given_aromatic_ring_valence_uses_kekule_orders() {
    let m = mol("c1ccccc1");
    assert!((0..6).all(|i| m.valence(i) == 4));
}

#[test]
fn from_smiles_given_deuterated_methyl_counts_heavy_hydrogens() {
    let m = mol("[2H]C([2H])([2H])C(=O)C");
    assert_eq!(m.atom_count(), 4);
    assert_eq!(
        (m.atoms()[0].hydrogens, m.atoms()[0].heavy_hydrogens),
        (3, 3)
    );
    assert_eq!(
        (m.atoms()[3].hydrogens, m.atoms()[3].heavy_hydrogens),
        (3, 0)
    );
    let c = m.symmetry_classes();
    assert_ne!(c[0], c[3], "CD3 and CH3 are not equivalent");
}

// ----- symmetry -----

#[test]
fn symmetry_classes_given_acetone_pair_the_methyls() {
    let c = mol("CC(C)=O").symmetry_classes();
    assert_eq!(c[0], c[2]);
    assert_ne!(c[0], c[1]);
    assert_ne!(c[1], c[3]);
}

#[test]
fn symmetry_classes_given_diethyl_malonate_pair_the_ethoxy_groups() {
    // CCOC(=O)CC(=O)OCC: atoms 0/10, 1/9, 2/8, 3/6, 4/7 equivalent; 5 alone.
    let c = mol("CCOC(=O)CC(=O)OCC").symmetry_classes();
    for (a, b) in [(0, 10), (1, 9), (2, 8), (3, 6), (4, 7)] {
        assert_eq!(c[a], c[b], "atoms {a} and {b}");
    }
    let distinct: std::collections::BTreeSet<u32> = c.iter().copied().collect();
    assert_eq!(distinct.len(), 6);
}

#[test]
fn symmetry_classes_given_toluene_pair_ortho_and_meta() {
    let c = mol("Cc1ccccc1").symmetry_classes();
    assert_eq!(c[2], c[6]);
    assert_eq!(c[3], c[5]);
    assert_ne!(c[2], c[3]);
    assert_ne!(c[4], c[3]);
}

#[test]
fn symmetry_classes_given_reordered_smiles_agree() {
    let a = mol("OCC(C)=O");
    let b = mol("CC(=O)CO");
    // a: O0 C1 C2 C3 O4 ; b: C0 C1 O2 C3 O4 (same molecule)
    let (ca, cb) = (a.symmetry_classes(), b.symmetry_classes());
    let map = [(0, 4), (1, 3), (2, 1), (3, 0), (4, 2)];
    for (x, y) in map {
        assert_eq!(ca[x], cb[y]);
    }
}

// ----- errors -----

#[test]
fn error_display_given_position_shows_caret() {
    let e = err("CC(=O)X");
    assert_eq!(e.position, Some(6));
    let text = e.to_string();
    let lines: Vec<&str> = text.lines().collect();
    assert_eq!(lines[1], "  CC(=O)X");
    assert_eq!(lines[2], "        ^");
    assert_eq!(e.one_line(), lines[0]);
    assert!(!e.one_line().contains('\n'));
}

#[test]
fn from_smiles_given_doubled_backslash_explains_escape() {
    // Data files sometimes hold C/C=C\\C with an escaped backslash; RDKit
    // reads it, but it is not valid SMILES.
    let e = err("C/C=C\\\\C");
    assert_eq!((e.kind, e.position), (ErrorKind::Syntax, Some(6)));
    assert!(e.message.contains("escaped"), "{e}");
}

#[test]
fn from_smiles_given_unclosed_bracket_says_so() {
    let e = err("C[NH4");
    assert_eq!((e.kind, e.position), (ErrorKind::Syntax, Some(5)));
    assert!(e.message.contains("bracket"), "{e}");
}

#[test]
fn from_smiles_given_non_ascii_points_at_it() {
    let e = err("CCé");
    assert_eq!((e.kind, e.position), (ErrorKind::Syntax, Some(2)));
}

#[test]
fn from_smiles_given_deep_branches_does_not_overflow() {
    let s = format!("{}C{}", "C(".repeat(4000), ")".repeat(4000));
    let m = mol(&s);
    assert_eq!(m.atom_count(), 4001);
}

#[test]
fn from_smiles_given_aromatic_tellurium_reads_it() {
    // RDKit accepts [te]; purr does not know the symbol (issue 2 gap).
    let m = mol("OCc1cc[te]c1");
    assert_eq!(m.atoms()[5].element, 52);
    assert_eq!(aromatic_atoms("OCc1cc[te]c1"), 5); // RDKit
}

#[test]
fn from_smiles_given_cobalt_complex_treats_metal_bonds_as_dative() {
    // A neutral imine N bonded to Co has four bonds; RDKit reads the N-Co
    // bond as dative.
    let m = mol("C1=N2[Co]N3=CC=CC3=C2C=C1");
    let co = 2;
    assert!(m
        .neighbors(co)
        .iter()
        .any(|x| m.dative_donor(x.bond).is_some()));
    assert_eq!(m.valence(1), 3);
}

#[test]
fn from_smiles_given_ring_numbers_73_and_74_keeps_them_apart() {
    // Regression (issue 2): purr 0.9 reads %73 as ring 74.
    let m = mol("C%73CC%74CC%73CC%74");
    assert_eq!(m.bond_count(), 8);
    assert!(m.bond_between(0, 4).is_some());
    assert!(m.bond_between(2, 6).is_some());
    assert_eq!(m.sssr_count(), 2);
}

#[test]
fn from_smiles_given_parenthesised_ring_number_says_unsupported() {
    let e = err("C%(100)CC%(100)");
    assert_eq!((e.kind, e.position), (ErrorKind::Syntax, Some(2)));
    assert!(e.message.contains("above 99"), "{e}");
}

#[test]
fn smarts_hydrogen_counts_given_kept_hydrogen_atom_differ() {
    // [H][H] keeps both atoms; each has one hydrogen neighbour (SMARTS H1)
    // and no hydrogens off the graph (h0), as RDKit counts them.
    let m = mol("[H][H]");
    assert_eq!((m.smarts_total_h(0), m.smarts_implicit_h(0)), (1, 0));
    let m = mol("C[NH2]");
    assert_eq!((m.smarts_total_h(1), m.smarts_implicit_h(1)), (2, 2));
    assert_eq!((m.smarts_total_h(0), m.smarts_implicit_h(0)), (3, 3));
}

#[test]
fn to_petgraph_given_molecule_keeps_indices() {
    let m = mol("CC(=O)O");
    let g = m.to_petgraph();
    assert_eq!((g.node_count(), g.edge_count()), (4, 3));
    let e = g.find_edge(
        petgraph::graph::NodeIndex::new(1),
        petgraph::graph::NodeIndex::new(2),
    );
    assert_eq!(
        e.and_then(|e| g.edge_weight(e)).copied(),
        m.bond_between(1, 2)
    );
}
