//! The page of `acidsite serve` in a real browser: Chromium driven through
//! its WebDriver (chromedriver, both from the system packages; `.ci/run`
//! installs them). Skipped, with a line saying so, when either is missing.
//!
//! Screenshots of the main states are written to
//! `target/serve-browser/*.png` for a person to look at.

use crate::serve_common;

use serde_json::{json, Value};
use serve_common::{cli, request, Resp, Server};
use std::path::{Path, PathBuf};
use std::process::{Child, Command, Stdio};
use std::time::{Duration, Instant};

const REAL: &str = concat!(env!("CARGO_MANIFEST_DIR"), "/corpus/bulk/real.smi");
const ELEMENT: &str = "element-6066-11e4-a52e-4f735466cecf";

fn which(names: &[&str]) -> Option<PathBuf> {
    let path = std::env::var_os("PATH")?;
    for dir in std::env::split_paths(&path) {
        for n in names {
            let p = dir.join(n);
            if p.is_file() {
                return Some(p);
            }
        }
    }
    None
}

/// chromedriver on a free port, stopped when dropped.
struct Driver {
    child: Child,
    addr: String,
}

impl Drop for Driver {
    fn drop(&mut self) {
        let _ = self.child.kill();
        let _ = self.child.wait();
    }
}

struct Session<'a> {
    driver: &'a Driver,
    id: String,
}

fn wd(addr: &str, method: &str, path: &str, body: Option<Value>) -> Value {
    let b = body.map(|v| v.to_string()).unwrap_or_default();
    let r: Resp = request(
        addr,
        method,
        path,
        &[("Content-Type", "application/json")],
        b.as_bytes(),
    );
    let v: Value = serde_json::from_slice(&r.body).unwrap_or(Value::Null);
    assert!(
        r.status == 200,
        "webdriver {method} {path}: {} {}",
        r.status,
        r.text()
    );
    v["value"].clone()
}

impl<'a> Session<'a> {
    fn new(driver: &'a Driver, chromium: &Path, downloads: &Path) -> Session<'a> {
        // The browser profile lives beside the downloads (removed at the end).
        let profile = downloads.with_file_name("profile");
        let caps = json!({"capabilities": {"alwaysMatch": {
            "browserName": "chrome",
            "goog:chromeOptions": {
                "binary": chromium.to_str().unwrap(),
                "args": ["--headless=new", "--no-sandbox", "--disable-gpu", "--disable-dev-shm-usage",
                         "--window-size=1400,1000", format!("--user-data-dir={}", profile.display())],
            }
        }}});
        let v = wd(&driver.addr, "POST", "/session", Some(caps));
        let s = Session {
            driver,
            id: v["sessionId"].as_str().expect("session id").to_string(),
        };
        s.cmd(
            "POST",
            "/goog/cdp/execute",
            Some(json!({"cmd": "Browser.setDownloadBehavior",
            "params": {"behavior": "allow", "downloadPath": downloads.to_str().unwrap()}})),
        );
        s
    }
    fn cmd(&self, method: &str, path: &str, body: Option<Value>) -> Value {
        wd(
            &self.driver.addr,
            method,
            &format!("/session/{}{path}", self.id),
            body,
        )
    }
    fn open(&self, url: &str) {
        self.cmd("POST", "/url", Some(json!({ "url": url })));
    }
    fn js(&self, script: &str) -> Value {
        self.cmd(
            "POST",
            "/execute/sync",
            Some(json!({ "script": script, "args": [] })),
        )
    }
    fn find(&self, css: &str) -> String {
        let v = self.cmd(
            "POST",
            "/element",
            Some(json!({"using": "css selector", "value": css})),
        );
        v[ELEMENT]
            .as_str()
            .unwrap_or_else(|| panic!("no element {css}: {v}"))
            .to_string()
    }
    fn click(&self, css: &str) {
        let e = self.find(css);
        self.cmd("POST", &format!("/element/{e}/click"), Some(json!({})));
    }
    fn type_into(&self, css: &str, text: &str) {
        let e = self.find(css);
        self.cmd("POST", &format!("/element/{e}/clear"), Some(json!({})));
        self.cmd(
            "POST",
            &format!("/element/{e}/value"),
            Some(json!({ "text": text })),
        );
    }
    /// Wait until the script returns a truthy value; returns it.
    fn wait(&self, what: &str, script: &str) -> Value {
        let start = Instant::now();
        loop {
            let v = self.js(script);
            if !(v.is_null() || v == false || v == "" || v == 0) {
                return v;
            }
            if start.elapsed() > Duration::from_secs(30) {
                self.shot("timeout");
                panic!("timed out waiting for {what}");
            }
            std::thread::sleep(Duration::from_millis(100));
        }
    }
    fn shot(&self, name: &str) {
        let v = self.cmd("GET", "/screenshot", None);
        let dir = Path::new(env!("CARGO_TARGET_TMPDIR")).join("../serve-browser");
        let _ = std::fs::create_dir_all(&dir);
        let _ = std::fs::write(dir.join(format!("{name}.png")), base64(v.as_str().unwrap()));
    }
}

impl Drop for Session<'_> {
    fn drop(&mut self) {
        let _ = request(
            &self.driver.addr,
            "DELETE",
            &format!("/session/{}", self.id),
            &[],
            b"",
        );
    }
}

fn base64(s: &str) -> Vec<u8> {
    let val = |c: u8| match c {
        b'A'..=b'Z' => c - b'A',
        b'a'..=b'z' => c - b'a' + 26,
        b'0'..=b'9' => c - b'0' + 52,
        b'+' => 62,
        _ => 63,
    };
    let bytes: Vec<u8> = s
        .bytes()
        .filter(|&c| c != b'=' && !c.is_ascii_whitespace())
        .map(val)
        .collect();
    let mut out = Vec::with_capacity(bytes.len() * 3 / 4);
    for q in bytes.chunks(4) {
        let n = q
            .iter()
            .enumerate()
            .fold(0u32, |n, (i, &b)| n | (b as u32) << (18 - 6 * i));
        out.push((n >> 16) as u8);
        if q.len() > 2 {
            out.push((n >> 8) as u8);
        }
        if q.len() > 3 {
            out.push(n as u8);
        }
    }
    out
}

fn start_driver(chromedriver: &Path) -> Driver {
    let port = std::net::TcpListener::bind("127.0.0.1:0")
        .unwrap()
        .local_addr()
        .unwrap()
        .port();
    let child = Command::new(chromedriver)
        .arg(format!("--port={port}"))
        .stdout(Stdio::null())
        .stderr(Stdio::null())
        .spawn()
        .expect("start chromedriver");
    let d = Driver {
        child,
        addr: format!("127.0.0.1:{port}"),
    };
    let start = Instant::now();
    while std::net::TcpStream::connect(&d.addr).is_err() {
        assert!(
            start.elapsed() < Duration::from_secs(20),
            "chromedriver did not start"
        );
        std::thread::sleep(Duration::from_millis(100));
    }
    d
}

/// The recommended base of a SMILES according to the API (what the page
/// must show).
fn api_base(s: &Server, body: Value) -> String {
    s.post("/api/scan", body.to_string().as_bytes()).json()["advice"]["base"]
        .as_str()
        .unwrap()
        .to_string()
}

#[test]
fn page_given_real_browser_issue13() {
    let (Some(chromium), Some(chromedriver)) = (
        which(&["chromium", "chromium-browser", "google-chrome"]),
        which(&["chromedriver"]),
    ) else {
        eprintln!("serve_browser: skipped: chromium and chromedriver are not installed (apt-get install chromium chromium-driver)");
        return;
    };
    let server = Server::start(&[]);
    let base_url = format!("http://{}", server.addr);
    let work = std::env::temp_dir().join(format!("acidsite-browser-{}", std::process::id()));
    let downloads = work.join("downloads");
    std::fs::create_dir_all(&downloads).unwrap();
    let driver = start_driver(&chromedriver);
    let s = Session::new(&driver, &chromium, &downloads);

    // 1. A shared link with a reaction: the drawing and the base appear.
    s.open(&format!(
        "{base_url}/?smiles=CC(%3DO)CC(%3DO)OCC&reaction=alkylation"
    ));
    s.wait(
        "the drawing",
        "return document.querySelectorAll('#drawing g[data-atom]').length",
    );
    let want = api_base(
        &server,
        json!({"smiles": "CC(=O)CC(=O)OCC", "reaction": "alkylation"}),
    );
    let headline = s.wait("the advice", "return document.querySelector('#advice .headline strong') && document.querySelector('#advice .headline strong').textContent");
    assert_eq!(headline, want.as_str());
    assert_eq!(
        s.js("return document.getElementById('reaction').value"),
        "alkylation"
    );
    assert_eq!(
        s.js("return document.getElementById('reaction-field').hidden"),
        false
    );
    assert_eq!(
        s.js("return document.querySelectorAll('#sites tbody tr').length"),
        // Two activated sites and, since issue 11, the two background alkane
        // C–H sites of the ethyl group (listed last).
        4
    );
    s.shot("1-shared-link");
    s.click("#copy-json");
    s.wait(
        "the copy note",
        "return document.getElementById('copy-note').textContent === 'Copied.'",
    );

    // 1b. Choose another reaction: the advice follows, and the address.
    s.click("#reaction option[value=condensation]");
    let want = api_base(
        &server,
        json!({"smiles": "CC(=O)CC(=O)OCC", "reaction": "condensation"}),
    );
    s.wait("the condensation advice", &format!(
        "var h = document.querySelector('#advice .headline strong'); return h && h.textContent === {} && location.search.indexOf('reaction=condensation') >= 0",
        json!(want)));
    s.shot("1b-reaction-chosen");

    // 1c. A link with a reaction this build does not know: left out, with a
    //     note, and the result still shown.
    s.open(&format!("{base_url}/?smiles=CCC(%3DO)CC&reaction=banana"));
    s.wait(
        "the drawing",
        "return document.querySelectorAll('#drawing g[data-atom]').length === 6",
    );
    let status = s.js("return document.getElementById('one-status').textContent");
    assert!(status.as_str().unwrap().contains("banana"), "{status}");
    assert_eq!(
        s.js("return document.getElementById('one-error').hidden"),
        true
    );
    // Many bases ruled out: the first few shown, the rest folded away.
    let folded = s
        .js("var d = document.querySelector('#advice details summary'); return d && d.textContent");
    assert!(
        folded
            .as_str()
            .is_some_and(|t| t.ends_with("more ruled out")),
        "{folded}"
    );

    // 2. Type a SMILES and press Enter: the new molecule's base.
    s.type_into("#smiles", "CC1CCCCC1=O\n");
    let want = api_base(&server, json!({"smiles": "CC1CCCCC1=O"}));
    s.wait("the ketone's advice", &format!(
        "var h = document.querySelector('#advice .headline strong'); return h && h.textContent === {} && location.search.indexOf('CC1CCCCC1') >= 0",
        json!(want)));
    let target0 = s.js("return document.querySelector('#advice dd').textContent");

    // 3. Click an atom of the other alpha carbon: the advice changes target
    //    and the URL records the site.
    s.click("#drawing g[data-atom=\"1\"]");
    s.wait(
        "the new target",
        "return document.querySelector('#advice dd').textContent.indexOf('atom 1 ') === 0",
    );
    assert_ne!(
        s.js("return document.querySelector('#advice dd').textContent"),
        target0
    );
    assert!(s
        .js("return location.search")
        .as_str()
        .unwrap()
        .contains("site=1"));
    assert_eq!(
        s.js("return document.querySelector('#sites tr.target-row td:nth-child(2)').textContent"),
        "C1"
    );
    s.shot("2-atom-clicked");

    // 3b. The rules behind an estimate, on demand.
    s.click("#sites tbody tr button");
    let rules = s.wait(
        "the rules",
        "var r = document.querySelector('#sites tr.rules-row li'); return r && r.textContent",
    );
    let ketone = server
        .post("/api/scan", br#"{"smiles":"CC1CCCCC1=O"}"#)
        .json();
    let first_rule = ketone["sites"][0]["rules"][0]["id"]
        .as_str()
        .unwrap()
        .to_string();
    assert!(rules.as_str().unwrap().starts_with(&first_rule), "{rules}");
    assert!(rules.as_str().unwrap().contains("source"), "{rules}");

    // 4. A bad SMILES: the message with a caret; then a good one works again.
    s.type_into("#smiles", "CC(=O)C(C\n");
    s.wait(
        "the error",
        "return !document.getElementById('one-error').hidden",
    );
    let err = s.js("return document.getElementById('one-error').textContent");
    assert!(err.as_str().unwrap().contains('^'), "{err}");
    assert_eq!(
        s.js("return document.getElementById('one-result').hidden"),
        true
    );
    s.shot("3-bad-smiles");
    s.type_into("#smiles", "CCOC(=O)CC(=O)OCC\n");
    let want = api_base(&server, json!({"smiles": "CCOC(=O)CC(=O)OCC"}));
    s.wait("a second answer", &format!(
        "var h = document.querySelector('#advice .headline strong'); return !document.getElementById('one-result').hidden && h && h.textContent === {}",
        json!(want)));
    assert_eq!(
        s.js("return document.getElementById('one-error').hidden"),
        true
    );

    // 5. A shared link with a site opens with that target.
    s.open(&format!(
        "{base_url}/?smiles=CC1CCCCC1%3DO&site=1&scale=water"
    ));
    s.wait("the linked target", "var r = document.querySelector('#sites tr.target-row td:nth-child(2)'); return r && r.textContent === 'C1'");
    assert_eq!(
        s.js("return document.querySelector('input[name=scale][value=water]').checked"),
        true
    );

    // 5b. A SMILES pasted into an address unencoded keeps its '+' and '#'.
    s.open(&format!(
        "{base_url}/?smiles=C[N+](C)(C)CC#N&reaction=alkylation"
    ));
    s.wait(
        "the drawing",
        "return document.querySelectorAll('#drawing g[data-atom]').length === 7",
    );
    assert_eq!(
        s.js("return document.getElementById('smiles').value"),
        "C[N+](C)(C)CC#N"
    );
    assert_eq!(
        s.js("return document.getElementById('reaction').value"),
        "alkylation"
    );

    // 6. A list of 1,000 lines with bad lines: count, failed rows, download.
    let mut lines: Vec<String> = std::fs::read_to_string(REAL)
        .unwrap()
        .lines()
        .filter(|l| !l.starts_with('#'))
        .take(985)
        .map(str::to_string)
        .collect();
    for (i, bad) in [
        "CC(=O",
        "C1CC",
        "c1cccc1",
        "Xx",
        "C[N+](C)(C)(C)C",
        "CC))",
        "[C@@",
        "C=1=C",
        "O=[Zz]",
        "CC%",
        "C(C",
        "[13]",
        "C..C",
        "B(B)(B)(B)B",
        "C#C#C",
    ]
    .iter()
    .enumerate()
    {
        lines.insert(60 * i + 7, format!("{bad} bad-{i}"));
    }
    assert_eq!(lines.len(), 1000);
    let list = work.join("list-1000.smi");
    std::fs::write(&list, lines.join("\n") + "\n").unwrap();
    let cli_out = String::from_utf8(cli(&["annotate", list.to_str().unwrap(), "--quiet"])).unwrap();
    let failed = cli_out
        .lines()
        .filter(|l| l.contains("\"ok\":false"))
        .count();
    assert!(
        failed >= 10,
        "the list should have failed records ({failed})"
    );
    s.open(&format!("{base_url}/"));
    s.click("#tab-list");
    let file = s.find("#file");
    s.cmd(
        "POST",
        &format!("/element/{file}/value"),
        Some(json!({ "text": list.to_str().unwrap() })),
    );
    s.click("#list-form button[type=submit]");
    s.wait(
        "the list result",
        "return !document.getElementById('list-result').hidden",
    );
    let count = s.js("return document.getElementById('list-count').textContent");
    assert!(
        count.as_str().unwrap().starts_with(&format!(
            "1000 records, {} analysed, {failed} failed",
            1000 - failed
        )),
        "{count}"
    );
    s.js("document.getElementById('list-table').scrollIntoView(); return 1");
    s.wait(
        "small drawings",
        "return document.querySelectorAll('#list-table td.pic svg').length >= 3",
    );
    s.js("document.getElementById('list-status').scrollIntoView(); return 1");
    s.wait(
        "small drawings in view",
        "return document.querySelectorAll('#list-table td.pic svg').length >= 3",
    );
    s.shot("4-list");
    s.js("var s = document.getElementById('list-show'); s.value = 'failed'; s.dispatchEvent(new Event('change')); return 1");
    let rows = s.js("return document.querySelectorAll('#list-table tbody tr.failed').length");
    assert_eq!(rows, failed);
    assert_eq!(
        s.js("return document.querySelectorAll('#list-table tbody tr').length"),
        failed
    );
    s.shot("5-list-failed");
    s.click("#dl-csv");
    let csv_path = downloads.join("list-1000-acidsite.csv");
    let start = Instant::now();
    while !csv_path.is_file() {
        assert!(start.elapsed() < Duration::from_secs(30), "no CSV download");
        std::thread::sleep(Duration::from_millis(200));
    }
    std::thread::sleep(Duration::from_millis(300));
    let got = std::fs::read_to_string(&csv_path).unwrap();
    let want = String::from_utf8(cli(&[
        "annotate",
        list.to_str().unwrap(),
        "--quiet",
        "--format",
        "csv",
    ]))
    .unwrap();
    assert_eq!(got.lines().count(), 1001);
    assert_eq!(got, want);
    drop(s);
    drop(driver);
    let _ = std::fs::remove_dir_all(&work);
}
