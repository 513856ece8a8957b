//! The independent planning corpus of issue 10
//! (`corpus/advice/planning_independent.tsv`) run through the real binary:
//! `scan --json --site N --reaction R [--control C]` for every case, judged
//! against what a chemist accepts.
//!
//! The cases were written from synthetic practice (Organic Syntheses
//! procedures, reviews, named-reaction practice) by someone who had not read
//! `fragments/practice.tsv` or the developers' `planning.tsv`; each row names
//! its source or says "common practice" / "from memory". See
//! `corpus/advice/README.md`.
//!
//! Matching rule (documented there as well):
//! * names compare case-insensitively;
//! * a system `A/B` is the set of its parts, so `Et3N/TMSCl` and `TMSCl/Et3N`
//!   are the same system;
//! * an acceptable entry matches the advised base when it is the same name or
//!   the same system, or when it is a bare catalogue base and the advised
//!   system is built on that base (the case does not care about the additive);
//! * a sequence (`NaH then n-BuLi`) matches only the same sequence;
//! * a route named with its reagent in parentheses (`enamine (pyrrolidine)`)
//!   is that route (`enamine`);
//! * an unacceptable entry matches only the same name or system;
//! * equivalents agree when `advice.equivalents >= min_equiv`; a catalytic
//!   case (`min_equiv <= 0.2`) also accepts any charge up to 0.5 equivalents.

use std::collections::{BTreeMap, BTreeSet};
use std::process::Command;

const BIN: &str = env!("CARGO_BIN_EXE_acidsite");
const CORPUS: &str = concat!(
    env!("CARGO_MANIFEST_DIR"),
    "/corpus/advice/planning_independent.tsv"
);
const BASES: &str = concat!(env!("CARGO_MANIFEST_DIR"), "/fragments/bases.tsv");

/// The reaction names of issue 10, in the order the issue lists them.
const REACTIONS: [&str; 9] = [
    "alkylation",
    "dialkylation",
    "aldol",
    "acylation",
    "condensation",
    "conjugate-addition",
    "enol-trap",
    "olefination",
    "equilibration",
];

/// Reagents, additives and routes a case may name besides the catalogue bases
/// (common practice). A name outside this list and the catalogue is a typo.
const OTHER_REAGENTS: &[&str] = &[
    "TMSCl",
    "TMSOTf",
    "TBSOTf",
    "LiCl",
    "Bu2BOTf",
    "TiCl4",
    "PTC",
    "18-crown-6",
    "MgCl2",
    "AcOH",
    "enamine",
    "imine anion",
    "PhLi",
    "EtMgBr",
    "Mg(OEt)2",
    "Ba(OH)2",
    "KOAc",
    "KHCO3",
    "NaHCO3",
    "pyrrolidine",
    "proline",
    "LiOMe",
];

/// Agreement the issue asks of the recommender (issue 10, "How it is checked").
const MIN_AGREEMENT: f64 = 0.90;
/// Least number of cases the issue asks for.
const MIN_CASES: usize = 60;

#[derive(Debug, Clone)]
struct Case {
    id: String,
    smiles: String,
    site: usize,
    reaction: String,
    control: Option<String>,
    acceptable: Vec<String>,
    unacceptable: Vec<(String, String)>,
    min_equiv: f64,
    source: String,
    note: String,
}

fn list(cell: &str) -> Vec<String> {
    if cell == "-" {
        return Vec::new();
    }
    cell.split('|').map(|s| s.trim().to_string()).collect()
}

fn load() -> Vec<Case> {
    let text = std::fs::read_to_string(CORPUS).expect("read planning_independent.tsv");
    let mut lines = text
        .lines()
        .enumerate()
        .filter(|(_, l)| !l.starts_with('#') && !l.trim().is_empty());
    let (_, header) = lines.next().expect("header row");
    let cols: Vec<&str> = header.split('\t').collect();
    assert_eq!(
        cols,
        [
            "id",
            "smiles",
            "site",
            "reaction",
            "control",
            "acceptable",
            "unacceptable",
            "min_equiv",
            "source",
            "note"
        ],
        "planning_independent.tsv header"
    );
    lines
        .map(|(n, l)| {
            let f: Vec<&str> = l.split('\t').collect();
            assert_eq!(
                f.len(),
                cols.len(),
                "planning_independent.tsv line {}: {l}",
                n + 1
            );
            let unacceptable = list(f[6])
                .into_iter()
                .map(|e| match e.split_once(':') {
                    Some((name, why)) => (name.trim().to_string(), why.trim().to_string()),
                    None => panic!(
                        "planning_independent.tsv line {}: '{e}' has no ':reason'",
                        n + 1
                    ),
                })
                .collect();
            Case {
                id: f[0].to_string(),
                smiles: f[1].to_string(),
                site: f[2]
                    .parse()
                    .unwrap_or_else(|_| panic!("line {}: site '{}'", n + 1, f[2])),
                reaction: f[3].to_string(),
                control: (f[4] != "-").then(|| f[4].to_string()),
                acceptable: list(f[5]),
                unacceptable,
                min_equiv: f[7]
                    .parse()
                    .unwrap_or_else(|_| panic!("line {}: min_equiv '{}'", n + 1, f[7])),
                source: f[8].to_string(),
                note: f[9].to_string(),
            }
        })
        .collect()
}

/// Single-base names of the catalogue (the `name` column of fragments/bases.tsv).
fn catalogue_names() -> BTreeSet<String> {
    let text = std::fs::read_to_string(BASES).expect("read bases.tsv");
    text.lines()
        .filter(|l| !l.starts_with('#') && !l.trim().is_empty())
        .skip(1)
        .filter_map(|l| l.split('\t').next())
        .filter(|n| !n.contains('/'))
        .map(|n| n.to_lowercase())
        .collect()
}

fn norm(s: &str) -> String {
    // A route written with its reagent, "enamine (pyrrolidine)", is the route.
    let s = match s.find(" (") {
        Some(i) if s.trim_end().ends_with(')') => &s[..i],
        _ => s,
    };
    s.split_whitespace()
        .collect::<Vec<_>>()
        .join(" ")
        .to_lowercase()
}

fn parts(s: &str) -> BTreeSet<String> {
    s.split('/').map(norm).collect()
}

fn is_sequence(s: &str) -> bool {
    norm(s).contains(" then ")
}

/// Same name, same system or same sequence.
fn same_reagent(advised: &str, entry: &str) -> bool {
    if is_sequence(advised) || is_sequence(entry) {
        return norm(advised) == norm(entry);
    }
    parts(advised) == parts(entry)
}

fn accepts(advised: &str, entry: &str, catalogue: &BTreeSet<String>) -> bool {
    if same_reagent(advised, entry) {
        return true;
    }
    if is_sequence(advised) || is_sequence(entry) {
        return false;
    }
    // A bare catalogue base accepts a system built on it.
    let e = norm(entry);
    let a = parts(advised);
    !entry.contains('/') && catalogue.contains(&e) && a.len() > 1 && a.contains(&e)
}

fn equivalents_agree(equiv: f64, min_equiv: f64) -> bool {
    equiv >= min_equiv - 1e-9 || (min_equiv <= 0.2 && equiv <= 0.5)
}

fn run(args: &[&str]) -> (Option<i32>, String, String) {
    let out = Command::new(BIN).args(args).output().expect("run acidsite");
    (
        out.status.code(),
        String::from_utf8_lossy(&out.stdout).into_owned(),
        String::from_utf8_lossy(&out.stderr).into_owned(),
    )
}

/// The advised base as shown, why the advice disagrees with practice
/// (`None` when it agrees), and, for an agreeing case, why it would fail
/// the stricter reading of the developers' corpus (an alternative that is
/// unacceptable, or more than 0.5 equivalents for a catalytic case).
type Verdict = (String, Option<String>, Option<String>);

fn judge(case: &Case, catalogue: &BTreeSet<String>) -> Verdict {
    let site = case.site.to_string();
    let mut args = vec![
        "scan",
        "--json",
        "--site",
        &site,
        "--reaction",
        &case.reaction,
    ];
    if let Some(c) = &case.control {
        args.push("--control");
        args.push(c);
    }
    args.push(&case.smiles);
    let (code, out, err) = run(&args);
    let rec: serde_json::Value = match serde_json::from_str(out.trim()) {
        Ok(v) => v,
        Err(_) => {
            let first = err.lines().next().unwrap_or("").to_string();
            return (
                "-".into(),
                Some(format!("no record (exit {code:?}): {first}")),
                None,
            );
        }
    };
    if rec["ok"] != true {
        return (
            "-".into(),
            Some(format!("failed record: {}", rec["error"])),
            None,
        );
    }
    let advice = &rec["advice"];
    let Some(base) = advice["base"].as_str() else {
        return ("-".into(), Some("no base advised".into()), None);
    };
    let equiv = advice["equivalents"].as_f64().unwrap_or(f64::NAN);
    let shown = format!("{base} {equiv}");
    if let Some((_, why)) = case
        .unacceptable
        .iter()
        .find(|(name, _)| same_reagent(base, name))
    {
        return (shown, Some(format!("unacceptable: {why}")), None);
    }
    if !case.acceptable.iter().any(|e| accepts(base, e, catalogue)) {
        return (
            shown,
            Some(format!("not among {}", case.acceptable.join("|"))),
            None,
        );
    }
    if !equivalents_agree(equiv, case.min_equiv) {
        return (
            shown,
            Some(format!("equivalents below {} ", case.min_equiv)),
            None,
        );
    }
    let bad_alternative = advice["alternatives"].as_array().and_then(|alts| {
        alts.iter()
            .filter_map(|a| a["base"].as_str())
            .find_map(|b| {
                case.unacceptable
                    .iter()
                    .find(|(name, _)| same_reagent(b, name))
                    .map(|(_, why)| format!("alternative {b} unacceptable: {why}"))
            })
    });
    let strict = bad_alternative.or_else(|| {
        (case.min_equiv <= 0.2 && equiv > 0.5)
            .then(|| format!("catalytic case given {equiv} equiv"))
    });
    (shown, None, strict)
}

#[test]
fn planning_independent_given_file_has_enough_cases_covering_every_reaction_issue10() {
    let cases = load();
    assert!(
        cases.len() >= MIN_CASES,
        "{} cases, the issue asks for at least {MIN_CASES}",
        cases.len()
    );
    let ids: BTreeSet<&str> = cases.iter().map(|c| c.id.as_str()).collect();
    assert_eq!(ids.len(), cases.len(), "duplicate case ids");
    let mut per_reaction: BTreeMap<&str, usize> = BTreeMap::new();
    for c in &cases {
        assert!(
            REACTIONS.contains(&c.reaction.as_str()),
            "{}: unknown reaction {}",
            c.id,
            c.reaction
        );
        *per_reaction.entry(c.reaction.as_str()).or_default() += 1;
        if let Some(k) = &c.control {
            assert!(
                k == "kinetic" || k == "thermodynamic",
                "{}: control {k}",
                c.id
            );
        }
        assert!(!c.acceptable.is_empty(), "{}: no acceptable base", c.id);
        assert!(
            c.min_equiv > 0.0 && c.min_equiv <= 3.0,
            "{}: min_equiv {}",
            c.id,
            c.min_equiv
        );
        assert!(
            c.source.len() > 10 && c.source != "-",
            "{}: a case names its source",
            c.id
        );
        assert!(!c.note.is_empty(), "{}: empty note cell", c.id);
        // A base may not be both acceptable and unacceptable.
        for (name, why) in &c.unacceptable {
            assert!(!why.is_empty(), "{}: {name} without a reason", c.id);
            assert!(
                !c.acceptable.iter().any(|a| same_reagent(a, name)),
                "{}: {name} both acceptable and unacceptable",
                c.id
            );
        }
    }
    for r in REACTIONS {
        assert!(
            per_reaction.get(r).copied().unwrap_or(0) >= 3,
            "reaction {r}: {:?} cases, at least 3 wanted",
            per_reaction.get(r)
        );
    }
    for k in ["kinetic", "thermodynamic"] {
        assert!(
            cases.iter().any(|c| c.control.as_deref() == Some(k)),
            "no {k} case"
        );
    }
    // Catalytic, two-equivalent and one-equivalent cases are all present.
    assert!(cases.iter().any(|c| c.min_equiv <= 0.2));
    assert!(cases.iter().any(|c| c.min_equiv >= 2.0));
    println!("cases per reaction: {per_reaction:?}");
}

#[test]
fn planning_independent_given_reagent_names_are_catalogue_or_known_reagents_issue10() {
    // Every part of every entry is a catalogue base or a reagent of
    // OTHER_REAGENTS; this catches misspelt names, which would never match.
    let catalogue = catalogue_names();
    let others: BTreeSet<String> = OTHER_REAGENTS.iter().map(|s| norm(s)).collect();
    let mut unknown = Vec::new();
    for c in load() {
        let names = c
            .acceptable
            .iter()
            .cloned()
            .chain(c.unacceptable.iter().map(|(n, _)| n.clone()));
        for entry in names {
            for step in norm(&entry).split(" then ") {
                for p in step.split('/') {
                    if !catalogue.contains(p) && !others.contains(p) {
                        unknown.push(format!("{}: {p}", c.id));
                    }
                }
            }
        }
    }
    assert!(unknown.is_empty(), "unknown reagent names: {unknown:?}");
}

#[test]
fn scan_given_independent_planning_case_site_is_an_acidic_site_issue10() {
    // Every SMILES reads and every target atom is a site of today's scan,
    // except the rows whose note says issue 11 must add the site class.
    let mut missing = Vec::new();
    let mut now_found = Vec::new();
    for c in load() {
        let (code, out, err) = run(&["scan", "--json", &c.smiles]);
        assert_eq!(code, Some(0), "{}: {} exit {code:?}: {err}", c.id, c.smiles);
        let rec: serde_json::Value = serde_json::from_str(out.trim()).expect("one JSON record");
        assert_eq!(rec["ok"], true, "{}: {}", c.id, c.smiles);
        let found = rec["sites"].as_array().is_some_and(|s| {
            s.iter().any(|site| {
                site["atoms"]
                    .as_array()
                    .is_some_and(|a| a.iter().any(|x| x.as_u64() == Some(c.site as u64)))
            })
        });
        let awaits_issue11 = c.note.contains("needs issue 11") && c.note.contains("not a site");
        match (found, awaits_issue11) {
            (false, false) => missing.push(format!("{} {} atom {}", c.id, c.smiles, c.site)),
            (true, true) => now_found.push(c.id.clone()),
            _ => {}
        }
    }
    if !now_found.is_empty() {
        println!("sites issue 11 added since the notes were written: {now_found:?}");
    }
    assert!(
        missing.is_empty(),
        "target atoms that are no site: {missing:?}"
    );
}

#[test]
fn accepts_given_matching_rule_examples_issue10() {
    // The matching rule of corpus/advice/README.md, checked on its examples.
    let cat = catalogue_names();
    assert!(accepts("lda", "LDA", &cat));
    assert!(accepts("TMSCl/Et3N", "Et3N/TMSCl", &cat));
    assert!(accepts("LiCl/DBU", "DBU", &cat));
    assert!(accepts("LDA/LiCl", "LDA", &cat));
    assert!(accepts("enamine (pyrrolidine)", "enamine", &cat));
    assert!(!accepts("enamine (pyrrolidine)", "imine anion", &cat));
    assert!(!accepts("Et3N", "Et3N/TMSCl", &cat));
    assert!(!accepts("Et3N/TMSCl", "TMSCl", &cat));
    assert!(!accepts("Et3N/TBSOTf", "Et3N/TMSCl", &cat));
    assert!(accepts("NaH then n-BuLi", "NaH then  n-BuLi", &cat));
    assert!(!accepts("NaH then n-BuLi", "n-BuLi", &cat));
    assert!(!accepts("NaH then n-BuLi", "NaH", &cat));
    assert!(same_reagent("et3n/tmscl", "TMSCl/Et3N"));
    assert!(!same_reagent("LiCl/Et3N", "Et3N"));
    assert!(equivalents_agree(2.1, 2.0));
    assert!(!equivalents_agree(1.1, 2.0));
    assert!(equivalents_agree(0.02, 0.05));
    assert!(equivalents_agree(1.1, 0.05));
    assert!(!equivalents_agree(0.02, 1.0));
}

#[test]
fn scan_given_independent_planning_cases_agrees_with_practice_issue10() {
    let catalogue = catalogue_names();
    let cases = load();
    let mut disagreements = Vec::new();
    let mut strict_only = Vec::new();
    let mut agree_per_reaction: BTreeMap<&str, (usize, usize)> = BTreeMap::new();
    for c in &cases {
        let (shown, why, strict) = judge(c, &catalogue);
        if let Some(s) = strict {
            strict_only.push(format!("{} {shown}: {s}", c.id));
        }
        let e = agree_per_reaction.entry(c.reaction.as_str()).or_default();
        e.1 += 1;
        match why {
            None => e.0 += 1,
            Some(w) => disagreements.push((c, shown, w)),
        }
    }
    let agreed = cases.len() - disagreements.len();
    let share = agreed as f64 / cases.len() as f64;
    println!("disagreements ({}):", disagreements.len());
    println!(
        "{:<8} {:<20} {:<14} {:<22} why",
        "id", "reaction", "control", "advised"
    );
    for (c, shown, why) in &disagreements {
        println!(
            "{:<8} {:<20} {:<14} {:<22} {why}",
            c.id,
            c.reaction,
            c.control.as_deref().unwrap_or("-"),
            shown
        );
    }
    for (r, (a, n)) in &agree_per_reaction {
        println!("{r:<20} {a}/{n}");
    }
    println!(
        "agreement {agreed}/{} = {:.1} %",
        cases.len(),
        100.0 * share
    );
    // Reported, not asserted: the stricter reading of corpus/advice/planning.tsv.
    println!(
        "stricter reading (alternatives checked too, catalytic cases at most 0.5 equiv): {}/{} = {:.1} %",
        agreed - strict_only.len(),
        cases.len(),
        100.0 * (agreed - strict_only.len()) as f64 / cases.len() as f64
    );
    for s in &strict_only {
        println!("  {s}");
    }
    assert!(
        share >= MIN_AGREEMENT,
        "agreement {:.1} % below {:.0} %",
        100.0 * share,
        100.0 * MIN_AGREEMENT
    );
}

#[test]
fn scan_given_unknown_reaction_exits_2_listing_valid_names_issue10() {
    let (code, out, err) = run(&["scan", "--json", "--reaction", "banana", "CC(C)=O"]);
    assert_eq!(code, Some(2), "stdout {out} stderr {err}");
    assert!(out.trim().is_empty(), "no record on a fatal error: {out}");
    for r in REACTIONS {
        assert!(err.contains(r), "the error lists {r}: {err}");
    }
}
