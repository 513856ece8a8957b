//! Exit codes of the real binary: 0 all records fine, 1 some failed, 2 fatal,
//! and a closed stdout pipe ends quietly with 0 (issue 6).

use std::io::Read;
use std::process::{Command, Stdio};

use crate::common;
use common::BIN;

fn run(args: &[&str], stdin: &[u8]) -> std::process::Output {
    common::run_binary(args, stdin)
}

fn temp_file(name: &str, content: &[u8]) -> std::path::PathBuf {
    let dir = std::env::temp_dir().join(format!("acidsite-test-{}", std::process::id()));
    std::fs::create_dir_all(&dir).expect("temp dir");
    let p = dir.join(name);
    std::fs::write(&p, content).expect("write temp file");
    p
}

#[test]
fn annotate_given_only_good_records_exits_zero() {
    // Acetone and ethyl acetate: plain, valid SMILES (common practice).
    let out = run(&["annotate", "-"], b"CC(C)=O acetone\nCCOC(C)=O\n");
    assert_eq!(
        out.status.code(),
        Some(0),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    assert_eq!(String::from_utf8_lossy(&out.stdout).lines().count(), 2);
}

#[test]
fn annotate_given_a_broken_record_exits_one_and_keeps_the_rest() {
    let out = run(&["annotate", "-"], b"CC(C)=O\nCC(=O\nCCO\n");
    assert_eq!(out.status.code(), Some(1));
    let text = String::from_utf8_lossy(&out.stdout);
    let recs: Vec<serde_json::Value> = text
        .lines()
        .map(|l| serde_json::from_str(l).unwrap())
        .collect();
    assert_eq!(recs.len(), 3);
    assert_eq!(recs[1]["ok"], false);
    assert_eq!(recs[1]["line"], 2);
    assert!(recs[1]["error"]["message"]
        .as_str()
        .is_some_and(|m| !m.is_empty()));
}

#[test]
fn annotate_given_missing_file_exits_two() {
    let out = run(&["annotate", "/nonexistent/acidsite/list.smi"], b"");
    assert_eq!(out.status.code(), Some(2));
    let err = String::from_utf8_lossy(&out.stderr);
    assert!(err.contains("cannot read"), "{err}");
    assert!(out.stdout.is_empty());
}

#[test]
fn annotate_given_directory_exits_two() {
    let out = run(&["annotate", "/"], b"");
    assert_eq!(out.status.code(), Some(2));
}

#[test]
fn annotate_given_bad_options_exits_two() {
    assert_eq!(
        run(&["annotate", "--no-such-option"], b"").status.code(),
        Some(2)
    );
    assert_eq!(
        run(&["annotate", "--format", "xml"], b"").status.code(),
        Some(2)
    );
    assert_eq!(
        run(&["annotate", "--flag", "noequals"], b"").status.code(),
        Some(2)
    );
    assert_eq!(
        run(&["annotate", "--chunk", "0"], b"").status.code(),
        Some(2)
    );
    assert_eq!(
        run(&["annotate", "--per-site"], b"CCO\n").status.code(),
        Some(2)
    );
    assert_eq!(run(&["frobnicate"], b"").status.code(), Some(2));
}

#[test]
fn annotate_given_unknown_csv_column_exits_two() {
    let p = temp_file("cols.csv", b"name,structure\nx,CCO\n");
    let out = run(&["annotate", p.to_str().unwrap()], b"");
    assert_eq!(out.status.code(), Some(2));
    let err = String::from_utf8_lossy(&out.stderr);
    assert!(
        err.contains("structure"),
        "the message lists the header: {err}"
    );
    let out = run(
        &["annotate", p.to_str().unwrap(), "--column", "structure"],
        b"",
    );
    assert_eq!(
        out.status.code(),
        Some(0),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
}

#[test]
fn scan_given_good_and_bad_smiles_exits_one() {
    assert_eq!(run(&["scan", "CC(C)=O"], b"").status.code(), Some(0));
    assert_eq!(
        run(&["scan", "CC(C)=O", "C1CC"], b"").status.code(),
        Some(1)
    );
    assert_eq!(run(&["scan"], b"").status.code(), Some(2));
}

#[test]
fn help_and_version_exit_zero() {
    assert_eq!(run(&["--help"], b"").status.code(), Some(0));
    assert_eq!(run(&["--version"], b"").status.code(), Some(0));
    assert_eq!(run(&["annotate", "--help"], b"").status.code(), Some(0));
}

#[test]
fn annotate_given_closed_stdout_pipe_ends_quietly_with_zero() {
    // Enough records to overflow the pipe buffer many times over.
    let real = std::fs::read(concat!(env!("CARGO_MANIFEST_DIR"), "/corpus/bulk/real.smi")).unwrap();
    let p = temp_file("pipe.smi", &real);
    let mut child = Command::new(BIN)
        .args(["annotate", p.to_str().unwrap(), "--threads", "1"])
        .stdout(Stdio::piped())
        .stderr(Stdio::piped())
        .spawn()
        .expect("run acidsite");
    let mut stdout = child.stdout.take().unwrap();
    let mut first = [0u8; 100];
    stdout.read_exact(&mut first).expect("some output");
    drop(stdout); // the reader goes away, as `| head` does
    let mut err = String::new();
    child
        .stderr
        .take()
        .unwrap()
        .read_to_string(&mut err)
        .unwrap();
    let status = child.wait().unwrap();
    assert_eq!(status.code(), Some(0), "stderr: {err}");
    assert!(
        !err.contains("error") && !err.contains("panicked"),
        "stderr: {err}"
    );
}

#[test]
fn annotate_given_bad_flag_pattern_exits_two_with_position() {
    // "[C" is an unclosed bracket atom: the SMARTS error names where.
    let out = run(&["annotate", "-", "--flag", "bad=[C"], b"CCO\n");
    assert_eq!(out.status.code(), Some(2));
    let err = String::from_utf8_lossy(&out.stderr);
    assert!(err.contains("bad") && err.contains("character"), "{err}");
    assert!(out.stdout.is_empty());
}

#[test]
fn scan_given_unclosed_ring_names_no_internal_error_kind_issue14() {
    let out = run(&["scan", "C1CC"], b"");
    assert_eq!(out.status.code(), Some(1));
    let text = String::from_utf8_lossy(&out.stdout);
    assert!(text.contains("ring closure error"), "{text}");
    assert!(!text.contains("ring_closure"), "{text}");
}
