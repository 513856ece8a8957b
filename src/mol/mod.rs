//! Molecule core: SMILES text to a validated molecular graph with hydrogens,
//! rings, aromaticity and components. No I/O.
//!
//! # Reading
//! [`Molecule::from_smiles`] lets `purr` check the syntax and walk the
//! string, collecting atoms and bonds with a follower of our own (purr's
//! own graph builder is not used: it panics on some stereo tags and costs an
//! extra pass). Atom indices are the order atoms are written, 0-based.
//! Hydrogens written as atoms (`[H]`, `[2H]`, `[3H]`) that are neutral,
//! carry no hydrogen count of their own and have exactly one single bond to
//! a non-hydrogen atom are folded into that atom's hydrogen count (their
//! atom-map numbers are dropped); deuterium and tritium are also counted in
//! [`Atom::heavy_hydrogens`]. Folded hydrogens take no index; every other
//! atom keeps its written order. Other hydrogens (`[H][H]`, `[H+]`, bridging
//! hydrogens) stay atoms.
//!
//! Implicit hydrogens follow the OpenSMILES valence rules for the organic
//! subset (B 3; C 4; N 3, 5; O 2; P 3, 5; S 2, 4, 6; halogens 1). An
//! aromatic (lower-case) organic atom needs one valence unit for its pi
//! bond when its normal valence leaves room for it, so `c1ccccc1` has six
//! hydrogens and `c1cc[nH]c1` keeps the written one on nitrogen.
//!
//! Stereo marks (`@`, `@@`, `@TB..`, `/`, `\`) are read and ignored.
//!
//! # Limits
//! Inputs over [`MAX_CHARS`] characters or [`MAX_ATOMS`] atoms give
//! [`ErrorKind::TooLarge`].

mod elements;
mod error;
mod read;

pub use elements::{atomic_number, symbol};
pub use error::{ErrorKind, MolError};
pub use read::{MAX_ATOMS, MAX_CHARS};

use read::RawOrder;
use std::ops::Range;

/// Bond order as read or perceived.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
pub enum BondOrder {
    Single,
    Double,
    Triple,
    Quadruple,
    Aromatic,
}

impl BondOrder {
    /// Order as an integer (aromatic counts 1; see [`Bond::kekule`]).
    pub fn as_u8(self) -> u8 {
        match self {
            BondOrder::Single | BondOrder::Aromatic => 1,
            BondOrder::Double => 2,
            BondOrder::Triple => 3,
            BondOrder::Quadruple => 4,
        }
    }
}

/// One heavy (or non-merged hydrogen) atom.
#[derive(Debug, Clone, PartialEq)]
pub struct Atom {
    /// Atomic number; 0 for `*`.
    pub element: u8,
    /// Aromatic after perception (Kekulé input is perceived too).
    pub aromatic: bool,
    pub charge: i8,
    /// Mass number if given (`[13C]`), else None.
    pub isotope: Option<u16>,
    /// Total hydrogens on this atom: implicit + bracket count + merged
    /// explicit `[H]`/`[2H]`/`[3H]` neighbours.
    pub hydrogens: u8,
    /// How many of `hydrogens` are deuterium or tritium.
    pub heavy_hydrogens: u8,
    /// Atom-map number (`[CH3:4]`), if any.
    pub map: Option<u16>,
    /// Written as a bracket atom.
    pub bracket: bool,
    /// Character range of this atom's text in the input SMILES
    /// (character indices, not bytes).
    pub span: Range<usize>,
}

impl Atom {
    /// Element symbol (`*` for the wildcard).
    pub fn symbol(&self) -> &'static str {
        symbol(self.element)
    }
}

/// One bond between two atoms (indices into `Molecule::atoms`).
#[derive(Debug, Clone, PartialEq)]
pub struct Bond {
    pub atoms: [usize; 2],
    /// Order after aromaticity perception (aromatic bonds are `Aromatic`).
    pub order: BondOrder,
    /// Kekulé order (1, 2, 3) after kekulization; equals the written order
    /// for non-aromatic bonds.
    pub kekule: u8,
}

impl Bond {
    /// The atom at the other end from `atom`.
    pub fn other(&self, atom: usize) -> usize {
        if self.atoms[0] == atom {
            self.atoms[1]
        } else {
            self.atoms[0]
        }
    }
}

/// A neighbour entry in the adjacency list.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct Neighbor {
    pub atom: usize,
    pub bond: usize,
}

/// A validated molecule.
#[derive(Debug, Clone)]
pub struct Molecule {
    pub atoms: Vec<Atom>,
    pub bonds: Vec<Bond>,
    /// Adjacency in compressed rows: neighbours of atom i are
    /// `adjacency[adjacency_start[i]..adjacency_start[i + 1]]`.
    adjacency_start: Vec<u32>,
    adjacency: Vec<Neighbor>,
    /// Hydrogens added by the valence rules (organic-subset atoms only).
    implicit_h: Vec<u8>,
}

impl Molecule {
    /// Read and validate a SMILES string.
    pub fn from_smiles(smiles: &str) -> Result<Molecule, MolError> {
        let raw = read::read_raw(smiles)?;
        build(smiles, raw)
    }

    pub fn atom_count(&self) -> usize {
        self.atoms.len()
    }

    pub fn bond_count(&self) -> usize {
        self.bonds.len()
    }

    /// Neighbours of atom `i` with the connecting bond index (empty for an
    /// index out of range).
    pub fn neighbors(&self, i: usize) -> &[Neighbor] {
        match (self.adjacency_start.get(i), self.adjacency_start.get(i + 1)) {
            (Some(&s), Some(&e)) => &self.adjacency[s as usize..e as usize],
            _ => &[],
        }
    }

    /// Number of explicit connections (bonds to atoms in the graph): SMARTS `D`.
    pub fn degree(&self, i: usize) -> usize {
        self.neighbors(i).len()
    }

    /// Total connections including all hydrogens: SMARTS `X`.
    pub fn total_connections(&self, i: usize) -> usize {
        self.degree(i) + self.atoms.get(i).map_or(0, |a| a.hydrogens as usize)
    }

    /// Hydrogens that were not written (added by the valence rules).
    pub fn implicit_hydrogens(&self, i: usize) -> u8 {
        self.implicit_h.get(i).copied().unwrap_or(0)
    }

    /// Hydrogens that were written: bracket counts and folded `[H]` atoms.
    pub fn explicit_hydrogens(&self, i: usize) -> u8 {
        self.atoms.get(i).map_or(0, |a| {
            a.hydrogens.saturating_sub(self.implicit_hydrogens(i))
        })
    }

    /// Valence as RDKit computes it: the sum of Kekulé bond orders plus all
    /// hydrogens: SMARTS `v`.
    pub fn valence(&self, i: usize) -> u32 {
        let bonds: u32 = self
            .neighbors(i)
            .iter()
            .map(|n| self.bonds[n.bond].kekule as u32)
            .sum();
        bonds + self.atoms.get(i).map_or(0, |a| a.hydrogens as u32)
    }

    /// The bond joining atoms `a` and `b`, if any.
    pub fn bond_between(&self, a: usize, b: usize) -> Option<usize> {
        self.neighbors(a)
            .iter()
            .find(|n| n.atom == b)
            .map(|n| n.bond)
    }

    /// Total hydrogen count of the molecule.
    pub fn total_hydrogens(&self) -> u32 {
        self.atoms
            .iter()
            .map(|a| a.hydrogens as u32 + (a.element == 1) as u32)
            .sum()
    }
}

fn raw_order_value(o: RawOrder) -> u8 {
    match o {
        RawOrder::Elided | RawOrder::Single | RawOrder::Aromatic => 1,
        RawOrder::Double => 2,
        RawOrder::Triple => 3,
        RawOrder::Quadruple => 4,
    }
}

/// Turn the written atoms and bonds into a molecule: fold hydrogens, add
/// implicit hydrogens, build the adjacency.
fn build(smiles: &str, raw: read::Raw) -> Result<Molecule, MolError> {
    let read::Raw {
        atoms: raw_atoms,
        bonds: raw_bonds,
        spans,
    } = raw;
    let n_raw = raw_atoms.len();
    // Degree of every written atom, to find hydrogens to fold.
    let mut raw_degree = vec![0u32; n_raw];
    for b in &raw_bonds {
        raw_degree[b.a] += 1;
        raw_degree[b.b] += 1;
    }
    let foldable = |i: usize| {
        let a = &raw_atoms[i];
        a.element == 1 && a.charge == 0 && a.hcount.unwrap_or(0) == 0 && raw_degree[i] == 1
    };
    // new_index[i] = index after folding, or usize::MAX for a folded H.
    let mut new_index = vec![usize::MAX; n_raw];
    let mut fold = vec![false; n_raw];
    for b in &raw_bonds {
        if !matches!(b.order, RawOrder::Elided | RawOrder::Single) {
            continue;
        }
        for (h, heavy) in [(b.a, b.b), (b.b, b.a)] {
            if foldable(h) && raw_atoms[heavy].element != 1 {
                fold[h] = true;
            }
        }
    }
    let mut atoms = Vec::with_capacity(n_raw);
    for (i, a) in raw_atoms.iter().enumerate() {
        if fold[i] {
            continue;
        }
        new_index[i] = atoms.len();
        atoms.push(Atom {
            element: a.element,
            aromatic: a.aromatic,
            charge: a.charge,
            isotope: a.isotope,
            hydrogens: a.hcount.unwrap_or(0),
            heavy_hydrogens: 0,
            map: a.map,
            bracket: a.bracket,
            span: spans[i].clone(),
        });
    }
    let n = atoms.len();
    let mut bonds: Vec<Bond> = Vec::with_capacity(raw_bonds.len());
    let mut written_aromatic: Vec<bool> = Vec::with_capacity(raw_bonds.len());
    for b in &raw_bonds {
        let (fa, fb) = (fold[b.a], fold[b.b]);
        if fa || fb {
            let (h, heavy) = if fa { (b.a, b.b) } else { (b.b, b.a) };
            let atom = &mut atoms[new_index[heavy]];
            atom.hydrogens = atom.hydrogens.saturating_add(1);
            if matches!(raw_atoms[h].isotope, Some(2) | Some(3)) {
                atom.heavy_hydrogens = atom.heavy_hydrogens.saturating_add(1);
            }
            continue;
        }
        let (x, y) = (new_index[b.a], new_index[b.b]);
        let both_aromatic = raw_atoms[b.a].aromatic && raw_atoms[b.b].aromatic;
        let aromatic = match b.order {
            RawOrder::Aromatic => true,
            RawOrder::Elided => both_aromatic,
            _ => false,
        };
        let order = if aromatic {
            BondOrder::Aromatic
        } else {
            match raw_order_value(b.order) {
                2 => BondOrder::Double,
                3 => BondOrder::Triple,
                4 => BondOrder::Quadruple,
                _ => BondOrder::Single,
            }
        };
        written_aromatic.push(aromatic);
        bonds.push(Bond {
            atoms: [x, y],
            order,
            kekule: raw_order_value(b.order),
        });
    }
    // Compressed adjacency in bond order of appearance.
    let mut adjacency_start = vec![0u32; n + 1];
    for b in &bonds {
        adjacency_start[b.atoms[0] + 1] += 1;
        adjacency_start[b.atoms[1] + 1] += 1;
    }
    for i in 0..n {
        adjacency_start[i + 1] += adjacency_start[i];
    }
    let mut fill: Vec<u32> = adjacency_start[..n].to_vec();
    let mut adjacency = vec![Neighbor { atom: 0, bond: 0 }; bonds.len() * 2];
    for (k, b) in bonds.iter().enumerate() {
        let [x, y] = b.atoms;
        adjacency[fill[x] as usize] = Neighbor { atom: y, bond: k };
        fill[x] += 1;
        adjacency[fill[y] as usize] = Neighbor { atom: x, bond: k };
        fill[y] += 1;
    }
    // Implicit hydrogens by the organic-subset valence rules.
    let mut implicit_h = vec![0u8; n];
    let mut bond_sum = vec![0u32; n];
    for b in &bonds {
        let v = b.kekule as u32;
        bond_sum[b.atoms[0]] += v;
        bond_sum[b.atoms[1]] += v;
    }
    for (i, atom) in atoms.iter_mut().enumerate() {
        if atom.bracket {
            continue;
        }
        let v = bond_sum[i] + atom.hydrogens as u32;
        let targets = elements::normal_valences(atom.element);
        let Some(&t) = targets.iter().find(|&&t| t as u32 >= v) else {
            continue;
        };
        let t = t as u32;
        let h = if atom.aromatic {
            // One valence unit goes to the aromatic pi bond when there is room.
            if t > v {
                t - v - 1
            } else {
                0
            }
        } else {
            t - v
        };
        implicit_h[i] = h as u8;
        atom.hydrogens = atom.hydrogens.saturating_add(h as u8);
    }
    let _ = (smiles, written_aromatic);
    Ok(Molecule {
        atoms,
        bonds,
        adjacency_start,
        adjacency,
        implicit_h,
    })
}

#[cfg(test)]
mod tests;
