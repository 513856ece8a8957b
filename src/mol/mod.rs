//! Molecule core: SMILES text to a validated molecular graph with hydrogens,
//! rings, aromaticity and components. No I/O.
//!
//! OWNER: molecule-core work (issue 2). The public items below are the
//! contract the other modules code against; extend freely, but keep these
//! names and meanings.

mod error;
pub use error::{ErrorKind, MolError};

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
    // Representation details are the molecule core's to choose.
}

impl Molecule {
    /// Read and validate a SMILES string.
    pub fn from_smiles(smiles: &str) -> Result<Molecule, MolError> {
        let _ = smiles;
        Err(MolError::new(
            ErrorKind::Unsupported,
            "the molecule core is not built yet",
            None,
            smiles,
        ))
    }

    pub fn atom_count(&self) -> usize {
        self.atoms.len()
    }

    /// Neighbours of atom `i` with the connecting bond index.
    pub fn neighbors(&self, i: usize) -> &[Neighbor] {
        let _ = i;
        &[]
    }
}
