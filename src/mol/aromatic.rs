//! Aromaticity perception on the Kekulé structure.
//!
//! The model follows RDKit's default model, which is our reference library
//! (its rules restated here; the code is our own):
//!
//! * Each ring atom gets a pi-electron donor type from its element, charge,
//!   connections and bonds: atoms with a ring double bond give 1 electron;
//!   pyrrole-type N, furan O, thiophene S and carbanions give 2; an atom
//!   whose only multiple bond is exocyclic to a more electronegative atom
//!   (C=O, C=N, C=S) gives 0, as does a ring carbocation; atoms with four or
//!   more connections (counting hydrogens), univalent elements, heavy
//!   elements other than Se and Te, and atoms above their default valence
//!   cannot be aromatic; `*` may give 1 or 2 (at most one per ring set).
//! * A ring (from the ring list, see `rings`) whose atoms are all
//!   candidates is aromatic when its electron count can be 4n+2 (n >= 1),
//!   or exactly 2 (cyclopropenyl cation).
//! * Rings sharing exactly one bond form fused systems; connected sets of
//!   up to six rings of a system are tested as a whole (counting the atoms
//!   in one or two of the rings), so azulene and other systems aromatic only as a whole are
//!   found. All atoms of an aromatic set become aromatic; of its bonds, only
//!   those in exactly one ring of the set (fusion bonds of that set are
//!   marked by smaller sets).
//! * "More electronegative" compares outer-shell electrons, then prefers
//!   the lighter element (RDKit's rule).

use super::valence_table::TABLE;
use super::{rings::RingInfo, Adj, Atom, Bond};

#[derive(Debug, Clone, Copy, PartialEq, Eq)]
enum Donor {
    Vacant,
    One,
    Two,
    Any,
    No,
}

fn default_valence(z: i32) -> i32 {
    if (0..=118).contains(&z) {
        TABLE[z as usize].0 as i32
    } else {
        -1
    }
}

fn outer(z: u8) -> i32 {
    TABLE.get(z as usize).map_or(0, |t| t.1 as i32)
}

fn more_electronegative(a: u8, b: u8) -> bool {
    let (ea, eb) = (outer(a), outer(b));
    ea > eb || (ea == eb && a < b)
}

/// Inputs the perception needs, per atom.
pub(crate) struct AtomFacts {
    pub degree: i32,
    /// Sum of Kekulé bond orders.
    pub bond_order_sum: i32,
    pub explicit_h: i32,
    pub radicals: i32,
}

/// Largest number of ring sets tested per molecule (connected sets of up to
/// six rings); beyond it larger sets are not tried. Ordinary molecules use
/// a few dozen.
const MAX_RING_SETS: usize = 100_000;

pub(crate) fn perceive(
    atoms: &[Atom],
    bonds: &[Bond],
    nb: &Adj,
    facts: &[AtomFacts],
    rings: &RingInfo,
) -> (Vec<bool>, Vec<bool>) {
    let n = atoms.len();
    let mut atom_arom = vec![false; n];
    let mut bond_arom = vec![false; bonds.len()];
    if rings.list.is_empty() {
        return (atom_arom, bond_arom);
    }
    // Donor types and candidacy, computed for ring atoms only.
    let mut donor = vec![Donor::No; n];
    let mut cand = vec![false; n];
    for i in 0..n {
        if rings.atom_rings[i] == 0 {
            continue;
        }
        donor[i] = donor_type(i, atoms, bonds, nb, facts, rings);
        cand[i] = is_candidate(i, donor[i], atoms, bonds, nb, facts);
    }
    // Candidate rings.
    let mut cand_rings: Vec<usize> = Vec::with_capacity(rings.list.len());
    cand_rings.extend((0..rings.list.len()).filter(|&r| {
        let ring = rings.list.atoms(r);
        ring.iter().all(|&a| cand[a]) && !ring.iter().all(|&a| atoms[a].element == 0)
    }));
    if cand_rings.is_empty() {
        return (atom_arom, bond_arom);
    }
    let nc = cand_rings.len();
    // Ring neighbour map: rings (up to 24 atoms) sharing exactly one bond.
    let mut neigh: Vec<Vec<usize>> = vec![Vec::new(); nc];
    for i in 0..nc {
        let bi = rings.list.bonds(cand_rings[i]);
        if bi.len() > 24 {
            continue;
        }
        for j in i + 1..nc {
            let bj = rings.list.bonds(cand_rings[j]);
            if bj.len() > 24 {
                continue;
            }
            let shared = bi.iter().filter(|b| bj.contains(b)).count();
            if shared == 1 {
                neigh[i].push(j);
                neigh[j].push(i);
            }
        }
    }
    let mut budget = MAX_RING_SETS;
    let mut times = vec![0u8; n];
    // Fused systems: connected components of the neighbour map.
    let mut done = vec![false; nc];
    for start in 0..nc {
        if done[start] {
            continue;
        }
        if neigh[start].is_empty() {
            // A ring fused to no other candidate ring: tested alone.
            done[start] = true;
            if huckel(&[start], &cand_rings, rings, &donor, &mut times) {
                mark(&[start], &cand_rings, rings, &mut atom_arom, &mut bond_arom);
            }
            continue;
        }
        let mut system = Vec::new();
        let mut stack = vec![start];
        done[start] = true;
        while let Some(r) = stack.pop() {
            system.push(r);
            for &t in neigh[r].iter().rev() {
                if !done[t] {
                    done[t] = true;
                    stack.push(t);
                }
            }
        }
        system.sort_unstable();
        // Stop once every ring bond of the system is aromatic.
        let mut system_bond = vec![false; bonds.len()];
        for &k in &system {
            for &b in rings.list.bonds(cand_rings[k]) {
                system_bond[b] = true;
            }
        }
        let n_system_bonds = system_bond.iter().filter(|x| **x).count();
        let mut done_bonds = vec![false; bonds.len()];
        let mut n_done_bonds = 0;
        // Level by level: connected sets of 1..=6 rings of this system.
        let mut level: Vec<Vec<usize>> = system.iter().map(|&r| vec![r]).collect();
        let max_size = system.len().min(6);
        for size in 1..=max_size {
            if n_done_bonds >= n_system_bonds || (size > 2 && system.len() > 300) {
                break;
            }
            for set in &level {
                if budget == 0 {
                    break;
                }
                budget -= 1;
                if huckel(set, &cand_rings, rings, &donor, &mut times) {
                    mark(set, &cand_rings, rings, &mut atom_arom, &mut bond_arom);
                    for &k in set {
                        for &b in rings.list.bonds(cand_rings[k]) {
                            if bond_arom[b] && !done_bonds[b] {
                                done_bonds[b] = true;
                                n_done_bonds += 1;
                            }
                        }
                    }
                }
            }
            if size == max_size || budget == 0 {
                break;
            }
            // Grow every set by one neighbouring ring; keep sets sorted, unique.
            let mut next: Vec<Vec<usize>> = Vec::new();
            for set in &level {
                for &r in set {
                    for &t in &neigh[r] {
                        if set.contains(&t) {
                            continue;
                        }
                        let mut grown = set.clone();
                        let pos = grown.partition_point(|&x| x < t);
                        grown.insert(pos, t);
                        next.push(grown);
                    }
                }
                if next.len() > budget.saturating_mul(4) {
                    break;
                }
            }
            next.sort_unstable();
            next.dedup();
            level = next;
        }
    }
    (atom_arom, bond_arom)
}

/// Hückel test of a set of rings: atoms in one or two of the rings count
/// (an atom inside three fused rings, as in acepentalene or perimidine, is
/// left out); at most one wildcard atom.
fn huckel(
    set: &[usize],
    cand_rings: &[usize],
    rings: &RingInfo,
    donor: &[Donor],
    times: &mut [u8],
) -> bool {
    for &k in set {
        for &a in rings.list.atoms(cand_rings[k]) {
            times[a] = times[a].saturating_add(1);
        }
    }
    let (mut lo, mut hi) = (0i32, 0i32);
    let mut wildcards = 0;
    let mut result = None;
    for &k in set {
        for &a in rings.list.atoms(cand_rings[k]) {
            let t = times[a];
            times[a] = 0; // count each atom once and leave the buffer clean
            if result.is_some() || t == 0 || t > 2 {
                continue;
            }
            if donor[a] == Donor::Any {
                wildcards += 1;
                if wildcards > 1 {
                    result = Some(false);
                }
            }
            let (l, h) = match donor[a] {
                Donor::Any => (1, 2),
                Donor::One => (1, 1),
                Donor::Two => (2, 2),
                Donor::Vacant | Donor::No => (0, 0),
            };
            lo += l;
            hi += h;
        }
    }
    if let Some(r) = result {
        return r;
    }
    if hi >= 6 {
        (lo..=hi).any(|e| (e - 2) % 4 == 0)
    } else {
        hi == 2
    }
}

fn mark(
    set: &[usize],
    cand_rings: &[usize],
    rings: &RingInfo,
    atom_arom: &mut [bool],
    bond_arom: &mut [bool],
) {
    for &k in set {
        for &a in rings.list.atoms(cand_rings[k]) {
            atom_arom[a] = true;
        }
    }
    if let [k] = set {
        // One ring: each of its bonds is in exactly one ring of the set.
        for &b in rings.list.bonds(cand_rings[*k]) {
            bond_arom[b] = true;
        }
        return;
    }
    for &k in set {
        for &b in rings.list.bonds(cand_rings[k]) {
            let count = set
                .iter()
                .filter(|&&o| rings.list.bonds(cand_rings[o]).contains(&b))
                .count();
            if count == 1 {
                bond_arom[b] = true;
            }
        }
    }
}

/// First multiple bond of atom `i` that is not in a ring: the other atom.
fn exocyclic_multiple(i: usize, bonds: &[Bond], nb: &Adj, rings: &RingInfo) -> Option<usize> {
    nb.get(i)
        .iter()
        .find(|x| !rings.bond_in_ring[x.bond] && bonds[x.bond].kekule >= 2)
        .map(|x| x.atom)
}

fn cyclic_multiple(i: usize, bonds: &[Bond], nb: &Adj, rings: &RingInfo) -> bool {
    nb.get(i)
        .iter()
        .any(|x| rings.bond_in_ring[x.bond] && bonds[x.bond].kekule >= 2)
}

/// Pi electrons the atom can give (RDKit's count): -1 when it cannot take
/// part.
fn count_electrons(i: usize, atoms: &[Atom], facts: &[AtomFacts]) -> i32 {
    let a = &atoms[i];
    let f = &facts[i];
    let dv = default_valence(a.element as i32);
    if dv <= 1 {
        return -1;
    }
    let degree = f.degree + a.hydrogens as i32;
    if degree > 3 {
        return -1;
    }
    let nlp = (outer(a.element) - dv - a.charge as i32).max(0);
    let mut res = (dv - degree) + nlp - f.radicals;
    if res > 1 {
        let unsaturations = f.bond_order_sum + f.explicit_h - f.degree;
        if unsaturations > 1 {
            res = 1;
        }
    }
    res
}

fn donor_type(
    i: usize,
    atoms: &[Atom],
    bonds: &[Bond],
    nb: &Adj,
    facts: &[AtomFacts],
    rings: &RingInfo,
) -> Donor {
    let a = &atoms[i];
    if a.element == 0 {
        return if cyclic_multiple(i, bonds, nb, rings) {
            Donor::One
        } else {
            Donor::Any
        };
    }
    let nelec = count_electrons(i, atoms, facts);
    if nelec < 0 {
        return Donor::No;
    }
    let exo = exocyclic_multiple(i, bonds, nb, rings);
    match nelec {
        0 => {
            if exo.is_some() {
                Donor::Vacant
            } else if cyclic_multiple(i, bonds, nb, rings) {
                Donor::One
            } else {
                Donor::No
            }
        }
        1 => {
            if let Some(w) = exo {
                if more_electronegative(atoms[w].element, a.element) {
                    Donor::Vacant
                } else {
                    Donor::One
                }
            } else if facts[i].bond_order_sum != facts[i].degree {
                Donor::One
            } else if a.charge == 1 {
                Donor::Vacant
            } else {
                Donor::No
            }
        }
        _ => {
            let mut e = nelec;
            if let Some(w) = exo {
                if more_electronegative(atoms[w].element, a.element) {
                    e -= 1;
                }
            }
            if e % 2 == 1 {
                Donor::One
            } else {
                Donor::Two
            }
        }
    }
}

fn is_candidate(
    i: usize,
    donor: Donor,
    atoms: &[Atom],
    bonds: &[Bond],
    nb: &Adj,
    facts: &[AtomFacts],
) -> bool {
    let a = &atoms[i];
    let z = a.element;
    if z > 18 && z != 34 && z != 52 {
        return false;
    }
    if donor == Donor::No {
        return false;
    }
    let total_valence = facts[i].bond_order_sum + a.hydrogens as i32;
    if default_valence(z as i32) > 0 && total_valence > default_valence(z as i32 - a.charge as i32)
    {
        return false;
    }
    if facts[i].radicals > 0 && (z != 6 || a.charge != 0) {
        return false;
    }
    let unsaturations = facts[i].bond_order_sum + facts[i].explicit_h - facts[i].degree;
    if unsaturations > 1 {
        let multiple = nb
            .get(i)
            .iter()
            .filter(|x| bonds[x.bond].kekule >= 2)
            .count();
        if multiple > 1 {
            return false;
        }
    }
    true
}
