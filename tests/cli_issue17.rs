//! Bulk runs that never destroy or corrupt data (issue 17): the output never
//! lands on the input, files appear only when complete, per-site rows keep
//! the header's width, repeated names are refused or made unique.

use crate::common;

fn dir(name: &str) -> std::path::PathBuf {
    let d = std::env::temp_dir().join(format!("acidsite-i17-{}-{name}", std::process::id()));
    let _ = std::fs::remove_dir_all(&d);
    std::fs::create_dir_all(&d).unwrap();
    d
}

const LIST: &str = "CC(C)=O acetone\nCCOC(C)=O ethyl_acetate\nC1CC broken\n";

#[test]
fn annotate_given_output_onto_input_refuses_and_keeps_the_input_issue17() {
    let d = dir("same");
    let input = d.join("list.smi");
    std::fs::write(&input, LIST).unwrap();
    let link = d.join("link.smi");
    std::os::unix::fs::symlink(&input, &link).unwrap();
    let hard = d.join("hard.smi");
    std::fs::hard_link(&input, &hard).unwrap();
    for out in [&input, &link, &hard] {
        let o = common::run_binary(
            &[
                "annotate",
                input.to_str().unwrap(),
                "-o",
                out.to_str().unwrap(),
            ],
            b"",
        );
        assert_eq!(o.status.code(), Some(2), "{}", out.display());
        let err = String::from_utf8_lossy(&o.stderr);
        assert!(err.contains("is the input file"), "{err}");
        assert_eq!(
            std::fs::read_to_string(&input).unwrap(),
            LIST,
            "input changed"
        );
    }
    // --html onto the input too.
    let o = common::run_binary(
        &[
            "annotate",
            input.to_str().unwrap(),
            "--html",
            link.to_str().unwrap(),
            "-o",
            d.join("x.jsonl").to_str().unwrap(),
        ],
        b"",
    );
    assert_eq!(o.status.code(), Some(2));
    assert_eq!(std::fs::read_to_string(&input).unwrap(), LIST);
    let _ = std::fs::remove_dir_all(&d);
}

#[test]
fn annotate_given_output_file_writes_it_whole_and_leaves_no_temporary_issue17() {
    let d = dir("whole");
    let input = d.join("list.smi");
    std::fs::write(&input, LIST).unwrap();
    let out = d.join("out.jsonl");
    let o = common::run_binary(
        &[
            "annotate",
            input.to_str().unwrap(),
            "-o",
            out.to_str().unwrap(),
            "-q",
        ],
        b"",
    );
    assert_eq!(o.status.code(), Some(1), "one record fails");
    let text = std::fs::read_to_string(&out).unwrap();
    assert_eq!(text.lines().count(), 3);
    let left: Vec<_> = std::fs::read_dir(&d)
        .unwrap()
        .filter_map(|e| e.ok())
        .map(|e| e.file_name().to_string_lossy().into_owned())
        .filter(|n| n.ends_with(".part"))
        .collect();
    assert!(left.is_empty(), "temporary files left: {left:?}");
    let _ = std::fs::remove_dir_all(&d);
}

#[test]
fn annotate_given_a_fatal_error_leaves_an_existing_output_untouched_issue17() {
    // A CSV without the SMILES column is fatal (exit 2) after the output
    // option is read: the old output file keeps its content.
    let d = dir("fatal");
    let input = d.join("list.csv");
    std::fs::write(&input, "name,notes\nx,y\n").unwrap();
    let out = d.join("out.jsonl");
    std::fs::write(&out, "previous results\n").unwrap();
    let o = common::run_binary(
        &[
            "annotate",
            input.to_str().unwrap(),
            "-o",
            out.to_str().unwrap(),
        ],
        b"",
    );
    assert_eq!(o.status.code(), Some(2));
    assert_eq!(std::fs::read_to_string(&out).unwrap(), "previous results\n");
    let _ = std::fs::remove_dir_all(&d);
}

/// A 30-ring fused ladder of cyclohexanes (121 carbons): a 30-atom chain
/// pattern has far more than 10,000 unique matches in it.
fn ladder() -> String {
    let n = 30;
    let label = |i: usize| {
        if i < 10 {
            i.to_string()
        } else {
            format!("%{i}")
        }
    };
    let mut s = String::from("C1CCC");
    for i in 2..=n {
        s.push_str(&label(i));
        s.push_str("CC");
    }
    s.truncate(s.len() - 2);
    s.push_str("CCCC");
    for i in (2..=n).rev() {
        s.push_str(&label(i));
        s.push_str("CC");
    }
    s.truncate(s.len() - 2);
    s.push_str("C1");
    s
}

#[test]
fn annotate_given_flag_with_huge_match_count_stops_and_says_so_issue17() {
    let chain = vec!["*"; 30].join("~");
    let flag = format!("chain={chain}");
    let input = format!("{} ladder\nCCO ethanol\n", ladder());
    let o = common::run_binary(
        &["annotate", "-", "--sites-only", "--flag", &flag, "-q"],
        input.as_bytes(),
    );
    assert_eq!(o.status.code(), Some(0));
    let recs: Vec<serde_json::Value> = String::from_utf8_lossy(&o.stdout)
        .lines()
        .map(|l| serde_json::from_str(l).unwrap())
        .collect();
    assert_eq!(recs.len(), 2, "the run goes on after the bound");
    assert_eq!(recs[0]["flags"]["chain"], 10_000);
    let w = recs[0]["flag_warnings"][0].as_str().unwrap();
    assert!(w.contains("chain") && w.contains("10000"), "{w}");
    assert!(recs[1].get("flag_warnings").is_none());
    assert_eq!(recs[1]["flags"]["chain"], 0);
}

#[test]
fn annotate_given_the_same_flag_name_twice_exits_2_issue17() {
    let o = common::run_binary(
        &["annotate", "-", "--flag", "x=C", "--flag", "x=O"],
        b"CCO\n",
    );
    assert_eq!(o.status.code(), Some(2));
    assert!(String::from_utf8_lossy(&o.stderr).contains("twice"));
    let s = common::run_binary(&["scan", "--flag", "x=C", "--flag", "x=O", "CCO"], b"");
    assert_eq!(s.status.code(), Some(2));
}

#[test]
fn annotate_given_repeated_csv_headers_names_them_apart_issue17() {
    let o = common::run_binary(
        &["annotate", "-", "--input-format", "csv", "-q"],
        b"smiles,note,note,note_2\nCCO,a,b,c\n",
    );
    let line = String::from_utf8_lossy(&o.stdout);
    let v: serde_json::Value = serde_json::from_str(line.trim()).unwrap();
    let cols = v["columns"].as_object().unwrap();
    assert_eq!(cols.len(), 3, "{line}");
    assert_eq!(cols["note"], "a");
    assert_eq!(cols["note_2"], "c");
    assert_eq!(cols["note_3"], "b");
    // No duplicate key in the record text of the columns.
    let start = line.find("\"columns\":{").unwrap();
    let obj = &line[start..start + line[start..].find('}').unwrap()];
    assert_eq!(obj.matches("\"note\"").count(), 1, "{obj}");
}

#[test]
fn annotate_given_per_site_csv_keeps_the_header_width_on_every_row_issue17() {
    for fmt in ["csv", "tsv"] {
        let o = common::run_binary(
            &["annotate", "-", "--format", fmt, "--per-site", "-q"],
            b"CC(C)=O a\nC1CC broken\nC methane\nOC(=O)CC(=O)O malonic\n",
        );
        let text = String::from_utf8_lossy(&o.stdout).into_owned();
        let sep = if fmt == "csv" { ',' } else { '\t' };
        // Fields here hold no quotes or separators except in the error text,
        // which the writer quotes: count fields with a small quote-aware split.
        let width = |l: &str| {
            let (mut n, mut q) = (1, false);
            for c in l.chars() {
                if c == '"' {
                    q = !q;
                } else if c == sep && !q {
                    n += 1;
                }
            }
            n
        };
        let mut lines = text.lines();
        let head = width(lines.next().unwrap());
        let rows: Vec<&str> = lines.collect();
        assert!(rows.len() >= 4, "{text}");
        for r in rows {
            assert_eq!(width(r), head, "{fmt}: {r}");
        }
    }
}

fn records(out: &std::process::Output) -> Vec<serde_json::Value> {
    String::from_utf8_lossy(&out.stdout)
        .lines()
        .map(|l| serde_json::from_str(l).unwrap())
        .collect()
}

#[test]
fn annotate_given_lone_cr_line_ends_reads_one_record_per_line_issue17() {
    let o = common::run_binary(&["annotate", "-", "-q"], b"CCO a\rCC(C)=O b\rCCN c\r");
    let r = records(&o);
    assert_eq!(r.len(), 3);
    assert_eq!(r[2]["id"], "c");
    assert_eq!(r[2]["line"], 3);
    // CR LF stays one line end.
    let o = common::run_binary(&["annotate", "-", "-q"], b"CCO a\r\nCCN b\r\n");
    assert_eq!(records(&o).len(), 2);
}

#[test]
fn annotate_given_vertical_tab_or_form_feed_lines_treats_both_as_blank_issue17() {
    let o = common::run_binary(&["annotate", "-", "-q"], b"CCO a\n\x0b\n\x0c\nCCN b\n");
    let r = records(&o);
    assert_eq!(r.len(), 2, "{r:?}");
    assert_eq!(o.status.code(), Some(0));
}

#[test]
fn annotate_given_quoted_csv_field_with_line_breaks_keeps_one_record_issue17() {
    let input =
        b"smiles,id,comment\nCCO,e1,\"two\nlines\"\nCCN,e2,\"say \"\"hi\"\"\"\nCC(C)=O,e3,plain\n";
    let o = common::run_binary(&["annotate", "-", "--input-format", "csv", "-q"], input);
    assert_eq!(
        o.status.code(),
        Some(0),
        "{}",
        String::from_utf8_lossy(&o.stderr)
    );
    let r = records(&o);
    assert_eq!(r.len(), 3);
    assert_eq!(r[0]["columns"]["comment"], "two\nlines");
    assert_eq!(r[0]["line"], 2, "the physical line where the record starts");
    assert_eq!(r[1]["line"], 4);
    assert_eq!(r[1]["columns"]["comment"], "say \"hi\"");
    assert_eq!(r[2]["id"], "e3");
}

#[test]
fn annotate_given_truncated_gzip_keeps_the_records_before_the_damage_issue17() {
    use std::io::Write;
    let d = dir("gzip");
    let mut text = String::new();
    for i in 0..20_000 {
        text.push_str(&format!("CC(=O)C{} m{i}\n", "C".repeat(i % 7)));
    }
    let mut enc = flate2::write::GzEncoder::new(Vec::new(), flate2::Compression::default());
    enc.write_all(text.as_bytes()).unwrap();
    let gz = enc.finish().unwrap();
    let path = d.join("list.smi.gz");
    std::fs::write(&path, &gz[..gz.len() / 2]).unwrap();
    let out = d.join("out.jsonl");
    let o = common::run_binary(
        &[
            "annotate",
            path.to_str().unwrap(),
            "-o",
            out.to_str().unwrap(),
            "-q",
            "--sites-only",
        ],
        b"",
    );
    assert_eq!(
        o.status.code(),
        Some(1),
        "{}",
        String::from_utf8_lossy(&o.stderr)
    );
    let recs: Vec<serde_json::Value> = std::fs::read_to_string(&out)
        .unwrap()
        .lines()
        .map(|l| serde_json::from_str(l).unwrap())
        .collect();
    assert!(recs.len() > 5_000, "{} records kept", recs.len());
    let last = recs.last().unwrap();
    assert_eq!(last["ok"], false);
    assert_eq!(last["error"]["kind"], "input");
    // Every record before the damage is whole and in order.
    for (i, r) in recs[..recs.len() - 1].iter().enumerate() {
        assert_eq!(r["id"], format!("m{i}"));
        assert_eq!(r["input"], format!("CC(=O)C{}", "C".repeat(i % 7)));
    }
    let _ = std::fs::remove_dir_all(&d);
}

#[test]
fn annotate_given_absurd_thread_count_exits_2_instead_of_aborting_issue17() {
    let o = common::run_binary(&["annotate", "-", "--threads", "100000"], b"CCO\n");
    assert_eq!(o.status.code(), Some(2));
    assert!(String::from_utf8_lossy(&o.stderr).contains("256"));
    let ok = common::run_binary(&["annotate", "-", "--threads", "3", "-q"], b"CCO\n");
    assert_eq!(ok.status.code(), Some(0));
}

mod lists {
    use proptest::prelude::*;
    use std::io::Write;

    // Valid and invalid SMILES (common practice examples and broken text).
    const SMILES: [&str; 8] = [
        "CC(C)=O",
        "CCOC(=O)CC(=O)OCC",
        "Oc1ccccc1",
        "C1CC",
        "CC(=O",
        "[Xx]",
        "N#CCc1ccccc1",
        "c1ccccc1C(=O)O",
    ];

    fn build(kind: u8, picks: &[(usize, bool)]) -> (Vec<u8>, Vec<String>, &'static str) {
        let ids: Vec<String> = (0..picks.len()).map(|i| format!("r{i}")).collect();
        let mut text = String::new();
        let fmt = match kind % 4 {
            0 | 3 => {
                for ((s, _), id) in picks.iter().zip(&ids) {
                    text.push_str(&format!("{} {id}\n", SMILES[*s]));
                }
                "smi"
            }
            1 => {
                text.push_str("smiles,id,comment\n");
                for ((s, multiline), id) in picks.iter().zip(&ids) {
                    let c = if *multiline {
                        "\"a, \"\"b\"\"\nc\""
                    } else {
                        "plain"
                    };
                    text.push_str(&format!("{},{id},{c}\n", SMILES[*s]));
                }
                "csv"
            }
            _ => {
                text.push_str("smiles\tid\n");
                for ((s, _), id) in picks.iter().zip(&ids) {
                    text.push_str(&format!("{}\t{id}\n", SMILES[*s]));
                }
                "tsv"
            }
        };
        let bytes = if kind % 4 == 3 {
            let mut enc = flate2::write::GzEncoder::new(Vec::new(), flate2::Compression::fast());
            enc.write_all(text.as_bytes()).unwrap();
            enc.finish().unwrap()
        } else {
            text.into_bytes()
        };
        (bytes, ids, fmt)
    }

    proptest! {
        #![proptest_config(ProptestConfig { cases: 24, ..ProptestConfig::default() })]

        /// One output record per input record, in order, with the input's
        /// ids, for smi, csv with quoted line breaks, tsv and gzip (issue 17).
        #[test]
        fn annotate_given_random_lists_writes_one_record_per_input_in_order_issue17(
            kind in 0u8..4,
            picks in prop::collection::vec((0usize..8, any::<bool>()), 1..40),
        ) {
            let (bytes, ids, fmt) = build(kind, &picks);
            let out = super::common::run_binary(
                &["annotate", "-", "--input-format", fmt, "--sites-only", "-q"],
                &bytes,
            );
            let recs: Vec<serde_json::Value> = String::from_utf8_lossy(&out.stdout)
                .lines()
                .map(|l| serde_json::from_str(l).unwrap())
                .collect();
            prop_assert_eq!(recs.len(), ids.len());
            for (r, id) in recs.iter().zip(&ids) {
                prop_assert_eq!(r["id"].as_str(), Some(id.as_str()));
            }
            let failed = recs.iter().filter(|r| r["ok"] == false).count();
            prop_assert_eq!(out.status.code(), Some(if failed > 0 { 1 } else { 0 }));
        }
    }
}

#[test]
fn annotate_given_csv_header_starting_with_hash_reads_it_as_the_header_issue17() {
    let o = common::run_binary(
        &[
            "annotate",
            "-",
            "--input-format",
            "csv",
            "--id-column",
            "#id",
            "-q",
        ],
        b"#id,smiles\nm1,CCO\n",
    );
    assert_eq!(
        o.status.code(),
        Some(0),
        "{}",
        String::from_utf8_lossy(&o.stderr)
    );
    let r = records(&o);
    assert_eq!(r.len(), 1);
    assert_eq!(r[0]["id"], "m1");
}

#[test]
fn annotate_given_huge_junk_line_echoes_a_short_prefix_with_its_length_issue17() {
    let mut junk = "C".repeat(3_000_000);
    junk.push_str("(((( x\n");
    let o = common::run_binary(&["annotate", "-", "-q"], junk.as_bytes());
    assert_eq!(o.status.code(), Some(1));
    assert!(o.stdout.len() < 4_000, "{} bytes of output", o.stdout.len());
    let r = records(&o);
    assert!(r[0]["error"]["message"].as_str().unwrap().contains("bytes"));
}

#[test]
fn equilibrium_given_absurd_numbers_gives_a_range_error_issue17() {
    for (opt, v) in [("--equiv", "1e308"), ("--conc", "1e308"), ("--equiv", "-1")] {
        let o = common::run_binary(&["equilibrium", "CCO", "--base", "LDA", opt, v], b"");
        assert_eq!(o.status.code(), Some(2), "{opt} {v}");
        let err = String::from_utf8_lossy(&o.stderr);
        assert!(err.len() < 300, "{err}");
    }
}
