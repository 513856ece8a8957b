//! Independent checks of the rule and increment values (issue 11).
//!
//! `corpus/sites/rule_water_iupac.tsv` (tests/reference/sites_rule_water_check.py):
//! the parent compound of every rule and increment with a water value, and
//! the median of its IUPAC Digitized pKa Dataset v1.0 rows where the parent is
//! in the set (CC BY-NC 4.0, reproduced by permission of IUPAC; see
//! corpus/sites/ATTRIBUTION.md). `corpus/sites/unmeasured_rules.tsv`: the
//! rule and increment ids that no measured value checks.
//!
//! `cargo test --release --test sites -- sites_rule_water:: --nocapture` prints the
//! comparison and the independent water MAE.

use std::collections::{BTreeSet, HashSet};

use acidsite::mol::Molecule;
use acidsite::sites::{find_sites, rule_set, Site};

use crate::sites_helpers::site_for;
use crate::tsv::{read_rows as read, Row};

fn cell<'a>(r: &'a Row, c: &str) -> &'a str {
    r.get(c).map_or("", String::as_str)
}

/// The site containing `atom`, or a site whose atom is symmetry-equivalent.
fn site_at(smiles: &str, atom: usize) -> Option<Site> {
    let mol = Molecule::from_smiles(smiles).unwrap_or_else(|e| panic!("{smiles}: {e}"));
    let sites = find_sites(&mol).sites;
    site_for(&mol, &sites, atom)
}

/// Parents whose estimate may differ from the IUPAC median by more than
/// WATER_ROW_LIMIT, with the reason. A stale entry fails the test.
/// These are findings of this check (issue 11), left for the rule work to
/// settle on data that is not the holdout.
const WATER_EXCEPTIONS: &[(&str, &str)] = &[
    (
        "I-NO-NO2",
        "trinitromethane: -5.0 per nitro after the gem-dinitro row overshoots; IUPAC 0.06 (Uncertain)",
    ),
    (
        "I-NH-HETB",
        "morpholine (a check compound, not the parent): -0.64 per path was set on DABCO; the ether O of morpholinium lowers the pKa by 2.6 (IUPAC 8.39 vs diethylammonium 10.98)",
    ),
];

/// Largest difference between a parent's water estimate and its IUPAC
/// median (pKa units). The rule value was meant to be the parent's own
/// value, so a larger difference means the recalled value is off.
const WATER_ROW_LIMIT: f64 = 1.0;

#[test]
fn rule_water_values_given_iupac_parents_agree_issue11() {
    let mut bad = Vec::new();
    let mut seen_exception = HashSet::new();
    let (mut n, mut sum) = (0usize, 0.0f64);
    let mut text = String::from(
        "\n== rule and increment water values against IUPAC parents\n\
         id           parent                                   estimate  iupac    diff\n",
    );
    for r in read("corpus/sites/rule_water_iupac.tsv") {
        let Ok(lit) = cell(&r, "pka_water_iupac").parse::<f64>() else {
            continue;
        };
        let id = cell(&r, "id");
        let atom: usize = cell(&r, "site_atom").parse().expect("site_atom");
        let Some(site) = site_at(cell(&r, "smiles"), atom) else {
            bad.push(format!(
                "{id}: no site at atom {atom} of {}",
                cell(&r, "smiles")
            ));
            continue;
        };
        if !site.rules.iter().any(|u| u.id == id) {
            bad.push(format!(
                "{id}: its parent {} is estimated without it ({:?})",
                cell(&r, "parent"),
                site.rules.iter().map(|u| u.id.as_str()).collect::<Vec<_>>()
            ));
            continue;
        }
        let Some(est) = site.pka_water else {
            bad.push(format!(
                "{id}: no water estimate for {}",
                cell(&r, "parent")
            ));
            continue;
        };
        let diff = est - lit;
        n += 1;
        sum += diff.abs();
        text += &format!(
            "{id:<12} {:<40} {est:>8.2} {lit:>6.2} {diff:>+7.2}\n",
            cell(&r, "parent").chars().take(40).collect::<String>()
        );
        if diff.abs() > WATER_ROW_LIMIT {
            if WATER_EXCEPTIONS.iter().any(|(x, _)| *x == id) {
                seen_exception.insert(id.to_string());
            } else {
                bad.push(format!(
                    "{id} ({}): estimate {est:.2}, IUPAC {lit:.2}",
                    cell(&r, "parent")
                ));
            }
        }
    }
    let mae = sum / n.max(1) as f64;
    text += &format!("-- independent water check: n={n} MAE={mae:.2}\n");
    println!("{text}");
    assert!(n >= 40, "only {n} parents with an IUPAC value");
    // Measured 0.15 (n=64) with rule set 2026.12-4 (0.16, n=61, with 2026.12-3; 0.23, n=59, with 2026.12-2); the limit leaves room
    // for a few more parents, not for a drift of the whole table.
    assert!(mae <= 0.4, "independent water MAE {mae:.2} > 0.4 (n={n})");
    assert!(bad.is_empty(), "{bad:#?}");
    for (id, why) in WATER_EXCEPTIONS {
        assert!(
            seen_exception.contains(*id),
            "{id}: within {WATER_ROW_LIMIT} now; remove the exception ({why})"
        );
    }
}

/// Every rule and increment with a water value has a parent row (found in
/// the IUPAC set or not), and every row names a current id.
#[test]
fn rule_water_table_given_rule_set_covers_every_water_value_issue11() {
    let set = rule_set().expect("embedded rules are valid");
    let rows = read("corpus/sites/rule_water_iupac.tsv");
    let listed: HashSet<&str> = rows.iter().map(|r| cell(r, "id")).collect();
    let mut with_water: HashSet<&str> = HashSet::new();
    for r in &set.rules {
        if r.pka_water.is_some() {
            with_water.insert(&r.id);
        }
    }
    for r in &set.increments {
        if r.water.is_some() {
            with_water.insert(&r.id);
        }
    }
    let mut missing: Vec<&&str> = with_water.difference(&listed).collect();
    missing.sort();
    assert!(
        missing.is_empty(),
        "water values without a parent row; add them to PARENTS in \
         tests/reference/sites_rule_water_check.py and rerun it: {missing:?}"
    );
    let mut stale: Vec<&&str> = listed.difference(&with_water).collect();
    stale.sort();
    assert!(
        stale.is_empty(),
        "rows for ids without a water value: {stale:?}"
    );
}

/// Rule and increment ids that contribute, on a scale where they have a
/// value, to an estimate compared with a measured value: literature.tsv rows
/// with a cited value (not from-memory or common practice), every row of
/// water_carbon_acids.tsv (IUPAC), the IUPAC parents above and every DMSO
/// value read in a stored text (dmso_measured.tsv).
fn measured_ids() -> BTreeSet<String> {
    let mut out = BTreeSet::new();
    let mut add = |smiles: &str, atom: usize, dmso: bool, water: bool| {
        let Some(site) = site_at(smiles, atom) else {
            return;
        };
        for u in &site.rules {
            if u.id.contains('/') {
                continue; // Hammett terms belong to their rule
            }
            let on_dmso = dmso && site.pka_dmso.is_some() && u.dmso.is_some();
            let on_water = water && site.pka_water.is_some() && u.water.is_some();
            if on_dmso || on_water {
                out.insert(u.id.clone());
            }
        }
    };
    let cited = |r: &Row, value: &str, source: &str| {
        !cell(r, value).is_empty()
            && !matches!(cell(r, source), "from-memory" | "common-practice" | "")
    };
    for r in read("corpus/sites/literature.tsv") {
        let atom = cell(&r, "site_atom").parse().expect("site_atom");
        add(
            cell(&r, "smiles"),
            atom,
            cited(&r, "pka_dmso", "dmso_source"),
            cited(&r, "pka_water", "water_source"),
        );
    }
    for r in read("corpus/sites/water_carbon_acids.tsv") {
        let atom = cell(&r, "site_atom").parse().expect("site_atom");
        add(cell(&r, "smiles"), atom, false, true);
    }
    for r in read("corpus/sites/dmso_measured.tsv") {
        let atom = cell(&r, "site_atom").parse().expect("site_atom");
        add(cell(&r, "smiles"), atom, true, false);
    }
    for r in read("corpus/sites/rule_water_iupac.tsv") {
        if cell(&r, "pka_water_iupac").is_empty() {
            continue;
        }
        let atom = cell(&r, "site_atom").parse().expect("site_atom");
        add(cell(&r, "smiles"), atom, false, true);
    }
    out
}

/// Issue 11: every rule id is checked against at least one measured value,
/// or is listed in corpus/sites/unmeasured_rules.tsv with its reason. A new
/// rule without either fails; so does a listed id that is now measured.
#[test]
fn rule_set_given_measured_values_lists_every_unmeasured_rule_issue11() {
    let set = rule_set().expect("embedded rules are valid");
    let measured = measured_ids();
    let listed: BTreeSet<String> = read("corpus/sites/unmeasured_rules.tsv")
        .iter()
        .map(|r| cell(r, "id").to_string())
        .collect();
    let all: BTreeSet<String> = set
        .rules
        .iter()
        .map(|r| r.id.clone())
        .chain(set.increments.iter().map(|r| r.id.clone()))
        .collect();
    let unmeasured: BTreeSet<String> = all.difference(&measured).cloned().collect();
    let not_listed: Vec<String> = unmeasured
        .difference(&listed)
        .map(|id| {
            let (src, note) = set
                .rules
                .iter()
                .find(|r| r.id == *id)
                .map(|r| (r.source.clone(), r.note.clone()))
                .or_else(|| {
                    set.increments
                        .iter()
                        .find(|r| r.id == *id)
                        .map(|r| (r.source.clone(), r.note.clone()))
                })
                .unwrap_or_default();
            format!("{id}\t{src}\t{note}")
        })
        .collect();
    let stale: Vec<&String> = listed.difference(&unmeasured).collect();
    println!(
        "\n== rule ids with a measured value: {} of {}; without: {}",
        measured.intersection(&all).count(),
        all.len(),
        unmeasured.len()
    );
    assert!(
        not_listed.is_empty(),
        "rule ids without any measured value; add a measured value or list them in \
         corpus/sites/unmeasured_rules.tsv (id, source, reason):\n{}",
        not_listed.join("\n")
    );
    assert!(
        stale.is_empty(),
        "listed as unmeasured but now measured (or no longer a rule id); remove: {stale:?}"
    );
}
