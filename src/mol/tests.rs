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

/// Reference SMILES of `corpus/mol` (first column of the data files).
fn corpus_smiles() -> Vec<String> {
    let dir = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("corpus/mol");
    let mut out = Vec::new();
    for name in [
        "chembl",
        "hiv",
        "tox21",
        "clintox",
        "freesolv",
        "rdkit_rejects",
    ] {
        if let Ok(text) = std::fs::read_to_string(dir.join(format!("{name}.tsv"))) {
            for line in text.lines().skip(1) {
                if let Some(s) = line.split('\t').next() {
                    out.push(s.to_string());
                }
            }
        }
    }
    out
}

fn same_reading(s: &str) {
    let direct = format!("{:?}", read::read_raw_with(s, true));
    let purr = format!("{:?}", read::read_raw_with(s, false));
    assert_eq!(direct, purr, "input {s:?}");
}

#[test]
fn read_raw_given_direct_reader_matches_purr_on_corpus_and_mutations() {
    // The direct reader of the common subset must give exactly what purr's
    // reader gives (atoms, bonds, spans, errors) on real SMILES and on
    // single-character mutations of them (deterministic choice).
    let real = corpus_smiles();
    assert!(real.len() > 1000, "corpus/mol is missing");
    let alphabet: Vec<char> = "CcNnOo()[]=#$:/\\.%0123456789@+-HBrClSsPpFI*te:"
        .chars()
        .collect();
    let mut seed = 0x2545_F491_4F6C_DD1Du64;
    let mut next = |m: usize| {
        seed ^= seed << 13;
        seed ^= seed >> 7;
        seed ^= seed << 17;
        (seed % m.max(1) as u64) as usize
    };
    for s in &real {
        same_reading(s);
        let chars: Vec<char> = s.chars().collect();
        for _ in 0..12 {
            let mut c = chars.clone();
            let k = next(c.len() + 1);
            match next(3) {
                0 if k < c.len() => {
                    c.remove(k);
                }
                1 => c.insert(k, alphabet[next(alphabet.len())]),
                _ if k < c.len() => c[k] = alphabet[next(alphabet.len())],
                _ => c.push(')'),
            }
            same_reading(&c.into_iter().collect::<String>());
        }
    }
}

#[test]
fn read_raw_given_unusual_syntax_matches_purr() {
    // Branches, dots, ring-closure bond orders and bracket forms the direct
    // reader handles or hands to purr (common practice of SMILES writing).
    for s in [
        "C(C.C)C",
        "C(.C)C",
        "C.(C)",
        "C=1CC1",
        "C1CC=1",
        "C-1CC=1",
        "C=1CC-1",
        "[nH]1cccc1",
        "C(C)(C)C",
        "C()C",
        "C(",
        "C)",
        "C((C))",
        "C1.C1",
        "C%1",
        "C%",
        "C%12CC%12",
        "C%00CC%00",
        "[C@@H](F)(Cl)Br",
        "At",
        "[At]",
        "Ts",
        "CAt",
        "C[te]1cccc1",
        "C$C",
        "C:C",
        "C/C=C\\C",
        "C/1=C/F.C1",
        "F/C=C\\1.C\\1",
        "C/1=C/F.C/1",
        "[C@]1(F)(Cl)CCC1",
        "F[C@]([H])(Cl)Br",
        "C[C@@H]1CC[C@@H](C)CC1",
        "C1CC1(",
        "C(C)1CC1",
        "C=(C)",
        "C.",
        ".C",
        "C..C",
        "1C",
        "C1CC11",
        "C11",
        "CC(=O)O.[Na+]",
        "[13CH3:7][2H]",
        "[C]]",
        "[[C]",
        "[C",
        "C]",
        "[CH5+3:99]",
        "[Xx]",
        "Bb",
        "Clc1ccccc1Br",
        "B",
        "BrBr",
        "C(Cl)(Br)I",
        "*1***1",
        "[*:1]C",
        "c1ccc2c(c1)cccc2",
        "C12CC1C2",
        "C(=C)",
        "C(#N)",
        "C(C)C)",
        "CC((C)",
        "C\\\\C",
        "C//C",
        "C=-C",
        "C 1",
        "C\t",
        "C1CC1 ",
        "",
        " ",
        "é",
        "Cé",
    ] {
        same_reading(s);
    }
}

#[test]
fn neighbors_given_corpus_molecules_list_each_atoms_bonds_in_bond_order() {
    // Rows must equal a plain scan of the bond list (bond order, other atom).
    let mut checked = 0;
    for s in corpus_smiles() {
        let Ok(m) = Molecule::from_smiles(&s) else {
            continue;
        };
        for i in 0..m.atom_count() {
            let expected: Vec<Neighbor> = m
                .bonds
                .iter()
                .enumerate()
                .filter(|(_, b)| b.atoms.contains(&i))
                .map(|(k, b)| Neighbor {
                    atom: b.other(i),
                    bond: k,
                })
                .collect();
            assert_eq!(m.neighbors(i), expected.as_slice(), "{s} atom {i}");
        }
        checked += 1;
    }
    assert!(checked > 1000);
}

#[test]
fn read_raw_given_long_stereo_input_matches_purr_issue12() {
    // Over the direct reader's atom limit, purr reads on its own thread;
    // both paths must keep the same stereo marks and neighbour keys.
    let centres: String = (0..1200)
        .map(|i| if i % 2 == 1 { "[C@H](F)" } else { "[C@@H](Cl)" })
        .collect();
    let chain = format!("C{centres}/C=C/C1CC[C@H](O)CC1");
    assert!(chain.len() > 1500);
    same_reading(&chain);
    let m = Molecule::from_smiles(&chain).unwrap();
    assert_eq!(m.chirality().len(), 1201);
    assert_eq!(m.double_bond_stereo().len(), 1);
    // And a short one read by both paths gives the same molecule stereo.
    for s in ["F/C=C/[C@@H](O)C1CC[C@]2(CC1)OC2", "C/1=C/F.C/1"] {
        same_reading(s);
    }
}
