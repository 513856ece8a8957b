//! SD files: records separated by `$$$$` lines, each a molfile followed by
//! data items (`> <NAME>` header, value lines, a blank line). No I/O: the
//! splitter works on text already read ([`records`]) or line by line
//! ([`is_record_end`]) for a streaming reader.
//!
//! ```
//! use acidsite::mol::sdf;
//! let text = "ethanol\n\n\n  3  2  0  0  0  0  0  0  0  0999 V2000\n\
//!     0.0 0.0 0.0 C   0  0\n    0.0 0.0 0.0 C   0  0\n    0.0 0.0 0.0 O   0  0\n\
//!   1  2  1  0\n  2  3  1  0\nM  END\n> <CAS>\n64-17-5\n\n$$$$\n";
//! let recs: Vec<_> = sdf::records(text).collect();
//! assert_eq!(recs.len(), 1);
//! assert_eq!(recs[0].title(), "ethanol");
//! assert_eq!(recs[0].fields(), vec![("CAS".to_string(), "64-17-5".to_string())]);
//! let read = recs[0].read_molecule().unwrap();
//! assert_eq!(read.molecule.formula(), "C2H6O");
//! ```
//!
//! A broken record does not stop the file: its error names the record
//! number and the line in the file ([`SdRecord::read_molecule`] shifts the
//! molfile's line numbers by the record's first line), and the next `$$$$`
//! starts the next record.

use super::molfile::{self, MolfileError, MolfileRead};

/// One SD record: its text up to (not including) the `$$$$` line.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct SdRecord<'a> {
    /// 1-based record number in the file.
    pub number: u64,
    /// 1-based line of the file where the record starts (its title line).
    pub first_line: u64,
    /// The record's text (molfile and data items).
    pub text: &'a str,
}

/// True for the line that ends a record (`$$$$`, trailing space or CR
/// allowed).
pub fn is_record_end(line: &[u8]) -> bool {
    line.starts_with(b"$$$$") && line[4..].iter().all(|b| b.is_ascii_whitespace())
}

/// The records of an SD text, in order. A text without a final `$$$$`
/// still gives its last record; empty tails (only blank lines) give none.
pub fn records(text: &str) -> impl Iterator<Item = SdRecord<'_>> + '_ {
    let mut rest = text;
    let mut line = 1u64;
    let mut number = 0u64;
    std::iter::from_fn(move || {
        if rest.is_empty() {
            return None;
        }
        // Find the end line.
        let mut pos = 0usize;
        let mut lines = 0u64;
        let mut end: Option<(usize, usize)> = None; // (record text end, next start)
        for l in rest.split_inclusive('\n') {
            lines += 1;
            if is_record_end(l.as_bytes()) {
                end = Some((pos, pos + l.len()));
                break;
            }
            pos += l.len();
        }
        let (body_end, next) = end.unwrap_or((rest.len(), rest.len()));
        let body = &rest[..body_end];
        let start_line = line;
        line += lines;
        rest = &rest[next..];
        if end.is_none() && body.trim().is_empty() {
            return None;
        }
        number += 1;
        Some(SdRecord {
            number,
            first_line: start_line,
            text: body,
        })
    })
}

impl<'a> SdRecord<'a> {
    /// A record from its text (as a streaming reader collects it).
    pub fn new(text: &'a str, number: u64, first_line: u64) -> Self {
        SdRecord {
            number,
            first_line,
            text,
        }
    }

    /// The title line, trimmed.
    pub fn title(&self) -> &'a str {
        self.text.split('\n').next().unwrap_or("").trim()
    }

    /// Byte offset where the data items start (after the `M  END` line, or
    /// at the first `> ` header line when there is no `M  END`).
    fn data_start(&self) -> usize {
        let mut pos = 0usize;
        let mut header_at = None;
        for l in self.text.split_inclusive('\n') {
            if l.starts_with("M  END") {
                return pos + l.len();
            }
            if header_at.is_none() && l.starts_with('>') && l.contains('<') {
                header_at = Some(pos);
            }
            pos += l.len();
        }
        header_at.unwrap_or(self.text.len())
    }

    /// The molfile part of the record.
    pub fn molfile(&self) -> &'a str {
        &self.text[..self.data_start()]
    }

    /// Data items as (name, value) pairs in record order; a value of
    /// several lines is joined with `\n`. Lines outside an item are ignored.
    pub fn fields(&self) -> Vec<(String, String)> {
        let mut out: Vec<(String, String)> = Vec::new();
        let mut current: Option<(String, Vec<&str>)> = None;
        for l in self.text[self.data_start()..].split('\n') {
            let l = l.strip_suffix('\r').unwrap_or(l);
            if let Some((name, lines)) = current.as_mut() {
                if l.trim().is_empty() {
                    out.push((std::mem::take(name), std::mem::take(lines).join("\n")));
                    current = None;
                } else {
                    lines.push(l);
                }
                continue;
            }
            if l.starts_with('>') {
                if let (Some(a), Some(b)) = (l.find('<'), l.rfind('>')) {
                    if b > a {
                        current = Some((l[a + 1..b].to_string(), Vec::new()));
                    }
                }
            }
        }
        if let Some((name, lines)) = current {
            out.push((name, lines.join("\n")));
        }
        out
    }

    /// The value of data item `name` (first match, trimmed), if present.
    pub fn field(&self, name: &str) -> Option<String> {
        self.fields()
            .into_iter()
            .find(|(n, _)| n == name)
            .map(|(_, v)| v.trim().to_string())
    }

    /// Read the molfile part; error lines are lines of the file.
    pub fn read_molecule(&self) -> Result<MolfileRead, MolfileError> {
        molfile::read(self.molfile()).map_err(|e| e.shifted(self.first_line as usize - 1))
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    const ONE: &str = "x\n\n\n  1  0  0  0  0  0  0  0  0  0999 V2000\n    0.0000    0.0000    0.0000 C   0  0  0  0  0  0  0  0  0  0  0  0\nM  END\n";

    #[test]
    fn records_given_three_records_and_no_final_separator() {
        let text = format!("{ONE}> <a>\n1\n\n$$$$\n{ONE}$$$$\r\n{ONE}");
        let recs: Vec<_> = records(&text).collect();
        assert_eq!(recs.len(), 3);
        assert_eq!(
            recs.iter().map(|r| r.first_line).collect::<Vec<_>>(),
            [1, 11, 18]
        );
        assert_eq!(recs[0].fields(), [("a".to_string(), "1".to_string())]);
        assert!(recs[2].fields().is_empty());
        assert_eq!(recs[2].read_molecule().unwrap().molecule.formula(), "CH4");
    }

    #[test]
    fn read_molecule_given_broken_second_record_reports_file_line() {
        let broken = ONE.replace("    0.0000    0.0000", "    zero      0.0000");
        let text = format!("{ONE}$$$$\n{broken}$$$$\n{ONE}$$$$\n");
        let recs: Vec<_> = records(&text).collect();
        assert_eq!(recs.len(), 3);
        let e = recs[1].read_molecule().unwrap_err();
        assert_eq!(e.line, Some(12)); // record 2 starts at line 8; its atom line is its 5th
        assert!(recs[2].read_molecule().is_ok());
    }

    #[test]
    fn records_given_empty_and_blank_text() {
        assert_eq!(records("").count(), 0);
        assert_eq!(records("\n\n").count(), 0);
    }
}
