//! Throughput of the molecule core: read + perceive over a SMILES file (one
//! SMILES per line, first column; a header line starting with "SMILES" or
//! "smiles" is skipped), single thread, compared in the same run with purr's
//! plain read + graph build.
//!
//! ```text
//! cargo run --release --example mol_bench -- ../shared/data/moses/moses_test.csv
//! ```

use std::time::Instant;

use acidsite::mol::Molecule;

fn main() {
    let path = std::env::args()
        .nth(1)
        .unwrap_or_else(|| "../shared/data/moses/moses_test.csv".to_string());
    let text = match std::fs::read_to_string(&path) {
        Ok(t) => t,
        Err(e) => {
            eprintln!("cannot read {path}: {e}");
            std::process::exit(2);
        }
    };
    let smiles: Vec<&str> = text
        .lines()
        .map(|l| l.split([',', '\t', ' ']).next().unwrap_or(""))
        .filter(|s| !s.is_empty() && !s.eq_ignore_ascii_case("smiles"))
        .collect();
    let n = smiles.len();
    println!("{n} molecules from {path}");

    // ACIDSITE_BENCH_ONLY=purr|ours runs one side only, once, without
    // warm-up (for instruction counts under callgrind).
    let only = std::env::var("ACIDSITE_BENCH_ONLY").unwrap_or_default();
    // Warm-up pass (page cache, allocator).
    let mut atoms = 0usize;
    for s in smiles.iter().take(if only.is_empty() { 5000 } else { 0 }) {
        if let Ok(m) = Molecule::from_smiles(s) {
            atoms += m.atom_count();
        }
    }

    let rounds = if only.is_empty() { 3 } else { 1 };
    let mut purr_best = f64::MAX;
    let mut ours_best = f64::MAX;
    let mut failures = 0;
    for _ in 0..rounds {
        let t = Instant::now();
        let mut ok = 0usize;
        for s in smiles.iter().filter(|_| only != "ours") {
            let mut builder = purr::graph::Builder::new();
            if purr::read::read(s, &mut builder, None).is_ok() {
                if let Ok(g) = builder.build() {
                    ok += g.len();
                }
            }
        }
        purr_best = purr_best.min(t.elapsed().as_secs_f64());
        std::hint::black_box(ok);

        let t = Instant::now();
        failures = 0;
        for s in smiles.iter().filter(|_| only != "purr") {
            match Molecule::from_smiles(s) {
                Ok(m) => atoms += m.atom_count(),
                Err(_) => failures += 1,
            }
        }
        ours_best = ours_best.min(t.elapsed().as_secs_f64());
    }
    std::hint::black_box(atoms);

    // Graph representation: neighbour walks over our compressed rows versus
    // a petgraph UnGraph built from the same bonds (the walk pattern of ring
    // search and substructure matching: every atom's neighbours, 20 times).
    if only.is_empty() {
        let mols: Vec<Molecule> = smiles
            .iter()
            .filter_map(|s| Molecule::from_smiles(s).ok())
            .collect();
        let mut sum = 0usize;
        for m in &mols {
            for i in 0..m.atom_count() {
                sum += m.neighbors(i).len();
            }
        }
        let t = Instant::now();
        for m in &mols {
            for _ in 0..20 {
                for i in 0..m.atom_count() {
                    for x in m.neighbors(i) {
                        sum += x.atom ^ x.bond;
                    }
                }
            }
        }
        let ours_walk = t.elapsed().as_secs_f64();
        let t = Instant::now();
        let graphs: Vec<petgraph::graph::UnGraph<(), usize>> = mols
            .iter()
            .map(|m| {
                let mut g = petgraph::graph::UnGraph::with_capacity(m.atom_count(), m.bond_count());
                for _ in 0..m.atom_count() {
                    g.add_node(());
                }
                for (k, b) in m.bonds().iter().enumerate() {
                    g.add_edge(
                        petgraph::graph::NodeIndex::new(b.atoms[0]),
                        petgraph::graph::NodeIndex::new(b.atoms[1]),
                        k,
                    );
                }
                g
            })
            .collect();
        let build = t.elapsed().as_secs_f64();
        let t = Instant::now();
        use petgraph::visit::EdgeRef;
        for g in &graphs {
            for _ in 0..20 {
                for v in g.node_indices() {
                    for e in g.edges(v) {
                        sum += e.target().index() ^ *e.weight();
                    }
                }
            }
        }
        let pet_walk = t.elapsed().as_secs_f64();
        std::hint::black_box(sum);
        println!(
            "neighbour walks: compressed rows {:.1} ms, petgraph UnGraph {:.1} ms (+ {:.1} ms to build the graphs)",
            ours_walk * 1e3,
            pet_walk * 1e3,
            build * 1e3
        );
    }
    let purr_rate = n as f64 / purr_best;
    let ours_rate = n as f64 / ours_best;
    println!(
        "purr read + graph build: {:.0} molecules/s (best of {rounds})",
        purr_rate
    );
    println!(
        "acidsite read + perceive: {:.0} molecules/s (best of {rounds}), {failures} errors",
        ours_rate
    );
    println!("ratio acidsite / purr: {:.2}", ours_rate / purr_rate);
}
