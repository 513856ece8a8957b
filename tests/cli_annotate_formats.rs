//! `acidsite annotate` input and output formats on the demo list and small
//! generated files: CSV/TSV output with carried columns, per-site rows, gzip
//! and stdin input, `.smi` ids, column choice. Issue 6.

use crate::common;
use std::io::Write;
const DEMO: &str = concat!(
    env!("CARGO_MANIFEST_DIR"),
    "/corpus/demo/route-intermediates.csv"
);

fn run(args: &[&str], stdin: &[u8]) -> (Option<i32>, String, String) {
    let out = common::run_binary(args, stdin);
    (
        out.status.code(),
        String::from_utf8(out.stdout).unwrap(),
        String::from_utf8_lossy(&out.stderr).into_owned(),
    )
}

fn temp(name: &str, bytes: &[u8]) -> String {
    let dir = std::env::temp_dir().join(format!("acidsite-fmt-{}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    let p = dir.join(name);
    std::fs::write(&p, bytes).unwrap();
    p.to_string_lossy().into_owned()
}

/// The demo holds 32 records (2 deliberately broken) after a comment line and a header.
#[test]
fn annotate_given_demo_as_tsv_carries_columns_and_keeps_order() {
    let (code, out, err) = run(&["annotate", DEMO, "--format", "tsv"], b"");
    assert_eq!(code, Some(1), "two broken SMILES in the demo: {err}");
    let rows: Vec<Vec<&str>> = out.lines().map(|l| l.split('\t').collect()).collect();
    assert_eq!(rows.len(), 33);
    assert_eq!(
        &rows[0][..6],
        &["line", "id", "step", "note", "smiles", "ok"]
    );
    let width = rows[0].len();
    assert!(rows.iter().all(|r| r.len() == width), "ragged TSV");
    let ids: Vec<&str> = rows[1..].iter().map(|r| r[1]).collect();
    let expected: Vec<String> = (1..=32).map(|i| format!("KL-{i:03}")).collect();
    assert_eq!(ids, expected);
    assert_eq!(rows[1][0], "3"); // line 1 is the comment, line 2 the header
    assert_eq!(rows[1][3], "aldol feed; cheap, volatile");
    let broken: Vec<&str> = rows[1..]
        .iter()
        .filter(|r| r[5] == "false")
        .map(|r| r[1])
        .collect();
    assert_eq!(broken, vec!["KL-031", "KL-032"]);
    let err_col = rows[0].iter().position(|h| *h == "error").unwrap();
    assert!(rows[31][err_col].len() > 5, "error text for KL-031");
}

#[test]
fn annotate_given_demo_as_csv_quotes_fields_with_commas() {
    let (_, out, _) = run(&["annotate", DEMO, "--format", "csv"], b"");
    let kl001 = out.lines().find(|l| l.contains("KL-001")).unwrap();
    assert!(kl001.contains("\"aldol feed; cheap, volatile\""), "{kl001}");
}

#[test]
fn annotate_given_per_site_gives_at_least_one_row_per_record() {
    let (_, out, _) = run(&["annotate", DEMO, "--format", "csv", "--per-site"], b"");
    let lines: Vec<&str> = out.lines().collect();
    assert!(lines[0].starts_with("line,id,step,note,smiles,ok,formula,rank,atoms"));
    let mut seen: Vec<String> = lines[1..]
        .iter()
        .map(|l| l.split(',').nth(1).unwrap().to_string())
        .collect();
    seen.dedup();
    assert_eq!(seen.len(), 32);
}

#[test]
fn annotate_given_gzip_input_matches_plain_input() {
    let plain = b"CC(C)=O acetone\n#skip\nCCOC(C)=O ethyl acetate\n";
    let mut gz = flate2::write::GzEncoder::new(Vec::new(), flate2::Compression::default());
    gz.write_all(plain).unwrap();
    let gz_bytes = gz.finish().unwrap();
    let a = temp("list.smi", plain);
    let b = temp("list.smi.gz", &gz_bytes);
    let (ca, oa, _) = run(&["annotate", &a], b"");
    let (cb, ob, _) = run(&["annotate", &b], b"");
    assert_eq!(ca, Some(0));
    assert_eq!((ca, &oa), (cb, &ob));
    // stdin, compressed, gives the same records too.
    let (cc, oc, _) = run(&["annotate", "-"], &gz_bytes);
    assert_eq!((cc, oc), (ca, oa.clone()));
    let first: serde_json::Value = serde_json::from_str(oa.lines().next().unwrap()).unwrap();
    assert_eq!(first["id"], "acetone");
    let second: serde_json::Value = serde_json::from_str(oa.lines().nth(1).unwrap()).unwrap();
    assert_eq!(second["id"], "ethyl acetate");
    assert_eq!(second["line"], 3);
}

#[test]
fn annotate_given_tsv_with_chosen_columns() {
    let f = temp("list.tsv", b"code\tstructure\tcomment\nX1\tCC#N\tsolvent\n");
    let (code, out, err) = run(
        &[
            "annotate",
            &f,
            "--column",
            "structure",
            "--id-column",
            "code",
            "--format",
            "csv",
        ],
        b"",
    );
    assert_eq!(code, Some(0), "{err}");
    let lines: Vec<&str> = out.lines().collect();
    assert!(
        lines[0].starts_with("line,id,comment,smiles,ok"),
        "{}",
        lines[0]
    );
    assert!(
        lines[1].starts_with("2,X1,solvent,CC#N,true"),
        "{}",
        lines[1]
    );
}

#[test]
fn annotate_given_short_csv_row_gives_a_columns_error_record() {
    let f = temp("short.csv", b"id,note,smiles\nA,only two\n");
    let (code, out, _) = run(&["annotate", &f], b"");
    assert_eq!(code, Some(1));
    let rec: serde_json::Value = serde_json::from_str(out.trim()).unwrap();
    assert_eq!(rec["error"]["kind"], "columns");
    assert_eq!(rec["id"], "A");
}

#[test]
fn annotate_given_output_file_writes_it() {
    let dir = std::env::temp_dir().join(format!("acidsite-fmt-out-{}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    let p = dir.join("out.jsonl");
    let (code, out, err) = run(&["annotate", "-", "-o", p.to_str().unwrap()], b"CCO\n");
    assert_eq!(code, Some(0));
    assert!(out.is_empty());
    assert!(err.contains("1 records"), "summary: {err}");
    assert_eq!(std::fs::read_to_string(&p).unwrap().lines().count(), 1);
}
