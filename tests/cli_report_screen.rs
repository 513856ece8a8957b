//! The scan report of one molecule fits one screen in the common case: the
//! ruled-out bases grouped by kind of reason, one line each, with every
//! reason behind `--all`; a CSV header piped as a SMILES list gets a hint.
//! Issue 14.

use crate::common;

fn run(args: &[&str], stdin: &[u8]) -> (Option<i32>, String, String) {
    let out = common::run_binary(args, stdin);
    (
        out.status.code(),
        String::from_utf8(out.stdout).unwrap(),
        String::from_utf8_lossy(&out.stderr).into_owned(),
    )
}

#[test]
fn scan_given_default_groups_ruled_out_bases_and_all_gives_each_reason_issue14() {
    // Ethyl 2-methyl-3-oxo-3-phenylpropanoate: many bases are ruled out
    // for several different reasons.
    let smiles = "CCOC(=O)C(C)C(=O)c1ccccc1";
    let (code, short, _) = run(&["scan", smiles], b"");
    assert_eq!(code, Some(0));
    let (_, all, _) = run(&["scan", "--all", smiles], b"");
    let ruled_out = |text: &str| {
        text.lines()
            .skip_while(|l| !l.trim_start().starts_with("ruled out"))
            .skip(1)
            .take_while(|l| l.starts_with("     "))
            .count()
    };
    let (n_short, n_all) = (ruled_out(&short), ruled_out(&all));
    assert!(n_short >= 2 && n_short < n_all, "{n_short} vs {n_all}");
    // Grouped: every rejected base of the JSON record is still named.
    let (_, json, _) = run(&["scan", "--json", smiles], b"");
    let rec: serde_json::Value = serde_json::from_str(json.trim()).unwrap();
    for r in rec["advice"]["rejected"].as_array().unwrap() {
        let base = r["base"].as_str().unwrap();
        assert!(short.contains(base), "{base} missing from the short report");
        assert!(all.contains(base));
    }
    // The long reasons appear only with --all.
    assert!(all.contains("transesterification: the tert-butyl alkoxide"));
    assert!(!short.contains("transesterification: the tert-butyl alkoxide"));
    assert!(short.lines().count() < 60, "{}", short.lines().count());
}

#[test]
fn annotate_given_csv_header_on_stdin_hints_input_format_issue14() {
    let (code, out, err) = run(&["annotate", "--quiet"], b"smiles,id\nCCO,a\n");
    assert_eq!(code, Some(1));
    assert_eq!(out.lines().count(), 2);
    assert!(err.contains("--input-format csv"), "{err}");
    let (code, _, err) = run(
        &["annotate", "--quiet", "--input-format", "csv"],
        b"smiles,id\nCCO,a\n",
    );
    assert_eq!(code, Some(0));
    assert!(!err.contains("--input-format"), "{err}");
}
