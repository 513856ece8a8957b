//! The atom-mapped SMILES of every analysed record must read back as the same
//! molecule (same formula, same atom order) with each site atom carrying its
//! rank as atom-map number and no other atom mapped. Real molecules from
//! corpus/bulk/real.smi (sources in corpus/bulk/README.md). Issue 6.

use acidsite::mol::Molecule;
use acidsite::report::{analyze, Options};

fn check(smiles: &str) -> bool {
    let rec = analyze(smiles, 1, None, &Options::default());
    if !rec.ok {
        return false;
    }
    let mapped = rec
        .mapped_smiles
        .as_deref()
        .expect("mapped SMILES on success");
    let original = Molecule::from_smiles(smiles).expect("read before");
    let again = Molecule::from_smiles(mapped)
        .unwrap_or_else(|e| panic!("mapped SMILES {mapped} of {smiles} does not read: {e}"));
    assert_eq!(again.formula(), original.formula(), "{smiles} -> {mapped}");
    assert_eq!(
        again.atoms().len(),
        original.atoms().len(),
        "{smiles} -> {mapped}"
    );
    let mut expected: Vec<Option<u16>> = original.atoms().iter().map(|a| a.map).collect();
    // Background alkane C–H sites (issue 11) are not labelled.
    for s in rec
        .sites
        .as_deref()
        .unwrap_or(&[])
        .iter()
        .filter(|s| !s.background)
    {
        for &a in &s.atoms {
            expected[a] = Some(s.rank as u16);
        }
    }
    let got: Vec<Option<u16>> = again.atoms().iter().map(|a| a.map).collect();
    assert_eq!(got, expected, "{smiles} -> {mapped}");
    for (x, y) in original.atoms().iter().zip(again.atoms()) {
        assert_eq!(
            (x.element, x.hydrogens, x.charge),
            (y.element, y.hydrogens, y.charge),
            "{smiles} -> {mapped}"
        );
    }
    true
}

#[test]
fn analyze_given_explicit_hydrogen_atoms_maps_without_double_counting() {
    // Acetone written with explicit hydrogens on one methyl (common practice).
    assert!(check("[H]C([H])([H])C(C)=O"));
    let rec = analyze("[H]C([H])([H])C(C)=O", 1, None, &Options::default());
    assert_eq!(
        rec.mapped_smiles.as_deref(),
        Some("[H][C:1]([H])([H])C([CH3:1])=O")
    );
}

#[test]
fn analyze_given_real_molecules_gives_readable_mapped_smiles() {
    let text =
        std::fs::read_to_string(concat!(env!("CARGO_MANIFEST_DIR"), "/corpus/bulk/real.smi"))
            .unwrap();
    let mut analysed = 0;
    for line in text.lines().filter(|l| !l.starts_with('#')).step_by(5) {
        let smiles = line.split_whitespace().next().unwrap_or("");
        if check(smiles) {
            analysed += 1;
        }
    }
    assert!(analysed > 900, "only {analysed} of 1000 analysed");
}
