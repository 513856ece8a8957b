//! The hand-written JSON writer of the output record (`Record::write_json`)
//! must give exactly the bytes `serde_json` makes of the same record through
//! its `Serialize` implementation, for real molecules (the 5,000-line bulk
//! corpus, `corpus/bulk/README.md`), every option that adds keys, and hostile
//! text that needs escaping. Issue 6.

use acidsite::report::record::{ErrorOut, Pairs};
use acidsite::report::{analyze, Flag, Options, Record, Scale};

fn assert_same(rec: &Record) {
    let expected = serde_json::to_string(rec).expect("records serialize");
    let got = rec.to_json_line();
    assert_eq!(got, expected, "record of line {}", rec.line);
    let mut buf = b"kept".to_vec();
    rec.write_json(&mut buf);
    assert_eq!(&buf[..4], b"kept", "write_json appends");
    assert_eq!(&buf[4..], expected.as_bytes());
}

fn corpus() -> Vec<(String, Option<String>)> {
    let text =
        std::fs::read_to_string(concat!(env!("CARGO_MANIFEST_DIR"), "/corpus/bulk/real.smi"))
            .expect("corpus/bulk/real.smi");
    text.lines()
        .filter(|l| !l.starts_with('#'))
        .map(|l| {
            let mut it = l.split_whitespace();
            let smiles = it.next().unwrap_or("").to_string();
            (smiles, it.next().map(str::to_string))
        })
        .collect()
}

#[test]
fn write_json_given_the_bulk_corpus_with_full_advice() {
    let opts = Options::default();
    for (i, (smiles, id)) in corpus().into_iter().enumerate() {
        assert_same(&analyze(&smiles, i as u64 + 1, id, &opts));
    }
}

#[test]
fn write_json_given_sites_only_water_scale_flags_and_base() {
    let flags = vec![
        Flag::parse("carbonyl=[CX3]=O").expect("valid SMARTS"),
        Flag::parse("a \"quoted\" name=[OH]").expect("valid SMARTS"),
    ];
    let variants = [
        Options {
            sites_only: true,
            ..Options::default()
        },
        Options {
            scale: Scale::Water,
            flags: flags.clone(),
            ..Options::default()
        },
        Options {
            base: Some("LDA".into()),
            site: Some(1),
            ..Options::default()
        },
    ];
    for opts in &variants {
        for (i, (smiles, id)) in corpus().into_iter().take(400).enumerate() {
            assert_same(&analyze(&smiles, i as u64 + 1, id, opts));
        }
    }
}

#[test]
fn write_json_given_text_that_needs_escaping() {
    // Inputs that fail (control characters, quotes, backslashes) carry their
    // text into the record; ids and carried columns are free text.
    let opts = Options::default();
    let inputs = [
        "C\tC",
        "CC\"O",
        "C\\C",
        "C\u{1}",
        "",
        "[13CH3]C(=O)[O-].[Na+]",
        "CC(=O)OCC\u{2013}",
        "OC(=O)C\u{7f}",
    ];
    for (i, s) in inputs.iter().enumerate() {
        let mut rec = analyze(s, i as u64, Some(format!("id \"{i}\"\\\n\u{b5}")), &opts);
        rec.columns = Some(Pairs(vec![
            ("step".into(), "R1-1".into()),
            ("note \"x\"".into(), "a\tb\r\nc\u{0}".into()),
        ]));
        assert_same(&rec);
    }
    let rec = Record::failure(
        9,
        None,
        "\u{fffd}C".into(),
        ErrorOut {
            kind: "encoding".into(),
            message: "bad byte \"\\xff\"".into(),
            position: Some(0),
        },
    );
    assert_same(&rec);
}
