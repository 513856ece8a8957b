//! The TSV reader shared by the corpus tests of the sites area (`mod tsv;`
//! in `tests/sites.rs`, `use crate::tsv;` in a module): lines starting
//! with `#` and blank lines are skipped, the first other line names the
//! columns, cells are trimmed and a row shorter than the header reads as
//! empty cells.

use std::collections::BTreeMap;

/// One data row: column name → trimmed cell.
pub type Row = BTreeMap<String, String>;

/// The rows of the TSV file at `path` (relative to the package root, where
/// cargo runs the tests); panics naming the file when it cannot be read.
pub fn read_rows(path: &str) -> Vec<Row> {
    let text = std::fs::read_to_string(path).unwrap_or_else(|e| panic!("{path}: {e}"));
    let mut cols: Vec<String> = Vec::new();
    let mut out = Vec::new();
    for line in text.lines() {
        if line.starts_with('#') || line.trim().is_empty() {
            continue;
        }
        let cells: Vec<&str> = line.split('\t').collect();
        if cols.is_empty() {
            cols = cells.iter().map(|s| s.to_string()).collect();
            continue;
        }
        out.push(
            cols.iter()
                .enumerate()
                .map(|(i, c)| (c.clone(), cells.get(i).unwrap_or(&"").trim().to_string()))
                .collect(),
        );
    }
    out
}
