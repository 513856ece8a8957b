//! Molecules a process chemist deprotonates every week (issue 11 review):
//! `corpus/sites/process_review.tsv` (protected amino esters, ketones with
//! protecting groups, heteroaryl ketones, enones and steroids, Weinreb
//! amides, N-acyl oxazolidinones, lactams, imides, sulfonamides, Julia
//! sulfones, Horner-Wadsworth-Emmons phosphonates, dithianes). Each row
//! names the site a chemist would deprotonate, the class of the rule that
//! should describe it and, where one is recalled (from memory, Bordwell-group
//! DMSO figures) or cited, its DMSO pKa. The issue's criterion: the site is
//! found as an activated site of that class, within 2 units of the value.
//! `cargo test --release --test sites -- sites_process_review:: --nocapture` prints
//! the table.

use acidsite::mol::Molecule;
use acidsite::sites::find_sites;

/// Largest allowed difference from a recalled or cited DMSO value (issue 11:
/// "more than 2 units off" is a miss).
const LIMIT: f64 = 2.0;

#[test]
fn find_sites_given_process_review_molecules_finds_each_site_within_2_units_issue11() {
    let path = concat!(
        env!("CARGO_MANIFEST_DIR"),
        "/corpus/sites/process_review.tsv"
    );
    let text = std::fs::read_to_string(path).expect("corpus/sites/process_review.tsv");
    let mut lines = text.lines().filter(|l| !l.starts_with('#'));
    let header: Vec<&str> = lines.next().expect("header").split('\t').collect();
    let col = |name: &str| {
        header
            .iter()
            .position(|h| *h == name)
            .unwrap_or_else(|| panic!("column {name}"))
    };
    let (c_smi, c_name, c_atom, c_class, c_dmso) = (
        col("smiles"),
        col("name"),
        col("site_atom"),
        col("class"),
        col("pka_dmso"),
    );
    let mut bad = Vec::new();
    let mut n = 0;
    for line in lines {
        let f: Vec<&str> = line.split('\t').collect();
        let atom: usize = f[c_atom].parse().expect("site_atom");
        let mol = Molecule::from_smiles(f[c_smi]).expect("parses");
        let report = find_sites(&mol);
        n += 1;
        let Some(site) = report.sites.iter().find(|s| s.atoms.contains(&atom)) else {
            bad.push(format!("{}: no site on atom {atom}", f[c_name]));
            continue;
        };
        let est = site.pka_dmso;
        println!(
            "{:45} {:>5} {:>7} {:45}",
            f[c_name],
            f[c_dmso],
            est.map_or("-".to_string(), |v| format!("{v:.1}")),
            site.class
        );
        if site.background {
            bad.push(format!("{}: a background site", f[c_name]));
        }
        if site.class != f[c_class] {
            bad.push(format!(
                "{}: class {:?}, expected {:?}",
                f[c_name], site.class, f[c_class]
            ));
        }
        if let Ok(want) = f[c_dmso].parse::<f64>() {
            match est {
                Some(v) if (v - want).abs() <= LIMIT => {}
                other => bad.push(format!("{}: DMSO {other:?}, expected {want}", f[c_name])),
            }
        }
    }
    assert!(n >= 40, "{n} rows");
    assert!(bad.is_empty(), "{bad:#?}");
}
