//! Matcher throughput benchmark (issue 3): a set of anchored patterns over
//! a SMILES list, one core.
//!
//! Usage:
//!   cargo run --release --example smarts_bench -- [SMILES_FILE] [PATTERN_FILE] [MAX_MOLECULES]
//!
//! Defaults: ../shared/data/moses/moses_test.csv (first column, header
//! skipped), corpus/smarts/bench_patterns.txt, all molecules. Prints reading
//! time, then the anchored scan (every atom where each pattern's anchor
//! matches) and the unique-match count, as molecules/s and
//! patterns x molecules/s. The molecule reading is timed apart from matching.

use acidsite::mol::Molecule;
use acidsite::smarts::{Pattern, Target};
use std::time::Instant;

fn main() {
    let args: Vec<String> = std::env::args().collect();
    let smiles_path = args
        .get(1)
        .cloned()
        .unwrap_or_else(|| "../shared/data/moses/moses_test.csv".to_string());
    let pattern_path = args
        .get(2)
        .cloned()
        .unwrap_or_else(|| "corpus/smarts/bench_patterns.txt".to_string());
    let limit: usize = args
        .get(3)
        .and_then(|s| s.parse().ok())
        .unwrap_or(usize::MAX);

    let pattern_text = match std::fs::read_to_string(&pattern_path) {
        Ok(t) => t,
        Err(e) => {
            eprintln!("cannot read {pattern_path}: {e}");
            std::process::exit(1);
        }
    };
    let mut patterns = Vec::new();
    for line in pattern_text.lines() {
        let line = line.trim();
        if line.is_empty() || line.starts_with('#') {
            continue;
        }
        match Pattern::parse(line) {
            Ok(p) => patterns.push(p),
            Err(e) => {
                eprintln!("{line}: {e}");
                std::process::exit(1);
            }
        }
    }
    let text = match std::fs::read_to_string(&smiles_path) {
        Ok(t) => t,
        Err(e) => {
            eprintln!("cannot read {smiles_path}: {e}");
            std::process::exit(1);
        }
    };
    let lines: Vec<&str> = text
        .lines()
        .skip(1)
        .filter_map(|l| l.split([',', '\t', ' ']).next())
        .filter(|s| !s.is_empty())
        .take(limit)
        .collect();

    let t0 = Instant::now();
    let mut mols = Vec::with_capacity(lines.len());
    let mut failed = 0usize;
    for s in &lines {
        match Molecule::from_smiles(s) {
            Ok(m) => mols.push(m),
            Err(_) => failed += 1,
        }
    }
    let read = t0.elapsed().as_secs_f64();
    let n = mols.len() as f64;
    let k = patterns.len() as f64;
    println!(
        "read {} molecules ({} failed) in {:.3} s: {:.0} molecules/s",
        mols.len(),
        failed,
        read,
        n / read
    );

    let t1 = Instant::now();
    let mut atoms = 0usize;
    for m in &mols {
        atoms += Target::new(m).atom_count();
    }
    let prep = t1.elapsed().as_secs_f64();
    println!(
        "prepare targets (rings, counts): {:.3} s: {:.0} molecules/s ({:.1} atoms/molecule)",
        prep,
        n / prep,
        atoms as f64 / n
    );

    let t2 = Instant::now();
    let mut hits = 0usize;
    for m in &mols {
        let t = Target::new(m);
        for p in &patterns {
            hits += p.anchored_atoms_in(&t).len();
        }
    }
    let anchored = t2.elapsed().as_secs_f64();
    println!(
        "anchored scan, {} patterns: {:.3} s: {:.0} molecules/s, {:.2e} patterns x molecules/s, {} anchor hits",
        patterns.len(),
        anchored,
        n / anchored,
        n * k / anchored,
        hits
    );

    let t3 = Instant::now();
    let mut total = 0usize;
    for m in &mols {
        let t = Target::new(m);
        for p in &patterns {
            total += p.count_unique_in(&t);
        }
    }
    let unique = t3.elapsed().as_secs_f64();
    println!(
        "unique-match count, {} patterns: {:.3} s: {:.0} molecules/s, {:.2e} patterns x molecules/s, {} matches",
        patterns.len(),
        unique,
        n / unique,
        n * k / unique,
        total
    );
}
