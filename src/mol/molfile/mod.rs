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
//! Coordinates are checked to be numbers; the drawing makes its own
//! layout, but in a 2D molfile they define stereo with the wedges (bond
//! stereo 1 / 6, V3000 `CFG=1` / `CFG=3`): tetrahedral centres at the
//! wedges' narrow ends and double-bond E/Z from the coordinates, kept as
//! the SMILES reader keeps them (rules in the `stereo` submodule; checked
//! against 100 RDKit-drawn molfiles in `tests/mol_stereo.rs`). Other
//! property lines are ignored.
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

mod stereo;
mod v2000;
mod v3000;
use v2000::read_v2000;
use v3000::read_v3000;

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
pub(super) struct TableAtom {
    pub(super) element: u8,
    pub(super) isotope: Option<u16>,
    pub(super) charge: i8,
    /// Unpaired electrons (M  RAD 2 = 1; 1 and 3 = 2).
    pub(super) radical: u8,
    /// Valence field: None (default), Some(0) (code 15), Some(v).
    pub(super) valence: Option<u8>,
    pub(super) line: usize,
    /// Coordinates as written.
    pub(super) xyz: [f64; 3],
}

pub(super) struct Table {
    pub(super) atoms: Vec<TableAtom>,
    /// (a, b, order, line), 0-based atoms.
    pub(super) bonds: Vec<(usize, usize, RawOrder, usize)>,
    /// Per bond, its stereo field in V2000 terms: 0 none, 1 wedge (narrow
    /// end at `a`), 6 hashed wedge, 4 either (single), 3 either (double).
    pub(super) stereo: Vec<u8>,
}

pub(super) fn element_of(symbol: &str, line: usize) -> Result<(u8, Option<u16>), MolfileError> {
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

pub(super) fn bond_order(code: i64, line: usize) -> Result<RawOrder, MolfileError> {
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

pub(super) fn radical_electrons(code: i64, line: usize) -> Result<u8, MolfileError> {
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

pub(super) fn check_count(n: i64, what: &str, line: usize) -> Result<usize, MolfileError> {
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
                chiral: 0,
                t: 0,
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
                dir: 0,
                ka: 0,
                kb: 0,
            })
            .collect(),
        spans: (0..n).map(|i| i..i + 1).collect(),
        stereo: false,
    };
    let lines: Vec<usize> = table.atoms.iter().map(|a| a.line).collect();
    // Atom index after folding hydrogens, for error messages.
    let molecule = super::build("", raw).map_err(|e| molecule_error(e, &lines))?;
    let (smiles, order) = super::smiles_out::write(&molecule);
    let mut final_mol = reread(&smiles, &order, &molecule).ok_or_else(|| MolfileError {
        kind: MolfileErrorKind::Unsupported,
        message: "the molecule could not be written as SMILES for the report (please report this)"
            .into(),
        line: None,
        atom: None,
    })?;
    stereo::assign(&table, &mut final_mol);
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
            dir: 0,
            ka: 0,
            kb: 0,
        })
        .collect();
    let mut mol = super::build(
        smiles,
        Raw {
            atoms,
            bonds,
            spans,
            stereo: false,
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
        a.tritium = o.tritium;
    }
    if mol.bonds.len() != original.bonds.len() {
        return None;
    }
    Some(mol)
}
