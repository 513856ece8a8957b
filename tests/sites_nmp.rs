//! Non-water check of the DMSO estimates (issue 11) against measured values in
//! N-methyl-2-pyrrolidone: `corpus/sites/nmp_izutsu.tsv` (Bordwell, Branca,
//! Hughes, Olmstead, J. Org. Chem. 1980, 45, 3305, via the Izutsu Digitized
//! pKa Dataset v1.0; CC BY-NC 4.0, reproduced by permission of IUPAC).
//!
//! NMP is not DMSO: the same group measured both scales and the NMP values lie
//! about one to two units higher. The check removes the median offset and
//! measures the spread, i.e. whether the rules order and space these acids as
//! the measurements do. `cargo test --release --test sites -- sites_nmp:: --nocapture`
//! prints the table.

use acidsite::mol::Molecule;
use acidsite::sites::find_sites;

fn rows() -> Vec<(String, String, f64)> {
    let text = std::fs::read_to_string("corpus/sites/nmp_izutsu.tsv").expect("nmp_izutsu.tsv");
    let mut out = Vec::new();
    let mut header = true;
    for line in text
        .lines()
        .filter(|l| !l.starts_with('#') && !l.trim().is_empty())
    {
        if header {
            header = false;
            continue;
        }
        let c: Vec<&str> = line.split('\t').collect();
        if let Some(v) = c.get(2).and_then(|v| v.parse::<f64>().ok()) {
            out.push((c[0].to_string(), c[1].to_string(), v));
        }
    }
    out
}

fn median(v: &mut [f64]) -> f64 {
    v.sort_by(f64::total_cmp);
    let n = v.len();
    if n % 2 == 1 {
        v[n / 2]
    } else {
        (v[n / 2 - 1] + v[n / 2]) / 2.0
    }
}

/// Offset-corrected MAE limit (pKa units). Measured 1.29 (n=28, median
/// offset -1.55) with rule set 2026.12-3 (1.47, offset -1.48, with 2026.12-2). Part of the spread is real
/// chemistry (the NMP-DMSO offset is about 1 for sulfonyl carbanions and 2
/// or more for oxyanions); the rest are findings of this check: cyclic and
/// alpha-alkyl bis-sulfones (1,3-dithiane tetraoxide, 1,1-bis(ethylsulfonyl)ethane)
/// and 2-(benzylthio)acetophenone come out 2-3 units too acidic (I-CO-SR was
/// set on the phenylthio group), salicylic acid and benzoylhydrazine 4 units
/// too weak (intramolecular hydrogen bond; hydrazide N-H read as an amide).
/// The limit is the measured figure plus a small margin, so that a change
/// that makes the spacing worse fails.
const SPREAD_LIMIT: f64 = 1.6;

#[test]
fn dmso_estimates_given_bordwell_nmp_values_keep_their_spacing_issue11() {
    let mut diffs = Vec::new();
    let mut text = String::from(
        "\n== DMSO estimate (most acidic site) against NMP (Bordwell 1980)\n\
         name                                        dmso est    nmp   diff\n",
    );
    let mut bad = Vec::new();
    for (name, smiles, nmp) in rows() {
        let mol = match Molecule::from_smiles(&smiles) {
            Ok(m) => m,
            Err(e) => {
                bad.push(format!("{name}: {smiles} does not parse: {e}"));
                continue;
            }
        };
        let est = find_sites(&mol)
            .sites
            .iter()
            .filter_map(|s| s.pka_dmso)
            .min_by(f64::total_cmp);
        let Some(est) = est else {
            bad.push(format!("{name}: no DMSO estimate"));
            continue;
        };
        text += &format!(
            "{:<43} {est:>9.2} {nmp:>6.2} {:>+6.2}\n",
            name.chars().take(43).collect::<String>(),
            est - nmp
        );
        diffs.push((name, est - nmp));
    }
    let mut d: Vec<f64> = diffs.iter().map(|x| x.1).collect();
    let offset = median(&mut d);
    let spread = diffs.iter().map(|x| (x.1 - offset).abs()).sum::<f64>() / diffs.len() as f64;
    text += &format!(
        "-- n={} median DMSO-NMP offset {offset:+.2}; MAE after the offset {spread:.2}\n",
        diffs.len()
    );
    println!("{text}");
    assert!(bad.is_empty(), "{bad:#?}");
    assert!(diffs.len() >= 25, "only {} NMP comparisons", diffs.len());
    // The same group found DMSO below NMP for every acid of this set.
    assert!(
        (-3.0..=0.0).contains(&offset),
        "median DMSO-NMP offset {offset:+.2} outside -3..0"
    );
    assert!(
        spread <= SPREAD_LIMIT,
        "offset-corrected MAE {spread:.2} > {SPREAD_LIMIT}"
    );
}
