//! Atom-mapped SMILES: the input text with each site's atoms rewritten as
//! bracket atoms carrying the site's rank as atom-map number, everything else
//! kept exactly as written (an open convention: drawing programs show map
//! numbers beside the atoms).
//!
//! ```
//! use acidsite::report::mapped::{atom_mapped_smiles, Label};
//!
//! // Acetone, `CC(=O)C`: both methyl carbons (characters 0 and 6, three H
//! // each) belong to the site ranked 1.
//! let methyl = |at: usize| Label { span: at..at + 1, bracket: false, hydrogens: 3, map: 1 };
//! let mapped = atom_mapped_smiles("CC(=O)C", &[methyl(0), methyl(6)]).unwrap();
//! assert_eq!(mapped, "[CH3:1]C(=O)[CH3:1]");
//! // A span outside the input is an error, not a panic.
//! assert!(atom_mapped_smiles("CC", &[methyl(5)]).is_err());
//! ```

use std::ops::Range;

/// One atom to label: its character span in the input, the text facts needed
/// to write it as a bracket atom, and the map number.
#[derive(Debug, Clone, PartialEq)]
pub struct Label {
    /// Character range of the atom's text in the input.
    pub span: Range<usize>,
    /// Whether the atom was written in brackets.
    pub bracket: bool,
    /// Hydrogens to write inside the new bracket (organic-subset atoms only).
    pub hydrogens: u8,
    /// Map number to write.
    pub map: u32,
}

/// Error when a span does not fit the input text (a contract violation by the
/// caller, reported instead of panicking).
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct MapError {
    /// Which atom span did not fit the input (with the input's length in
    /// characters) or which bracket-atom text was malformed.
    pub message: String,
}

impl std::fmt::Display for MapError {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str(&self.message)
    }
}

impl std::error::Error for MapError {}

/// Rewrite `input` with the given labels. Spans are character ranges; labels
/// may come in any order but must not overlap.
///
/// * organic-subset atom `C` with 3 H and map 1 → `[CH3:1]`, `c` → `[cH:1]`;
/// * bracket atom `[C@@H]` → `[C@@H:1]`; an existing map `[CH3:7]` is replaced.
pub fn atom_mapped_smiles(input: &str, labels: &[Label]) -> Result<String, MapError> {
    // Byte offset of every character boundary (only needed beyond ASCII,
    // where characters and bytes differ).
    let ascii = input.is_ascii();
    let bounds: Vec<usize> = if ascii {
        Vec::new()
    } else {
        input
            .char_indices()
            .map(|(b, _)| b)
            .chain(std::iter::once(input.len()))
            .collect()
    };
    let chars = if ascii {
        input.len()
    } else {
        bounds.len().saturating_sub(1)
    };
    // Character index (at most `chars`) to byte offset.
    let byte = |c: usize| {
        if ascii {
            c
        } else {
            bounds.get(c).copied().unwrap_or(input.len())
        }
    };
    let mut sorted: Vec<&Label> = labels.iter().collect();
    sorted.sort_by_key(|l| l.span.start);
    let mut out = String::with_capacity(input.len() + 8 * labels.len());
    let mut pos = 0usize;
    for label in sorted {
        let Range { start, end } = label.span.clone();
        if start < pos || end > chars || start >= end {
            return Err(MapError {
                message: format!(
                    "atom span {start}..{end} does not fit the input of {chars} characters"
                ),
            });
        }
        out.push_str(input.get(byte(pos)..byte(start)).unwrap_or(""));
        let text = input.get(byte(start)..byte(end)).unwrap_or("");
        relabel(&mut out, text, label)?;
        pos = end;
    }
    out.push_str(input.get(byte(pos)..).unwrap_or(""));
    Ok(out)
}

// atom ::= bracket_atom | organic_symbol
fn relabel(out: &mut String, text: &str, label: &Label) -> Result<(), MapError> {
    if label.bracket || text.starts_with('[') {
        relabel_bracket(out, text, label.map)
    } else {
        relabel_organic(out, text, label.hydrogens, label.map);
        Ok(())
    }
}

// organic_symbol ::= 'B' | 'C' | 'N' | 'O' | 'P' | 'S' | 'F' | 'Cl' | 'Br' | 'I'
//                  | 'b' | 'c' | 'n' | 'o' | 'p' | 's' | '*'
fn relabel_organic(out: &mut String, symbol: &str, hydrogens: u8, map: u32) {
    out.push('[');
    out.push_str(symbol);
    match hydrogens {
        0 => {}
        1 => out.push('H'),
        n => {
            out.push('H');
            push_number(out, n as u32);
        }
    }
    out.push(':');
    push_number(out, map);
    out.push(']');
}

// bracket_atom ::= '[' isotope? symbol chiral? hcount? charge? class? ']'
// class ::= ':' NUMBER
fn relabel_bracket(out: &mut String, text: &str, map: u32) -> Result<(), MapError> {
    let inner = text
        .strip_prefix('[')
        .and_then(|t| t.strip_suffix(']'))
        .ok_or_else(|| MapError {
            message: format!("bracket atom text {text:?} is not enclosed in brackets"),
        })?;
    // Drop an existing class (':' followed by digits at the end).
    let body = match inner.rfind(':') {
        Some(i) if inner[i + 1..].chars().all(|c| c.is_ascii_digit()) => &inner[..i],
        _ => inner,
    };
    out.push('[');
    out.push_str(body);
    out.push(':');
    push_number(out, map);
    out.push(']');
    Ok(())
}

/// Append a number in decimal.
fn push_number(out: &mut String, n: u32) {
    let mut digits = [0u8; 10];
    let mut i = digits.len();
    let mut n = n;
    loop {
        i -= 1;
        digits[i] = b'0' + (n % 10) as u8;
        n /= 10;
        if n == 0 {
            break;
        }
    }
    for &d in &digits[i..] {
        out.push(d as char);
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn label(span: Range<usize>, bracket: bool, h: u8, map: u32) -> Label {
        Label {
            span,
            bracket,
            hydrogens: h,
            map,
        }
    }

    #[test]
    fn atom_mapped_smiles_given_organic_atoms() {
        // acetone, both methyls one site: CC(C)=O -> [CH3:1]C([CH3:1])=O
        let s = atom_mapped_smiles(
            "CC(C)=O",
            &[label(0..1, false, 3, 1), label(3..4, false, 3, 1)],
        )
        .unwrap();
        assert_eq!(s, "[CH3:1]C([CH3:1])=O");
    }

    #[test]
    fn atom_mapped_smiles_given_bracket_atoms_and_existing_map() {
        let s = atom_mapped_smiles(
            "O=C[C@@H](C)[CH2:7]O",
            &[label(3..9, true, 1, 2), label(12..19, true, 2, 1)],
        )
        .unwrap();
        assert_eq!(s, "O=C[C@@H:2](C)[CH2:1]O");
    }

    #[test]
    fn atom_mapped_smiles_given_aromatic_and_two_letter_symbols() {
        let s = atom_mapped_smiles("c1ccccc1CCl", &[label(9..11, false, 0, 3)]).unwrap();
        assert_eq!(s, "c1ccccc1C[Cl:3]");
        let s = atom_mapped_smiles("c1ccccc1", &[label(2..3, false, 1, 1)]).unwrap();
        assert_eq!(s, "c1[cH:1]cccc1");
    }

    #[test]
    fn atom_mapped_smiles_given_non_ascii_text_and_large_numbers() {
        // Spans count characters, not bytes (the record's `position` rule).
        let s = atom_mapped_smiles("[Na+].\u{b5}CC(=O)C", &[label(7..8, false, 3, 1234567890)])
            .unwrap();
        assert_eq!(s, "[Na+].\u{b5}[CH3:1234567890]C(=O)C");
        let s = atom_mapped_smiles("\u{b5}\u{b5}C", &[label(2..3, false, 4, 10)]).unwrap();
        assert_eq!(s, "\u{b5}\u{b5}[CH4:10]");
        assert!(atom_mapped_smiles("\u{b5}C", &[label(1..3, false, 3, 1)]).is_err());
    }

    #[test]
    fn atom_mapped_smiles_given_span_outside_input() {
        assert!(atom_mapped_smiles("CC", &[label(1..5, false, 3, 1)]).is_err());
        assert!(
            atom_mapped_smiles("CC", &[label(0..1, false, 3, 1), label(0..1, false, 3, 2)])
                .is_err()
        );
    }
}
