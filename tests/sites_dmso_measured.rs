//! DMSO estimates against values read in stored literature (issue 11).
//!
//! Reference values: `corpus/sites/dmso_measured.tsv`, DMSO pKa values read
//! in stored public texts (abstracts, open-access articles, a handbook table,
//! a reagent encyclopedia entry, encyclopedia articles), each row with its
//! citation key, the place in the text and the page it was read on; the
//! header states the inclusion rule, fixed before any estimate was looked at.
//! Rows whose molecule and site are also in `corpus/sites/literature.tsv`
//! carry its `lit-NNN` id; the others are molecules the rules were never
//! checked on.
//!
//! Run with `cargo test --test sites -- sites_dmso_measured:: --nocapture`
//! to see the table.

use std::collections::BTreeMap;

use acidsite::mol::Molecule;
use acidsite::sites::{find_sites, rule_set};

use crate::sites_helpers::site_for;
use crate::tsv;

const PATH: &str = "corpus/sites/dmso_measured.tsv";
const LITERATURE: &str = "corpus/sites/literature.tsv";

/// Regression guard on the MAE over all rows (pKa units). Measured 0.95
/// (n = 36, 2026-12-04, rules of commit cdd99d2; printed by
/// `dmso_estimates_given_values_read_in_literature_print_the_table`) when the
/// table was complete; 1.16 (n = 28) after the eight rows read in a textbook
/// table were removed (the project cites no teaching material); the limit
/// sits just above it. A guard against drift, not a target. One row
/// dominates: dm-025, a heptaol whose tertiary O-H is acidified by
/// intramolecular hydrogen bonds the rules do not model (error about +21).
/// 22 of the 28 rows are molecules of literature.tsv, mostly parents whose
/// values the rules were set from.
const MAE_LIMIT: f64 = 1.2;

struct Row {
    id: String,
    smiles: String,
    name: String,
    site_atom: usize,
    element: String,
    value: f64,
    source: String,
    literature_id: String,
}

fn rows() -> Vec<Row> {
    tsv::read_rows(PATH)
        .iter()
        .map(|r| {
            let get = |n: &str| {
                r.get(n)
                    .cloned()
                    .unwrap_or_else(|| panic!("{PATH}: no column {n}"))
            };
            let id = get("id");
            Row {
                site_atom: get("site_atom")
                    .parse()
                    .unwrap_or_else(|e| panic!("{id}: site_atom: {e}")),
                value: get("pka_dmso")
                    .parse()
                    .unwrap_or_else(|e| panic!("{id}: pka_dmso: {e}")),
                smiles: get("smiles"),
                name: get("name"),
                element: get("element"),
                source: get("source"),
                literature_id: get("literature_id"),
                id,
            }
        })
        .collect()
}

/// One row compared: the estimate (None when the site is missed or has no
/// DMSO value) and whether the row is a molecule of literature.tsv.
struct Compared<'a> {
    row: &'a Row,
    site_found: bool,
    estimate: Option<f64>,
}

fn compare(rows: &[Row]) -> Vec<Compared<'_>> {
    rows.iter()
        .map(|row| {
            let mol = Molecule::from_smiles(&row.smiles)
                .unwrap_or_else(|e| panic!("{}: {} does not parse: {e}", row.id, row.smiles));
            let report = find_sites(&mol);
            let site = site_for(&mol, &report.sites, row.site_atom);
            Compared {
                row,
                site_found: site.is_some(),
                estimate: site.and_then(|s| s.pka_dmso),
            }
        })
        .collect()
}

/// (n, MAE) over the rows with an estimate that pass `keep`.
fn mae(cmp: &[Compared], keep: impl Fn(&Row) -> bool) -> (usize, f64) {
    let errs: Vec<f64> = cmp
        .iter()
        .filter(|c| keep(c.row))
        .filter_map(|c| c.estimate.map(|e| (e - c.row.value).abs()))
        .collect();
    let n = errs.len();
    let m = if n == 0 {
        f64::NAN
    } else {
        errs.iter().sum::<f64>() / n as f64
    };
    (n, m)
}

fn table(cmp: &[Compared]) -> String {
    use std::fmt::Write;
    let mut t = String::new();
    let _ = writeln!(t, "\n== DMSO values read in literature ({PATH})");
    let _ = writeln!(
        t,
        "{:<7} {:<48} {:>4} {:>7} {:>7} {:>6}  {:<22} literature",
        "id", "name", "atom", "est", "value", "err", "source"
    );
    for c in cmp {
        let r = c.row;
        let (est, err) = match c.estimate {
            Some(e) => (format!("{e:.2}"), format!("{:+.2}", e - r.value)),
            None if c.site_found => ("-".to_string(), "no est".to_string()),
            None => ("-".to_string(), "MISSED".to_string()),
        };
        let _ = writeln!(
            t,
            "{:<7} {:<48} {:>4} {est:>7} {:>7.2} {err:>6}  {:<22} {}",
            r.id,
            r.name,
            r.site_atom,
            r.value,
            r.source,
            if r.literature_id.is_empty() {
                "(new)"
            } else {
                &r.literature_id
            }
        );
    }
    let new_molecule = |r: &Row| r.literature_id.is_empty();
    for (label, (n, m)) in [
        ("all rows", mae(cmp, |_| true)),
        ("new molecules (no literature_id)", mae(cmp, new_molecule)),
        (
            "molecules of literature.tsv",
            mae(cmp, |r| !new_molecule(r)),
        ),
    ] {
        let _ = writeln!(t, "-- MAE {label}: n={n} {m:.2}");
    }
    t
}

#[test]
fn dmso_estimates_given_values_read_in_literature_print_the_table() {
    let rows = rows();
    let cmp = compare(&rows);
    println!("{}", table(&cmp));
    let (n, m) = mae(&cmp, |_| true);
    assert_eq!(n, rows.len(), "every row has a DMSO estimate");
    // MAE_LIMIT: regression guard set just above the first measurement.
    assert!(m <= MAE_LIMIT, "DMSO MAE {m:.2} > {MAE_LIMIT} (n={n})");
}

#[test]
fn find_sites_given_each_measured_row_finds_its_site() {
    let rows = rows();
    let missed: Vec<String> = compare(&rows)
        .iter()
        .filter(|c| !c.site_found)
        .map(|c| format!("{} {} atom {}", c.row.id, c.row.smiles, c.row.site_atom))
        .collect();
    assert!(missed.is_empty(), "sites not found: {missed:?}");
}

#[test]
fn dmso_measured_given_its_rows_is_well_formed() {
    let rows = rows();
    assert!(!rows.is_empty(), "{PATH} has no rows");
    let sources = &rule_set().expect("embedded rule set").sources;
    let mut ids = BTreeMap::new();
    for r in &rows {
        assert!(
            ids.insert(r.id.clone(), ()).is_none(),
            "{}: duplicate id",
            r.id
        );
        assert!(
            sources.contains_key(&r.source),
            "{}: source '{}' not in fragments/sources.tsv",
            r.id,
            r.source
        );
        assert_ne!(r.source, "from-memory", "{}: a recalled value", r.id);
        let mol = Molecule::from_smiles(&r.smiles)
            .unwrap_or_else(|e| panic!("{}: {} does not parse: {e}", r.id, r.smiles));
        let atom = mol
            .atoms()
            .get(r.site_atom)
            .unwrap_or_else(|| panic!("{}: no atom {}", r.id, r.site_atom));
        assert_eq!(
            atom.symbol(),
            r.element,
            "{}: element of atom {}",
            r.id,
            r.site_atom
        );
        assert!(
            atom.hydrogens > 0,
            "{}: atom {} has no H",
            r.id,
            r.site_atom
        );
    }
}

#[test]
fn literature_id_given_a_measured_row_names_the_same_molecule_and_site() {
    let lit: BTreeMap<String, (String, usize)> = tsv::read_rows(LITERATURE)
        .iter()
        .map(|r| {
            (
                r["id"].clone(),
                (
                    r["smiles"].clone(),
                    r["site_atom"].parse().expect("literature site_atom"),
                ),
            )
        })
        .collect();
    for r in rows().iter().filter(|r| !r.literature_id.is_empty()) {
        let (smiles, atom) = lit
            .get(&r.literature_id)
            .unwrap_or_else(|| panic!("{}: {} not in {LITERATURE}", r.id, r.literature_id));
        assert_eq!(
            (smiles.as_str(), *atom),
            (r.smiles.as_str(), r.site_atom),
            "{}: {} is another molecule or site",
            r.id,
            r.literature_id
        );
    }
}
