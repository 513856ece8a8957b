//! Print what the molecule core makes of SMILES given as arguments (or one
//! per line on standard input): atoms with hydrogens, ring facts and
//! symmetry classes, or the error with its caret.
//!
//! ```text
//! cargo run --example mol_check -- 'CC(=O)Oc1ccccc1C(=O)O'
//! ```

use std::io::BufRead;
use std::time::Instant;

use acidsite::mol::Molecule;

fn show(s: &str) {
    let t = Instant::now();
    let result = Molecule::from_smiles(s);
    let elapsed = t.elapsed();
    match result {
        Err(e) => println!("{e}\n  ({elapsed:?})"),
        Ok(m) => {
            println!(
                "{s}\n  formula {}  atoms {}  bonds {}  rings {} (SSSR {})  components {}  ({elapsed:?})",
                m.formula(),
                m.atom_count(),
                m.bond_count(),
                m.ring_total(),
                m.sssr_count(),
                m.component_count()
            );
            if m.atom_count() > 200 {
                return;
            }
            let classes = m.symmetry_classes();
            for (i, a) in m.atoms().iter().enumerate() {
                println!(
                    "  {i:>3} {:<2} arom={} charge={:+} H={} (D/T {}) deg={} val={} R={} r={} x={} class={}",
                    a.symbol(),
                    a.aromatic as u8,
                    a.charge,
                    a.hydrogens,
                    a.heavy_hydrogens,
                    m.degree(i),
                    m.valence(i),
                    m.ring_count(i),
                    m.smallest_ring(i),
                    m.ring_bond_count(i),
                    classes[i]
                );
            }
        }
    }
}

fn main() {
    let args: Vec<String> = std::env::args().skip(1).collect();
    if args.is_empty() {
        for line in std::io::stdin().lock().lines().map_while(Result::ok) {
            show(line.trim_end());
        }
    } else {
        for s in &args {
            show(s);
        }
    }
}
