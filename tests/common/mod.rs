//! Shared helpers for the integration tests that run the real binary.

use std::io::Write;
use std::process::{Command, Output, Stdio};

pub const BIN: &str = env!("CARGO_BIN_EXE_acidsite");

/// Runs `acidsite ARGS` with `stdin` fed from a separate thread (so a large
/// output cannot deadlock against unread input) and returns its output. The
/// binary may exit before reading stdin (bad options): the broken pipe that
/// the writer then meets is expected and ignored.
pub fn run_binary(args: &[&str], stdin: &[u8]) -> Output {
    let mut child = Command::new(BIN)
        .args(args)
        .stdin(Stdio::piped())
        .stdout(Stdio::piped())
        .stderr(Stdio::piped())
        .spawn()
        .expect("run acidsite");
    let mut input = child.stdin.take().expect("stdin");
    let data = stdin.to_vec();
    let writer = std::thread::spawn(move || {
        let _ = input.write_all(&data);
    });
    let out = child.wait_with_output().expect("wait for acidsite");
    writer.join().expect("stdin writer");
    out
}
