//! Never-panic property test of the molecule core (issue 2): random SMILES-
//! alphabet strings and mutations of real SMILES from the reference corpus.
//! Every result must be a molecule whose indices are consistent, or an error
//! whose position lies inside the input.
//!
//! Cases: 100,000 in release builds, 20,000 in debug builds; set
//! ACIDSITE_FUZZ_CASES for a longer run, e.g.
//! `ACIDSITE_FUZZ_CASES=2000000 cargo test --release --test mol -- mol_fuzz::`.

use acidsite::mol::Molecule;
use proptest::prelude::*;
use proptest::test_runner::{Config, TestRunner};
use std::path::Path;
use std::sync::atomic::{AtomicUsize, Ordering};

const ALPHABET: &[&str] = &[
    "C", "c", "N", "n", "O", "o", "S", "s", "P", "p", "B", "b", "F", "Cl", "Br", "I", "H", "*",
    "[", "]", "(", ")", "=", "#", "$", ":", "/", "\\", "-", "+", ".", "@", "@@", "%", "1", "2",
    "3", "9", "0", "%10", "[nH]", "[NH4+]", "[2H]", "[H]", "[C@@H]", "[O-]", "[n+]", "[Fe+2]",
    "[Co]", "[te]", "[se]", "[13C]", "[CH2:1]", "TB1", "OH1", "SP2", "AL1", "@TB1", "@OH12",
    "[C@OH1H]", "c1ccccc1", "C1CC1", "é", " ", "\t", "Xx", "[U]", "[Na+]",
];

fn corpus() -> Vec<String> {
    let dir = Path::new(env!("CARGO_MANIFEST_DIR")).join("corpus/mol");
    let mut out = Vec::new();
    for name in ["chembl", "hiv", "tox21", "clintox", "freesolv"] {
        if let Ok(text) = std::fs::read_to_string(dir.join(format!("{name}.tsv"))) {
            for line in text.lines().skip(2) {
                if let Some(s) = line.split('\t').next() {
                    out.push(s.to_string());
                }
            }
        }
    }
    out
}

/// One edit of a character vector.
#[derive(Debug, Clone)]
enum Edit {
    Insert(usize, usize),
    Delete(usize),
    Replace(usize, usize),
    Duplicate(usize, usize),
    Swap(usize, usize),
    Truncate(usize),
}

fn apply(s: &str, edits: &[Edit]) -> String {
    let mut c: Vec<char> = s.chars().collect();
    for e in edits {
        let n = c.len().max(1);
        match *e {
            Edit::Insert(at, k) => {
                let piece: Vec<char> = ALPHABET[k % ALPHABET.len()].chars().collect();
                let at = at % (c.len() + 1);
                c.splice(at..at, piece);
            }
            Edit::Delete(at) if !c.is_empty() => {
                c.remove(at % n);
            }
            Edit::Replace(at, k) if !c.is_empty() => {
                let piece: Vec<char> = ALPHABET[k % ALPHABET.len()].chars().collect();
                let at = at % n;
                c.splice(at..at + 1, piece);
            }
            Edit::Duplicate(at, len) if !c.is_empty() => {
                let from = at % n;
                let to = (from + 1 + len % 12).min(c.len());
                let part: Vec<char> = c[from..to].to_vec();
                c.splice(to..to, part);
            }
            Edit::Swap(a, b) if !c.is_empty() => c.swap(a % n, b % n),
            Edit::Truncate(at) => c.truncate(at % (c.len() + 1)),
            _ => {}
        }
    }
    c.into_iter().collect()
}

fn edit() -> impl Strategy<Value = Edit> {
    prop_oneof![
        (any::<usize>(), any::<usize>()).prop_map(|(a, k)| Edit::Insert(a, k)),
        any::<usize>().prop_map(Edit::Delete),
        (any::<usize>(), any::<usize>()).prop_map(|(a, k)| Edit::Replace(a, k)),
        (any::<usize>(), any::<usize>()).prop_map(|(a, k)| Edit::Duplicate(a, k)),
        (any::<usize>(), any::<usize>()).prop_map(|(a, b)| Edit::Swap(a, b)),
        any::<usize>().prop_map(Edit::Truncate),
    ]
}

static ACCEPTED: AtomicUsize = AtomicUsize::new(0);

/// Check a result fully; panics (fails the property) on an inconsistency.
fn check(s: &str) {
    let n_chars = s.chars().count();
    let result = Molecule::from_smiles(s);
    if result.is_ok() {
        ACCEPTED.fetch_add(1, Ordering::Relaxed);
    }
    match result {
        Err(e) => {
            if let Some(p) = e.position {
                assert!(p <= n_chars, "position {p} beyond input {s:?}");
            }
            let _ = e.to_string();
            let _ = e.one_line();
        }
        Ok(m) => {
            let n = m.atom_count();
            for a in m.atoms() {
                assert!(
                    a.span.start < a.span.end && a.span.end <= n_chars,
                    "span in {s:?}"
                );
                assert!(a.heavy_hydrogens <= a.hydrogens);
            }
            for (k, b) in m.bonds().iter().enumerate() {
                assert!(b.atoms[0] < n && b.atoms[1] < n && b.atoms[0] != b.atoms[1]);
                assert!(m.neighbors(b.atoms[0]).iter().any(|x| x.bond == k));
                assert!((1..=4).contains(&b.kekule));
            }
            for i in 0..n {
                let _ = (
                    m.valence(i),
                    m.total_connections(i),
                    m.ring_count(i),
                    m.smallest_ring(i),
                );
                let _ = (
                    m.component_of(i),
                    m.explicit_hydrogens(i),
                    m.implicit_hydrogens(i),
                );
            }
            for r in m.rings() {
                assert!(r.len() >= 3 && r.iter().all(|&a| a < n));
            }
            assert_eq!(m.symmetry_classes().len(), n);
            let _ = (m.formula(), m.main_component_atoms(), m.counter_ions());
        }
    }
}

fn cases() -> u32 {
    std::env::var("ACIDSITE_FUZZ_CASES")
        .ok()
        .and_then(|v| v.parse().ok())
        .unwrap_or(if cfg!(debug_assertions) {
            20_000
        } else {
            100_000
        })
}

#[test]
fn from_smiles_given_random_and_mutated_input_never_panics() {
    let real = corpus();
    assert!(!real.is_empty(), "corpus/mol is missing");
    let total = cases();
    // Half the cases mutate real SMILES, half are random token strings.
    let config = Config {
        cases: total / 2,
        failure_persistence: None,
        ..Config::default()
    };
    let mut runner = TestRunner::new(config.clone());
    let mutated = (0..real.len(), proptest::collection::vec(edit(), 1..4));
    runner
        .run(&mutated, |(k, edits)| {
            check(&apply(&real[k], &edits));
            Ok(())
        })
        .unwrap_or_else(|e| panic!("{e}"));
    let accepted = ACCEPTED.load(Ordering::Relaxed);
    eprintln!(
        "{} mutated SMILES, {accepted} of them still valid",
        total / 2
    );
    // The mutations must keep exercising perception, not only the parser.
    assert!(
        accepted * 20 > (total / 2) as usize,
        "only {accepted} mutated inputs were valid"
    );
    let mut runner = TestRunner::new(config);
    let random = proptest::collection::vec(0..ALPHABET.len(), 0..40);
    runner
        .run(&random, |tokens| {
            let s: String = tokens.iter().map(|&k| ALPHABET[k]).collect();
            check(&s);
            Ok(())
        })
        .unwrap_or_else(|e| panic!("{e}"));
}

#[test]
fn from_smiles_given_known_hostile_inputs_returns() {
    // Regression inputs for issue 2: purr's graph builder panics on the
    // first; the others probe limits.
    for s in [
        "F[C@OH1H](Cl)Br",
        "F[C@TB1H](Cl)Br",
        "F[C@SP1H](Cl)Br",
        "F[C@AL1H](Cl)Br",
        "C%99CC%99",
        "C%9",
        "[",
        "]",
        "(",
        ")",
        "C)",
        "C((C))",
        "C1CC1.1",
        "[HH]",
        "[H+]",
        "[H-][H+]",
        "[999C]",
        "[C:999]",
        "[C+15]",
        "[C--]",
        "*",
        "**",
        "[*]",
        "c",
        "n1cccc1",
        "c1cc2cc1",
        "C12C3C4C1C5C2C3C45",
        ".",
        "C..C",
        "C=1=C1",
    ] {
        check(s);
    }
    let long_chain = "C".repeat(9_999);
    check(&long_chain);
    let rings: String = (0..2000).map(|_| "C1CC1").collect::<Vec<_>>().join(".");
    check(&rings);
    let ladder = format!("C1{}C1", "C2CC2".repeat(1000));
    check(&ladder);
    let graphite = "c1cc2ccc3ccc4ccc5ccc6ccc1c1c2c3c4c5c61".repeat(30);
    check(&graphite);
    check(&"(".repeat(100_000));
    check(&"[".repeat(300_000));
}
