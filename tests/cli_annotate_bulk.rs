//! `acidsite annotate` on 10,000 lines mixing real SMILES (corpus/bulk/real.smi,
//! sources in corpus/bulk/README.md) with hostile lines generated here from a
//! fixed seed: garbage, mutated SMILES, a 1 MB line, NUL and non-UTF-8 bytes,
//! CRLF endings and a byte-order mark. Regression tests for issue 6.

use std::io::Write;
use std::process::{Command, Stdio};

const BIN: &str = env!("CARGO_BIN_EXE_acidsite");

/// splitmix64: a tiny deterministic generator so the input is the same on
/// every run without a committed 1 MB file.
struct Rng(u64);

impl Rng {
    fn next(&mut self) -> u64 {
        self.0 = self.0.wrapping_add(0x9E37_79B9_7F4A_7C15);
        let mut z = self.0;
        z = (z ^ (z >> 30)).wrapping_mul(0xBF58_476D_1CE4_E5B9);
        z = (z ^ (z >> 27)).wrapping_mul(0x94D0_49BB_1331_11EB);
        z ^ (z >> 31)
    }
    fn below(&mut self, n: usize) -> usize {
        (self.next() % n as u64) as usize
    }
}

const SMILES_CHARS: &[u8] = b"CNOSPFIBrcnos()[]=#@+-123456789%/\\.:*H";

fn real_lines() -> Vec<Vec<u8>> {
    let text =
        std::fs::read_to_string(concat!(env!("CARGO_MANIFEST_DIR"), "/corpus/bulk/real.smi"))
            .expect("corpus/bulk/real.smi is part of the repository");
    text.lines()
        .filter(|l| !l.trim().is_empty() && !l.starts_with('#'))
        .map(|l| l.as_bytes().to_vec())
        .collect()
}

fn mutate(rng: &mut Rng, line: &[u8]) -> Vec<u8> {
    let smiles_len = line.iter().position(|&b| b == b' ').unwrap_or(line.len());
    let mut s = line[..smiles_len].to_vec();
    for _ in 0..1 + rng.below(4) {
        let i = if s.is_empty() { 0 } else { rng.below(s.len()) };
        match rng.below(3) {
            0 if !s.is_empty() => {
                s.remove(i);
            }
            1 => s.insert(i, SMILES_CHARS[rng.below(SMILES_CHARS.len())]),
            _ if s.len() > 1 => {
                let j = rng.below(s.len());
                s.swap(i, j);
            }
            _ => s.push(b'C'),
        }
    }
    s
}

fn hostile(rng: &mut Rng, real: &[Vec<u8>], k: usize) -> Vec<u8> {
    let base = &real[rng.below(real.len())];
    let mut line = match k % 8 {
        // printable garbage
        0 => (0..1 + rng.below(60))
            .map(|_| 0x21 + rng.below(0x5e) as u8)
            .collect(),
        // mutated real SMILES
        1..=3 => mutate(rng, base),
        // NUL inside a SMILES
        4 => {
            let mut s = base.clone();
            let i = rng.below(s.len().max(1));
            s.insert(i.min(s.len()), 0);
            s
        }
        // invalid UTF-8
        5 => {
            let mut s = base.clone();
            let bad: &[&[u8]] = &[
                b"\xff",
                b"\xc3\x28",
                b"\xe2\x82",
                b"\xf0\x28\x8c\xbc",
                b"\x80",
            ];
            let i = rng.below(s.len().max(1)).min(s.len());
            let b = bad[rng.below(bad.len())];
            s.splice(i..i, b.iter().copied());
            s
        }
        // random bytes of any value except line breaks
        6 => (0..1 + rng.below(40))
            .map(|_| match rng.below(256) as u8 {
                b'\n' | b'\r' => b'x',
                b => b,
            })
            .collect(),
        // valid UTF-8 that is not SMILES
        _ => "Ωmega–C(=O)→π ".as_bytes().to_vec(),
    };
    // Keep hostile lines from looking blank or like comments: those are
    // skipped by design and counted separately below.
    if line.iter().all(|b| b.is_ascii_whitespace()) || line.first() == Some(&b'#') {
        line.insert(0, b'!');
    }
    line
}

/// The 10,000-line input and the line numbers that hold records.
fn build_input() -> (Vec<u8>, Vec<u64>) {
    let real = real_lines();
    assert_eq!(real.len(), 5000);
    let mut rng = Rng(0x00AC_1D51_7E00_0006);
    let mut out: Vec<u8> = b"\xEF\xBB\xBF".to_vec();
    let mut record_lines = Vec::new();
    let mut real_iter = real.iter();
    for n in 1..=10_000u64 {
        let line: Vec<u8> = if n == 5_000 {
            // the 1 MB line: a long chain, valid characters throughout
            let mut l = vec![b'C'; 1_000_000];
            l.extend_from_slice(b" one-megabyte-line");
            l
        } else if n % 997 == 0 {
            Vec::new() // blank line: skipped, still counted
        } else if n % 1009 == 0 {
            b"# a comment line inside the data".to_vec()
        } else if n % 2 == 1 {
            real_iter.next().cloned().unwrap_or_else(|| b"CCO".to_vec())
        } else {
            hostile(&mut rng, &real, n as usize / 2)
        };
        let skipped = line.iter().all(|b| b.is_ascii_whitespace()) || line.first() == Some(&b'#');
        if !skipped {
            record_lines.push(n);
        }
        out.extend_from_slice(&line);
        out.extend_from_slice(if n % 3 == 0 { b"\r\n" } else { b"\n" });
    }
    (out, record_lines)
}

fn run_annotate(input: &[u8], extra: &[&str]) -> std::process::Output {
    let mut child = Command::new(BIN)
        .arg("annotate")
        .arg("-")
        .args(extra)
        .stdin(Stdio::piped())
        .stdout(Stdio::piped())
        .stderr(Stdio::piped())
        .spawn()
        .expect("run acidsite");
    let mut stdin = child.stdin.take().expect("stdin");
    let data = input.to_vec();
    let writer = std::thread::spawn(move || {
        let _ = stdin.write_all(&data);
    });
    let out = child.wait_with_output().expect("wait");
    writer.join().expect("writer thread");
    out
}

#[test]
fn annotate_given_ten_thousand_mixed_and_hostile_lines() {
    let (input, record_lines) = build_input();
    let out = run_annotate(&input, &[]);
    let stderr = String::from_utf8_lossy(&out.stderr);
    assert!(!stderr.contains("panicked"), "stderr: {stderr}");
    // Some records fail (hostile lines), none is fatal: exit code 1.
    assert_eq!(out.status.code(), Some(1), "stderr: {stderr}");
    let text = String::from_utf8(out.stdout).expect("output is UTF-8");
    let records: Vec<serde_json::Value> = text
        .lines()
        .map(|l| serde_json::from_str(l).expect("every output line is one JSON record"))
        .collect();
    // Records out = records in, in input order.
    assert_eq!(records.len(), record_lines.len());
    let lines: Vec<u64> = records
        .iter()
        .map(|r| r["line"].as_u64().unwrap())
        .collect();
    assert_eq!(lines, record_lines);
    let mut failed = 0;
    for r in &records {
        assert_eq!(r["schema"], "acidsite-record/4");
        if r["ok"] == false {
            failed += 1;
            let e = &r["error"];
            assert!(!e["message"].as_str().unwrap_or("").is_empty(), "{r}");
            assert!(!e["kind"].as_str().unwrap_or("").is_empty(), "{r}");
            assert_ne!(e["kind"], "internal", "a library panic was caught: {r}");
        } else {
            assert!(r["sites"].is_array(), "{r}");
        }
    }
    assert!(failed > 0 && failed < records.len());
    // The first line carried a BOM: its record's input must not start with it.
    assert!(!records[0]["input"]
        .as_str()
        .unwrap()
        .starts_with('\u{feff}'));
    // The 1 MB line is one record, failed with a clear size error.
    let big = records.iter().find(|r| r["line"] == 5000).unwrap();
    assert_eq!(big["ok"], false);
    assert_eq!(big["id"], "one-megabyte-line");
    assert_eq!(big["error"]["kind"], "too_large");
    // Non-UTF-8 lines are error records with kind "encoding".
    assert!(records.iter().any(|r| r["error"]["kind"] == "encoding"));
    // Real SMILES keep their id.
    assert_eq!(
        records[0]["id"]
            .as_str()
            .map(|s| s.starts_with("moses-test-")),
        Some(true)
    );
    // The summary line counts the same.
    assert!(
        stderr.contains(&format!("{} records", record_lines.len())),
        "summary: {stderr}"
    );
    assert!(
        stderr.contains(&format!("{failed} failed")),
        "summary: {stderr}"
    );
}

#[test]
fn annotate_given_one_thread_equals_default_parallel_run() {
    let (input, _) = build_input();
    let seq = run_annotate(&input, &["--threads", "1", "--quiet"]);
    let par = run_annotate(&input, &["--threads", "2", "--chunk", "333", "--quiet"]);
    assert_eq!(seq.status.code(), par.status.code());
    assert!(
        seq.stdout == par.stdout,
        "parallel output differs from sequential output"
    );
}
