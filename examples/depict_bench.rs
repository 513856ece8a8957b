//! Layout speed: molecules per second for `depict::layout` (and, separately,
//! layout + SVG) over a SMILES list, one core.
//!
//! `cargo run --release --example depict_bench -- ../shared/data/moses/moses_test.csv [N]`
//! (first column of a CSV with a header, or a .smi file; N molecules, default 20,000).

use acidsite::depict::{self, Marks, SvgOptions};
use acidsite::mol::Molecule;
use std::time::Instant;

fn main() {
    let mut args = std::env::args().skip(1);
    let path = args
        .next()
        .unwrap_or_else(|| "../shared/data/moses/moses_test.csv".into());
    let limit: usize = args.next().and_then(|n| n.parse().ok()).unwrap_or(20_000);
    let text = std::fs::read_to_string(&path).expect("cannot read the SMILES list");
    let mols: Vec<Molecule> = text
        .lines()
        .filter(|l| !l.starts_with('#') && !l.eq_ignore_ascii_case("smiles"))
        .filter_map(|l| l.split([',', ' ', '\t']).next())
        .filter_map(|s| Molecule::from_smiles(s).ok())
        .take(limit)
        .collect();
    let n = mols.len();
    let t = Instant::now();
    let mut atoms = 0usize;
    for m in &mols {
        atoms += depict::layout(m).points.len();
    }
    let lay = t.elapsed().as_secs_f64();
    let t = Instant::now();
    let mut bytes = 0usize;
    for m in &mols {
        let l = depict::layout(m);
        bytes += depict::svg(m, &l, &Marks::default(), &SvgOptions::default()).len();
    }
    let both = t.elapsed().as_secs_f64();
    println!("{n} molecules from {path} ({atoms} atoms)");
    println!(
        "layout        {:>9.0} molecules/s ({lay:.2} s)",
        n as f64 / lay
    );
    println!(
        "layout + SVG  {:>9.0} molecules/s ({both:.2} s, {:.1} KB per drawing)",
        n as f64 / both,
        bytes as f64 / n as f64 / 1024.0
    );
}
