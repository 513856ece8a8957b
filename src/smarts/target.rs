//! A molecule prepared for matching: per-atom counts that the SMARTS
//! primitives ask for and element counts for the pre-screens. Ring
//! primitives read the molecule's own ring information (perceived once in
//! [`Molecule::from_smiles`]: RDKit's symmetrised SSSR, dative bonds left
//! out).

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
}

/// One neighbour entry as the neighbourhood screens read it.
#[derive(Debug, Clone, Copy)]
pub(crate) struct NbrInfo {
    /// The neighbour's atom signature.
    pub sig: u64,
    pub atom: u32,
    /// State of the bond to it (see [`Target::bond_state`]).
    pub state: u8,
}

/// A molecule prepared for matching many patterns. Build it once per
/// molecule with [`Target::new`] and pass it to the `*_in` methods of
/// [`super::Pattern`] when running more than one pattern. It holds no
/// interior mutability, so it can be shared between threads.
#[derive(Debug, Clone)]
pub struct Target<'m> {
    pub(crate) mol: &'m Molecule,
    pub(crate) atoms: Vec<AtomInfo>,
    /// Per-atom signatures for the atom filters.
    pub(crate) sig: Vec<u64>,
    /// Per bond its state for [`super::QueryBond::mask`]: order (0 to 4)
    /// or 5 for a dative bond (donor to metal; it matches only `~` and
    /// negations), plus 6 when the bond is in a ring.
    pub(crate) bond_state: Vec<u8>,
    /// Neighbours with their signatures and bond states, in compressed
    /// rows: atom `i` has `nbr[nbr_start[i]..nbr_start[i + 1]]`.
    nbr_start: Vec<u32>,
    nbr: Vec<NbrInfo>,
    /// Atom count per atomic number (0..=127; larger numbers are clamped).
    pub(crate) element_count: [u16; 128],
    /// Bit `e` set when the molecule has an atom of element `e` (below 128).
    pub(crate) element_mask: u128,
    pub(crate) aromatic_count: usize,
    /// Non-aromatic double and triple bonds, aromatic bonds.
    pub(crate) double_count: usize,
    pub(crate) triple_count: usize,
    pub(crate) aromatic_bond_count: usize,
    /// Atom indices grouped by element (ascending within a group) and the
    /// groups as (element, start, end).
    by_element: Vec<usize>,
    groups: Vec<(u8, usize, usize)>,
}

impl<'m> Target<'m> {
    /// Prepare `mol` for matching.
    pub fn new(mol: &'m Molecule) -> Target<'m> {
        let (mut double_count, mut triple_count, mut aromatic_bond_count) = (0, 0, 0);
        let bond_state: Vec<u8> = mol
            .bonds
            .iter()
            .enumerate()
            .map(|(b, bond)| {
                match bond.order {
                    BondOrder::Double => double_count += 1,
                    BondOrder::Triple => triple_count += 1,
                    BondOrder::Aromatic => aromatic_bond_count += 1,
                    _ => {}
                }
                let state = if mol.dative_donor(b).is_some() {
                    5
                } else {
                    match bond.order {
                        BondOrder::Single => 0,
                        BondOrder::Double => 1,
                        BondOrder::Triple => 2,
                        BondOrder::Quadruple => 3,
                        BondOrder::Aromatic => 4,
                    }
                };
                state + if mol.bond_in_ring(b) { 6 } else { 0 }
            })
            .collect();
        let atoms: Vec<AtomInfo> = mol
            .atoms
            .iter()
            .enumerate()
            .map(|(i, a)| {
                let nbrs = mol.neighbors(i);
                let mut valence = a.hydrogens as u32;
                for nb in nbrs {
                    // A dative bond does not count for its donor (RDKit).
                    if mol.dative_donor(nb.bond) == Some(i) {
                        continue;
                    }
                    valence += mol
                        .bonds
                        .get(nb.bond)
                        .map_or(0, |b| match (b.kekule, b.order) {
                            (k, _) if k > 0 => k as u32,
                            (_, o) => o.as_u8() as u32,
                        });
                }
                AtomInfo {
                    element: a.element,
                    aromatic: a.aromatic,
                    charge: a.charge,
                    isotope: a.isotope.unwrap_or(0),
                    hydrogens: a.hydrogens,
                    degree: nbrs.len().min(255) as u8,
                    valence: valence.min(255) as u8,
                }
            })
            .collect();
        let mut element_count = [0u16; 128];
        let mut element_mask = 0u128;
        let mut aromatic_count = 0;
        // Atoms grouped by element (a counting sort: ascending index within
        // a group, groups by ascending element).
        let mut per_element = [0u32; 256];
        let mut present: Vec<u8> = Vec::with_capacity(8);
        for a in &atoms {
            let e = (a.element as usize).min(127);
            element_count[e] = element_count[e].saturating_add(1);
            if a.element < 128 {
                element_mask |= 1u128 << a.element;
            }
            aromatic_count += usize::from(a.aromatic);
            let c = &mut per_element[a.element as usize];
            if *c == 0 {
                present.push(a.element);
            }
            *c += 1;
        }
        present.sort_unstable();
        let mut groups: Vec<(u8, usize, usize)> = Vec::with_capacity(present.len());
        // `per_element` becomes each group's next free slot.
        let mut start = 0u32;
        for &e in &present {
            let slot = &mut per_element[e as usize];
            let count = *slot;
            groups.push((e, start as usize, (start + count) as usize));
            *slot = start;
            start += count;
        }
        let mut by_element = vec![0usize; atoms.len()];
        for (i, a) in atoms.iter().enumerate() {
            let slot = &mut per_element[a.element as usize];
            if let Some(x) = by_element.get_mut(*slot as usize) {
                *x = i;
            }
            *slot += 1;
        }
        let sig: Vec<u64> = atoms
            .iter()
            .enumerate()
            .map(|(i, info)| {
                let ring = u64::from(mol.ring_bond_count(i) > 0) << super::expr::SIG_RING;
                super::expr::atom_signature(info) | ring
            })
            .collect();
        let mut nbr_start: Vec<u32> = Vec::with_capacity(atoms.len() + 1);
        let mut nbr: Vec<NbrInfo> = Vec::with_capacity(2 * mol.bonds.len());
        nbr_start.push(0);
        for i in 0..atoms.len() {
            nbr.extend(mol.neighbors(i).iter().map(|nb| NbrInfo {
                sig: sig.get(nb.atom).copied().unwrap_or(0),
                atom: nb.atom as u32,
                // 15: a state no bond mask has.
                state: bond_state.get(nb.bond).copied().unwrap_or(15),
            }));
            nbr_start.push(nbr.len() as u32);
        }
        Target {
            mol,
            nbr_start,
            nbr,
            atoms,
            sig,
            bond_state,
            double_count,
            triple_count,
            aromatic_bond_count,
            by_element,
            groups,
            element_count,
            element_mask,
            aromatic_count,
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

    /// Number of rings in the ring set used for `R n` and `r n`
    /// ([`Molecule::ring_total`]: the SSSR symmetrised as RDKit does, so
    /// cubane has six).
    pub fn ring_count(&self) -> usize {
        self.mol.ring_total()
    }

    /// Number of rings (from the set above) containing atom `a`.
    pub fn atom_ring_count(&self, a: usize) -> u8 {
        self.mol.ring_count(a).min(255) as u8
    }

    /// Size of the smallest ring (from the set above) containing atom `a`;
    /// 0 if none.
    pub fn smallest_ring(&self, a: usize) -> u8 {
        self.mol.smallest_ring(a).min(255) as u8
    }

    /// Is bond `b` in a ring?
    #[inline]
    pub fn bond_in_ring(&self, b: usize) -> bool {
        self.mol.bond_in_ring(b)
    }

    /// Number of ring bonds at atom `a`.
    #[inline]
    pub fn ring_bond_count(&self, a: usize) -> u8 {
        self.mol.ring_bond_count(a).min(255) as u8
    }

    /// Does the molecule have any ring?
    pub fn has_ring(&self) -> bool {
        self.mol.sssr_count() > 0
    }

    /// Atoms of element `e`, ascending.
    #[inline]
    pub(crate) fn atoms_of_element(&self, e: u8) -> &[usize] {
        match self.groups.iter().find(|g| g.0 == e) {
            Some(&(_, s, x)) => self.by_element.get(s..x).unwrap_or(&[]),
            None => &[],
        }
    }

    /// Neighbours of atom `a` with signatures and bond states.
    #[inline]
    pub(crate) fn nbr_info(&self, a: usize) -> &[NbrInfo] {
        match self.nbr_start.get(a..a + 2) {
            Some(&[s, e]) => self.nbr.get(s as usize..e as usize).unwrap_or(&[]),
            _ => &[],
        }
    }

    /// Neighbours of atom `a`.
    #[inline]
    pub(crate) fn neighbors(&self, a: usize) -> &'m [crate::mol::Neighbor] {
        self.mol.neighbors(a)
    }

    /// Bond index joining atoms `a` and `b`, if any.
    #[inline]
    pub(crate) fn bond_between(&self, a: usize, b: usize) -> Option<usize> {
        self.mol.bond_between(a, b)
    }
}
