//! Parser tests: accepted syntax, and errors that name the problem and its
//! 0-based character position (issue 3). Positions are counted by hand
//! from the pattern text.

use acidsite::smarts::{Pattern, PatternError, MAX_ATOMS, MAX_RECURSION_DEPTH};
use proptest::prelude::*;

fn err(pattern: &str) -> PatternError {
    match Pattern::parse(pattern) {
        Ok(_) => panic!("{pattern} should not parse"),
        Err(e) => e,
    }
}

fn assert_err(pattern: &str, position: usize, words: &str) {
    let e = err(pattern);
    assert_eq!(e.position, position, "{pattern}: {e}");
    assert!(
        e.message.contains(words),
        "{pattern}: message {:?} lacks {words:?}",
        e.message
    );
    assert_eq!(e.pattern, pattern);
}

#[test]
fn parse_given_unclosed_bracket() {
    assert_err("[C", 0, "unclosed bracket");
    assert_err("CC[N", 2, "unclosed bracket");
}

#[test]
fn parse_given_unclosed_branch() {
    assert_err("C(", 1, "unclosed branch");
    assert_err("CC(C(C)", 2, "unclosed branch");
}

#[test]
fn parse_given_unclosed_recursion() {
    assert_err("[$(C]", 1, "unclosed recursive");
    assert_err("[$(C", 1, "unclosed recursive");
}

#[test]
fn parse_given_unclosed_ring() {
    assert_err("C1CC", 1, "unclosed ring closure 1");
    assert_err("C%12CC", 1, "unclosed ring closure 12");
}

#[test]
fn parse_given_unsupported_features() {
    assert_err("[C@H](F)Cl", 2, "chirality");
    assert_err("[C@@H]", 2, "chirality");
    assert_err("[$foo]", 1, "macros");
    assert_err("CC>>CC", 2, "reaction");
    assert_err("C/C=C/C", 1, "directional");
    assert_err("C\\C", 1, "directional");
    assert_err("C$C", 1, "quadruple");
    assert_err("[C^2]", 2, "hybridisation");
    assert_err("[Cz1]", 2, "'z' is not supported");
    assert_err("(C).(C)", 0, "component grouping");
    assert_err("C{1-3}", 1, "ranges");
}

#[test]
fn parse_given_malformed_logic() {
    assert_err("[C;]", 3, "missing primitive");
    assert_err("[!]", 2, "missing primitive");
    assert_err("[,C]", 1, "missing primitive");
    assert_err("[]", 1, "empty bracket");
}

#[test]
fn parse_given_malformed_structure() {
    assert_err("", 0, "empty");
    assert_err("C)", 1, "unmatched ')'");
    assert_err("C]", 1, "unmatched ']'");
    assert_err("C-", 1, "bond without a following atom");
    assert_err("-C", 0, "bond without a preceding atom");
    assert_err(".C", 0, "'.'");
    assert_err("C.", 1, "'.'");
    assert_err("C..C", 2, "'.'");
    assert_err("C()", 2, "empty branch");
    assert_err("C11", 2, "itself");
    assert_err("C12CC12", 6, "duplicates");
    assert_err("C%1C", 1, "two digits");
    assert_err("[#300]", 2, "larger than 255");
    assert_err("[C:]", 3, "atom-map number");
}

#[test]
fn parse_given_deep_recursion_is_bounded() {
    let mut s = String::from("C");
    for _ in 0..MAX_RECURSION_DEPTH {
        s = format!("[$({s})]");
    }
    assert!(Pattern::parse(&s).is_ok());
    let deeper = format!("[$({s})]");
    let e = err(&deeper);
    assert!(e.message.contains("nested deeper"), "{e}");
}

#[test]
fn parse_given_hostile_nesting_does_not_overflow() {
    // 100,000 nested branches: parsed iteratively, rejected for size.
    let s = "C(".repeat(100_000) + "C" + &")".repeat(100_000);
    let e = err(&s);
    assert!(e.message.contains("more than"), "{e}");
    let t = "[$(".repeat(50_000);
    assert!(Pattern::parse(&t).is_err());
}

#[test]
fn parse_given_too_many_atoms() {
    let s = "C".repeat(MAX_ATOMS + 1);
    assert_err(&s, MAX_ATOMS, "more than");
}

#[test]
fn parse_given_supported_syntax() {
    for s in [
        "C",
        "c1ccccc1",
        "[CX4;!$(C(F)(F)F):1][CX3](=O)[#6]",
        "[#6]!@[#7]",
        "C%(123)CC%(123)",
        "[13C]",
        "[2H]",
        "[H+]",
        "[Cl-]",
        "[N+](=O)[O-]",
        "[C,N;!R0&x2]",
        "*~*",
        "[A;a]",
        "[h]",
        "[h0]",
        "[v4]",
        "[D]",
        "[X]",
        "[R]",
        "[r]",
        "[x]",
        "[+]",
        "[--]",
        "[+3]",
        "C-,=;@C",
        "[Co]",
        "[Sc]",
        "[se]",
        "[as]",
        "[Nh]",
        "C.C",
        "C(.C)C",
        "C(-C)(=O)",
        "[$([OH]-c),$([OH]-C=O)]",
        "[Hg]",
        "[He]",
    ] {
        if let Err(e) = Pattern::parse(s) {
            panic!("{s}: {e}");
        }
    }
}

#[test]
fn parse_given_atom_and_bond_counts() {
    let p = Pattern::parse("CC(C)C=O").unwrap();
    assert_eq!(p.atom_count(), 5);
    assert_eq!(p.bond_count(), 4);
    let r = Pattern::parse("C1CC1").unwrap();
    assert_eq!(r.bond_count(), 3);
    let q = Pattern::parse("[CH2:1]C(=O)[$(O)]").unwrap();
    assert_eq!(q.atom_count(), 4);
    assert_eq!(q.atom_position(2), Some(10));
}

#[test]
fn display_given_error_names_position() {
    let e = err("C(");
    assert_eq!(
        e.to_string(),
        "SMARTS error at character 1: unclosed branch '('"
    );
}

/// Molecules with charges, metals, isotopes, cages and aromatic rings
/// (structures from memory or from the reference sample).
const PROP_MOLECULES: &[&str] = &[
    "CC(=O)c1ccc[nH]1",
    "C12C3C4C1C5C2C3C45",
    "[2H]C([2H])([2H])C(=O)[O-].[Na+]",
    "C[N+](=O)[O-]",
    "CCCC[Sn](CCCC)(CCCC)Cl",
    "c1ccc2cc3ccccc3cc2c1",
    "C1CN2CN3CN4CCN5CN6CN1[Cu-5]524([SH+]c1nnc6s1)[SH+]c1nnc3s1",
];

proptest! {
    #![proptest_config(ProptestConfig::with_cases(2000))]
    #[test]
    fn parse_given_arbitrary_text_never_panics(s in "[CcNnOo\\[\\]()=#:~@!&,;$%*+\\-0-9HhDXvRrxAa.>/]{0,24}") {
        if let Ok(p) = Pattern::parse(&s) {
            for smiles in PROP_MOLECULES {
                let m = acidsite::mol::Molecule::from_smiles(smiles).unwrap();
                let t = acidsite::smarts::Target::new(&m);
                let _ = p.count_unique_limited(&t, 100_000);
                let _ = p.anchored_atoms_limited(&t, 100_000);
                for a in 0..m.atom_count() + 1 {
                    let _ = p.matches_at_in(&t, a);
                }
            }
        }
    }
}

/// Pieces that often make a valid pattern when strung together.
const TOKENS: &[&str] = &[
    "C",
    "c",
    "N",
    "n",
    "O",
    "S",
    "*",
    "[C,N]",
    "[!#6;R]",
    "[CH2]",
    "[$(C=O)]",
    "[n;H1]",
    "[R2]",
    "[x3]",
    "[+]",
    "[r5]",
    "[v4]",
    "[D3]",
    "[X4]",
    "[h]",
    "[a;!c]",
    "[$([#7]~*)]",
    "(",
    ")",
    "1",
    "2",
    "%10",
    "=",
    "#",
    ":",
    "~",
    "@",
    "!-",
    "-,=",
    ".",
    "[O-]",
    "[N+]",
];

proptest! {
    #![proptest_config(ProptestConfig::with_cases(1000))]
    #[test]
    fn count_unique_limited_given_token_patterns_never_panics(
        tokens in proptest::collection::vec(proptest::sample::select(TOKENS), 1..14)
    ) {
        let s: String = tokens.concat();
        if let Ok(p) = Pattern::parse(&s) {
            for smiles in PROP_MOLECULES {
                let m = acidsite::mol::Molecule::from_smiles(smiles).unwrap();
                let t = acidsite::smarts::Target::new(&m);
                let bounded = p.count_unique_limited(&t, 1_000_000);
                if let Ok(n) = bounded {
                    prop_assert_eq!(n, p.unique_matches_in(&t).len());
                }
                let scan = p.anchored_atoms_limited(&t, 1_000_000);
                if let Ok(atoms) = scan {
                    let per_atom: Vec<usize> = (0..m.atom_count())
                        .filter(|&a| p.matches_at_in(&t, a).is_some())
                        .collect();
                    prop_assert_eq!(atoms, per_atom);
                }
            }
        }
    }
}
