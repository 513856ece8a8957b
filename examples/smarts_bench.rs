//! Matcher throughput benchmark (issue 3): a set of anchored patterns over
//! a SMILES list, one core.
//!
//! Usage:
//!   cargo run --release --example smarts_bench -- [SMILES_FILE] [PATTERN_FILE] [MAX_MOLECULES]
//!
//! Defaults: ../shared/data/moses/moses_test.csv (first column, header
//! skipped), corpus/smarts/bench_patterns.txt, all molecules. PATTERN_FILE
//! may also be a TSV rule table (fragments/rules.tsv): from each row the
//! field with a `:1` atom is taken. Prints reading
//! time, then the anchored scan (every atom where each pattern's anchor
//! matches) and the unique-match count, as molecules/s and
//! patterns x molecules/s (best of SMARTS_BENCH_REPEAT runs, default 3). The
//! molecule reading is timed apart from matching; each matching run includes
//! building the per-molecule `Target`.

use acidsite::mol::Molecule;
use acidsite::smarts::{Pattern, Target};
use std::time::Instant;

/// CPU time of this thread in seconds (Linux; None elsewhere). Reported
/// next to wall time because the machine may be shared.
fn thread_cpu_seconds() -> Option<f64> {
    let stat = std::fs::read_to_string("/proc/thread-self/stat").ok()?;
    // Fields after the command name (which is in parentheses).
    let rest = stat.rsplit_once(')')?.1;
    let f: Vec<&str> = rest.split_whitespace().collect();
    // utime and stime are fields 14 and 15 of the whole line: 12 and 13 here.
    let ticks: f64 = f.get(11)?.parse::<f64>().ok()? + f.get(12)?.parse::<f64>().ok()?;
    Some(ticks / 100.0)
}

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
        // A TSV rule table: take the column that parses (header skipped).
        let line = if line.contains('\t') {
            match line.split('\t').find(|f| f.contains(":1]")) {
                Some(f) => f,
                None => continue,
            }
        } else {
            line
        };
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

    // Best of a few runs: the machine may be shared.
    let repeat: usize = std::env::var("SMARTS_BENCH_REPEAT")
        .ok()
        .and_then(|s| s.parse().ok())
        .unwrap_or(3)
        .max(1);
    let mut anchored = f64::INFINITY;
    let mut anchored_cpu = f64::INFINITY;
    let mut hits = 0usize;
    for _ in 0..repeat {
        let c2 = thread_cpu_seconds();
        let t2 = Instant::now();
        hits = 0;
        for m in &mols {
            let t = Target::new(m);
            for p in &patterns {
                hits += p.anchored_atoms_in(&t).len();
            }
        }
        anchored = anchored.min(t2.elapsed().as_secs_f64());
        if let (Some(a), Some(b)) = (c2, thread_cpu_seconds()) {
            anchored_cpu = anchored_cpu.min(b - a);
        }
    }
    println!(
        "anchored scan, {} patterns: {:.3} s: {:.0} molecules/s, {:.2e} patterns x molecules/s, {} anchor hits",
        patterns.len(),
        anchored,
        n / anchored,
        n * k / anchored,
        hits
    );
    if anchored_cpu.is_finite() && anchored_cpu > 0.0 {
        println!(
            "  by thread CPU time ({:.2} s): {:.0} molecules/s, {:.2e} patterns x molecules/s",
            anchored_cpu,
            n / anchored_cpu,
            n * k / anchored_cpu
        );
    }

    // The way a rule table uses it: every pattern tried on every atom.
    let mut per_atom = f64::INFINITY;
    let mut per_atom_hits = 0usize;
    for _ in 0..repeat {
        let t4 = Instant::now();
        per_atom_hits = 0;
        for m in &mols {
            let t = Target::new(m);
            for p in &patterns {
                for a in 0..t.atom_count() {
                    per_atom_hits += p.matches_at_in(&t, a).is_some() as usize;
                }
            }
        }
        per_atom = per_atom.min(t4.elapsed().as_secs_f64());
    }
    println!(
        "matches_at on every atom, {} patterns: {:.3} s: {:.0} molecules/s, {:.2e} patterns x molecules/s, {} hits",
        patterns.len(),
        per_atom,
        n / per_atom,
        n * k / per_atom,
        per_atom_hits
    );

    if std::env::var("SMARTS_BENCH_PER_PATTERN").is_ok() {
        // Slowest patterns in the anchored scan (development aid).
        let targets: Vec<Target> = mols.iter().map(Target::new).collect();
        let mut times: Vec<(f64, &str)> = patterns
            .iter()
            .map(|p| {
                let s = Instant::now();
                let mut h = 0;
                for t in &targets {
                    h += p.anchored_atoms_in(t).len();
                }
                std::hint::black_box(h);
                (s.elapsed().as_secs_f64(), p.source.as_str())
            })
            .collect();
        times.sort_by(|a, b| b.0.total_cmp(&a.0));
        for (secs, src) in times.iter().take(15) {
            println!("  {:8.1} ns/molecule  {src}", secs * 1e9 / n);
        }
    }

    let mut unique = f64::INFINITY;
    let mut total = 0usize;
    for _ in 0..repeat {
        let t3 = Instant::now();
        total = 0;
        for m in &mols {
            let t = Target::new(m);
            for p in &patterns {
                total += p.count_unique_in(&t);
            }
        }
        unique = unique.min(t3.elapsed().as_secs_f64());
    }
    println!(
        "unique-match count, {} patterns: {:.3} s: {:.0} molecules/s, {:.2e} patterns x molecules/s, {} matches",
        patterns.len(),
        unique,
        n / unique,
        n * k / unique,
        total
    );
}
