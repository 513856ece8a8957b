//! Molfiles (MDL connection tables, V2000 and V3000) to a [`Molecule`].
//!
//! ```
//! use acidsite::mol::molfile;
//! let text = "acetone\n\n\n  4  3  0  0  0  0  0  0  0  0999 V2000\n\
//!     0.0 0.0 0.0 C   0  0\n    0.0 0.0 0.0 C   0  0\n\
//!     0.0 0.0 0.0 O   0  0\n    0.0 0.0 0.0 C   0  0\n\
//!   1  2  1  0\n  2  3  2  0\n  2  4  1  0\nM  END\n";
//! let read = molfile::read(text).unwrap();
//! assert_eq!(read.molecule.formula(), "C3H6O");
//! assert_eq!(read.title, "acetone");
//! // A SMILES of the same molecule; atom spans point into it.
//! assert_eq!(read.smiles, "CC(=O)C");
//! ```
//!
//! What is read: atoms (element, charge from the atom block or `M  CHG`,
//! isotope from `M  ISO` or V3000 `MASS=`, radicals from the atom block,
//! `M  RAD` or `RAD=`, the valence field `vvv` / `VAL=`), bonds of type 1,
//! 2, 3 and 4 (aromatic). As the CTfile format specifies, the first `M  CHG`
//! or `M  RAD` line replaces the charges and radicals of the atom block.
//! Coordinates are checked to be numbers and then ignored (the drawing makes
//! its own layout); stereo marks and other property lines are ignored.
//! Query features (atom lists, `A`/`Q`/`L` atoms, bond types 5 to 8) and
//! dative or hydrogen bonds (types 9, 10) are refused as unsupported.
//!
//! Hydrogens follow RDKit's reading of molfiles: an atom without a valence
//! field gets the hydrogens its element's default valence leaves (charged
//! atoms by the isoelectronic rule, as for SMILES), an aromatic atom keeps
//! one valence unit for its pi bond; an atom with a valence field gets
//! exactly the hydrogens that make up that valence; a radical atom gets the
//! default valence less its bonds and unpaired electrons. Hydrogen atoms
//! written as atoms are folded into their neighbour exactly as `[H]` in a
//! SMILES, and take no index.
//!
//! The molecule then goes through the same perception as a SMILES
//! (kekulization, valence check, rings, aromaticity from scratch,
//! components). Atom indices are the molfile's atom order, 0-based, with
//! folded hydrogen atoms left out (so they equal the molfile's numbering
//! minus one whenever the hydrogen atoms come after the heavy atoms, as
//! common writers put them).
//!
//! The report layer works on SMILES text (atom spans for the atom-mapped
//! SMILES, component texts), so [`read`] also writes a SMILES of the
//! molecule (Kekulé form, atoms in depth-first order) and reads it back:
//! every [`Atom::span`](super::Atom::span) of the returned molecule points
//! into [`MolfileRead::smiles`], while atom indices stay in molfile order.
//! Deuterium and tritium stay counted in
//! [`Atom::heavy_hydrogens`](super::Atom::heavy_hydrogens) but are written
//! as plain hydrogens in that SMILES.

use super::read::{Raw, RawAtom, RawBond, RawOrder};
use super::{atomic_number, elements, ErrorKind, MolError, Molecule, MAX_ATOMS};
use std::fmt;

/// What went wrong while reading a molfile.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
#[non_exhaustive]
pub enum MolfileErrorKind {
    /// Not a connection table: missing lines, counts that do not match,
    /// fields that are not numbers, bonds to atoms that do not exist.
    Format,
    /// A valid connection table with features this reader does not handle
    /// (query atoms and bonds, dative bonds).
    Unsupported,
    /// More atoms than [`MAX_ATOMS`].
    TooLarge,
    /// The connection table was read but the molecule is not valid
    /// (valence, aromaticity); the kind is the molecule core's.
    Molecule(ErrorKind),
}

impl MolfileErrorKind {
    /// Stable lower-case name used in JSON output.
    pub fn name(self) -> &'static str {
        match self {
            MolfileErrorKind::Format => "molfile",
            MolfileErrorKind::Unsupported => "unsupported",
            MolfileErrorKind::TooLarge => "too_large",
            MolfileErrorKind::Molecule(k) => k.name(),
        }
    }
}

/// A molfile error with the 1-based line of the molfile text where it was
/// found and the 0-based atom it concerns, when known.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct MolfileError {
    /// What kind of problem.
    pub kind: MolfileErrorKind,
    /// What is wrong, in words.
    pub message: String,
    /// 1-based line in the molfile text.
    pub line: Option<usize>,
    /// 0-based atom index in molfile order.
    pub atom: Option<usize>,
}

impl MolfileError {
    fn format(line: usize, message: impl Into<String>) -> Self {
        MolfileError {
            kind: MolfileErrorKind::Format,
            message: message.into(),
            line: Some(line),
            atom: None,
        }
    }

    fn unsupported(line: usize, message: impl Into<String>) -> Self {
        MolfileError {
            kind: MolfileErrorKind::Unsupported,
            message: message.into(),
            line: Some(line),
            atom: None,
        }
    }

    /// The same error with its line moved down by `offset` lines (for a
    /// molfile inside an SD file).
    pub fn shifted(mut self, offset: usize) -> Self {
        self.line = self.line.map(|l| l + offset);
        self
    }
}

impl fmt::Display for MolfileError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        if let Some(l) = self.line {
            write!(f, "line {l}: ")?;
        }
        if let Some(a) = self.atom {
            write!(f, "atom {} of the atom block (index {a}): ", a + 1)?;
        }
        write!(f, "{}", self.message)
    }
}

impl std::error::Error for MolfileError {}

/// A molfile read into a molecule.
#[derive(Debug, Clone)]
pub struct MolfileRead {
    /// The molecule; atom indices in molfile order (folded hydrogens left
    /// out), atom spans into [`MolfileRead::smiles`].
    pub molecule: Molecule,
    /// A SMILES of the molecule, written by this reader.
    pub smiles: String,
    /// The title (first) line, trimmed.
    pub title: String,
}

/// Read one molfile (V2000 or V3000). The text may carry an SD record's
/// data block after `M  END`; it is ignored. Never panics.
pub fn read(text: &str) -> Result<MolfileRead, MolfileError> {
    let lines: Vec<&str> = text
        .split('\n')
        .map(|l| l.strip_suffix('\r').unwrap_or(l))
        .collect();
    let title = lines.first().map_or("", |l| l.trim()).to_string();
    if lines.len() < 4 || lines[3].trim().is_empty() && lines.len() == 4 {
        return Err(MolfileError::format(
            lines.len().min(4),
            "the molfile ends before its counts line (line 4)",
        ));
    }
    let counts = lines[3];
    let table = if counts.contains("V3000") {
        read_v3000(&lines)?
    } else {
        read_v2000(&lines)?
    };
    let molecule_of = finish(table)?;
    Ok(MolfileRead {
        molecule: molecule_of.0,
        smiles: molecule_of.1,
        title,
    })
}

/// One atom as read, before hydrogens are decided.
#[derive(Debug, Clone)]
struct TableAtom {
    element: u8,
    isotope: Option<u16>,
    charge: i8,
    /// Unpaired electrons (M  RAD 2 = 1; 1 and 3 = 2).
    radical: u8,
    /// Valence field: None (default), Some(0) (code 15), Some(v).
    valence: Option<u8>,
    line: usize,
}

struct Table {
    atoms: Vec<TableAtom>,
    /// (a, b, order, line), 0-based atoms.
    bonds: Vec<(usize, usize, RawOrder, usize)>,
}

/// Fixed-column field (characters `from..to`, trimmed), or None when the
/// line is too short.
fn col(line: &str, from: usize, to: usize) -> Option<&str> {
    if !line.is_ascii() || line.len() <= from {
        return None;
    }
    Some(line[from..to.min(line.len())].trim())
}

fn int_field(line: &str, from: usize, to: usize) -> Option<i64> {
    match col(line, from, to) {
        None => Some(0),
        Some("") => Some(0),
        Some(s) => s.parse().ok(),
    }
}

fn element_of(symbol: &str, line: usize) -> Result<(u8, Option<u16>), MolfileError> {
    match symbol {
        "D" => return Ok((1, Some(2))),
        "T" => return Ok((1, Some(3))),
        "*" | "R#" | "R" => return Ok((0, None)),
        "A" | "Q" | "L" | "LP" | "AH" | "QH" | "X" | "XH" | "M" | "MH" => {
            return Err(MolfileError::unsupported(
                line,
                format!("query atom '{symbol}' is not supported"),
            ))
        }
        _ => {}
    }
    match atomic_number(symbol) {
        Some(z) if z > 0 => Ok((z, None)),
        _ => Err(MolfileError::format(
            line,
            format!("'{symbol}' is not an element symbol"),
        )),
    }
}

fn bond_order(code: i64, line: usize) -> Result<RawOrder, MolfileError> {
    Ok(match code {
        1 => RawOrder::Single,
        2 => RawOrder::Double,
        3 => RawOrder::Triple,
        4 => RawOrder::Aromatic,
        5..=8 => {
            return Err(MolfileError::unsupported(
                line,
                format!("query bond type {code} is not supported"),
            ))
        }
        9 | 10 => {
            return Err(MolfileError::unsupported(
                line,
                format!(
                    "bond type {code} ({}) is not supported",
                    if code == 9 { "dative" } else { "hydrogen bond" }
                ),
            ))
        }
        _ => {
            return Err(MolfileError::format(
                line,
                format!("bond type {code} is not a molfile bond type"),
            ))
        }
    })
}

fn radical_electrons(code: i64, line: usize) -> Result<u8, MolfileError> {
    match code {
        0 => Ok(0),
        2 => Ok(1),
        1 | 3 => Ok(2),
        _ => Err(MolfileError::format(
            line,
            format!("radical value {code} is not 0 to 3"),
        )),
    }
}

fn check_count(n: i64, what: &str, line: usize) -> Result<usize, MolfileError> {
    if n < 0 {
        return Err(MolfileError::format(
            line,
            format!("negative {what} count {n}"),
        ));
    }
    if n as u64 > MAX_ATOMS as u64 * 4 || (what == "atom" && n as usize > MAX_ATOMS) {
        return Err(MolfileError {
            kind: MolfileErrorKind::TooLarge,
            message: format!("{n} {what}s is more than this reader takes ({MAX_ATOMS} atoms)"),
            line: Some(line),
            atom: None,
        });
    }
    Ok(n as usize)
}

fn read_v2000(lines: &[&str]) -> Result<Table, MolfileError> {
    let counts = lines[3];
    let ws: Vec<&str> = counts.split_whitespace().collect();
    let na = int_field(counts, 0, 3)
        .or_else(|| ws.first().and_then(|s| s.parse().ok()))
        .ok_or_else(|| {
            MolfileError::format(4, "the counts line does not start with the atom count")
        })?;
    let nb = int_field(counts, 3, 6)
        .or_else(|| ws.get(1).and_then(|s| s.parse().ok()))
        .ok_or_else(|| MolfileError::format(4, "the counts line has no bond count"))?;
    let na = check_count(na, "atom", 4)?;
    let nb = check_count(nb, "bond", 4)?;
    let mut atoms = Vec::with_capacity(na);
    for i in 0..na {
        let ln = 5 + i;
        let Some(line) = lines.get(4 + i) else {
            return Err(MolfileError::format(
                lines.len(),
                format!("the molfile ends in the atom block: {na} atoms announced, {i} found"),
            ));
        };
        let f: Vec<&str> = line.split_whitespace().collect();
        let fixed = line.is_ascii() && line.len() >= 34;
        let (coords, symbol) = if fixed {
            (
                [col(line, 0, 10), col(line, 10, 20), col(line, 20, 30)],
                col(line, 31, 34).unwrap_or(""),
            )
        } else {
            (
                [f.first().copied(), f.get(1).copied(), f.get(2).copied()],
                f.get(3).copied().unwrap_or(""),
            )
        };
        for c in coords {
            if c.and_then(|c| c.parse::<f64>().ok()).is_none() {
                return Err(MolfileError::format(
                    ln,
                    format!("atom line {} does not start with three coordinates", i + 1),
                ));
            }
        }
        if symbol.is_empty() {
            return Err(MolfileError::format(
                ln,
                format!("atom line {} has no element symbol", i + 1),
            ));
        }
        let (element, isotope) = element_of(symbol, ln)?;
        let num = |from: usize, k: usize| -> Result<i64, MolfileError> {
            let v = if fixed {
                int_field(line, from, from + 3)
            } else {
                Some(f.get(k).and_then(|s| s.parse().ok()).unwrap_or(0))
            };
            v.ok_or_else(|| {
                MolfileError::format(
                    ln,
                    format!("atom line {} has a field that is not a number", i + 1),
                )
            })
        };
        let code = num(36, 5)?;
        let (charge, radical) = match code {
            0 => (0, 0),
            1..=3 => (4 - code as i8, 0),
            4 => (0, 1),
            5..=7 => (4 - code as i8, 0),
            _ => {
                return Err(MolfileError::format(
                    ln,
                    format!("charge code {code} is not 0 to 7"),
                ))
            }
        };
        let valence = match num(48, 9)? {
            0 => None,
            15 => Some(0),
            v @ 1..=14 => Some(v as u8),
            v => {
                return Err(MolfileError::format(
                    ln,
                    format!("valence field {v} is not 0 to 15"),
                ))
            }
        };
        atoms.push(TableAtom {
            element,
            isotope,
            charge,
            radical,
            valence,
            line: ln,
        });
    }
    let mut bonds = Vec::with_capacity(nb);
    for k in 0..nb {
        let ln = 5 + na + k;
        let Some(line) = lines.get(4 + na + k) else {
            return Err(MolfileError::format(
                lines.len(),
                format!("the molfile ends in the bond block: {nb} bonds announced, {k} found"),
            ));
        };
        let f: Vec<&str> = line.split_whitespace().collect();
        let fixed = line.is_ascii() && line.len() >= 9;
        let get = |from: usize, j: usize| -> Option<i64> {
            if fixed {
                col(line, from, from + 3).and_then(|s| s.parse().ok())
            } else {
                f.get(j).and_then(|s| s.parse().ok())
            }
        };
        let (Some(a), Some(b), Some(t)) = (get(0, 0), get(3, 1), get(6, 2)) else {
            return Err(MolfileError::format(
                ln,
                format!(
                    "bond line {} does not hold two atom numbers and a type",
                    k + 1
                ),
            ));
        };
        bonds.push(checked_bond(a, b, t, na, ln)?);
    }
    let mut table = Table { atoms, bonds };
    // Property block.
    let mut charges_reset = false;
    let mut radicals_reset = false;
    let mut ended = false;
    for (j, line) in lines.iter().enumerate().skip(4 + na + nb) {
        let ln = j + 1;
        if line.starts_with("M  END") {
            ended = true;
            break;
        }
        if line.starts_with("$$$$") || line.starts_with("> ") {
            break;
        }
        let tag = line.get(..6).unwrap_or("");
        if !matches!(tag, "M  CHG" | "M  ISO" | "M  RAD") {
            continue;
        }
        let values: Vec<i64> = line[6..]
            .split_whitespace()
            .map(|s| s.parse::<i64>())
            .collect::<Result<_, _>>()
            .map_err(|_| {
                MolfileError::format(ln, format!("{tag} line has a field that is not a number"))
            })?;
        let n = values.first().copied().unwrap_or(0);
        if n < 0 || values.len() < 1 + 2 * n as usize {
            return Err(MolfileError::format(
                ln,
                format!("{tag} line announces {n} entries but holds fewer"),
            ));
        }
        if tag == "M  CHG" && !charges_reset {
            charges_reset = true;
            table.atoms.iter_mut().for_each(|a| a.charge = 0);
        }
        if tag == "M  RAD" && !radicals_reset {
            radicals_reset = true;
            table.atoms.iter_mut().for_each(|a| a.radical = 0);
        }
        for pair in values[1..1 + 2 * n as usize].chunks(2) {
            let (a, v) = (pair[0], pair[1]);
            let Some(atom) = (a >= 1)
                .then(|| table.atoms.get_mut(a as usize - 1))
                .flatten()
            else {
                return Err(MolfileError::format(
                    ln,
                    format!("{tag} names atom {a}, but there are {na} atoms"),
                ));
            };
            match tag {
                "M  CHG" => {
                    if !(-15..=15).contains(&v) {
                        return Err(MolfileError::format(
                            ln,
                            format!("charge {v} is out of range"),
                        ));
                    }
                    atom.charge = v as i8;
                }
                "M  ISO" => {
                    if !(1..=999).contains(&v) {
                        return Err(MolfileError::format(
                            ln,
                            format!("mass number {v} is out of range"),
                        ));
                    }
                    atom.isotope = Some(v as u16);
                }
                _ => atom.radical = radical_electrons(v, ln)?,
            }
        }
    }
    if !ended {
        return Err(MolfileError::format(
            lines.len(),
            "the molfile has no 'M  END' line",
        ));
    }
    Ok(table)
}

fn checked_bond(
    a: i64,
    b: i64,
    t: i64,
    na: usize,
    ln: usize,
) -> Result<(usize, usize, RawOrder, usize), MolfileError> {
    for x in [a, b] {
        if x < 1 || x as usize > na {
            return Err(MolfileError::format(
                ln,
                format!("bond to atom {x}, but there are {na} atoms"),
            ));
        }
    }
    if a == b {
        return Err(MolfileError::format(
            ln,
            format!("bond from atom {a} to itself"),
        ));
    }
    Ok((a as usize - 1, b as usize - 1, bond_order(t, ln)?, ln))
}

/// V3000: logical lines (continuations joined), each with its first
/// physical line number.
fn read_v3000(lines: &[&str]) -> Result<Table, MolfileError> {
    let mut logical: Vec<(usize, String)> = Vec::new();
    let mut pending: Option<(usize, String)> = None;
    let mut ended = false;
    for (j, line) in lines.iter().enumerate().skip(4) {
        let ln = j + 1;
        if line.starts_with("M  END") {
            ended = true;
            break;
        }
        let Some(body) = line.strip_prefix("M  V30 ") else {
            if pending.is_some() {
                return Err(MolfileError::format(
                    ln,
                    "a V3000 line ending in '-' is not continued",
                ));
            }
            continue;
        };
        let (start, mut text) = pending.take().unwrap_or((ln, String::new()));
        let body = body.trim_end();
        if let Some(cont) = body.strip_suffix('-') {
            text.push_str(cont);
            pending = Some((start, text));
        } else {
            text.push_str(body);
            logical.push((start, text));
        }
    }
    if !ended {
        return Err(MolfileError::format(
            lines.len(),
            "the molfile has no 'M  END' line",
        ));
    }
    let mut na = None;
    let mut atoms: Vec<TableAtom> = Vec::new();
    let mut ids: std::collections::HashMap<i64, usize> = std::collections::HashMap::new();
    let mut bonds = Vec::new();
    let mut block = "";
    for (ln, text) in &logical {
        let ln = *ln;
        let words = split_v3000(text);
        let first = words.first().map(String::as_str).unwrap_or("");
        match first {
            "COUNTS" => {
                let get = |k: usize| words.get(k).and_then(|s| s.parse::<i64>().ok());
                let (Some(a), Some(_)) = (get(1), get(2)) else {
                    return Err(MolfileError::format(
                        ln,
                        "the COUNTS line does not hold the atom and bond counts",
                    ));
                };
                na = Some(check_count(a, "atom", ln)?);
                continue;
            }
            "BEGIN" => {
                block = match words.get(1).map(String::as_str) {
                    Some("ATOM") => "atom",
                    Some("BOND") => "bond",
                    Some("CTAB") => "",
                    _ => "other",
                };
                continue;
            }
            "END" => {
                block = "";
                continue;
            }
            _ => {}
        }
        match block {
            "atom" => {
                let Some(id) = words.first().and_then(|s| s.parse::<i64>().ok()) else {
                    return Err(MolfileError::format(
                        ln,
                        "atom line does not start with an atom number",
                    ));
                };
                let symbol = words.get(1).map(String::as_str).unwrap_or("");
                if symbol.starts_with('[') || symbol.starts_with("NOT") {
                    return Err(MolfileError::unsupported(
                        ln,
                        "atom lists are not supported",
                    ));
                }
                if symbol.is_empty() {
                    return Err(MolfileError::format(ln, "atom line has no element symbol"));
                }
                for k in 2..5 {
                    if words.get(k).and_then(|s| s.parse::<f64>().ok()).is_none() {
                        return Err(MolfileError::format(
                            ln,
                            "atom line does not hold three coordinates after the symbol",
                        ));
                    }
                }
                let (element, mut isotope) = element_of(symbol, ln)?;
                let mut atom = TableAtom {
                    element,
                    isotope: None,
                    charge: 0,
                    radical: 0,
                    valence: None,
                    line: ln,
                };
                for w in words.iter().skip(6) {
                    let Some((key, value)) = w.split_once('=') else {
                        continue;
                    };
                    let bad = || MolfileError::format(ln, format!("{key}={value} is not a number"));
                    match key {
                        "CHG" => {
                            let v: i64 = value.parse().map_err(|_| bad())?;
                            if !(-15..=15).contains(&v) {
                                return Err(MolfileError::format(
                                    ln,
                                    format!("charge {v} is out of range"),
                                ));
                            }
                            atom.charge = v as i8;
                        }
                        "MASS" => {
                            let v: i64 = value.parse().map_err(|_| bad())?;
                            if !(1..=999).contains(&v) {
                                return Err(MolfileError::format(
                                    ln,
                                    format!("mass number {v} is out of range"),
                                ));
                            }
                            isotope = Some(v as u16);
                        }
                        "RAD" => {
                            atom.radical = radical_electrons(value.parse().map_err(|_| bad())?, ln)?
                        }
                        "VAL" => {
                            let v: i64 = value.parse().map_err(|_| bad())?;
                            atom.valence = match v {
                                0 => None,
                                -1 => Some(0),
                                1..=14 => Some(v as u8),
                                _ => {
                                    return Err(MolfileError::format(
                                        ln,
                                        format!("valence {v} is out of range"),
                                    ))
                                }
                            };
                        }
                        _ => {}
                    }
                }
                atom.isotope = isotope;
                if ids.insert(id, atoms.len()).is_some() {
                    return Err(MolfileError::format(
                        ln,
                        format!("atom number {id} is used twice"),
                    ));
                }
                if atoms.len() >= MAX_ATOMS {
                    return Err(MolfileError {
                        kind: MolfileErrorKind::TooLarge,
                        message: format!("more than {MAX_ATOMS} atoms"),
                        line: Some(ln),
                        atom: None,
                    });
                }
                atoms.push(atom);
            }
            "bond" => {
                let get = |k: usize| words.get(k).and_then(|s| s.parse::<i64>().ok());
                let (Some(_), Some(t), Some(a), Some(b)) = (get(0), get(1), get(2), get(3)) else {
                    return Err(MolfileError::format(
                        ln,
                        "bond line does not hold a number, a type and two atoms",
                    ));
                };
                let (Some(&x), Some(&y)) = (ids.get(&a), ids.get(&b)) else {
                    let missing = if ids.contains_key(&a) { b } else { a };
                    return Err(MolfileError::format(
                        ln,
                        format!("bond to atom {missing}, which the atom block does not define"),
                    ));
                };
                if x == y {
                    return Err(MolfileError::format(
                        ln,
                        format!("bond from atom {a} to itself"),
                    ));
                }
                bonds.push((x, y, bond_order(t, ln)?, ln));
            }
            _ => {}
        }
    }
    let Some(na) = na else {
        return Err(MolfileError::format(
            4,
            "the V3000 connection table has no COUNTS line",
        ));
    };
    if na != atoms.len() {
        return Err(MolfileError::format(
            4,
            format!(
                "COUNTS announces {na} atoms, the atom block holds {}",
                atoms.len()
            ),
        ));
    }
    Ok(Table { atoms, bonds })
}

/// Split a V3000 line into words; double-quoted words keep their spaces,
/// and parenthesised lists stay one word.
fn split_v3000(text: &str) -> Vec<String> {
    let mut out = Vec::new();
    let mut cur = String::new();
    let mut quote = false;
    let mut depth = 0i32;
    for c in text.chars() {
        match c {
            '"' => {
                quote = !quote;
                cur.push(c);
            }
            '(' if !quote => {
                depth += 1;
                cur.push(c);
            }
            ')' if !quote => {
                depth -= 1;
                cur.push(c);
            }
            c if c.is_whitespace() && !quote && depth <= 0 => {
                if !cur.is_empty() {
                    out.push(std::mem::take(&mut cur));
                }
            }
            c => cur.push(c),
        }
    }
    if !cur.is_empty() {
        out.push(cur);
    }
    out
}

/// Decide hydrogens, build the molecule through the core's perception, and
/// write its SMILES.
fn finish(table: Table) -> Result<(Molecule, String), MolfileError> {
    let n = table.atoms.len();
    let mut seen = std::collections::HashSet::with_capacity(table.bonds.len());
    let mut aromatic = vec![false; n];
    let mut bond_units = vec![0u32; n]; // twice the bond order sum (aromatic 1.5)
    for &(a, b, o, ln) in &table.bonds {
        if !seen.insert((a.min(b), a.max(b))) {
            return Err(MolfileError::format(
                ln,
                format!("a second bond between atoms {} and {}", a + 1, b + 1),
            ));
        }
        let u = match o {
            RawOrder::Aromatic => 3,
            RawOrder::Double => 4,
            RawOrder::Triple => 6,
            _ => 2,
        };
        bond_units[a] += u;
        bond_units[b] += u;
        if o == RawOrder::Aromatic {
            aromatic[a] = true;
            aromatic[b] = true;
        }
    }
    let atoms: Vec<RawAtom> = table
        .atoms
        .iter()
        .enumerate()
        .map(|(i, a)| {
            // Hydrogen atoms and atoms with a valence field or unpaired
            // electrons take exactly the hydrogens stated; the others get
            // implicit hydrogens in the core, as organic-subset atoms do.
            let bonds = bond_units[i] / 2;
            let hcount = if a.element == 1 {
                Some(0)
            } else if let Some(v) = a.valence {
                Some((v as u32).saturating_sub(bonds) as u8)
            } else if a.radical > 0 {
                let targets = elements::charged_valences(a.element, a.charge);
                let need = bonds + a.radical as u32;
                let t = targets
                    .iter()
                    .map(|&t| t as u32)
                    .find(|&t| t >= need)
                    .unwrap_or(need);
                Some((t - need) as u8)
            } else {
                None
            };
            RawAtom {
                element: a.element,
                aromatic: aromatic[i],
                charge: a.charge,
                isotope: a.isotope,
                hcount,
                map: None,
                bracket: hcount.is_some(),
            }
        })
        .collect();
    let raw = Raw {
        atoms,
        bonds: table
            .bonds
            .iter()
            .map(|&(a, b, order, _)| RawBond {
                a: a as u32,
                b: b as u32,
                order,
                join: None,
            })
            .collect(),
        spans: (0..n).map(|i| i..i + 1).collect(),
    };
    let lines: Vec<usize> = table.atoms.iter().map(|a| a.line).collect();
    // Atom index after folding hydrogens, for error messages.
    let molecule = super::build("", raw).map_err(|e| molecule_error(e, &lines))?;
    let (smiles, order) = super::smiles_out::write(&molecule);
    let final_mol = reread(&smiles, &order, &molecule).ok_or_else(|| MolfileError {
        kind: MolfileErrorKind::Unsupported,
        message: "the molecule could not be written as SMILES for the report (please report this)"
            .into(),
        line: None,
        atom: None,
    })?;
    Ok((final_mol, smiles))
}

fn molecule_error(e: MolError, lines: &[usize]) -> MolfileError {
    // Positions are raw atom indices (spans i..i+1).
    let raw = e.position;
    let message = e.message.replace("this '", "this atom '");
    MolfileError {
        kind: MolfileErrorKind::Molecule(e.kind),
        message,
        line: raw.and_then(|p| lines.get(p).copied()),
        atom: raw,
    }
}

/// Read the written SMILES back, put its atoms in molfile order and check
/// that it is the same molecule.
fn reread(smiles: &str, order: &[usize], original: &Molecule) -> Option<Molecule> {
    let raw = super::read::read_raw(smiles).ok()?;
    let n = raw.atoms.len();
    if n != order.len() || n != original.atoms.len() {
        return None;
    }
    // written position k holds original atom order[k].
    let mut atoms: Vec<Option<RawAtom>> = vec![None; n];
    let mut spans = vec![0..0; n];
    for (k, (a, s)) in raw.atoms.into_iter().zip(raw.spans).enumerate() {
        let i = *order.get(k)?;
        atoms[i] = Some(a);
        spans[i] = s;
    }
    let atoms: Vec<RawAtom> = atoms.into_iter().collect::<Option<_>>()?;
    let bonds = raw
        .bonds
        .into_iter()
        .map(|b| RawBond {
            a: order[b.a as usize] as u32,
            b: order[b.b as usize] as u32,
            order: b.order,
            join: b.join,
        })
        .collect();
    let mut mol = super::build(
        smiles,
        Raw {
            atoms,
            bonds,
            spans,
        },
    )
    .ok()?;
    for (a, o) in mol.atoms.iter_mut().zip(&original.atoms) {
        if a.element != o.element
            || a.charge != o.charge
            || a.hydrogens != o.hydrogens
            || a.aromatic != o.aromatic
            || a.isotope != o.isotope
        {
            return None;
        }
        a.heavy_hydrogens = o.heavy_hydrogens;
    }
    if mol.bonds.len() != original.bonds.len() {
        return None;
    }
    Some(mol)
}
