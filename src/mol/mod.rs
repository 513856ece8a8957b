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

mod aromatic;
mod elements;
mod error;
mod kekule;
mod read;
mod rings;
mod symmetry;
mod valence_table;

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
    rings: rings::RingInfo,
    /// Connected component of each atom (numbered by first atom).
    component: Vec<u32>,
    component_count: usize,
    main_component: u32,
    /// Per bond: the donor atom when the bond is treated as dative.
    dative_donor: Vec<u32>,
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
    /// hydrogens (a dative bond does not count for its donor): SMARTS `v`.
    pub fn valence(&self, i: usize) -> u32 {
        let bonds: u32 = self
            .neighbors(i)
            .iter()
            .filter(|n| !self.is_dative_from(n.bond, i))
            .map(|n| self.bonds[n.bond].kekule as u32)
            .sum();
        bonds + self.atoms.get(i).map_or(0, |a| a.hydrogens as u32)
    }

    /// Bond `b` is a dative bond from donor atom `i` to a metal (an
    /// over-valent N, O, P or S bonded to a metal with a plain bond).
    pub fn is_dative_from(&self, b: usize, i: usize) -> bool {
        self.dative_donor.get(b).is_some_and(|d| *d as usize == i)
    }

    /// The donor atom of bond `b` if it is treated as dative.
    pub fn dative_donor(&self, b: usize) -> Option<usize> {
        self.dative_donor
            .get(b)
            .filter(|d| **d != u32::MAX)
            .map(|d| *d as usize)
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

    // ----- rings -----

    /// Atom `i` is in a ring.
    pub fn in_ring(&self, i: usize) -> bool {
        self.rings.atom_ring_bonds.get(i).is_some_and(|c| *c > 0)
    }

    /// Number of rings of [`Molecule::rings`] containing atom `i`: SMARTS
    /// `R<n>` as RDKit defines it (over its symmetrized SSSR).
    pub fn ring_count(&self, i: usize) -> usize {
        self.rings.atom_rings.get(i).map_or(0, |c| *c as usize)
    }

    /// Size of the smallest ring containing atom `i` (0 when not in a
    /// ring): SMARTS `r<n>`.
    pub fn smallest_ring(&self, i: usize) -> usize {
        self.rings.atom_smallest.get(i).map_or(0, |c| *c as usize)
    }

    /// Number of ring bonds at atom `i`: SMARTS `x<n>`.
    pub fn ring_bond_count(&self, i: usize) -> usize {
        self.rings.atom_ring_bonds.get(i).map_or(0, |c| *c as usize)
    }

    /// Bond `b` is in a ring: SMARTS `@`.
    pub fn bond_in_ring(&self, b: usize) -> bool {
        self.rings.bond_in_ring.get(b).copied().unwrap_or(false)
    }

    /// Number of rings of [`Molecule::rings`] containing bond `b`.
    pub fn bond_ring_count(&self, b: usize) -> usize {
        self.rings.bond_rings.get(b).map_or(0, |c| *c as usize)
    }

    /// Number of rings in [`Molecule::rings`].
    pub fn ring_total(&self) -> usize {
        self.rings.list.len()
    }

    /// The rings: the relevant cycles (union of all smallest sets of
    /// smallest rings), each as atom indices in cycle order. For ordinary
    /// molecules this is the SSSR; for cages it is RDKit's symmetrized SSSR.
    pub fn rings(&self) -> impl Iterator<Item = &[usize]> + '_ {
        (0..self.rings.list.len()).map(|r| self.rings.list.atoms(r))
    }

    /// Atoms of ring `r` in cycle order (empty when out of range).
    pub fn ring_atoms(&self, r: usize) -> &[usize] {
        if r < self.rings.list.len() {
            self.rings.list.atoms(r)
        } else {
            &[]
        }
    }

    /// Bonds of ring `r`, bond k joining atoms k and k+1 of
    /// [`Molecule::ring_atoms`] (empty when out of range).
    pub fn ring_bond_list(&self, r: usize) -> &[usize] {
        if r < self.rings.list.len() {
            self.rings.list.bonds(r)
        } else {
            &[]
        }
    }

    /// Size of the smallest set of smallest rings (the cycle rank:
    /// bonds - atoms + components).
    pub fn sssr_count(&self) -> usize {
        self.rings.sssr_count
    }

    // ----- components -----

    /// Number of connected components (`.`-separated parts).
    pub fn component_count(&self) -> usize {
        self.component_count
    }

    /// Component of atom `i` (components are numbered in order of their
    /// first written atom).
    pub fn component_of(&self, i: usize) -> usize {
        self.component.get(i).map_or(0, |c| *c as usize)
    }

    /// The main component: the one with the most heavy atoms among those
    /// containing carbon (among all when none does); the first written wins
    /// a tie.
    pub fn main_component(&self) -> usize {
        self.main_component as usize
    }

    /// Atoms of the main component, in index order.
    pub fn main_component_atoms(&self) -> Vec<usize> {
        self.component_atoms(self.main_component as usize)
    }

    /// Atoms of component `c`, in index order.
    pub fn component_atoms(&self, c: usize) -> Vec<usize> {
        (0..self.atoms.len())
            .filter(|&i| self.component[i] as usize == c)
            .collect()
    }

    /// Components other than the main one (counter-ions, solvents), each as
    /// its atom list.
    pub fn counter_ions(&self) -> Vec<Vec<usize>> {
        (0..self.component_count)
            .filter(|&c| c != self.main_component as usize)
            .map(|c| self.component_atoms(c))
            .collect()
    }

    // ----- formula -----

    /// Molecular formula in Hill order (C, H, then alphabetical; all
    /// alphabetical without carbon), every hydrogen counted, isotopes
    /// counted as their element, no charge: `C2H3NaO2` for sodium acetate.
    /// Wildcard atoms are written `*`, sorted before the letters.
    pub fn formula(&self) -> String {
        formula_of(self.atoms.iter())
    }

    /// Formula of the atoms listed (e.g. one component).
    pub fn formula_of_atoms(&self, atoms: &[usize]) -> String {
        formula_of(atoms.iter().filter_map(|&i| self.atoms.get(i)))
    }

    /// Net formal charge.
    pub fn net_charge(&self) -> i32 {
        self.atoms.iter().map(|a| a.charge as i32).sum()
    }

    // ----- symmetry -----

    /// Symmetry classes: atoms that are topologically equivalent share a
    /// class (acetone's two methyl carbons; the two ethoxy groups of diethyl
    /// malonate). Classes come from iterative refinement of an atom
    /// invariant (element, isotope, charge, hydrogens and deuterium/tritium
    /// count, degree, aromaticity, ring membership) by the sorted classes
    /// and bond orders of the neighbours, until the partition stops
    /// splitting. Class numbers are dense (0..k) and ordered by invariant,
    /// so they do not depend on atom order. Refinement can leave rare
    /// non-equivalent atoms together (regular graphs); it never separates
    /// equivalent ones.
    pub fn symmetry_classes(&self) -> Vec<u32> {
        symmetry::classes(self)
    }
}

fn formula_of<'a>(atoms: impl Iterator<Item = &'a Atom>) -> String {
    let mut counts = [0u32; 119];
    let mut hydrogens = 0u32;
    for a in atoms {
        if let Some(c) = counts.get_mut(a.element as usize) {
            *c += 1;
        }
        hydrogens += a.hydrogens as u32;
    }
    counts[1] += hydrogens;
    let mut parts: Vec<(&str, u32)> = Vec::new();
    let has_carbon = counts[6] > 0;
    if has_carbon {
        parts.push(("C", counts[6]));
        if counts[1] > 0 {
            parts.push(("H", counts[1]));
        }
    }
    // `*` sorts before the letters, as RDKit writes it.
    let mut rest: Vec<(&str, u32)> = (0..119)
        .filter(|&z| counts[z] > 0 && !(has_carbon && (z == 6 || z == 1)))
        .map(|z| (elements::SYMBOLS[z], counts[z]))
        .collect();
    rest.sort_unstable_by(|a, b| a.0.cmp(b.0));
    parts.extend(rest);
    let mut out = String::new();
    for (sym, c) in parts {
        out.push_str(sym);
        if c > 1 {
            out.push_str(&c.to_string());
        }
    }
    out
}

fn raw_order_value(o: RawOrder) -> u8 {
    match o {
        RawOrder::Elided | RawOrder::Single | RawOrder::Aromatic => 1,
        RawOrder::Double => 2,
        RawOrder::Triple => 3,
        RawOrder::Quadruple => 4,
    }
}

fn error_at(kind: ErrorKind, message: String, atom: &Atom, smiles: &str) -> MolError {
    MolError::new(kind, message, Some(atom.span.start), smiles)
}

fn describe(atom: &Atom) -> String {
    let sym = atom.symbol();
    if atom.aromatic {
        sym.to_lowercase()
    } else {
        sym.to_string()
    }
}

/// Borrowed view of the compressed adjacency rows.
pub(crate) struct Adj<'a> {
    start: &'a [u32],
    list: &'a [Neighbor],
}

impl<'a> Adj<'a> {
    #[inline]
    pub(crate) fn get(&self, i: usize) -> &'a [Neighbor] {
        &self.list[self.start[i] as usize..self.start[i + 1] as usize]
    }
}

/// Compressed adjacency rows from a bond list.
fn adjacency_of(n: usize, bonds: &[Bond]) -> (Vec<u32>, Vec<Neighbor>) {
    let mut start = vec![0u32; n + 1];
    for b in bonds {
        start[b.atoms[0] + 1] += 1;
        start[b.atoms[1] + 1] += 1;
    }
    for i in 0..n {
        start[i + 1] += start[i];
    }
    let mut fill: Vec<u32> = start[..n].to_vec();
    let mut adjacency = vec![Neighbor { atom: 0, bond: 0 }; bonds.len() * 2];
    for (k, b) in bonds.iter().enumerate() {
        let [x, y] = b.atoms;
        adjacency[fill[x] as usize] = Neighbor { atom: y, bond: k };
        fill[x] += 1;
        adjacency[fill[y] as usize] = Neighbor { atom: x, bond: k };
        fill[y] += 1;
    }
    (start, adjacency)
}

/// Valence a (possibly charged) atom may have, as RDKit accepts it.
fn valence_allowed(z: u8, charge: i8, valence: u32) -> bool {
    let Some(row) = valence_table::TABLE.get(z as usize) else {
        return false;
    };
    let any = 0x3ff;
    if !(valence_table::CHARGE_MIN..=valence_table::CHARGE_MAX).contains(&charge) {
        // Unusual charges: only elements without a valence rule.
        return row.2[4] == any;
    }
    let mask = row.2[(charge - valence_table::CHARGE_MIN) as usize];
    mask == any || (valence <= 9 && mask & (1 << valence) != 0)
}

/// Charge-separate pentavalent nitrogen (nitro, N-oxide, azide written with
/// five bonds) and halogen oxides written with double bonds, as RDKit's
/// clean-up does: `CN(=O)=O` is read as `C[N+](=O)[O-]`, `OCl(=O)(=O)=O`
/// as `O[Cl+3]([O-])([O-])[O-]`.
fn charge_separate(atoms: &mut [Atom], bonds: &mut [Bond], start: &[u32], adj: &[Neighbor]) {
    let nb = |i: usize| &adj[start[i] as usize..start[i + 1] as usize];
    for i in 0..atoms.len() {
        let z = atoms[i].element;
        if atoms[i].charge != 0 || !matches!(z, 7 | 17 | 35 | 53) {
            continue;
        }
        let v: u32 = nb(i)
            .iter()
            .map(|x| bonds[x.bond].kekule as u32)
            .sum::<u32>()
            + atoms[i].hydrogens as u32;
        let terminal_o = |x: &Neighbor, atoms: &[Atom], bonds: &[Bond]| {
            bonds[x.bond].kekule == 2
                && bonds[x.bond].order != BondOrder::Aromatic
                && atoms[x.atom].element == 8
                && atoms[x.atom].charge == 0
                && nb(x.atom).len() == 1
        };
        if z == 7 {
            let pentavalent = v == 5 || (atoms[i].aromatic && v == 4);
            if !pentavalent {
                continue;
            }
            if let Some(x) = nb(i).iter().find(|x| terminal_o(x, atoms, bonds)) {
                let x = *x;
                bonds[x.bond].kekule = 1;
                bonds[x.bond].order = BondOrder::Single;
                atoms[x.atom].charge = -1;
                atoms[i].charge = 1;
            } else if let Some(x) = nb(i).iter().find(|x| {
                bonds[x.bond].kekule == 3
                    && atoms[x.atom].element == 7
                    && atoms[x.atom].charge == 0
                    && nb(x.atom).len() == 1
            }) {
                let x = *x;
                bonds[x.bond].kekule = 2;
                bonds[x.bond].order = BondOrder::Double;
                atoms[x.atom].charge = -1;
                atoms[i].charge = 1;
            }
        } else if v > 1 {
            let oxo: Vec<Neighbor> = nb(i)
                .iter()
                .filter(|x| terminal_o(x, atoms, bonds))
                .copied()
                .collect();
            for x in &oxo {
                bonds[x.bond].kekule = 1;
                bonds[x.bond].order = BondOrder::Single;
                atoms[x.atom].charge = -1;
            }
            atoms[i].charge = oxo.len() as i8;
        }
    }
}

/// Turn the written atoms and bonds into a validated molecule: fold
/// hydrogens, add implicit hydrogens, kekulize aromatic input, check
/// valences, find rings, perceive aromaticity, find components.
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
    // new_index[i] = index after folding (unused for a folded H).
    let mut new_index = vec![usize::MAX; n_raw];
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
        bonds.push(Bond {
            atoms: [x, y],
            order,
            kekule: raw_order_value(b.order),
        });
    }
    let (adjacency_start, adjacency) = adjacency_of(n, &bonds);
    charge_separate(&mut atoms, &mut bonds, &adjacency_start, &adjacency);
    let nb = Adj {
        start: &adjacency_start,
        list: &adjacency,
    };

    // Implicit hydrogens by the organic-subset valence rules; aromatic atoms
    // that have room for a pi bond must get a double bond in kekulization.
    let mut implicit_h = vec![0u8; n];
    let mut needs_pi = vec![false; n];
    let mut bond_sum = vec![0u32; n];
    for b in &bonds {
        let v = b.kekule as u32;
        bond_sum[b.atoms[0]] += v;
        bond_sum[b.atoms[1]] += v;
    }
    for (i, atom) in atoms.iter_mut().enumerate() {
        let v = bond_sum[i] + atom.hydrogens as u32;
        let targets = if atom.bracket || atom.charge != 0 {
            elements::charged_valences(atom.element, atom.charge)
        } else {
            elements::normal_valences(atom.element)
        };
        let Some(&t) = targets.iter().find(|&&t| t as u32 >= v) else {
            continue;
        };
        let t = t as u32;
        if atom.aromatic && t > v {
            needs_pi[i] = true;
        }
        if !atom.bracket {
            let h = if atom.aromatic && t > v {
                t - v - 1
            } else {
                t - v
            };
            implicit_h[i] = h as u8;
            atom.hydrogens = atom.hydrogens.saturating_add(h as u8);
        }
    }

    let ring_info = rings::perceive(n, &bonds, &nb, smiles)?;

    // Aromatic input: every aromatic atom must be in a ring, and the pi
    // atoms must pair up along ring bonds written aromatic.
    if atoms.iter().any(|a| a.aromatic) {
        for (i, a) in atoms.iter().enumerate() {
            if a.aromatic && ring_info.atom_rings[i] == 0 {
                return Err(error_at(
                    ErrorKind::Aromaticity,
                    format!("aromatic atom '{}' is not in a ring", describe(a)),
                    a,
                    smiles,
                ));
            }
        }
        let mut pi_atoms: Vec<usize> = Vec::with_capacity(n);
        pi_atoms.extend((0..n).filter(|&i| needs_pi[i]));
        let mut local = vec![usize::MAX; n];
        for (k, &i) in pi_atoms.iter().enumerate() {
            local[i] = k;
        }
        let mut adj = kekule::Graph {
            start: Vec::with_capacity(pi_atoms.len() + 1),
            list: Vec::with_capacity(pi_atoms.len() * 3),
        };
        adj.start.push(0);
        for &i in &pi_atoms {
            for x in nb.get(i) {
                if bonds[x.bond].order == BondOrder::Aromatic
                    && ring_info.bond_in_ring[x.bond]
                    && local[x.atom] != usize::MAX
                {
                    adj.list.push((local[x.atom], x.bond));
                }
            }
            adj.start.push(adj.list.len());
        }
        let mate = kekule::perfect_matching(&adj);
        if let Some(k) = mate.iter().position(|m| *m == usize::MAX) {
            let a = &atoms[pi_atoms[k]];
            let hint = if a.element == 7 && !a.bracket {
                " (a pyrrole-type nitrogen is written [nH])"
            } else {
                ""
            };
            return Err(error_at(
                ErrorKind::Aromaticity,
                format!(
                    "cannot kekulize the aromatic ring system at this '{}': its atoms cannot be given alternating double bonds{}",
                    describe(a),
                    hint
                ),
                a,
                smiles,
            ));
        }
        for b in bonds.iter_mut() {
            if b.order == BondOrder::Aromatic {
                b.kekule = 1;
            }
        }
        for (k, &m) in mate.iter().enumerate() {
            if m > k {
                if let Some(&(_, bond)) = adj[k].iter().find(|(w, _)| *w == m) {
                    bonds[bond].kekule = 2;
                }
            }
        }
        for b in bonds.iter_mut() {
            if b.order == BondOrder::Aromatic {
                b.order = if b.kekule == 2 {
                    BondOrder::Double
                } else {
                    BondOrder::Single
                };
            }
        }
        for s in bond_sum.iter_mut() {
            *s = 0;
        }
        for b in &bonds {
            bond_sum[b.atoms[0]] += b.kekule as u32;
            bond_sum[b.atoms[1]] += b.kekule as u32;
        }
    }

    // Valence check on the Kekulé structure. A donor atom (N, O, P, S...)
    // over its valence because of single bonds to metals has those bonds
    // treated as dative (they do not count toward its valence), as RDKit does
    // for organometallics written with plain bonds.
    let mut dative_donor = vec![u32::MAX; bonds.len()];
    for (i, a) in atoms.iter().enumerate() {
        let mut v = bond_sum[i] + a.hydrogens as u32;
        if valence_allowed(a.element, a.charge, v) {
            continue;
        }
        if !elements::is_metal(a.element) {
            for x in nb.get(i) {
                if bonds[x.bond].kekule == 1
                    && elements::is_metal(atoms[x.atom].element)
                    && dative_donor[x.bond] == u32::MAX
                {
                    dative_donor[x.bond] = i as u32;
                    v -= 1;
                    if valence_allowed(a.element, a.charge, v) {
                        break;
                    }
                }
            }
        }
        if !valence_allowed(a.element, a.charge, v) {
            let charge = match a.charge {
                0 => String::new(),
                c => format!(" with charge {:+}", c),
            };
            return Err(error_at(
                ErrorKind::Valence,
                format!(
                    "valence {} is not allowed for {}{}",
                    bond_sum[i] + a.hydrogens as u32,
                    a.symbol(),
                    charge
                ),
                a,
                smiles,
            ));
        }
    }
    for (b, &d) in dative_donor.iter().enumerate() {
        if d != u32::MAX {
            bond_sum[d as usize] -= bonds[b].kekule as u32;
        }
    }

    // Aromaticity perception from scratch on the Kekulé structure.
    let facts: Vec<aromatic::AtomFacts> = (0..n)
        .map(|i| {
            let a = &atoms[i];
            let degree = nb
                .get(i)
                .iter()
                .filter(|x| dative_donor[x.bond] != i as u32)
                .count() as i32;
            let v = bond_sum[i] as i32 + a.hydrogens as i32;
            let radicals = if a.bracket && a.element != 0 {
                elements::charged_valences(a.element, a.charge)
                    .iter()
                    .find(|&&t| t as i32 >= v)
                    .map_or(0, |&t| t as i32 - v)
            } else {
                0
            };
            aromatic::AtomFacts {
                degree,
                bond_order_sum: bond_sum[i] as i32,
                explicit_h: (a.hydrogens - implicit_h[i]) as i32,
                radicals,
            }
        })
        .collect();
    let (atom_arom, bond_arom) = aromatic::perceive(&atoms, &bonds, &nb, &facts, &ring_info);
    for (a, &ar) in atoms.iter_mut().zip(&atom_arom) {
        a.aromatic = ar;
    }
    for (b, &ar) in bonds.iter_mut().zip(&bond_arom) {
        if ar && matches!(b.kekule, 1 | 2) {
            b.order = BondOrder::Aromatic;
        }
    }

    // Connected components, numbered in order of their first atom.
    let mut component = vec![u32::MAX; n];
    let mut count = 0u32;
    let mut stack = Vec::with_capacity(n);
    for s in 0..n {
        if component[s] != u32::MAX {
            continue;
        }
        component[s] = count;
        stack.push(s);
        while let Some(v) = stack.pop() {
            for x in nb.get(v) {
                if component[x.atom] == u32::MAX {
                    component[x.atom] = count;
                    stack.push(x.atom);
                }
            }
        }
        count += 1;
    }
    // Main component: most heavy atoms among those containing carbon (else
    // among all); the first written wins a tie.
    let mut heavy = vec![0usize; count as usize];
    let mut carbon = vec![false; count as usize];
    for (i, a) in atoms.iter().enumerate() {
        let c = component[i] as usize;
        if a.element != 1 {
            heavy[c] += 1;
        }
        if a.element == 6 {
            carbon[c] = true;
        }
    }
    let any_carbon = carbon.iter().any(|c| *c);
    let mut main = 0u32;
    let mut best = None;
    for c in 0..count as usize {
        if any_carbon && !carbon[c] {
            continue;
        }
        if best.is_none_or(|b| heavy[c] > b) {
            best = Some(heavy[c]);
            main = c as u32;
        }
    }

    Ok(Molecule {
        atoms,
        bonds,
        adjacency_start,
        adjacency,
        implicit_h,
        rings: ring_info,
        component,
        component_count: count as usize,
        main_component: main,
        dative_donor,
    })
}

#[cfg(test)]
mod tests;
