//! Per-rule cost of the anchored class-rule matching over a SMILES list
//! (development aid): `cargo run --release --example rule_probe FILE`.
use acidsite::mol::Molecule;
use acidsite::smarts::Target;
use std::time::Instant;

fn main() {
    let path = std::env::args().nth(1).unwrap_or_default();
    let text = std::fs::read_to_string(&path).unwrap_or_default();
    let Ok(rules) = acidsite::sites::rules() else {
        return;
    };
    let mut tries = vec![0u64; rules.len()];
    let mut hits = vec![0u64; rules.len()];
    let mut nanos = vec![0u128; rules.len()];
    for line in text.lines().skip(1) {
        let Ok(mol) = Molecule::from_smiles(line.trim()) else {
            continue;
        };
        let t = Target::new(&mol);
        for (i, a) in mol.atoms.iter().enumerate() {
            if a.hydrogens == 0 {
                continue;
            }
            for (r, rule) in rules.iter().enumerate() {
                if rule.element != a.symbol() {
                    continue;
                }
                let t0 = Instant::now();
                let m = rule.pattern.matches_at_in(&t, i);
                nanos[r] += t0.elapsed().as_nanos();
                tries[r] += 1;
                if m.is_some() {
                    hits[r] += 1;
                    break;
                }
            }
        }
    }
    let mut order: Vec<usize> = (0..rules.len()).collect();
    order.sort_by_key(|&r| std::cmp::Reverse(nanos[r]));
    for r in order.into_iter().take(25) {
        println!(
            "{:>12} {:>8} {:>6} {:<12} {}",
            nanos[r], tries[r], hits[r], rules[r].id, rules[r].smarts
        );
    }
}
