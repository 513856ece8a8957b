//! A molecule prepared for matching: per-atom counts that the SMARTS
//! primitives ask for, ring information, adjacency and element counts for
//! the pre-screens. Built once per molecule and shared by every pattern.

use crate::mol::{BondOrder, Molecule};

/// Per-atom values the primitives test.
#[derive(Debug, Clone, Copy, Default)]
pub(crate) struct AtomInfo {
    pub element: u8,
    pub aromatic: bool,
    pub charge: i8,
    pub isotope: u16,
    /// Total hydrogens (H).
    pub hydrogens: u8,
    /// Explicit connections (D).
    pub degree: u8,
    /// Total valence (v): Kekulé bond orders plus hydrogens.
    pub valence: u8,
    /// Number of SSSR rings containing the atom (R n).
    pub rings: u8,
    /// Smallest SSSR ring containing the atom, 0 if none (r n).
    pub min_ring: u8,
    /// Ring bonds on the atom (x n).
    pub ring_bonds: u8,
}

/// A molecule prepared for matching many patterns. Build it once per
/// molecule with [`Target::new`] and pass it to the `*_in` methods of
/// [`super::Pattern`] when running more than one pattern.
#[derive(Debug, Clone)]
pub struct Target<'m> {
    pub(crate) mol: &'m Molecule,
    pub(crate) atoms: Vec<AtomInfo>,
    /// Adjacency: (neighbour atom, bond index).
    pub(crate) adj: Vec<Vec<(usize, usize)>>,
    pub(crate) bond_order: Vec<BondOrder>,
    pub(crate) bond_ring: Vec<bool>,
    /// Atom count per atomic number (0..=127; larger numbers are clamped).
    pub(crate) element_count: [u16; 128],
    pub(crate) aromatic_count: usize,
    pub(crate) ring_count: usize,
    /// Atoms in input order grouped by atomic number, for anchored scans.
    pub(crate) by_element: Vec<Vec<usize>>,
}

impl<'m> Target<'m> {
    /// Prepare `mol` for matching. Bonds that name atoms out of range are
    /// ignored, so a malformed molecule cannot make matching panic.
    pub fn new(mol: &'m Molecule) -> Target<'m> {
        let n = mol.atoms.len();
        let mut adj: Vec<Vec<(usize, usize)>> = vec![Vec::new(); n];
        let mut atoms: Vec<AtomInfo> = mol
            .atoms
            .iter()
            .map(|a| AtomInfo {
                element: a.element,
                aromatic: a.aromatic,
                charge: a.charge,
                isotope: a.isotope.unwrap_or(0),
                hydrogens: a.hydrogens,
                degree: 0,
                valence: a.hydrogens,
                rings: 0,
                min_ring: 0,
                ring_bonds: 0,
            })
            .collect();
        let mut bond_order = Vec::with_capacity(mol.bonds.len());
        for (bi, b) in mol.bonds.iter().enumerate() {
            bond_order.push(b.order);
            let [x, y] = b.atoms;
            if x >= n || y >= n || x == y {
                continue;
            }
            adj[x].push((y, bi));
            adj[y].push((x, bi));
            let order = match (b.kekule, b.order) {
                (k, _) if k > 0 => k,
                (_, BondOrder::Single | BondOrder::Aromatic) => 1,
                (_, BondOrder::Double) => 2,
                (_, BondOrder::Triple) => 3,
                (_, BondOrder::Quadruple) => 4,
            };
            for a in [x, y] {
                atoms[a].degree = atoms[a].degree.saturating_add(1);
                atoms[a].valence = atoms[a].valence.saturating_add(order);
            }
        }
        let rings = super::rings::perceive(n, &adj, mol.bonds.len());
        let mut bond_ring = rings.bond_in_ring;
        bond_ring.resize(mol.bonds.len(), false);
        for (i, info) in atoms.iter_mut().enumerate() {
            info.rings = rings.atom_rings.get(i).copied().unwrap_or(0);
            info.min_ring = rings.atom_min_ring.get(i).copied().unwrap_or(0);
            info.ring_bonds = adj[i]
                .iter()
                .filter(|&&(_, b)| bond_ring.get(b).copied().unwrap_or(false))
                .count()
                .min(255) as u8;
        }
        let mut element_count = [0u16; 128];
        let mut by_element: Vec<Vec<usize>> = Vec::new();
        let mut aromatic_count = 0;
        for (i, a) in atoms.iter().enumerate() {
            let e = (a.element as usize).min(127);
            element_count[e] = element_count[e].saturating_add(1);
            if by_element.len() <= e {
                by_element.resize(e + 1, Vec::new());
            }
            by_element[e].push(i);
            if a.aromatic {
                aromatic_count += 1;
            }
        }
        Target {
            mol,
            atoms,
            adj,
            bond_order,
            bond_ring,
            element_count,
            aromatic_count,
            ring_count: rings.count,
            by_element,
        }
    }

    /// The molecule this target was built from.
    pub fn molecule(&self) -> &'m Molecule {
        self.mol
    }

    /// Number of atoms.
    pub fn atom_count(&self) -> usize {
        self.atoms.len()
    }

    /// Number of rings in the ring set used for `R` and `r` (SSSR,
    /// symmetrised as RDKit does).
    pub fn ring_count(&self) -> usize {
        self.ring_count
    }

    /// Bond index joining atoms `a` and `b`, if any.
    pub(crate) fn bond_between(&self, a: usize, b: usize) -> Option<usize> {
        self.adj
            .get(a)?
            .iter()
            .find(|&&(x, _)| x == b)
            .map(|&(_, bond)| bond)
    }
}
