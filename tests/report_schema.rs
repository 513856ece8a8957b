//! Locks the JSON record schema (`acidsite-record/4`, documented in
//! `src/report/record.rs`): records from the real binary must deserialize into
//! mirror types that refuse unknown keys, and the required keys must be present.
//! A change here is a schema change: bump `SCHEMA` and the docs with it. Issue 6.

use crate::common;
use serde::Deserialize;
use serde_json::Value;
use std::collections::BTreeMap;

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
#[allow(dead_code)]
struct RecordMirror {
    schema: String,
    line: u64,
    id: Option<String>,
    input: String,
    ok: bool,
    columns: Option<BTreeMap<String, String>>,
    formula: Option<String>,
    components: Option<Vec<ComponentMirror>>,
    rule_set: Option<String>,
    sites: Option<Vec<SiteMirror>>,
    advice: Option<AdviceMirror>,
    advice_note: Option<String>,
    hazards: Option<Vec<HazardMirror>>,
    mapped_smiles: Option<String>,
    flags: Option<BTreeMap<String, u64>>,
    flag_warnings: Option<Vec<String>>,
    error: Option<ErrorMirror>,
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
#[allow(dead_code)]
struct HazardMirror {
    id: String,
    text: String,
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
#[allow(dead_code)]
struct ComponentMirror {
    role: String,
    smiles: String,
    formula: String,
    charge: i32,
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
#[allow(dead_code)]
struct SiteMirror {
    rank: u32,
    atoms: Vec<usize>,
    element: String,
    hydrogens: u8,
    /// Present only for a labelled site (issue 11).
    deuterium: Option<u8>,
    tritium: Option<u8>,
    class: String,
    pka_dmso: Option<f64>,
    pka_water: Option<f64>,
    uncertainty: f64,
    rules: Vec<RuleMirror>,
    regio: Option<String>,
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
#[allow(dead_code)]
struct RuleMirror {
    id: String,
    dmso: Option<f64>,
    water: Option<f64>,
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
#[allow(dead_code)]
struct AdviceMirror {
    target: Vec<usize>,
    reaction: String,
    control: Option<String>,
    mode: String,
    mode_note: String,
    practice_row: Option<String>,
    not_judged: Vec<NotJudgedMirror>,
    base: Option<String>,
    equivalents: Option<f64>,
    conversion: Option<f64>,
    solvent: Option<String>,
    temperature_c: Option<f64>,
    scale: Option<String>,
    alternatives: Vec<AlternativeMirror>,
    alternatives_omitted: usize,
    rejected: Vec<RejectedMirror>,
    warnings: Vec<String>,
    cautions: Vec<CautionMirror>,
    target_note: String,
    equivalents_note: String,
    counted: Vec<CountedMirror>,
    temperature_range_c: Option<[f64; 2]>,
    scale_note: String,
    regio_conditions: Option<RegioMirror>,
    catalogue: String,
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
#[allow(dead_code)]
struct NotJudgedMirror {
    base: String,
    missing: String,
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
#[allow(dead_code)]
struct CautionMirror {
    reagent: String,
    hazards: Vec<String>,
    text: String,
    full: bool,
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
#[allow(dead_code)]
struct CountedMirror {
    atoms: Vec<usize>,
    class: String,
    protons: usize,
    reason: String,
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
#[allow(dead_code)]
struct AlternativeMirror {
    base: String,
    equivalents: f64,
    conversion: f64,
    solvent: String,
    temperature_range_c: [f64; 2],
    note: String,
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
#[allow(dead_code)]
struct RegioMirror {
    kinetic: RegioSideMirror,
    thermodynamic: RegioSideMirror,
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
#[allow(dead_code)]
struct RegioSideMirror {
    base: String,
    equivalents: f64,
    solvent: String,
    temperature_range_c: [f64; 2],
    procedure: String,
    favours: Vec<usize>,
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
#[allow(dead_code)]
struct RejectedMirror {
    base: String,
    kind: String,
    reason: String,
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
#[allow(dead_code)]
struct ErrorMirror {
    kind: String,
    message: String,
    position: Option<usize>,
}

fn run(args: &[&str], stdin: &[u8]) -> (Option<i32>, String) {
    let out = common::run_binary(args, stdin);
    (out.status.code(), String::from_utf8(out.stdout).unwrap())
}

fn check(line: &str) -> RecordMirror {
    let rec: RecordMirror = serde_json::from_str(line)
        .unwrap_or_else(|e| panic!("record does not match the schema: {e}\n{line}"));
    let v: Value = serde_json::from_str(line).unwrap();
    let o = v.as_object().unwrap();
    assert_eq!(rec.schema, "acidsite-record/4");
    for key in ["schema", "line", "id", "input", "ok"] {
        assert!(o.contains_key(key), "missing {key}: {line}");
    }
    if rec.ok {
        for key in [
            "formula",
            "components",
            "rule_set",
            "sites",
            "advice",
            "mapped_smiles",
        ] {
            assert!(o.contains_key(key), "missing {key}: {line}");
        }
        assert!(!o.contains_key("error"));
    } else {
        assert!(rec.error.is_some(), "failure without error: {line}");
        for key in ["formula", "sites", "advice"] {
            assert!(!o.contains_key(key), "failure with {key}: {line}");
        }
    }
    rec
}

#[test]
fn scan_json_given_success_and_failure_matches_schema() {
    // Ethyl acetoacetate (a beta-keto ester), a sodium salt, and a broken SMILES.
    let (code, out) = run(
        &[
            "scan",
            "--json",
            "CCOC(=O)CC(C)=O",
            "[Na+].[O-]C(=O)Cc1ccccc1",
            "CC(=O",
        ],
        b"",
    );
    assert_eq!(code, Some(1));
    let recs: Vec<RecordMirror> = out.lines().map(check).collect();
    assert_eq!(recs.len(), 3);
    assert!(recs[0].ok && recs[1].ok && !recs[2].ok);
    assert_eq!(recs[0].line, 1);
    assert_eq!(recs[0].formula.as_deref(), Some("C6H10O3")); // Hill formula of ethyl acetoacetate
    let comps = recs[1].components.as_ref().unwrap();
    assert_eq!(comps.len(), 2);
    assert_eq!(comps[0].role, "main");
    assert_eq!(comps[1].role, "counter_ion");
    assert_eq!(comps[1].smiles, "[Na+]");
    let e = recs[2].error.as_ref().unwrap();
    assert!(!e.message.is_empty());
}

#[test]
fn annotate_given_csv_with_flags_matches_schema() {
    let input = b"id,smiles,batch\nA-1,CCOC(C)=O,b7\nA-2,CC(=O,b8\n";
    let dir = std::env::temp_dir().join(format!("acidsite-schema-{}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    let p = dir.join("list.csv");
    std::fs::write(&p, input).unwrap();
    let (code, out) = run(
        &[
            "annotate",
            p.to_str().unwrap(),
            "--flag",
            "ester=C(=O)O[#6]",
            "--flag",
            "halide=[Cl,Br,I][CX4]",
        ],
        b"",
    );
    assert_eq!(code, Some(1));
    let recs: Vec<RecordMirror> = out.lines().map(check).collect();
    assert_eq!(recs.len(), 2);
    assert_eq!(recs[0].id.as_deref(), Some("A-1"));
    assert_eq!(recs[0].line, 2);
    let cols = recs[0].columns.as_ref().unwrap();
    assert_eq!(cols.get("batch").map(String::as_str), Some("b7"));
    let flags = recs[0].flags.as_ref().unwrap();
    // Ethyl acetate has one ester group and no alkyl halide (common practice).
    assert_eq!(flags.get("ester"), Some(&1));
    assert_eq!(flags.get("halide"), Some(&0));
    assert_eq!(
        recs[1]
            .columns
            .as_ref()
            .unwrap()
            .get("batch")
            .map(String::as_str),
        Some("b8")
    );
    // Flag keys keep the order given on the command line.
    let first = out.lines().next().unwrap();
    assert!(first.find("\"ester\"").unwrap() < first.find("\"halide\"").unwrap());
}

#[test]
fn annotate_given_sites_only_gives_null_advice_with_note() {
    let (code, out) = run(
        &["annotate", "-", "--sites-only", "--quiet"],
        b"CC(C)=O acetone\n",
    );
    assert_eq!(code, Some(0));
    let rec = check(out.trim());
    assert!(rec.advice.is_none());
    assert!(rec.advice_note.is_some_and(|n| n.contains("not requested")));
    assert!(!rec.sites.unwrap().is_empty());
    assert_eq!(
        run(
            &["annotate", "-", "--sites-only", "--base", "LDA"],
            b"CCO\n"
        )
        .0,
        Some(2)
    );
}
