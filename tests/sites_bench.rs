//! Throughput of `find_sites` on drug-like molecules (benchmark, not a
//! timed test). Run once, in release:
//!
//! ```text
//! cargo test --release --test sites -- sites_bench:: --ignored --nocapture
//! ```
//!
//! Molecules: the MOSES test split (`../shared/data/moses/moses_test.csv`,
//! MIT, ZINC clean leads) when present, else the ChEMBL sample in
//! `corpus/mol/chembl.tsv`. Parsing is done first and not timed.

use std::time::Instant;

use acidsite::mol::Molecule;
use acidsite::sites::find_sites;

fn load() -> (String, Vec<Molecule>) {
    let moses = "../shared/data/moses/moses_test.csv";
    let (label, smiles): (String, Vec<String>) = match std::fs::read_to_string(moses) {
        Ok(t) => (
            moses.into(),
            t.lines()
                .skip(1)
                .take(50_000)
                .map(|l| l.trim().to_string())
                .collect(),
        ),
        Err(_) => {
            let t = std::fs::read_to_string("corpus/mol/chembl.tsv").expect("chembl sample");
            let mut cols: Vec<&str> = Vec::new();
            let mut out = Vec::new();
            for l in t.lines().filter(|l| !l.starts_with('#')) {
                let cells: Vec<&str> = l.split('\t').collect();
                if cols.is_empty() {
                    cols = cells;
                    continue;
                }
                let i = cols.iter().position(|c| c.contains("smiles")).unwrap_or(0);
                if let Some(s) = cells.get(i) {
                    out.push(s.to_string());
                }
            }
            ("corpus/mol/chembl.tsv".into(), out)
        }
    };
    let mols = smiles
        .iter()
        .filter_map(|s| Molecule::from_smiles(s).ok())
        .collect();
    (label, mols)
}

#[test]
#[ignore = "benchmark: run with --ignored in release"]
fn find_sites_given_drug_like_set_reports_throughput() {
    let (label, mols) = load();
    assert!(!mols.is_empty());
    acidsite::sites::rule_set().expect("rules");
    // Warm-up pass.
    let mut sites = 0usize;
    for m in mols.iter().take(1000) {
        sites += find_sites(m).sites.len();
    }
    let rounds = 3;
    let t = Instant::now();
    for _ in 0..rounds {
        for m in &mols {
            sites += find_sites(m).sites.len();
        }
    }
    let secs = t.elapsed().as_secs_f64();
    let n = mols.len() * rounds;
    println!(
        "find_sites: {n} molecules from {label} in {secs:.3} s = {:.0} molecules/s on one core ({} sites seen)",
        n as f64 / secs,
        sites
    );
}
