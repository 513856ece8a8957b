//! Shared by the `acidsite serve` tests: start the real binary on a free
//! port (`--port 0`, the chosen address read from its first line) and speak
//! plain HTTP/1.1 to it over a socket, so that tests can send what a browser
//! never would (foreign Host headers, broken bodies, 100 MB uploads).
#![allow(dead_code)]

use std::io::{BufRead, BufReader, Read, Write};
use std::net::TcpStream;
use std::process::{Child, Command, Stdio};
use std::time::Duration;

pub const BIN: &str = env!("CARGO_BIN_EXE_acidsite");

/// A running `acidsite serve`; stopped (SIGTERM, then kill) when dropped.
pub struct Server {
    pub child: Child,
    /// `127.0.0.1:PORT`
    pub addr: String,
    pub stderr: Option<std::process::ChildStderr>,
}

impl Server {
    pub fn start(extra: &[&str]) -> Server {
        let mut child = Command::new(BIN)
            .arg("serve")
            .args(["--port", "0"])
            .args(extra)
            .stdout(Stdio::piped())
            .stderr(Stdio::piped())
            .spawn()
            .expect("start acidsite serve");
        let mut out = BufReader::new(child.stdout.take().expect("stdout"));
        let mut line = String::new();
        out.read_line(&mut line)
            .expect("first line of acidsite serve");
        let addr = line
            .split("http://")
            .nth(1)
            .and_then(|r| r.split('/').next())
            .unwrap_or_else(|| panic!("no address in {line:?}"))
            .to_string();
        // Keep reading stdout so the server never blocks on a full pipe.
        std::thread::spawn(move || {
            let mut sink = String::new();
            let _ = out.read_to_string(&mut sink);
        });
        let stderr = child.stderr.take();
        Server {
            child,
            addr,
            stderr,
        }
    }

    pub fn port(&self) -> u16 {
        self.addr.rsplit(':').next().unwrap().parse().unwrap()
    }

    pub fn get(&self, path: &str) -> Resp {
        request(&self.addr, "GET", path, &[], b"")
    }

    pub fn post(&self, path: &str, body: &[u8]) -> Resp {
        request(
            &self.addr,
            "POST",
            path,
            &[("Content-Type", "application/json")],
            body,
        )
    }

    /// SIGTERM and wait: the exit status and what the server wrote to stderr.
    pub fn stop(self) -> (std::process::ExitStatus, String) {
        self.stop_with("-TERM")
    }

    /// Send this signal (`-TERM`, `-INT`) and wait, as [`Server::stop`].
    pub fn stop_with(mut self, signal: &str) -> (std::process::ExitStatus, String) {
        let pid = self.child.id().to_string();
        let _ = Command::new("kill").args([signal, &pid]).status();
        let status = self.child.wait().expect("wait for server");
        let mut err = String::new();
        if let Some(mut e) = self.stderr.take() {
            let _ = e.read_to_string(&mut err);
        }
        (status, err)
    }
}

impl Drop for Server {
    fn drop(&mut self) {
        let _ = self.child.kill();
        let _ = self.child.wait();
    }
}

#[derive(Debug)]
pub struct Resp {
    pub status: u16,
    pub headers: Vec<(String, String)>,
    pub body: Vec<u8>,
}

impl Resp {
    pub fn header(&self, name: &str) -> Option<&str> {
        self.headers
            .iter()
            .find(|(k, _)| k.eq_ignore_ascii_case(name))
            .map(|(_, v)| v.as_str())
    }
    pub fn text(&self) -> String {
        String::from_utf8_lossy(&self.body).into_owned()
    }
    pub fn json(&self) -> serde_json::Value {
        serde_json::from_slice(&self.body)
            .unwrap_or_else(|e| panic!("not JSON ({e}): {}", self.text()))
    }
}

/// One request on a fresh connection (`Connection: close`). A `Host` in
/// `headers` replaces the default one. The body is written from a second
/// thread, so a server that answers before reading it all (a refused upload)
/// is seen as it answers.
pub fn request(
    addr: &str,
    method: &str,
    path: &str,
    headers: &[(&str, &str)],
    body: &[u8],
) -> Resp {
    let mut s = TcpStream::connect(addr).expect("connect");
    s.set_read_timeout(Some(Duration::from_secs(120))).unwrap();
    let mut head = format!("{method} {path} HTTP/1.1\r\n");
    if !headers.iter().any(|(k, _)| k.eq_ignore_ascii_case("host")) {
        head.push_str(&format!("Host: {addr}\r\n"));
    }
    for (k, v) in headers {
        head.push_str(&format!("{k}: {v}\r\n"));
    }
    head.push_str(&format!(
        "Content-Length: {}\r\nConnection: close\r\n\r\n",
        body.len()
    ));
    s.write_all(head.as_bytes()).expect("write request head");
    let mut w = s.try_clone().unwrap();
    let data = body.to_vec();
    let writer = std::thread::spawn(move || {
        let _ = w.write_all(&data);
    });
    let mut raw = Vec::new();
    let mut buf = [0u8; 65536];
    loop {
        if complete(&raw) {
            break;
        }
        match s.read(&mut buf) {
            Ok(0) => break,
            Ok(n) => raw.extend_from_slice(&buf[..n]),
            // A server that refuses an upload closes the connection with
            // unread data, which may end in a reset after the answer.
            Err(e) if !raw.is_empty() && e.kind() == std::io::ErrorKind::ConnectionReset => break,
            Err(e) => panic!("read response: {e}"),
        }
    }
    let _ = s.shutdown(std::net::Shutdown::Both);
    let _ = writer.join();
    parse(&raw)
}

/// A whole answer has arrived (some servers keep the connection open
/// whatever `Connection: close` says).
fn complete(raw: &[u8]) -> bool {
    let Some(end) = raw.windows(4).position(|w| w == b"\r\n\r\n") else {
        return false;
    };
    let head = String::from_utf8_lossy(&raw[..end]).to_ascii_lowercase();
    let body = &raw[end + 4..];
    if let Some(len) = head
        .lines()
        .find_map(|l| l.strip_prefix("content-length:"))
        .and_then(|v| v.trim().parse::<usize>().ok())
    {
        return body.len() >= len;
    }
    if head.contains("transfer-encoding: chunked") {
        return body.ends_with(b"0\r\n\r\n");
    }
    false
}

fn parse(raw: &[u8]) -> Resp {
    let end = raw
        .windows(4)
        .position(|w| w == b"\r\n\r\n")
        .unwrap_or_else(|| panic!("no header end in {:?}", String::from_utf8_lossy(raw)));
    let head = String::from_utf8_lossy(&raw[..end]).into_owned();
    let mut lines = head.split("\r\n");
    let status: u16 = lines
        .next()
        .and_then(|l| l.split(' ').nth(1))
        .and_then(|s| s.parse().ok())
        .expect("status line");
    let headers: Vec<(String, String)> = lines
        .filter_map(|l| l.split_once(':'))
        .map(|(k, v)| (k.trim().to_string(), v.trim().to_string()))
        .collect();
    let mut body = raw[end + 4..].to_vec();
    let chunked = headers
        .iter()
        .any(|(k, v)| k.eq_ignore_ascii_case("transfer-encoding") && v.contains("chunked"));
    if chunked {
        body = dechunk(&body);
    }
    Resp {
        status,
        headers,
        body,
    }
}

fn dechunk(mut b: &[u8]) -> Vec<u8> {
    let mut out = Vec::new();
    while let Some(eol) = b.windows(2).position(|w| w == b"\r\n") {
        let size_text = String::from_utf8_lossy(&b[..eol]);
        let size = usize::from_str_radix(size_text.split(';').next().unwrap().trim(), 16)
            .expect("chunk size");
        if size == 0 {
            break;
        }
        out.extend_from_slice(&b[eol + 2..eol + 2 + size]);
        b = &b[eol + 2 + size + 2..];
    }
    out
}

/// The stdout of `acidsite ARGS`.
pub fn cli(args: &[&str]) -> Vec<u8> {
    let out = Command::new(BIN).args(args).output().expect("run acidsite");
    out.stdout
}
