//! Snapshots of the `acidsite scan` report for representative molecules (the
//! human layout is part of the product: a change shows up here for review).
//! Molecules are textbook compounds chosen by their class (common practice).
//! Issue 6.

use std::process::Command;

const BIN: &str = env!("CARGO_BIN_EXE_acidsite");

fn scan(args: &[&str]) -> String {
    let out = Command::new(BIN)
        .arg("scan")
        .args(args)
        .output()
        .expect("run acidsite");
    let mut text = String::from_utf8(out.stdout).expect("UTF-8 report");
    text.push_str(&format!("[exit {}]\n", out.status.code().unwrap_or(-1)));
    text
}

#[test]
fn scan_given_unsymmetrical_ketone() {
    // 2-methylcyclohexanone: kinetic and thermodynamic enolate sides.
    insta::assert_snapshot!(scan(&["CC1CCCCC1=O"]));
}

#[test]
fn scan_given_beta_keto_ester() {
    // ethyl acetoacetate: doubly activated CH2, ester present.
    insta::assert_snapshot!(scan(&["CCOC(=O)CC(C)=O"]));
}

#[test]
fn scan_given_hydroxy_amide_with_competing_sites() {
    // N-(2-hydroxyethyl)phenylacetamide: O-H and N-H compete with the benzylic CH2.
    insta::assert_snapshot!(scan(&["OCCNC(=O)Cc1ccccc1"]));
}

#[test]
fn scan_given_ammonium_salt() {
    // methyl piperidin-4-ylacetate hydrochloride: main component and counter-ion.
    insta::assert_snapshot!(scan(&["[Cl-].COC(=O)CC1CC[NH2+]CC1"]));
}

#[test]
fn scan_given_aldehyde() {
    // propanal: self-aldol warning.
    insta::assert_snapshot!(scan(&["CCC=O"]));
}

#[test]
fn scan_given_water_scale_and_chosen_base() {
    // diethyl malonate with sodium ethoxide, ranked on the water scale.
    insta::assert_snapshot!(scan(&[
        "CCOC(=O)CC(=O)OCC",
        "--scale",
        "water",
        "--base",
        "NaOEt"
    ]));
}

#[test]
fn scan_given_chosen_site() {
    // 2-butanone, target the CH2 (atom 3, the more substituted side) instead of the default site.
    insta::assert_snapshot!(scan(&["CC(=O)CC", "--site", "3"]));
}

#[test]
fn scan_given_broken_smiles() {
    // unclosed branch: error with a caret under the position.
    insta::assert_snapshot!(scan(&["CC(=O"]));
}

#[test]
fn scan_given_json_flag() {
    // acetonitrile as one JSON record.
    insta::assert_snapshot!(scan(&["--json", "CC#N"]));
}
