//! `acidsite serve` without a browser: every API route with good and bad
//! input, the limits, the Host and Origin refusals, the security headers,
//! 200 concurrent requests, and records identical to the command line's.
//! The server is the real binary started with `--port 0`.

use crate::serve_common;

use serve_common::{cli, request, Server};
use std::io::Write;

const DEMO: &str = concat!(
    env!("CARGO_MANIFEST_DIR"),
    "/corpus/demo/route-intermediates.csv"
);
const REAL: &str = concat!(env!("CARGO_MANIFEST_DIR"), "/corpus/bulk/real.smi");

fn body(v: serde_json::Value) -> Vec<u8> {
    v.to_string().into_bytes()
}

#[test]
fn health_given_running_server_issue13() {
    let s = Server::start(&[]);
    let r = s.get("/api/health");
    assert_eq!(r.status, 200);
    let j = r.json();
    assert_eq!(j["status"], "ok");
    assert_eq!(j["schema"], acidsite::report::SCHEMA);
    let csp = r
        .header("content-security-policy")
        .expect("CSP on every answer");
    assert!(
        csp.contains("script-src 'self'") && !csp.contains("unsafe-inline"),
        "{csp}"
    );
    assert_eq!(r.header("x-content-type-options"), Some("nosniff"));
}

#[test]
fn page_given_root_has_no_inline_script_issue13() {
    let s = Server::start(&[]);
    let r = s.get("/");
    assert_eq!(r.status, 200);
    assert!(r.header("content-type").unwrap().starts_with("text/html"));
    assert!(r
        .header("content-security-policy")
        .unwrap()
        .contains("default-src 'none'"));
    let html = r.text();
    // Every <script> element loads a file (the CSP forbids inline script).
    for tag in html.split("<script").skip(1) {
        let open = &tag[..tag.find('>').unwrap()];
        assert!(open.contains("src=\"/"), "inline script: <script{open}>");
    }
    assert!(
        !html.contains("http://") && !html.contains("https://"),
        "no outside resource"
    );
    for file in ["/util.js", "/app.js", "/list.js"] {
        assert!(
            html.contains(&format!("<script src=\"{file}\" defer>")),
            "{file}"
        );
        let js = s.get(file);
        assert_eq!(js.status, 200);
        assert!(js
            .header("content-type")
            .unwrap()
            .starts_with("text/javascript"));
        let text = js.text();
        // The page builds its DOM with textContent; markup from strings
        // would let a SMILES or an id inject HTML.
        for sink in [
            "innerHTML",
            "outerHTML",
            "insertAdjacentHTML",
            "document.write",
            "eval(",
        ] {
            assert!(!text.contains(sink), "{file} uses {sink}");
        }
    }
    assert_eq!(s.get("/style.css").status, 200);
    assert_eq!(s.get("/etc/passwd").status, 404);
    assert_eq!(s.get("/../Cargo.toml").status, 404);
}

#[test]
fn scan_given_smiles_equals_scan_json_issue13() {
    let s = Server::start(&[]);
    // Ketone, beta-keto ester, amide with a free OH, salt, no acidic site
    // (common practice examples, the same as the demo list's kinds).
    let cases: &[(&str, &[&str], serde_json::Value)] = &[
        ("CC1CCCCC1=O", &[], serde_json::json!({})),
        ("CCOC(=O)CC(C)=O", &[], serde_json::json!({})),
        ("OCCNC(=O)Cc1ccccc1", &[], serde_json::json!({})),
        (
            "CC1CCCCC1=O",
            &["--site", "1"],
            serde_json::json!({"site": 1}),
        ),
        (
            "CC1CCCCC1=O",
            &["--scale", "water"],
            serde_json::json!({"scale": "water"}),
        ),
        (
            "CCOC(=O)CC(C)=O",
            &["--base", "NaH"],
            serde_json::json!({"base": "NaH"}),
        ),
        (
            "CC1CCCCC1=O",
            &["--reaction", "alkylation", "--control", "thermodynamic"],
            serde_json::json!({"reaction": "alkylation", "control": "thermodynamic"}),
        ),
        (
            "CCOC(=O)CC(=O)OCC",
            &["--reaction", "condensation"],
            serde_json::json!({"reaction": "condensation"}),
        ),
        ("[Na+].CC(=O)[O-]", &[], serde_json::json!({})),
        ("C", &[], serde_json::json!({})),
        ("CC(=O", &[], serde_json::json!({})),
    ];
    for (smiles, args, extra) in cases {
        let mut req = extra.clone();
        req["smiles"] = (*smiles).into();
        let r = s.post("/api/scan", &body(req));
        assert_eq!(r.status, 200, "{smiles}: {}", r.text());
        let mut a = vec!["scan", "--json", smiles];
        a.extend_from_slice(args);
        assert_eq!(
            r.text(),
            String::from_utf8(cli(&a)).unwrap(),
            "{smiles} {args:?}"
        );
    }
}

#[test]
fn scan_given_bad_smiles_returns_failed_record_with_position_issue13() {
    let s = Server::start(&[]);
    let r = s.post("/api/scan", br#"{"smiles":"CC(=O)C(C"}"#);
    assert_eq!(r.status, 200);
    let j = r.json();
    assert_eq!(j["ok"], false);
    assert_eq!(j["error"]["kind"], "syntax");
    assert!(j["error"]["position"].is_u64());
    // A name becomes the record's id.
    let j = s
        .post("/api/scan", br#"{"smiles":"CCO","name":"ethanol"}"#)
        .json();
    assert_eq!(j["id"], "ethanol");
}

#[test]
fn scan_given_bad_bodies_answers_400_issue13() {
    let s = Server::start(&[]);
    for (what, b, kind) in [
        ("empty body", &b""[..], "empty"),
        ("malformed JSON", &b"{\"smiles\": "[..], "json"),
        ("invalid UTF-8", &b"{\"smiles\": \"C\xff\"}"[..], "encoding"),
        ("not an object", &b"[1,2]"[..], "json"),
        ("missing smiles", &b"{}"[..], "json"),
        (
            "unknown key",
            &b"{\"smiles\":\"C\",\"file\":\"/etc/passwd\"}"[..],
            "json",
        ),
        (
            "unknown scale",
            &b"{\"smiles\":\"C\",\"scale\":\"thf\"}"[..],
            "scale",
        ),
        (
            "unknown base",
            &b"{\"smiles\":\"C\",\"base\":\"NoSuchBase\"}"[..],
            "base",
        ),
        (
            "site past the last atom",
            &b"{\"smiles\":\"CCO\",\"site\":3}"[..],
            "site",
        ),
        (
            "negative site",
            &b"{\"smiles\":\"C\",\"site\":-1}"[..],
            "json",
        ),
    ] {
        let r = s.post("/api/scan", b);
        assert_eq!(r.status, 400, "{what}: {}", r.text());
        assert_eq!(r.json()["error"]["kind"], kind, "{what}");
        assert_eq!(s.post("/api/draw", b).status, 400, "draw, {what}");
    }
    // A reaction or control the build does not know is refused by the API
    // (the page leaves it out instead, with a note).
    let r = s.post(
        "/api/scan",
        br#"{"smiles":"CC(C)=O","reaction":"no-such-reaction"}"#,
    );
    assert_eq!(r.status, 400);
    assert_eq!(r.json()["error"]["kind"], "reaction");
    let r = s.post("/api/scan", br#"{"smiles":"CC(C)=O","control":"sideways"}"#);
    assert_eq!(r.status, 400);
    assert_eq!(r.json()["error"]["kind"], "control");
}

#[test]
fn scan_given_smiles_of_1_mb_gives_too_large_record_issue13() {
    let s = Server::start(&[]);
    let big = "C".repeat(1 << 20);
    let r = s.post("/api/scan", &body(serde_json::json!({ "smiles": big })));
    assert_eq!(r.status, 200);
    let j = r.json();
    assert_eq!(j["ok"], false);
    assert_eq!(j["error"]["kind"], "too_large");
    // A body past the JSON limit (2 MB) is refused before it is read.
    let r = s.post(
        "/api/scan",
        &body(serde_json::json!({ "smiles": "C".repeat(3 << 20) })),
    );
    assert_eq!(r.status, 413);
    assert_eq!(r.json()["error"]["kind"], "too_large");
}

#[test]
fn annotate_given_100_mb_body_refused_pointing_to_command_line_issue13() {
    let s = Server::start(&[]);
    let big = vec![b'C'; 100 << 20];
    let r = request(&s.addr, "POST", "/api/annotate", &[], &big);
    assert_eq!(r.status, 413);
    let msg = r.json()["error"]["message"].as_str().unwrap().to_string();
    assert!(
        msg.contains("10 MB") && msg.contains("acidsite annotate"),
        "{msg}"
    );
    // The server still answers afterwards.
    assert_eq!(s.get("/api/health").status, 200);
}

#[test]
fn annotate_given_gzip_bomb_refused_issue13() {
    let s = Server::start(&[]);
    // 60 MB of one repeated line packs into well under the upload limit.
    let mut gz = flate2::write::GzEncoder::new(Vec::new(), flate2::Compression::best());
    let line = b"CCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCC\n";
    for _ in 0..(60 << 20) / line.len() {
        gz.write_all(line).unwrap();
    }
    let packed = gz.finish().unwrap();
    assert!(packed.len() < 10 << 20);
    let r = request(&s.addr, "POST", "/api/annotate", &[], &packed);
    assert_eq!(r.status, 413, "{}", r.text());
    assert!(r.text().contains("acidsite annotate"));
}

#[test]
fn annotate_given_demo_list_equals_cli_in_every_format_issue13() {
    let s = Server::start(&[]);
    let data = std::fs::read(DEMO).unwrap();
    let q = "input=csv&name=".to_string() + DEMO;
    let jsonl = request(&s.addr, "POST", &format!("/api/annotate?{q}"), &[], &data);
    assert_eq!(jsonl.status, 200);
    assert_eq!(
        jsonl.text(),
        String::from_utf8(cli(&["annotate", DEMO, "--quiet"])).unwrap()
    );
    assert_eq!(jsonl.text().lines().count(), 32);
    let lines: usize = jsonl.header("x-acidsite-lines").unwrap().parse().unwrap();
    assert_eq!(lines, 34);
    for fmt in ["csv", "tsv"] {
        let r = request(
            &s.addr,
            "POST",
            &format!("/api/annotate?{q}&format={fmt}"),
            &[],
            &data,
        );
        assert_eq!(r.status, 200);
        assert_eq!(
            r.text(),
            String::from_utf8(cli(&["annotate", DEMO, "--quiet", "--format", fmt])).unwrap(),
            "{fmt}"
        );
    }
    let r = request(
        &s.addr,
        "POST",
        &format!("/api/annotate?{q}&format=csv&per_site=true"),
        &[],
        &data,
    );
    assert_eq!(
        r.text(),
        String::from_utf8(cli(&[
            "annotate",
            DEMO,
            "--quiet",
            "--format",
            "csv",
            "--per-site"
        ]))
        .unwrap()
    );
    let r = request(
        &s.addr,
        "POST",
        &format!("/api/annotate?{q}&reaction=acylation"),
        &[],
        &data,
    );
    assert_eq!(
        r.text(),
        String::from_utf8(cli(&[
            "annotate",
            DEMO,
            "--quiet",
            "--reaction",
            "acylation"
        ]))
        .unwrap()
    );
    // The HTML report is the one `annotate --html` writes.
    let dir = std::env::temp_dir().join(format!("acidsite-serve-{}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    let html_path = dir.join("report.html");
    cli(&[
        "annotate",
        DEMO,
        "--quiet",
        "-o",
        "/dev/null",
        "--html",
        html_path.to_str().unwrap(),
    ]);
    let r = request(
        &s.addr,
        "POST",
        &format!("/api/annotate?{q}&format=html"),
        &[],
        &data,
    );
    assert_eq!(r.status, 200);
    assert_eq!(r.text(), std::fs::read_to_string(&html_path).unwrap());
    let _ = std::fs::remove_dir_all(&dir);
}

#[test]
fn annotate_given_gzip_and_smi_equals_cli_issue13() {
    let s = Server::start(&[]);
    let text: String = std::fs::read_to_string(REAL)
        .unwrap()
        .lines()
        .take(400)
        .collect::<Vec<_>>()
        .join("\n");
    let mut gz = flate2::write::GzEncoder::new(Vec::new(), flate2::Compression::default());
    gz.write_all(text.as_bytes()).unwrap();
    let packed = gz.finish().unwrap();
    let plain = request(&s.addr, "POST", "/api/annotate", &[], text.as_bytes());
    let zipped = request(
        &s.addr,
        "POST",
        "/api/annotate?input=list.smi.gz",
        &[],
        &packed,
    );
    assert_eq!(plain.status, 200);
    assert_eq!(plain.body, zipped.body);
    let dir = std::env::temp_dir().join(format!("acidsite-serve-smi-{}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    let f = dir.join("list.smi");
    std::fs::write(&f, &text).unwrap();
    assert_eq!(
        plain.text(),
        String::from_utf8(cli(&["annotate", f.to_str().unwrap(), "--quiet"])).unwrap()
    );
    let _ = std::fs::remove_dir_all(&dir);
}

#[test]
fn annotate_given_bad_input_issue13() {
    let s = Server::start(&[]);
    // Invalid UTF-8 and a broken line are records, not failures of the request.
    let r = request(
        &s.addr,
        "POST",
        "/api/annotate",
        &[],
        b"CCO\nC\xffC\nCC(=O\n",
    );
    assert_eq!(r.status, 200);
    let recs: Vec<serde_json::Value> = r
        .text()
        .lines()
        .map(|l| serde_json::from_str(l).unwrap())
        .collect();
    assert_eq!(recs.len(), 3);
    assert_eq!(recs[1]["error"]["kind"], "encoding");
    assert_eq!(recs[2]["error"]["kind"], "syntax");
    // An empty list is an empty answer.
    let r = request(&s.addr, "POST", "/api/annotate", &[], b"");
    assert_eq!((r.status, r.body.len()), (200, 0));
    // CSV without a SMILES column, an unknown format or parameter: 400.
    let r = request(
        &s.addr,
        "POST",
        "/api/annotate?input=csv",
        &[],
        b"a,b\n1,2\n",
    );
    assert_eq!(r.status, 400);
    assert!(r.text().contains("no SMILES column"), "{}", r.text());
    assert_eq!(
        request(&s.addr, "POST", "/api/annotate?format=xml", &[], b"C").status,
        400
    );
    assert_eq!(
        request(&s.addr, "POST", "/api/annotate?path=/etc/passwd", &[], b"C").status,
        400
    );
    assert_eq!(s.get("/api/annotate").status, 405);
}

#[test]
fn draw_given_smiles_gives_svg_with_atoms_issue13() {
    let s = Server::start(&[]);
    let r = s.post("/api/draw", br#"{"smiles":"CC(=O)CC(=O)OCC","site":0}"#);
    assert_eq!(r.status, 200);
    assert_eq!(r.header("content-type"), Some("image/svg+xml"));
    let svg = r.text();
    assert_eq!(svg.matches("data-atom=").count(), 9);
    assert_eq!(
        svg,
        String::from_utf8(cli(&["draw", "CC(=O)CC(=O)OCC", "--site", "0"]))
            .unwrap()
            .trim_end()
    );
    let r = s.post("/api/draw", br#"{"smiles":"CC(=O"}"#);
    assert_eq!(r.status, 422);
    assert_eq!(r.json()["error"]["kind"], "syntax");
    assert_eq!(
        s.post("/api/draw", br#"{"smiles":"C","bond_px":1000}"#)
            .status,
        400
    );
}

#[test]
fn options_and_rules_given_build_match_listings_issue13() {
    let s = Server::start(&[]);
    let o = s.get("/api/options").json();
    let bases = String::from_utf8(cli(&["bases", "--json"])).unwrap();
    assert_eq!(o["bases"].as_array().unwrap().len(), bases.lines().count());
    assert_eq!(o["scales"], serde_json::json!(["dmso", "water"]));
    // The reactions and controls are the library's (the values of
    // `scan --reaction` / `--control`).
    let names = |k: &str| -> Vec<String> {
        o[k].as_array()
            .unwrap()
            .iter()
            .map(|r| r["name"].as_str().unwrap().to_string())
            .collect()
    };
    let reactions = names("reactions");
    assert!(
        reactions.contains(&"alkylation".to_string()) && reactions.contains(&"aldol".to_string())
    );
    assert_eq!(names("controls"), ["kinetic", "thermodynamic"]);
    for r in &reactions {
        let out = std::process::Command::new(serve_common::BIN)
            .args(["scan", "CC(C)=O", "--reaction", r])
            .output()
            .unwrap();
        assert!(out.status.success(), "scan --reaction {r}");
    }
    assert_eq!(o["limits"]["annotate_body_bytes"], 10 << 20);
    let r = s.get("/api/rules").json();
    let listing = String::from_utf8(cli(&["rules", "--json"])).unwrap();
    let kinds: Vec<serde_json::Value> = listing
        .lines()
        .map(|l| serde_json::from_str(l).unwrap())
        .collect();
    let rules = kinds.iter().filter(|k| k["kind"] == "rule").count();
    assert_eq!(r["rules"].as_array().unwrap().len(), rules);
    assert_eq!(
        r["increments"].as_array().unwrap().len(),
        kinds.len() - rules
    );
    assert_eq!(r["rule_set"], kinds[0]["rule_set"]);
}

#[test]
fn guard_given_foreign_host_or_origin_refuses_issue13() {
    let s = Server::start(&[]);
    let port = s.port();
    // DNS rebinding: a foreign name pointing at 127.0.0.1.
    let r = request(&s.addr, "GET", "/", &[("Host", "attacker.example")], b"");
    assert_eq!(r.status, 403);
    assert_eq!(r.json()["error"]["kind"], "host");
    let local = format!("localhost:{port}");
    assert_eq!(
        request(&s.addr, "GET", "/api/health", &[("Host", &local)], b"").status,
        200
    );
    // Cross-origin API calls are refused; the page's own are not.
    let json = ("Content-Type", "application/json");
    let b = br#"{"smiles":"CCO"}"#;
    let r = request(
        &s.addr,
        "POST",
        "/api/scan",
        &[json, ("Origin", "http://attacker.example")],
        b,
    );
    assert_eq!(r.status, 403);
    assert_eq!(r.json()["error"]["kind"], "origin");
    let r = request(&s.addr, "POST", "/api/scan", &[json, ("Origin", "null")], b);
    assert_eq!(r.status, 403);
    let other_port = format!("http://127.0.0.1:{}", port.wrapping_add(1));
    assert_eq!(
        request(
            &s.addr,
            "POST",
            "/api/scan",
            &[json, ("Origin", &other_port)],
            b
        )
        .status,
        403
    );
    let same = format!("http://{}", s.addr);
    assert_eq!(
        request(&s.addr, "POST", "/api/scan", &[json, ("Origin", &same)], b).status,
        200
    );
    let r = request(
        &s.addr,
        "GET",
        "/api/options",
        &[("Sec-Fetch-Site", "cross-site")],
        b"",
    );
    assert_eq!(r.status, 403);
    // A shared link opened from another site is a plain page load: allowed.
    let r = request(
        &s.addr,
        "GET",
        "/?smiles=CCO",
        &[("Sec-Fetch-Site", "cross-site")],
        b"",
    );
    assert_eq!(r.status, 200);
    // With --bind the Host check is off (the user chose to serve a network).
    let open = Server::start(&["--bind", "127.0.0.1"]);
    let r = request(
        &open.addr,
        "GET",
        "/api/health",
        &[("Host", "workstation.lab.example")],
        b"",
    );
    assert_eq!(r.status, 200);
}

#[test]
fn scan_given_200_concurrent_requests_answers_each_correctly_issue13() {
    let s = Server::start(&[]);
    let smiles: Vec<String> = std::fs::read_to_string(REAL)
        .unwrap()
        .lines()
        .filter(|l| !l.starts_with('#'))
        .take(200)
        .map(|l| l.split_whitespace().next().unwrap().to_string())
        .collect();
    // Expected records from the command line (one `scan --json` run; its
    // line numbers count the arguments, the server's are always 1).
    let mut args = vec!["scan", "--json"];
    args.extend(smiles.iter().map(String::as_str));
    let expected: Vec<serde_json::Value> = String::from_utf8(cli(&args))
        .unwrap()
        .lines()
        .map(|l| {
            let mut v: serde_json::Value = serde_json::from_str(l).unwrap();
            v["line"] = 1.into();
            v
        })
        .collect();
    assert_eq!(expected.len(), 200);
    let addr = s.addr.clone();
    let handles: Vec<_> = smiles
        .iter()
        .cloned()
        .map(|smi| {
            let addr = addr.clone();
            std::thread::spawn(move || {
                let r = request(
                    &addr,
                    "POST",
                    "/api/scan",
                    &[("Content-Type", "application/json")],
                    &body(serde_json::json!({ "smiles": smi })),
                );
                assert_eq!(r.status, 200);
                r.json()
            })
        })
        .collect();
    for (h, want) in handles.into_iter().zip(&expected) {
        assert_eq!(&h.join().unwrap(), want);
    }
}

#[test]
fn serve_given_sigterm_stops_cleanly_issue13() {
    let s = Server::start(&[]);
    assert_eq!(s.get("/api/health").status, 200);
    let (status, err) = s.stop();
    assert!(status.success(), "{status:?} {err}");
    assert!(err.contains("stopped"), "{err}");
    // Ctrl-C (SIGINT) ends it the same way.
    let s = Server::start(&[]);
    assert_eq!(s.get("/api/health").status, 200);
    let (status, err) = s.stop_with("-INT");
    assert!(status.success(), "{status:?} {err}");
    assert!(err.contains("stopped"), "{err}");
}

#[test]
fn serve_given_port_in_use_exits_2_issue13() {
    let s = Server::start(&[]);
    let out = std::process::Command::new(serve_common::BIN)
        .args(["serve", "--port", &s.port().to_string()])
        .output()
        .unwrap();
    assert_eq!(out.status.code(), Some(2));
    assert!(String::from_utf8_lossy(&out.stderr).contains("cannot listen"));
}
