//! Unit tests of the molecule core. Expected values are from memory /
//! common practice of organic chemistry unless a source is named.

use super::*;

fn mol(s: &str) -> Molecule {
    match Molecule::from_smiles(s) {
        Ok(m) => m,
        Err(e) => panic!("{s}: {e}"),
    }
}

fn err(s: &str) -> MolError {
    match Molecule::from_smiles(s) {
        Ok(_) => panic!("{s}: expected an error"),
        Err(e) => e,
    }
}

fn hs(m: &Molecule) -> Vec<u8> {
    m.atoms.iter().map(|a| a.hydrogens).collect()
}

#[test]
fn from_smiles_given_ethanol_counts_hydrogens() {
    let m = mol("CCO");
    assert_eq!(hs(&m), vec![3, 2, 1]);
    assert_eq!(m.total_hydrogens(), 6);
    assert_eq!(m.neighbors(1).len(), 2);
}

#[test]
fn from_smiles_given_benzene_gives_one_h_per_carbon() {
    let m = mol("c1ccccc1");
    assert_eq!(hs(&m), vec![1; 6]);
}

#[test]
fn from_smiles_given_pyrrole_keeps_bracket_h() {
    let m = mol("c1cc[nH]c1");
    assert_eq!(hs(&m), vec![1, 1, 1, 1, 1]);
    assert_eq!(m.atoms[3].element, 7);
    assert!(m.atoms[3].bracket);
}

#[test]
fn from_smiles_given_naphthalene_fusion_carbons_have_no_h() {
    let m = mol("c1ccc2ccccc2c1");
    assert_eq!(hs(&m), vec![1, 1, 1, 0, 1, 1, 1, 1, 0, 1]);
}

#[test]
fn from_smiles_given_explicit_hydrogens_folds_them() {
    // CD3 group: three deuteriums folded into the carbon.
    let m = mol("[2H]C([2H])([2H])C(=O)O[H]");
    assert_eq!(m.atom_count(), 4);
    assert_eq!(m.atoms[0].hydrogens, 3);
    assert_eq!(m.atoms[0].heavy_hydrogens, 3);
    assert_eq!(m.atoms[3].hydrogens, 1);
    assert_eq!(m.atoms[3].heavy_hydrogens, 0);
    assert_eq!(m.atoms[0].span, 4..5);
    assert_eq!(m.atoms[1].span, 17..18);
    assert_eq!(m.explicit_hydrogens(0), 3);
    assert_eq!(m.implicit_hydrogens(0), 0);
}

#[test]
fn from_smiles_given_hydrogen_molecule_keeps_atoms() {
    let m = mol("[H][H]");
    assert_eq!(m.atom_count(), 2);
    assert_eq!(m.total_hydrogens(), 2);
}

#[test]
fn from_smiles_given_bracket_atom_reads_fields() {
    let m = mol("[13CH3:7][N+](C)(C)C");
    let a = &m.atoms[0];
    assert_eq!(
        (
            a.element,
            a.isotope,
            a.hydrogens,
            a.map,
            a.bracket,
            a.span.clone()
        ),
        (6, Some(13), 3, Some(7), true, 0..9)
    );
    assert_eq!(m.atoms[1].charge, 1);
    assert_eq!(m.atoms[1].hydrogens, 0);
    assert_eq!(m.atoms[1].span, 9..13);
}

#[test]
fn from_smiles_given_two_letter_symbols_spans_them() {
    let m = mol("ClCBr");
    assert_eq!(m.atoms[0].span, 0..2);
    assert_eq!(m.atoms[1].span, 2..3);
    assert_eq!(m.atoms[2].span, 3..5);
    assert_eq!(m.atoms[2].element, 35);
}

#[test]
fn from_smiles_given_hypervalent_sulfur_uses_next_valence() {
    // DMSO: S has valence 4 with no H; sulfuric acid S valence 6.
    assert_eq!(hs(&mol("CS(=O)C")), vec![3, 0, 0, 3]);
    assert_eq!(hs(&mol("OS(=O)(=O)O")), vec![1, 0, 0, 0, 1]);
}

#[test]
fn from_smiles_given_non_tetrahedral_stereo_does_not_panic() {
    // purr's own graph builder panics on this input (issue 2).
    let m = mol("F[C@OH1H](Cl)Br");
    assert_eq!(m.atoms[1].hydrogens, 1);
    let m = mol("F[C@TB1H](Cl)Br");
    assert_eq!(m.atoms[1].hydrogens, 1);
}

#[test]
fn from_smiles_given_empty_input_is_empty_error() {
    assert_eq!(err("").kind, ErrorKind::Empty);
    assert_eq!(err("   ").kind, ErrorKind::Empty);
}

#[test]
fn from_smiles_given_bad_character_points_at_it() {
    let e = err("CC(X)C");
    assert_eq!((e.kind, e.position), (ErrorKind::Syntax, Some(3)));
    assert_eq!(
        e.to_string(),
        "syntax error at character 3: unexpected character 'X'\n  CC(X)C\n     ^"
    );
}

#[test]
fn from_smiles_given_unclosed_branch_points_at_end() {
    let e = err("CC(C");
    assert_eq!((e.kind, e.position), (ErrorKind::Syntax, Some(4)));
    assert!(e.message.contains("branch"));
}

#[test]
fn from_smiles_given_unclosed_ring_points_at_digit() {
    let e = err("C1CCC2CC1");
    assert_eq!((e.kind, e.position), (ErrorKind::RingClosure, Some(5)));
    let e = err("CC%12CC");
    assert_eq!((e.kind, e.position), (ErrorKind::RingClosure, Some(2)));
}

#[test]
fn from_smiles_given_ring_bond_conflict_is_error() {
    let e = err("C=1CCC-1");
    assert_eq!((e.kind, e.position), (ErrorKind::RingClosure, Some(7)));
    let e = err("C11");
    assert_eq!((e.kind, e.position), (ErrorKind::RingClosure, Some(2)));
    let e = err("C12CCC12");
    assert_eq!((e.kind, e.position), (ErrorKind::RingClosure, Some(7)));
}

#[test]
fn from_smiles_given_ring_closure_bond_order_uses_either_end() {
    let m = mol("C=1CCCC1");
    assert_eq!(hs(&m), vec![1, 2, 2, 2, 1]);
}

#[test]
fn from_smiles_given_mixture_keeps_every_atom() {
    let m = mol("[Na+].[O-]C(C)=O");
    assert_eq!(m.atom_count(), 5);
    assert_eq!(hs(&m), vec![0, 0, 0, 3, 0]);
}

#[test]
fn from_smiles_given_long_chain_reads_it() {
    let s = "C".repeat(5000);
    let m = mol(&s);
    assert_eq!(m.atom_count(), 5000);
    assert_eq!(m.total_hydrogens(), 2 * 5000 + 2);
}

#[test]
fn from_smiles_given_too_many_atoms_is_too_large() {
    let s = "C".repeat(MAX_ATOMS + 1);
    assert_eq!(err(&s).kind, ErrorKind::TooLarge);
}

#[test]
fn neighbors_given_out_of_range_index_is_empty() {
    let m = mol("CC");
    assert!(m.neighbors(7).is_empty());
}
