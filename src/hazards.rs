//! Hazards of the substrate itself: hydrogen cyanide, hydrogen sulfide, P–H
//! phosphines, azides, peroxides, diazo and gem-dinitro compounds.
//!
//! They belong to the molecule, not to the planned reaction, so every
//! analysed molecule is checked, whether or not it gets advice. The rows are
//! data (`fragments/hazards.tsv`: id, SMARTS, message, citation key), parsed
//! and validated on first use; hazards that arise only from the planned
//! reaction are side reactions of the advice (`fragments/side_reactions.tsv`).
//!
//! ```
//! use acidsite::hazards::substrate_hazards;
//! use acidsite::mol::Molecule;
//! use acidsite::smarts::Target;
//!
//! let mol = Molecule::from_smiles("CCOC(=O)C=[N+]=[N-]").expect("valid SMILES");
//! let found = substrate_hazards(&Target::new(&mol)).expect("embedded rows are valid");
//! assert_eq!(found.len(), 1);
//! assert_eq!(found[0].id, "HZ-DIAZO");
//! ```

use std::fmt;
use std::sync::OnceLock;

use crate::smarts::{Pattern, Target};

/// The embedded hazard rows: (file name, text).
const HAZARDS: (&str, &str) = (
    "fragments/hazards.tsv",
    include_str!("../fragments/hazards.tsv"),
);

/// One hazard row.
#[derive(Debug, Clone)]
pub struct Hazard {
    /// Stable id (column `id`, e.g. `HZ-HCN`).
    pub id: String,
    /// The SMARTS as written (column `smarts`).
    pub smarts: String,
    /// The caution, worded for the chemist (column `message`).
    pub message: String,
    /// Citation key of `fragments/sources.tsv` (column `source`).
    pub source: String,
    pattern: Pattern,
}

/// A bad hazard row: the file, the 1-based line and what is wrong.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct HazardError {
    /// File name as passed to the parser; used only in messages.
    pub file: String,
    /// 1-based line number; 0 when the file as a whole is concerned.
    pub line: usize,
    /// What is wrong, naming the column or value.
    pub message: String,
}

impl fmt::Display for HazardError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "{}:{}: {}", self.file, self.line, self.message)
    }
}

impl std::error::Error for HazardError {}

/// Read hazard rows (columns `id`, `smarts`, `message`, `source`; `#`
/// comment lines and blank lines skipped). `known_source` says whether a
/// citation key exists. `file` is used only in error messages.
pub fn parse_hazards(
    file: &str,
    text: &str,
    known_source: impl Fn(&str) -> bool,
) -> Result<Vec<Hazard>, HazardError> {
    let err = |line: usize, message: String| HazardError {
        file: file.to_string(),
        line,
        message,
    };
    let mut header: Option<Vec<&str>> = None;
    let mut out: Vec<Hazard> = Vec::new();
    for (n, line) in text.lines().enumerate() {
        let line_no = n + 1;
        if line.starts_with('#') || line.trim().is_empty() {
            continue;
        }
        let cells: Vec<&str> = line.split('\t').map(str::trim).collect();
        let Some(cols) = &header else {
            if cells != ["id", "smarts", "message", "source"] {
                return Err(err(
                    line_no,
                    format!("expected the header id, smarts, message, source, found {cells:?}"),
                ));
            }
            header = Some(cells);
            continue;
        };
        if cells.len() != cols.len() {
            return Err(err(
                line_no,
                format!("expected {} columns, found {}", cols.len(), cells.len()),
            ));
        }
        let (id, smarts, message, source) = (cells[0], cells[1], cells[2], cells[3]);
        if id.is_empty() || message.is_empty() || message == "-" {
            return Err(err(line_no, "empty id or message".to_string()));
        }
        if out.iter().any(|h| h.id == id) {
            return Err(err(line_no, format!("duplicate id {id}")));
        }
        if !known_source(source) {
            return Err(err(
                line_no,
                format!("source '{source}' is not a key of fragments/sources.tsv"),
            ));
        }
        let pattern = Pattern::parse(smarts)
            .map_err(|e| err(line_no, format!("column smarts: {smarts}: {e}")))?;
        out.push(Hazard {
            id: id.to_string(),
            smarts: smarts.to_string(),
            message: message.to_string(),
            source: source.to_string(),
            pattern,
        });
    }
    if header.is_none() {
        return Err(err(0, "no header line".to_string()));
    }
    Ok(out)
}

static LOADED: OnceLock<Result<Vec<Hazard>, HazardError>> = OnceLock::new();

/// The embedded hazard rows, parsed and validated on first use (citation
/// keys against the embedded `fragments/sources.tsv`).
pub fn hazards() -> Result<&'static [Hazard], &'static HazardError> {
    LOADED
        .get_or_init(|| {
            let sources = crate::sites::rule_set().map_err(|e| HazardError {
                file: HAZARDS.0.to_string(),
                line: 0,
                message: format!("sources not available: {e}"),
            })?;
            parse_hazards(HAZARDS.0, HAZARDS.1, |k| sources.sources.contains_key(k))
        })
        .as_ref()
        .map(Vec::as_slice)
}

/// The hazard rows found in the molecule behind `target`, in file order.
pub fn substrate_hazards(target: &Target) -> Result<Vec<&'static Hazard>, &'static HazardError> {
    Ok(hazards()?
        .iter()
        .filter(|h| h.pattern.is_match_in(target))
        .collect())
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn hazards_given_embedded_file_parses() {
        let h = hazards().expect("embedded hazards are valid");
        assert!(h.iter().any(|x| x.id == "HZ-HCN"));
    }

    #[test]
    fn parse_hazards_given_bad_smarts_names_the_line() {
        let text = "id\tsmarts\tmessage\tsource\nHZ-X\t[C\tA caution.\tcommon-practice\n";
        let e = parse_hazards("h.tsv", text, |_| true).expect_err("bad SMARTS");
        assert_eq!(e.line, 2);
        assert!(e.message.contains("smarts"), "{e}");
    }

    #[test]
    fn parse_hazards_given_unknown_source_is_an_error() {
        let text = "id\tsmarts\tmessage\tsource\nHZ-X\t[CH]#N\tA caution.\tnowhere\n";
        let e = parse_hazards("h.tsv", text, |k| k == "common-practice").expect_err("source");
        assert!(e.message.contains("nowhere"), "{e}");
    }

    #[test]
    fn parse_hazards_given_duplicate_id_is_an_error() {
        let text = "id\tsmarts\tmessage\tsource\nHZ-X\t[CH]#N\tA.\tc\nHZ-X\tC\tB.\tc\n";
        let e = parse_hazards("h.tsv", text, |_| true).expect_err("duplicate");
        assert_eq!(e.line, 3);
    }
}
