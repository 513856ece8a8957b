//! `acidsite bases`, `acidsite rules` and `acidsite equilibrium` through the
//! real binary. Issue 6.

use std::process::Command;

const BIN: &str = env!("CARGO_BIN_EXE_acidsite");

fn run(args: &[&str]) -> (Option<i32>, String, String) {
    let out = Command::new(BIN).args(args).output().expect("run acidsite");
    (
        out.status.code(),
        String::from_utf8(out.stdout).unwrap(),
        String::from_utf8_lossy(&out.stderr).into_owned(),
    )
}

#[test]
fn rules_given_no_options_lists_version_rules_and_sources() {
    let (code, out, _) = run(&["rules"]);
    assert_eq!(code, Some(0));
    let version = acidsite::sites::rule_set_version();
    assert!(
        out.starts_with(&format!("rule set {version} (")),
        "{}",
        &out[..80.min(out.len())]
    );
    let set = acidsite::sites::rule_set().unwrap();
    for r in &set.rules {
        assert!(out.contains(&r.id), "rule {} missing", r.id);
    }
    assert!(out.contains("\nsources\n"));
    let (code, json, _) = run(&["rules", "--json", "--only", "malonate"]);
    assert_eq!(code, Some(0));
    let recs: Vec<serde_json::Value> = json
        .lines()
        .map(|l| serde_json::from_str(l).unwrap())
        .collect();
    assert!(!recs.is_empty());
    assert!(recs.iter().all(|r| r["rule_set"] == version));
}

#[test]
fn bases_given_name_shows_one_base_with_sources() {
    let (code, out, _) = run(&["bases"]);
    assert_eq!(code, Some(0));
    for name in ["LDA", "NaH", "KOtBu", "DBU", "K2CO3"] {
        // bases every catalogue of this kind holds (issue 5 list)
        assert!(out.lines().any(|l| l.starts_with(name)), "{name} missing");
    }
    let (code, json, _) = run(&["bases", "--json", "nbuli"]);
    assert_eq!(code, Some(0));
    let rec: serde_json::Value = serde_json::from_str(json.trim()).unwrap();
    assert_eq!(rec["name"], "n-BuLi");
    assert!(rec["hazards"]
        .as_array()
        .unwrap()
        .iter()
        .any(|h| h == "pyrophoric")); // common practice
    assert_eq!(run(&["bases", "no-such-base"]).0, Some(2));
}

#[test]
fn equilibrium_given_acetone_and_ethoxide_in_ethanol_leaves_little_enolate() {
    // Acetone with 1 equiv NaOEt in EtOH at 0.5 mol/L: about a thousandth or
    // less as enolate (common practice).
    let (code, out, err) = run(&[
        "equilibrium",
        "CC(C)=O",
        "--base",
        "NaOEt",
        "--equiv",
        "1",
        "--solvent",
        "EtOH",
        "--json",
    ]);
    assert_eq!(code, Some(0), "{err}");
    let rec: serde_json::Value = serde_json::from_str(out.trim()).unwrap();
    let f = rec["sites"][0]["deprotonated"].as_f64().unwrap();
    assert!(f > 0.0 && f < 2e-3, "enolate fraction {f}");
    let anions: f64 = rec["anions"]
        .as_array()
        .unwrap()
        .iter()
        .map(|x| x["fraction"].as_f64().unwrap())
        .sum();
    // Six significant digits per species (issue 14: no float noise).
    assert!((anions - 1.0).abs() < 1e-5);
    assert_eq!(rec["anions"][0]["charge"], 0);
    assert_eq!(rec["anions"][1]["charge"], -1);
    let text = out.trim();
    assert!(
        !text.contains("9999999") && !text.contains("0000001"),
        "float noise in {text}"
    );
}

#[test]
fn equilibrium_given_bad_input_fails_with_right_code() {
    assert_eq!(
        run(&["equilibrium", "CC(C)=O", "--base", "nope"]).0,
        Some(2)
    );
    assert_eq!(
        run(&["equilibrium", "CC(C)=O", "--base", "LDA", "--equiv", "-1"]).0,
        Some(2)
    );
    let (code, out, _) = run(&["equilibrium", "CC(=O", "--base", "LDA"]);
    assert_eq!(code, Some(1));
    assert!(out.contains("not read"), "{out}");
}

#[test]
fn rules_given_only_matching_no_increment_prints_no_empty_increments_table_issue14() {
    let (code, out, _) = run(&["rules", "--only", "ketone"]);
    assert_eq!(code, Some(0));
    assert!(out.contains("class rules:"), "{out}");
    assert!(!out.contains("increments: added"), "{out}");
}

#[test]
fn rules_given_only_matching_nothing_says_so_and_exits_1_issue14() {
    let (code, out, err) = run(&["rules", "--only", "no-such-class-xyz"]);
    assert_eq!(code, Some(1));
    assert!(out.is_empty(), "{out}");
    assert!(err.contains("no-such-class-xyz"), "{err}");
}

#[test]
fn bases_given_no_options_fits_120_columns_and_lists_systems_issue14() {
    let (code, out, _) = run(&["bases"]);
    assert_eq!(code, Some(0));
    for line in out.lines() {
        assert!(
            line.chars().count() <= 120,
            "{} columns: {line}",
            line.chars().count()
        );
    }
    assert!(out.contains("Et3N/TMSCl"), "reagent systems listed");
    let (_, wide, _) = run(&["bases", "--wide"]);
    assert!(wide.contains("[bordwell1988]") && wide.contains("\nsources\n"));
}

#[test]
fn bases_given_system_name_shows_it_with_its_caution_issue10() {
    let (code, json, _) = run(&["bases", "--json", "Et3N/TMSCl"]);
    assert_eq!(code, Some(0));
    let rec: serde_json::Value = serde_json::from_str(json.trim()).unwrap();
    assert_eq!(rec["system"], "Et3N/TMSCl");
    assert_eq!(rec["source"], "house1969");
    assert!(rec["caution"]
        .as_str()
        .unwrap()
        .contains("safety data sheet"));
    let (_, lda, _) = run(&["bases", "--json", "LDA"]);
    let rec: serde_json::Value = serde_json::from_str(lda.trim()).unwrap();
    assert!(rec["caution"]
        .as_str()
        .unwrap()
        .contains("safety data sheet"));
}
