//! `annotate`, `scan` and `draw` on SD files and molfiles; refusal of inputs
//! the tool cannot read (issue 14). The SD records are RDKit-written
//! (`corpus/mol/sdf/reference.sdf.gz`, see `corpus/mol/README.md`).

use crate::common;
use common::run_binary;
use std::io::Read;

fn reference_records(n: usize) -> Vec<String> {
    let path = concat!(
        env!("CARGO_MANIFEST_DIR"),
        "/corpus/mol/sdf/reference.sdf.gz"
    );
    let mut s = String::new();
    flate2::read::GzDecoder::new(std::fs::File::open(path).unwrap())
        .read_to_string(&mut s)
        .unwrap();
    s.split_inclusive("$$$$\n")
        .take(n)
        .map(str::to_string)
        .collect()
}

fn json_lines(out: &[u8]) -> Vec<serde_json::Value> {
    String::from_utf8_lossy(out)
        .lines()
        .map(|l| serde_json::from_str(l).expect("JSON line"))
        .collect()
}

fn temp(name: &str, bytes: &[u8]) -> std::path::PathBuf {
    let dir = std::env::temp_dir().join(format!("acidsite-cli-sdf-{}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    let p = dir.join(name);
    std::fs::write(&p, bytes).unwrap();
    p
}

#[test]
fn annotate_given_gzip_sd_file_gives_one_record_per_molecule_issue14() {
    let path = concat!(
        env!("CARGO_MANIFEST_DIR"),
        "/corpus/mol/sdf/reference.sdf.gz"
    );
    let out = run_binary(&["annotate", path, "--quiet", "--sites-only"], b"");
    assert_eq!(
        out.status.code(),
        Some(0),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    let recs = json_lines(&out.stdout);
    assert_eq!(recs.len(), 2454);
    assert_eq!(recs[0]["id"], "chembl-1");
    assert_eq!(recs[0]["line"], 1);
    // Data items are carried like CSV columns.
    assert_eq!(recs[0]["columns"]["rdkit_formula"], recs[0]["formula"]);
    assert!(recs.iter().all(|r| r["mapped_smiles"].is_string()));
}

#[test]
fn annotate_given_broken_record_resynchronises_at_next_separator_issue14() {
    let mut recs = reference_records(3);
    // Record 2: an atom line with a letter where a coordinate belongs.
    let lines: Vec<&str> = recs[1].lines().collect();
    let bad = lines[4].replacen("0.", "x.", 1);
    recs[1] = recs[1].replacen(lines[4], &bad, 1);
    let start2 = recs[0].lines().count() + 1;
    let text = recs.concat();
    let out = run_binary(
        &["annotate", "--quiet", "--sites-only", "--threads", "1"],
        text.as_bytes(),
    );
    assert_eq!(out.status.code(), Some(1));
    let r = json_lines(&out.stdout);
    assert_eq!(r.len(), 3);
    assert_eq!(
        (
            r[0]["ok"].as_bool(),
            r[1]["ok"].as_bool(),
            r[2]["ok"].as_bool()
        ),
        (Some(true), Some(false), Some(true))
    );
    assert_eq!(r[1]["line"], start2 as u64);
    let msg = r[1]["error"]["message"].as_str().unwrap();
    assert!(
        msg.starts_with(&format!("SD record 2, line {}:", start2 + 4)),
        "{msg}"
    );
    assert_eq!(r[1]["error"]["kind"], "molfile");
}

#[test]
fn annotate_given_id_field_and_csv_output_carries_data_items_issue14() {
    let text = reference_records(4).concat();
    let p = temp("four.sdf", text.as_bytes());
    let out = run_binary(
        &[
            "annotate",
            p.to_str().unwrap(),
            "--quiet",
            "--id-field",
            "smiles",
            "--format",
            "csv",
            "--sites-only",
        ],
        b"",
    );
    assert_eq!(out.status.code(), Some(0));
    let csv = String::from_utf8_lossy(&out.stdout);
    let mut lines = csv.lines();
    let header = lines.next().unwrap();
    assert!(
        header.starts_with("line,id,source,form,rdkit_formula,rdkit_total_h,smiles,"),
        "{header}"
    );
    let first = lines.next().unwrap();
    assert!(first.contains(",N[C@@H](Cc1ccc(O)cc1)"), "{first}");
    assert_eq!(lines.count(), 3);
}

#[test]
fn annotate_given_sd_parallel_output_equals_sequential_issue14() {
    let text = reference_records(300).concat();
    let one = run_binary(
        &["annotate", "--quiet", "--threads", "1", "--chunk", "7"],
        text.as_bytes(),
    );
    let many = run_binary(
        &["annotate", "--quiet", "--threads", "4", "--chunk", "7"],
        text.as_bytes(),
    );
    assert_eq!(one.status.code(), Some(0));
    assert_eq!(one.stdout, many.stdout);
}

#[test]
fn annotate_given_unsupported_inputs_exits_2_with_clear_message_issue14() {
    let cases: Vec<(std::path::PathBuf, &str)> = vec![
        (
            temp("book.xlsx", b"PK\x03\x04\x14\x00\x06\x00"),
            "zip archive",
        ),
        (temp("list.json", b"[\"CCO\"]\n"), ".json"),
        (temp("blob", &[0u8, 1, 2, 3, 0, 255, 254, 0]), "binary"),
    ];
    for (p, words) in cases {
        let out = run_binary(&["annotate", p.to_str().unwrap(), "--quiet"], b"");
        let err = String::from_utf8_lossy(&out.stderr);
        assert_eq!(out.status.code(), Some(2), "{err}");
        assert!(
            err.contains("unsupported format") && err.contains(words),
            "{err}"
        );
        assert!(out.stdout.is_empty());
    }
    // Binary on stdin too.
    let out = run_binary(&["annotate", "--quiet"], b"\x89PNG\r\n\x1a\n\x00\x00");
    assert_eq!(out.status.code(), Some(2));
}

#[test]
fn scan_and_draw_given_mol_file_use_molfile_atom_order_issue14() {
    let rec = &reference_records(2)[1]; // chembl-2: Cc1cccc(NC(=O)/C=C/c2ccccc2)c1
    let p = temp("one.mol", rec.as_bytes());
    let out = run_binary(&["scan", "--mol", p.to_str().unwrap(), "--json"], b"");
    assert_eq!(out.status.code(), Some(0));
    let r = &json_lines(&out.stdout)[0];
    assert_eq!(r["id"], "chembl-2");
    // Atom 6 of the molfile is the anilide nitrogen (RDKit wrote the atoms
    // in SMILES order).
    assert_eq!(r["sites"][0]["atoms"][0], 6);
    assert_eq!(r["sites"][0]["element"], "N");
    let out = run_binary(&["draw", "--mol", p.to_str().unwrap()], b"");
    assert_eq!(out.status.code(), Some(0));
    let svg = String::from_utf8_lossy(&out.stdout);
    assert!(svg.starts_with("<svg") && svg.contains("data-atom=\"6\""));
    let out = run_binary(&["scan", "--mol", "/nonexistent/x.mol"], b"");
    assert_eq!(out.status.code(), Some(2));
}

#[test]
fn annotate_given_hostile_sd_records_gives_one_record_each_issue14() {
    let good = reference_records(1).remove(0);
    let body = good.trim_end_matches("$$$$\n");
    let hostile: Vec<String> = vec![
        String::new(),                                           // empty record
        "\x00\x01garbage\u{fffd}\n".into(),                     // control bytes
        body.replacen("V2000", "V3000", 1),                      // wrong version mark
        "t\n\n\n999999999  0  0  0  0  0  0  0  0  0999 V2000\nM  END\n".into(),
        "t\n\n\n  0  0  0     0  0            999 V3000\nM  V30 BEGIN CTAB\nM  V30 COUNTS 100000000 0 0 0 0\nM  END\n".into(),
        body[..body.len() / 2].to_string(),                      // cut in half
        body.replace("M  END", "M  CHG  9   1  -1\nM  END"),     // announces more than it holds
    ];
    let mut text = String::new();
    for h in &hostile {
        text.push_str(h);
        if !h.ends_with('\n') && !h.is_empty() {
            text.push('\n');
        }
        text.push_str("$$$$\n");
        text.push_str(&good);
    }
    let out = run_binary(
        &[
            "annotate",
            "--quiet",
            "--sites-only",
            "--input-format",
            "sdf",
        ],
        text.as_bytes(),
    );
    assert_eq!(
        out.status.code(),
        Some(1),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    let r = json_lines(&out.stdout);
    assert_eq!(r.len(), 2 * hostile.len());
    for (k, rec) in r.iter().enumerate() {
        // Every good record after a hostile one is read again.
        assert_eq!(
            rec["ok"].as_bool(),
            Some(k % 2 == 1),
            "record {}: {rec}",
            k + 1
        );
        if k % 2 == 0 {
            let kind = rec["error"]["kind"].as_str().unwrap();
            assert_ne!(kind, "internal", "{rec}");
        }
    }
}
