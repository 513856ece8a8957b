//! Ring perception.
//!
//! Ring bonds are the bonds that are not bridges (found with an iterative
//! depth-first search, so no input can make it recurse deeply). The ring
//! bonds fall into ring systems; a system whose cycle rank is 1 is a single
//! ring. For larger systems the candidate cycles of Horton (shortest path
//! from a root to each end of an edge, closed by the edge) are sorted by
//! size and reduced over GF(2): a candidate independent of all strictly
//! shorter cycles is a *relevant* cycle (Vismara 1997). The relevant cycles
//! are the union of all minimum cycle bases (SSSRs); using all of them
//! instead of one arbitrary SSSR makes the result independent of atom order
//! and equals RDKit's symmetrized SSSR on cages (cubane: 6 four-membered
//! rings; bicyclo[2.2.2]octane: 3 six-membered rings). The SSSR size (cycle
//! rank) is kept separately.

use super::{Adj, Bond, MolError, Neighbor};

/// Ring systems larger than this (atoms × bonds of one system) are refused
/// as too large: candidate generation is quadratic in the system size.
pub(crate) const MAX_SYSTEM_WORK: usize = 4_000_000;

/// Relevant cycles kept beyond the cycle rank of a system (pathological
/// graphs can have exponentially many).
const EXTRA_RELEVANT_LIMIT: usize = 64;

#[derive(Debug, Clone, Default)]
pub(crate) struct RingInfo {
    /// Rings as atom lists in cycle order.
    pub rings: Vec<Vec<usize>>,
    /// Rings as bond lists (same order as `rings`).
    pub ring_bonds: Vec<Vec<usize>>,
    /// Per atom: number of rings containing it.
    pub atom_rings: Vec<u16>,
    /// Per atom: size of the smallest ring containing it (0: none).
    pub atom_smallest: Vec<u16>,
    /// Per atom: number of ring bonds at it.
    pub atom_ring_bonds: Vec<u8>,
    /// Per bond: in a ring.
    pub bond_in_ring: Vec<bool>,
    /// Per bond: number of rings containing it.
    pub bond_rings: Vec<u16>,
    /// Cycle rank (SSSR size): bonds - atoms + components.
    pub sssr_count: usize,
}

/// Mark bridges with an iterative Tarjan low-link search. Returns
/// `in_ring` per bond.
fn ring_bonds(n: usize, bonds: &[Bond], nb: &Adj) -> Vec<bool> {
    let mut in_ring = vec![false; bonds.len()];
    if bonds.is_empty() {
        return in_ring;
    }
    const NONE: usize = usize::MAX;
    let mut disc = vec![NONE; n];
    let mut low = vec![0usize; n];
    let mut time = 0;
    // (atom, bond used to enter, next neighbour index)
    let mut stack: Vec<(usize, usize, usize)> = Vec::new();
    let mut is_bridge = vec![false; bonds.len()];
    for root in 0..n {
        if disc[root] != NONE {
            continue;
        }
        disc[root] = time;
        low[root] = time;
        time += 1;
        stack.push((root, NONE, 0));
        while let Some(top) = stack.last_mut() {
            let (v, via, k) = *top;
            let neighbors = nb.get(v);
            if k < neighbors.len() {
                top.2 += 1;
                let Neighbor { atom: w, bond: b } = neighbors[k];
                if b == via {
                    continue;
                }
                if disc[w] == NONE {
                    disc[w] = time;
                    low[w] = time;
                    time += 1;
                    stack.push((w, b, 0));
                } else if disc[w] < low[v] {
                    low[v] = disc[w];
                }
            } else {
                stack.pop();
                if let Some(&(parent, _, _)) = stack.last() {
                    if low[v] < low[parent] {
                        low[parent] = low[v];
                    }
                    if low[v] > disc[parent] {
                        is_bridge[via] = true;
                    }
                }
            }
        }
    }
    for (b, r) in in_ring.iter_mut().enumerate() {
        *r = !is_bridge[b];
    }
    in_ring
}

fn find(parent: &mut [usize], mut x: usize) -> usize {
    while parent[x] != x {
        parent[x] = parent[parent[x]];
        x = parent[x];
    }
    x
}

/// A GF(2) vector over the bonds of one ring system.
type Bits = Vec<u64>;

fn lowest(bits: &Bits) -> Option<usize> {
    bits.iter()
        .enumerate()
        .find(|(_, w)| **w != 0)
        .map(|(i, w)| i * 64 + w.trailing_zeros() as usize)
}

/// Echelon basis keyed by lowest set bit.
struct Basis {
    by_pivot: Vec<Option<usize>>,
    vectors: Vec<Bits>,
}

impl Basis {
    fn new(bits: usize) -> Self {
        Basis {
            by_pivot: vec![None; bits],
            vectors: Vec::new(),
        }
    }

    /// Reduce `v` by the basis; returns the remainder's pivot if nonzero.
    fn reduce(&self, v: &mut Bits) -> Option<usize> {
        while let Some(p) = lowest(v) {
            match self.by_pivot[p] {
                Some(k) => {
                    for (a, b) in v.iter_mut().zip(&self.vectors[k]) {
                        *a ^= *b;
                    }
                }
                None => return Some(p),
            }
        }
        None
    }

    fn insert(&mut self, mut v: Bits) -> bool {
        match self.reduce(&mut v) {
            Some(p) => {
                self.by_pivot[p] = Some(self.vectors.len());
                self.vectors.push(v);
                true
            }
            None => false,
        }
    }

    fn rank(&self) -> usize {
        self.vectors.len()
    }
}

pub(crate) fn perceive(
    n: usize,
    bonds: &[Bond],
    nb: &Adj,
    smiles: &str,
) -> Result<RingInfo, MolError> {
    let bond_in_ring = ring_bonds(n, bonds, nb);
    let mut info = RingInfo {
        atom_rings: vec![0; n],
        atom_smallest: vec![0; n],
        atom_ring_bonds: vec![0; n],
        bond_rings: vec![0; bonds.len()],
        ..RingInfo::default()
    };
    let ring_bond_total = bond_in_ring.iter().filter(|r| **r).count();
    info.bond_in_ring = bond_in_ring;
    if ring_bond_total == 0 {
        return Ok(info);
    }
    // Ring systems: union-find over ring bonds.
    let mut parent: Vec<usize> = (0..n).collect();
    for (b, bond) in bonds.iter().enumerate() {
        if info.bond_in_ring[b] {
            let (x, y) = (
                find(&mut parent, bond.atoms[0]),
                find(&mut parent, bond.atoms[1]),
            );
            if x != y {
                parent[x] = y;
            }
            info.atom_ring_bonds[bond.atoms[0]] += 1;
            info.atom_ring_bonds[bond.atoms[1]] += 1;
        }
    }
    // Group atoms and bonds by system root.
    let mut system_of = vec![usize::MAX; n];
    let mut systems: Vec<(Vec<usize>, Vec<usize>)> = Vec::new();
    for a in 0..n {
        if info.atom_ring_bonds[a] == 0 {
            continue;
        }
        let r = find(&mut parent, a);
        if system_of[r] == usize::MAX {
            system_of[r] = systems.len();
            systems.push((Vec::new(), Vec::new()));
        }
        let s = system_of[r];
        systems[s].0.push(a);
    }
    for (b, bond) in bonds.iter().enumerate() {
        if info.bond_in_ring[b] {
            let r = find(&mut parent, bond.atoms[0]);
            systems[system_of[r]].1.push(b);
        }
    }
    for (atoms, sbonds) in &systems {
        let rank = sbonds.len() + 1 - atoms.len();
        info.sssr_count += rank;
        if rank == 1 {
            let ring = walk_simple_cycle(atoms, &info.bond_in_ring, nb);
            let rb = cycle_bonds(&ring, nb);
            info.rings.push(ring);
            info.ring_bonds.push(rb);
        } else {
            if atoms.len().saturating_mul(sbonds.len()) > MAX_SYSTEM_WORK {
                return Err(MolError::new(
                    super::ErrorKind::TooLarge,
                    format!(
                        "a ring system of {} atoms and {} ring bonds is too large to analyse",
                        atoms.len(),
                        sbonds.len()
                    ),
                    None,
                    smiles,
                ));
            }
            relevant_cycles(
                n,
                atoms,
                sbonds,
                rank,
                bonds,
                &info.bond_in_ring,
                nb,
                (&mut info.rings, &mut info.ring_bonds),
            );
        }
    }
    for (ring, rb) in info.rings.iter().zip(&info.ring_bonds) {
        let size = ring.len() as u16;
        for &a in ring {
            info.atom_rings[a] += 1;
            if info.atom_smallest[a] == 0 || size < info.atom_smallest[a] {
                info.atom_smallest[a] = size;
            }
        }
        for &b in rb {
            info.bond_rings[b] += 1;
        }
    }
    Ok(info)
}

/// Atoms of a single-cycle system in cycle order.
fn walk_simple_cycle(atoms: &[usize], in_ring: &[bool], nb: &Adj) -> Vec<usize> {
    let start = atoms[0];
    let mut ring = vec![start];
    let mut prev_bond = usize::MAX;
    let mut cur = start;
    loop {
        let next = nb
            .get(cur)
            .iter()
            .find(|x| in_ring[x.bond] && x.bond != prev_bond);
        match next {
            Some(x) if x.atom != start && ring.len() <= atoms.len() => {
                prev_bond = x.bond;
                cur = x.atom;
                ring.push(cur);
            }
            _ => break,
        }
    }
    ring
}

/// Bonds joining consecutive atoms of a cycle.
fn cycle_bonds(ring: &[usize], nb: &Adj) -> Vec<usize> {
    let mut out = Vec::with_capacity(ring.len());
    for i in 0..ring.len() {
        let (a, b) = (ring[i], ring[(i + 1) % ring.len()]);
        if let Some(x) = nb.get(a).iter().find(|x| x.atom == b) {
            out.push(x.bond);
        }
    }
    out
}

#[allow(clippy::too_many_arguments)]
fn relevant_cycles(
    n: usize,
    atoms: &[usize],
    sbonds: &[usize],
    rank: usize,
    bonds: &[Bond],
    in_ring: &[bool],
    nb: &Adj,
    out: (&mut Vec<Vec<usize>>, &mut Vec<Vec<usize>>),
) {
    const NONE: u32 = u32::MAX;
    let v = atoms.len();
    let mut local = vec![NONE; n];
    for (i, &a) in atoms.iter().enumerate() {
        local[a] = i as u32;
    }
    let mut local_bond = vec![NONE; bonds.len()];
    for (i, &b) in sbonds.iter().enumerate() {
        local_bond[b] = i as u32;
    }
    // BFS trees from every root: distance, parent atom, parent bond, branch.
    let mut dist = vec![NONE; v * v];
    let mut par = vec![NONE; v * v];
    let mut pbond = vec![NONE; v * v];
    let mut branch = vec![NONE; v * v];
    // Candidates: (length, root, bond)
    let mut cands: Vec<(u32, u32, u32)> = Vec::new();
    let mut queue = Vec::with_capacity(v);
    for r in 0..v {
        let base = r * v;
        dist[base + r] = 0;
        queue.clear();
        queue.push(r);
        let mut head = 0;
        while head < queue.len() {
            let x = queue[head];
            head += 1;
            for nbr in nb.get(atoms[x]) {
                if !in_ring[nbr.bond] {
                    continue;
                }
                let y = local[nbr.atom] as usize;
                if dist[base + y] == NONE {
                    dist[base + y] = dist[base + x] + 1;
                    par[base + y] = x as u32;
                    pbond[base + y] = nbr.bond as u32;
                    branch[base + y] = if x == r { y as u32 } else { branch[base + x] };
                    queue.push(y);
                }
            }
        }
        for &b in sbonds {
            let [ga, gb] = bonds[b].atoms;
            let (x, y) = (local[ga] as usize, local[gb] as usize);
            if pbond[base + x] == b as u32 || pbond[base + y] == b as u32 {
                continue;
            }
            let disjoint = x == r || y == r || branch[base + x] != branch[base + y];
            if disjoint {
                cands.push((dist[base + x] + dist[base + y] + 1, r as u32, b as u32));
            }
        }
    }
    cands.sort_unstable();
    let words = sbonds.len().div_ceil(64);
    let mut shorter = Basis::new(sbonds.len());
    let mut current = Basis::new(sbonds.len());
    let mut found: Vec<Bits> = Vec::new();
    let mut extra = 0usize;
    let mut i = 0;
    while i < cands.len() {
        let len = cands[i].0;
        let mut j = i;
        while j < cands.len() && cands[j].0 == len {
            j += 1;
        }
        if shorter.rank() == rank {
            break;
        }
        for &(_, r, b) in &cands[i..j] {
            let (r, b) = (r as usize, b as usize);
            let base = r * v;
            // Materialise the cycle: r .. x, y .. r.
            let [ga, gb] = bonds[b].atoms;
            let (x, y) = (local[ga] as usize, local[gb] as usize);
            let mut bits: Bits = vec![0; words];
            let mut set = |bond: usize| {
                if let Some(&k) = local_bond.get(bond) {
                    if k != NONE {
                        let k = k as usize;
                        bits[k / 64] ^= 1 << (k % 64);
                    }
                }
            };
            set(b);
            let mut path_x = vec![x];
            let mut c = x;
            while c != r {
                set(pbond[base + c] as usize);
                c = par[base + c] as usize;
                path_x.push(c);
            }
            let mut path_y = Vec::new();
            let mut c = y;
            while c != r {
                path_y.push(c);
                set(pbond[base + c] as usize);
                c = par[base + c] as usize;
            }
            let mut reduced = bits.clone();
            if shorter.reduce(&mut reduced).is_none() {
                continue; // a sum of shorter cycles: not relevant
            }
            if found.contains(&bits) {
                continue;
            }
            let independent = current.insert(bits.clone());
            if !independent {
                if extra >= EXTRA_RELEVANT_LIMIT {
                    continue;
                }
                extra += 1;
            }
            found.push(bits);
            // Atom order: r .. x then y .. (child of r).
            path_x.reverse();
            let mut ring: Vec<usize> = path_x.iter().map(|&l| atoms[l]).collect();
            ring.extend(path_y.iter().map(|&l| atoms[l]));
            let rb = cycle_bonds(&ring, nb);
            out.0.push(ring);
            out.1.push(rb);
        }
        for vct in &current.vectors[shorter.rank()..] {
            shorter.insert(vct.clone());
        }
        i = j;
    }
}
