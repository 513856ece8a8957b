//! Print matches of a SMARTS pattern in a SMILES (development aid).
//! Usage: cargo run --example smarts_probe -- 'SMARTS' 'SMILES'
use acidsite::mol::Molecule;
use acidsite::smarts::Pattern;

fn main() {
    let args: Vec<String> = std::env::args().collect();
    if args.len() < 3 {
        eprintln!("usage: smarts_probe SMARTS SMILES");
        std::process::exit(2);
    }
    let p = match Pattern::parse(&args[1]) {
        Ok(p) => p,
        Err(e) => {
            eprintln!("{e}");
            std::process::exit(1);
        }
    };
    let m = match Molecule::from_smiles(&args[2]) {
        Ok(m) => m,
        Err(e) => {
            eprintln!("{e}");
            std::process::exit(1);
        }
    };
    use std::io::Write;
    let matches = p.unique_matches(&m);
    let mut out = std::io::stdout().lock();
    // Write errors (a closed pipe) end the output quietly.
    let _ = writeln!(out, "{} unique matches", matches.len());
    for mm in matches.iter().take(20) {
        if writeln!(out, "{mm:?}").is_err() {
            break;
        }
    }
}
