//! The layout and the SVG writer never panic and always give finite
//! coordinates (issue 12): every molecule of the reference corpora that `mol`
//! accepts is drawn, and a property test draws random SMILES-alphabet
//! strings and mutations of real SMILES.

use acidsite::depict::{self, Marks, SiteMark, SvgOptions};
use acidsite::mol::Molecule;
use proptest::prelude::*;
use proptest::test_runner::{Config, TestRunner};
use std::path::Path;

fn corpus() -> Vec<String> {
    let root = Path::new(env!("CARGO_MANIFEST_DIR"));
    let mut out = Vec::new();
    for entry in std::fs::read_dir(root.join("corpus/mol")).unwrap() {
        let p = entry.unwrap().path();
        if p.extension().is_some_and(|e| e == "tsv") {
            let text = std::fs::read_to_string(&p).unwrap();
            for line in text.lines().filter(|l| !l.starts_with('#')) {
                if let Some(s) = line.split('\t').next() {
                    out.push(s.to_string());
                }
            }
        }
    }
    let bulk = std::fs::read_to_string(root.join("corpus/bulk/real.smi")).unwrap();
    for line in bulk.lines().filter(|l| !l.starts_with('#')) {
        if let Some(s) = line.split_whitespace().next() {
            out.push(s.to_string());
        }
    }
    out
}

/// Lay out and draw; check every point is finite and every atom is in the SVG.
fn draw_checked(m: &Molecule) {
    let lay = depict::layout(m);
    assert_eq!(lay.points.len(), m.atom_count());
    assert!(lay.points.iter().all(|p| p.is_finite()));
    let marks = Marks {
        sites: vec![SiteMark {
            rank: 1,
            atoms: vec![0, m.atom_count()],
            pka: Some(20.0),
        }],
        target: Some(vec![0]),
    };
    let svg = depict::svg(m, &lay, &marks, &SvgOptions::default());
    assert_eq!(svg.matches("data-atom=").count(), m.atom_count());
    assert!(!svg.contains("NaN") && !svg.contains("inf"));
}

#[test]
fn layout_given_every_corpus_molecule_draws_without_panic() {
    let (mut drawn, mut refused) = (0usize, 0usize);
    for s in corpus() {
        match Molecule::from_smiles(&s) {
            Ok(m) => {
                draw_checked(&m);
                drawn += 1;
            }
            Err(_) => refused += 1,
        }
    }
    println!("drew {drawn} corpus molecules ({refused} refused by mol)");
    assert!(drawn > 9_000);
}

const ALPHABET: &[&str] = &[
    "C",
    "c",
    "N",
    "n",
    "O",
    "S",
    "(",
    ")",
    "=",
    "#",
    "1",
    "2",
    "3",
    "4",
    "%10",
    ".",
    "[Na+]",
    "[O-]",
    "[nH]",
    "c1ccccc1",
    "C1CC1",
    "C1CCCCCCCCCCCC1",
    "[C@@H]",
    "[13CH3]",
    "Cl",
    "Br",
    "C=C=C",
    "C#C",
    "[NH3+]",
    "C12CC3CC(C1)CC(C2)C3",
];

#[test]
fn layout_given_random_smiles_never_panics() {
    let corpus = corpus();
    let mut runner = TestRunner::new(Config {
        cases: 3000,
        failure_persistence: None,
        ..Config::default()
    });
    let strat = (
        0..corpus.len(),
        proptest::collection::vec((0..ALPHABET.len(), 0usize..200, any::<bool>()), 0..8),
    );
    runner
        .run(&strat, |(k, edits)| {
            let mut s = corpus[k].clone();
            for (tok, at, delete) in edits {
                let mut chars: Vec<char> = s.chars().collect();
                let at = at % (chars.len() + 1);
                if delete && at < chars.len() {
                    chars.remove(at);
                } else {
                    for (i, c) in ALPHABET[tok].chars().enumerate() {
                        chars.insert(at + i, c);
                    }
                }
                s = chars.into_iter().collect();
            }
            if let Ok(m) = Molecule::from_smiles(&s) {
                draw_checked(&m);
            }
            Ok(())
        })
        .unwrap();
}
