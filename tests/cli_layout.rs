//! The test layout: every test file in `tests/` belongs to one area binary.
//!
//! `Cargo.toml` sets `autotests = false` and lists one `[[test]]` per area
//! (`tests/<area>.rs`), which includes its files as modules. A new test file
//! that no area lists would never be compiled or run; this test fails then.

use std::collections::BTreeMap;
use std::path::Path;

/// The `[[test]]` paths of Cargo.toml (`path = "tests/<area>.rs"`).
fn area_files(manifest: &str) -> Vec<String> {
    let mut out = Vec::new();
    let mut in_test = false;
    for line in manifest.lines() {
        let line = line.trim();
        if line.starts_with('[') {
            in_test = line == "[[test]]";
            continue;
        }
        if in_test {
            if let Some(rest) = line.strip_prefix("path = \"tests/") {
                out.push(rest.trim_end_matches('"').to_string());
            }
        }
    }
    out
}

#[test]
fn test_files_given_tests_folder_are_each_in_one_area() {
    let root = Path::new(env!("CARGO_MANIFEST_DIR"));
    let manifest = std::fs::read_to_string(root.join("Cargo.toml")).expect("Cargo.toml");
    assert!(
        manifest.contains("autotests = false"),
        "Cargo.toml no longer sets autotests = false: update this test"
    );
    let areas = area_files(&manifest);
    assert!(areas.len() >= 2, "no [[test]] areas found in Cargo.toml");
    // file -> areas that include it
    let mut included: BTreeMap<String, Vec<String>> = BTreeMap::new();
    for area in &areas {
        let text = std::fs::read_to_string(root.join("tests").join(area)).expect("area file");
        for line in text.lines() {
            if let Some(rest) = line.trim().strip_prefix("#[path = \"") {
                let file = rest.trim_end_matches("\"]").to_string();
                included.entry(file).or_default().push(area.clone());
            }
        }
    }
    let mut problems = Vec::new();
    for entry in std::fs::read_dir(root.join("tests")).expect("tests folder") {
        let name = entry
            .expect("entry")
            .file_name()
            .to_string_lossy()
            .into_owned();
        if !name.ends_with(".rs") || areas.contains(&name) {
            continue;
        }
        match included.get(&name).map(Vec::len) {
            Some(1) => {}
            Some(n) => problems.push(format!("{name} is included by {n} areas")),
            None => problems.push(format!(
                "{name} is in no area: add `#[path = \"{name}\"] mod ...;` to one of {areas:?}"
            )),
        }
    }
    for file in included.keys() {
        if !root.join("tests").join(file).is_file() {
            problems.push(format!("an area includes {file}, which does not exist"));
        }
    }
    assert!(problems.is_empty(), "test layout: {problems:#?}");
}
