//! Internal consistency of the matcher's entry points over the reference
//! sample (issue 3): the one-pass anchored scan agrees with per-atom
//! anchored matching, unique matches agree with their count, every match
//! is a real embedding of the pattern graph, and bounded searches agree
//! with unbounded ones. No external values: the checks compare our own
//! functions with each other.

use acidsite::mol::Molecule;
use acidsite::smarts::{LimitReached, Pattern, Target};

const PATTERNS: &str = include_str!("../corpus/smarts/patterns.tsv");
const MOLECULES: &str = include_str!("../corpus/smarts/molecules.tsv");

fn patterns() -> Vec<(String, Pattern)> {
    PATTERNS
        .lines()
        .filter(|l| !l.is_empty() && !l.starts_with('#'))
        .map(|l| {
            let f: Vec<&str> = l.split('\t').collect();
            (f[0].to_string(), Pattern::parse(f[1]).expect("pattern"))
        })
        .collect()
}

fn molecules(n: usize) -> Vec<(String, Molecule)> {
    MOLECULES
        .lines()
        .filter(|l| !l.is_empty() && !l.starts_with('#'))
        // Every 10th molecule: a spread over all sources.
        .step_by(10)
        .take(n)
        .filter_map(|l| {
            let f: Vec<&str> = l.split('\t').collect();
            Molecule::from_smiles(f[2])
                .ok()
                .map(|m| (f[0].to_string(), m))
        })
        .collect()
}

#[test]
fn anchored_atoms_in_given_sample_equals_per_atom_matches_at() {
    let pats = patterns();
    for (id, m) in molecules(150) {
        let t = Target::new(&m);
        for (name, p) in &pats {
            let scan = p.anchored_atoms_in(&t);
            let per_atom: Vec<usize> = (0..m.atom_count())
                .filter(|&a| p.matches_at_in(&t, a).is_some())
                .collect();
            assert_eq!(scan, per_atom, "{id} {name}");
            for a in 0..m.atom_count() {
                let all = p.matches_at_all_in(&t, a);
                assert_eq!(
                    all.is_empty(),
                    !per_atom.contains(&a),
                    "{id} {name} atom {a}"
                );
                for mm in &all {
                    assert_eq!(mm[p.anchor_or_first()], a, "{id} {name}");
                }
            }
        }
    }
}

#[test]
fn unique_matches_in_given_sample_are_embeddings_counted_once() {
    let pats = patterns();
    for (id, m) in molecules(240) {
        let t = Target::new(&m);
        for (name, p) in &pats {
            let all = p.unique_matches_in(&t);
            assert_eq!(all.len(), p.count_unique_in(&t), "{id} {name}");
            assert_eq!(!all.is_empty(), p.is_match_in(&t), "{id} {name}");
            let mut keys: Vec<Vec<usize>> = Vec::new();
            for mm in &all {
                assert_eq!(mm.len(), p.atom_count(), "{id} {name}");
                let mut key = mm.clone();
                key.sort_unstable();
                key.dedup();
                assert_eq!(key.len(), mm.len(), "{id} {name}: atom used twice");
                keys.push(key);
            }
            for mm in &all {
                for [x, y] in p.bond_atoms() {
                    assert!(
                        m.bond_between(mm[x], mm[y]).is_some(),
                        "{id} {name}: pattern bond {x}-{y} has no molecule bond"
                    );
                }
            }
            keys.sort();
            keys.dedup();
            assert_eq!(keys.len(), all.len(), "{id} {name}: duplicate atom set");
            if !all.is_empty() {
                assert!(p.passes_screen(&t), "{id} {name}: screen rejected a match");
            }
        }
    }
}

#[test]
fn count_unique_limited_given_enough_steps_equals_unbounded() {
    let pats = patterns();
    for (id, m) in molecules(60) {
        let t = Target::new(&m);
        for (name, p) in &pats {
            assert_eq!(
                p.count_unique_limited(&t, 1 << 40),
                Ok(p.count_unique_in(&t)),
                "{id} {name}"
            );
        }
    }
}

#[test]
fn count_unique_limited_given_general_pattern_stops() {
    // A long chain of wildcards over a large ring system (from memory:
    // coronene-like fused rings) has a great many embeddings.
    let m = Molecule::from_smiles("c1cc2ccc3ccc4ccc5ccc6ccc1c7c2c3c4c5c67").expect("smiles");
    let t = Target::new(&m);
    let p = Pattern::parse("*~*~*~*~*~*~*~*~*~*~*~*").expect("pattern");
    assert_eq!(
        p.count_unique_limited(&t, 10_000),
        Err(LimitReached { max_steps: 10_000 })
    );
    assert!(p.anchored_atoms_limited(&t, 10).is_err());
}

#[test]
fn pattern_given_threads_is_send_and_sync() {
    fn check<T: Send + Sync>() {}
    check::<Pattern>();
}
