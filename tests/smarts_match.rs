//! Unit tests of the SMARTS matcher, one per primitive and operator
//! (issue 3). Every expected count was checked with RDKit 2026.09
//! (`len(mol.GetSubstructMatches(Chem.MolFromSmarts(p), uniquify=True))`)
//! unless a comment says otherwise.

use acidsite::mol::Molecule;
use acidsite::smarts::{Pattern, Target};

fn mol(smiles: &str) -> Molecule {
    Molecule::from_smiles(smiles).unwrap_or_else(|e| panic!("{smiles}: {e}"))
}

fn count(pattern: &str, smiles: &str) -> usize {
    let p = Pattern::parse(pattern).unwrap_or_else(|e| panic!("{pattern}: {e}"));
    p.count_unique(&mol(smiles))
}

#[test]
fn count_unique_given_branch_in_small_ring_is_non_induced() {
    // Issue 3: isobutyraldehyde pattern in methyl cyclopropanecarboxylate;
    // an induced matcher misses it because C-C(ring)-C is closed by a bond.
    assert_eq!(count("CC(C)C=O", "COC(=O)C1CC1"), 1);
}

#[test]
fn count_unique_given_symmetric_pattern_counts_each_atom_set_once() {
    assert_eq!(count("CCC", "CC(C)C"), 3);
    assert_eq!(count("C(C)(C)C", "CC(C)(C)C"), 4);
    assert_eq!(count("C1CC1", "C1CC1"), 1);
}

#[test]
fn count_unique_given_element_symbols() {
    assert_eq!(count("[#6]", "CCO"), 2);
    assert_eq!(count("C", "c1ccccc1C"), 1);
    assert_eq!(count("c", "c1ccccc1C"), 6);
    assert_eq!(count("[Cl]", "ClCCl"), 2);
    assert_eq!(count("Cl", "ClCCl"), 2);
    assert_eq!(count("Br", "BrC"), 1);
    assert_eq!(count("[Sn]", "C[Sn](C)(C)C"), 1);
    assert_eq!(count("[#7]", "c1ccncc1N"), 2);
}

#[test]
fn count_unique_given_nh_reads_as_nitrogen_with_hydrogen() {
    // RDKit reads [Nh] as N & h (nihonium is not a SMARTS symbol there).
    assert_eq!(count("[Nh]", "CN"), 1);
}

#[test]
fn count_unique_given_wildcard_and_aromaticity_primitives() {
    assert_eq!(count("*", "CCO"), 3);
    assert_eq!(count("A", "c1ccccc1O"), 1);
    assert_eq!(count("a", "c1ccccc1O"), 6);
}

#[test]
fn count_unique_given_total_hydrogen_count() {
    assert_eq!(count("[H3]", "CCO"), 1);
    assert_eq!(count("[CH3]", "CC(C)O"), 2);
    assert_eq!(count("[CH0]", "CC(C)(C)O"), 1);
    assert_eq!(count("[NH2]", "NCC[NH3+]"), 1);
    // Folded explicit hydrogens count too (RDKit removes them into the atom).
    assert_eq!(count("[CH3]", "[H]C([H])([H])C"), 2);
}

#[test]
fn count_unique_given_implicit_hydrogen_count() {
    // RDKit's h counts the hydrogens carried by the atom, bracket or not.
    assert_eq!(count("[h]", "CC(C)(C)O"), 4);
    assert_eq!(count("[h3]", "C[CH2]O"), 1);
    assert_eq!(count("[h2]", "C[CH2]O"), 1);
}

#[test]
fn count_unique_given_degree() {
    assert_eq!(count("[D1]", "CC(C)O"), 3);
    assert_eq!(count("[D3]", "CC(C)O"), 1);
    assert_eq!(count("[D]", "CC(C)O"), 3);
}

#[test]
fn count_unique_given_total_connections() {
    assert_eq!(count("[X4]", "CC(C)O"), 3);
    assert_eq!(count("[X2]", "CC(C)O"), 1);
    assert_eq!(count("[X]", "C"), 0);
}

#[test]
fn count_unique_given_valence() {
    assert_eq!(count("[v4]", "C[N+](C)(C)C"), 5);
    assert_eq!(count("[v3]", "CN"), 1);
    assert_eq!(count("[v2]", "C=O"), 1);
    assert_eq!(count("[v]", "C=O"), 0);
}

#[test]
fn count_unique_given_ring_membership_count() {
    assert_eq!(count("[R]", "C1CC1C"), 3);
    assert_eq!(count("[R0]", "C1CC1C"), 1);
    // Norbornane: two five-membered SSSR rings share three atoms.
    assert_eq!(count("[R2]", "C1CC2CCC1C2"), 3);
    assert_eq!(count("[R1]", "C1CC2CCC1C2"), 4);
    // Cubane: RDKit keeps all six faces, so every atom is in three rings.
    assert_eq!(count("[R3]", "C12C3C4C1C5C2C3C45"), 8);
}

#[test]
fn count_unique_given_smallest_ring_size() {
    assert_eq!(count("[r5]", "C1CC2CCC1C2"), 7);
    assert_eq!(count("[r6]", "c1ccc2ccccc2c1"), 10);
    assert_eq!(count("[r]", "C1CC1C"), 3);
    assert_eq!(count("[r3]", "C1CC1C1CCCC1"), 3);
}

#[test]
fn count_unique_given_ring_bond_count() {
    assert_eq!(count("[x2]", "C1CC2CCC1C2"), 5);
    assert_eq!(count("[x3]", "C1CC2CCC1C2"), 2);
    assert_eq!(count("[x]", "C1CC1C"), 3);
    assert_eq!(count("[x0]", "C1CC1C"), 1);
}

#[test]
fn count_unique_given_charges() {
    assert_eq!(count("[+]", "C[N+](C)(C)C"), 1);
    assert_eq!(count("[-]", "CC(=O)[O-]"), 1);
    assert_eq!(count("[+0]", "C[N+](C)(C)C"), 4);
    assert_eq!(count("[++]", "[Ca++]"), 1);
    assert_eq!(count("[+2]", "[Ca+2]"), 1);
    assert_eq!(count("[--]", "[O-2]"), 1);
    assert_eq!(count("[-2]", "[O--]"), 1);
    assert_eq!(count("[-1]", "[O-]C[O-]"), 2);
}

#[test]
fn count_unique_given_isotopes() {
    assert_eq!(count("[13C]", "[13CH3]C"), 1);
    assert_eq!(count("[12C]", "[13CH3]C"), 0);
    assert_eq!(count("[13#6]", "[13CH3]C"), 1);
}

#[test]
fn count_unique_given_not_operator() {
    assert_eq!(count("[!C]", "CCO"), 1);
    assert_eq!(count("[!!C]", "CCO"), 2);
    assert_eq!(count("[!C;!N]", "CC(=O)N"), 1);
}

#[test]
fn count_unique_given_and_operators() {
    assert_eq!(count("[C&X4]", "CC=O"), 1);
    assert_eq!(count("[CX4]", "CC=O"), 1);
}

#[test]
fn count_unique_given_or_operator() {
    assert_eq!(count("[C,O]", "CCN"), 2);
}

#[test]
fn count_unique_given_operator_precedence() {
    // ';' binds loosest, then ',', then '&' / juxtaposition.
    assert_eq!(count("[C,N;X3]", "CC(=O)N"), 2);
    assert_eq!(count("[C;X3,X4]", "CC(=O)N"), 2);
    assert_eq!(count("[C,N&X3]", "CC(=O)N"), 3);
    assert_eq!(count("[N,C&X3]", "CC(=O)N"), 2);
}

#[test]
fn count_unique_given_recursive_smarts() {
    assert_eq!(count("[$(CO)]", "CCOC"), 2);
    assert_eq!(count("[C;!$(C=O)]", "CC(=O)C"), 2);
    assert_eq!(count("[$([C;$(C=O)])]", "CC(=O)C"), 1);
    assert_eq!(count("[$(C=O),$(C#N)]", "CC(=O)CC#N"), 2);
}

#[test]
fn count_unique_given_bond_orders() {
    assert_eq!(count("C-C", "CC=CC"), 2);
    assert_eq!(count("C=C", "CC=CC"), 1);
    assert_eq!(count("C#C", "CC#C"), 1);
    assert_eq!(count("c:c", "c1ccccc1"), 6);
    assert_eq!(count("C~C", "CC=CC#C"), 4);
}

#[test]
fn count_unique_given_implicit_bond_is_single_or_aromatic() {
    assert_eq!(count("c-c", "c1ccccc1-c1ccccc1"), 1);
    assert_eq!(count("cc", "c1ccccc1-c1ccccc1"), 13);
    assert_eq!(count("c!:c", "c1ccccc1-c1ccccc1"), 1);
}

#[test]
fn count_unique_given_ring_bond_primitive() {
    assert_eq!(count("*@*", "C1CC1CC"), 3);
    assert_eq!(count("*!@*", "C1CC1CC"), 2);
    assert_eq!(count("C-&!@C", "C1CC1CC"), 2);
    assert_eq!(count("C-;@C", "C1CC1CC"), 3);
}

#[test]
fn count_unique_given_bond_logic() {
    assert_eq!(count("C-,=C", "CC=CC#C"), 3);
    assert_eq!(count("C!-C", "CC=CC#C"), 2);
}

#[test]
fn count_unique_given_ring_closures() {
    assert_eq!(count("C1CC1", "C1CC1"), 1);
    assert_eq!(count("C1CCC1", "C1CC1"), 0);
    assert_eq!(count("C%10CC%10", "C1CC1"), 1);
    assert_eq!(count("C%(10)CC%(10)", "C1CC1"), 1);
    assert_eq!(count("C-1CC1", "C1CC1"), 1);
    assert_eq!(count("C=1CC1", "C1CC1"), 0);
}

#[test]
fn count_unique_given_dot_components() {
    assert_eq!(count("C.C", "CC"), 1);
    assert_eq!(count("C.O", "CCO"), 2);
    assert_eq!(count("[OH].[OH]", "OCCO"), 1);
}

#[test]
fn anchor_given_map_label_one() {
    let p = Pattern::parse("O=C[CH2:1]").unwrap();
    assert_eq!(p.anchor(), Some(2));
    assert_eq!(p.anchor_or_first(), 2);
    assert_eq!(p.map_label(2), Some(1));
    assert_eq!(p.atom_with_map(1), Some(2));
    let q = Pattern::parse("CC=O").unwrap();
    assert_eq!(q.anchor(), None);
    assert_eq!(q.anchor_or_first(), 0);
}

#[test]
fn matches_at_given_anchor_on_alpha_carbon() {
    // Butan-2-one CC(=O)CC: alpha carbons are atoms 0 and 3; atom 4 is beta
    // (common practice).
    let m = mol("CC(=O)CC");
    let p = Pattern::parse("[CX4;!H0:1][CX3](=O)[#6]").unwrap();
    assert!(p.matches_at(&m, 0).is_some());
    assert!(p.matches_at(&m, 3).is_some());
    assert!(p.matches_at(&m, 4).is_none());
    assert!(p.matches_at(&m, 1).is_none());
    assert!(p.matches_at(&m, 99).is_none());
    let hit = p.matches_at(&m, 3).unwrap();
    assert_eq!(hit[0], 3);
    assert_eq!(hit[1], 1);
    assert_eq!(p.anchored_atoms(&m), vec![0, 3]);
}

#[test]
fn matches_at_all_given_two_carbonyl_partners() {
    // Pentane-2,4-dione: C3 is alpha to both carbonyls (common practice).
    let m = mol("CC(=O)CC(C)=O");
    let p = Pattern::parse("[CH2:1]C=O").unwrap();
    assert_eq!(p.matches_at_all(&m, 3).len(), 2);
    assert_eq!(p.matches_at_all(&m, 0).len(), 0);
}

#[test]
fn unique_matches_given_pattern_maps_every_pattern_atom() {
    let m = mol("OCC(=O)O");
    let p = Pattern::parse("C(=O)[OH]").unwrap();
    let all = p.unique_matches(&m);
    assert_eq!(all, vec![vec![2, 3, 4]]);
}

#[test]
fn count_unique_in_given_shared_target_equals_per_call() {
    let m = mol("CC(=O)OCC(C#N)c1ccccc1");
    let t = Target::new(&m);
    for s in ["[CX4;!H0]", "c", "C#N", "[$(C=O)]", "*~*", "[R]"] {
        let p = Pattern::parse(s).unwrap();
        assert_eq!(p.count_unique_in(&t), p.count_unique(&m), "{s}");
    }
}

#[test]
fn passes_screen_given_missing_element_is_false() {
    let m = mol("CCO");
    let t = Target::new(&m);
    assert!(!Pattern::parse("C#N").unwrap().passes_screen(&t));
    assert!(!Pattern::parse("[R]").unwrap().passes_screen(&t));
    assert!(Pattern::parse("CO").unwrap().passes_screen(&t));
}

#[test]
fn ring_count_given_cages_follows_rdkit_symmetrised_sssr() {
    // RDKit 2026.09 RingInfo sizes: norbornane [5, 5]; bicyclo[2.2.2]octane
    // [6, 6, 6]; cubane six 4-rings; the tricycle below [4, 6, 6, 6, 6];
    // the para-cyclophane macrocycle 4 benzene rings + 8 equivalent
    // 23-membered rings.
    for (smiles, rings) in [
        ("C1CC2CCC1C2", 2),
        ("C1CC2CCC1CC2", 3),
        ("C12C3C4C1C5C2C3C45", 6),
        ("CC12CCC(=NNC(N)=O)C3C1CCCC32", 5),
        ("C1=Nc2ccc(cc2)N=Cc2ccc(cc2)OCc2cccc(n2)COc2ccc1cc2", 12),
        ("c1ccc2ccccc2c1", 2),
        ("CCO", 0),
    ] {
        let m = mol(smiles);
        assert_eq!(Target::new(&m).ring_count(), rings, "{smiles}");
    }
}

#[test]
fn atom_ring_count_given_bicyclooctane_bridgeheads() {
    // RDKit 2026.09 NumAtomRings for C1CC2CCC1CC2: [2, 2, 3, 2, 2, 3, 2, 2].
    let m = mol("C1CC2CCC1CC2");
    let t = Target::new(&m);
    let got: Vec<u8> = (0..m.atom_count()).map(|a| t.atom_ring_count(a)).collect();
    assert_eq!(got, vec![2, 2, 3, 2, 2, 3, 2, 2]);
}

#[test]
fn bond_in_ring_given_spiro_and_chain() {
    // Spiro[4.4]nonane with a methyl: every ring bond is in a ring, the
    // methyl bond is not (common practice).
    let m = mol("CC1CCC2(C1)CCCC2");
    let t = Target::new(&m);
    assert!(t.has_ring());
    assert!(!t.bond_in_ring(0));
    assert!((1..m.bond_count()).all(|b| t.bond_in_ring(b)));
    assert_eq!(t.ring_bond_count(4), 4);
    assert_eq!(t.smallest_ring(4), 5);
    assert_eq!(t.smallest_ring(0), 0);
    assert!(!Target::new(&mol("CC(C)CO")).has_ring());
}

#[test]
fn atom_ring_count_given_long_spiro_chain() {
    // 100 cyclopentanes joined by 99 spiro atoms (structure from memory):
    // each spiro atom is in two rings, every other ring atom in one.
    let mut s = String::from("C1CCC");
    let mut prev = 1;
    for _ in 1..100 {
        let next = if prev == 1 { 2 } else { 1 };
        s.push_str(&format!("C{next}(C{prev})CC"));
        prev = next;
    }
    s.push_str(&format!("C{prev}"));
    assert_eq!(count("[R2]", &s), 99);
    assert_eq!(count("[R1]", &s), 302);
    assert_eq!(Target::new(&mol(&s)).ring_count(), 100);
}

#[test]
fn ring_count_given_huge_ring_block_stays_fast() {
    // Two 700-atom paths between two atoms plus a bond between them: one
    // block of 1,402 atoms and cycle rank 2, whose two 702-membered rings
    // are found directly (issue 3: hostile input stays cheap; exact, no
    // approximation; common practice).
    let s = format!("C12{}C1{}C2", "C".repeat(700), "C".repeat(700));
    let m = mol(&s);
    let t = Target::new(&m);
    assert_eq!(t.ring_count(), 2);
    assert_eq!(count("[R0]", &s), 0);
}

#[test]
fn count_unique_given_dative_metal_bonds() {
    // Amine to platinum bonds are dative in RDKit 2026.09 (and in our
    // molecule core): only `~` matches them, the donor's valence leaves them
    // out, degree counts them, and they make no rings. Counts checked with
    // RDKit 2026.09.
    let s = "C[NH2][Pt](Cl)(Cl)[NH2]C";
    assert_eq!(count("[#7]-[Pt]", s), 0);
    assert_eq!(count("[#7][Pt]", s), 0);
    assert_eq!(count("[#7]~[Pt]", s), 2);
    assert_eq!(count("[#7]!-[Pt]", s), 2);
    assert_eq!(count("[N;v3]", s), 2);
    assert_eq!(count("[N;X4]", s), 2);
    assert_eq!(count("[Pt;D4]", s), 1);
    assert_eq!(count("[Pt;v4]", s), 1);
    let chelate = "C1C[NH2][Pt]2([NH2]1)[NH2]CC[NH2]2";
    assert_eq!(count("*@*", chelate), 0);
    assert_eq!(count("[R]", chelate), 0);
}

#[test]
fn target_given_ring_queries_is_shareable_between_threads() {
    // The ring data now lives in the molecule (issue 3: one ring
    // perception), so a prepared target can be shared between threads.
    fn shareable<T: Send + Sync>(_: &T) {}
    let m = mol("C12C3C4C1C5C2C3C45");
    let t = Target::new(&m);
    shareable(&t);
    // Cubane: six four-membered rings, every atom in three (RDKit 2026.09.1).
    assert_eq!(t.ring_count(), 6);
    assert!((0..m.atom_count()).all(|a| t.atom_ring_count(a) == 3 && t.smallest_ring(a) == 4));
}

#[test]
fn matches_at_given_ring_pattern_on_chain_and_ring_needs_the_ring() {
    // Common practice: a pattern written as a ring matches only atoms of a
    // ring of the molecule (the ring screen must not change this).
    let p = Pattern::parse("[CH2:1]1CCCCC1").expect("parses");
    assert!(p.matches_at(&mol("C1CCCCC1"), 0).is_some());
    assert!(p.matches_at(&mol("CCCCCCC"), 1).is_none());
    // A six-membered pattern ring does not fit a five-membered ring.
    assert!(p.matches_at(&mol("C1CCCC1"), 0).is_none());
    // Alternatives allowing several elements: the molecule needs one.
    let q = Pattern::parse("[CX4:1][Cl,Br,I]").expect("parses");
    assert!(q.matches_at(&mol("CCBr"), 1).is_some());
    assert!(q.matches_at(&mol("CCF"), 1).is_none());
}
