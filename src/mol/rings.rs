//! Ring perception: the one ring set of the crate, used by aromaticity, by
//! the ring accessors of [`super::Molecule`] and by the SMARTS ring
//! primitives (`R n`, `r n`, `x n`, `@`).
//!
//! Dative bonds (donor to metal) can be left out (`skip`), as RDKit leaves
//! them out of its ring information. Biconnected blocks are found with an
//! iterative depth-first search with an edge stack (so no input can make it
//! recurse deeply); a ring bond is a bond in a block of more than one bond.
//! The ring set splits exactly over the blocks, so each block is handled
//! apart:
//!
//! * cycle rank 1: the block is one ring;
//! * cycle rank 2: three paths between two atoms (a fused or bridged
//!   bicycle); with path lengths l1 <= l2 <= l3 the rings are p1+p2 and
//!   p1+p3, and p2+p3 too when l1 == l2 (bicyclo\[2.2.2\]octane: 3 rings);
//! * higher rank: a smallest set of smallest rings (SSSR), then
//!   symmetrised the way RDKit's ring information is.
//!
//! The SSSR: for every root atom a breadth-first tree over the block; each
//! non-tree bond whose two tree paths meet only at the root closes a
//! candidate cycle (Horton). Candidates are taken shortest first (roots in
//! ascending atom order, then tree order) while independent over GF(2) of
//! those already taken, until the cycle rank is reached.
//!
//! Symmetrisation (the effect of RDKit's `symmetrizeSSSR`, restated): a
//! further cycle joins the set when it has the size of a chosen ring and
//! contains every bond that only that chosen ring provides; when every bond
//! of the chosen ring is shared with other chosen rings, a cycle of its size
//! joins when it is independent of those other rings (it could replace the
//! chosen one in the basis). Cubane gets six four-membered rings,
//! hexaprismane its two hexagons (not the six-cycles around two adjacent
//! squares), bicyclo\[2.2.2\]octane three six-membered rings and the
//! para-cyclophane macrocycle
//! `C1=Nc2ccc(cc2)N=Cc2ccc(cc2)OCc2cccc(n2)COc2ccc1cc2` its 4 benzene
//! rings and 8 equivalent 23-membered rings, as in RDKit 2026.09 (issue 3).
//! The union of all minimum cycle bases (relevant cycles), used before,
//! gives that macrocycle 16 large rings and each of its ring atoms one ring
//! too many or more.
//!
//! The search for equivalent cycles is a bounded depth-first search
//! ([`CYCLE_STEP_LIMIT`] steps per bond, [`BLOCK_STEP_LIMIT`] per block);
//! only pathological cages can reach the bound, and then some equivalent
//! rings are missing. The SSSR size (cycle rank) is kept separately.

use super::{Adj, Bond, MolError, Neighbor};
use std::collections::HashSet;

mod sssr;
use sssr::symmetrised_sssr;

/// Ring blocks larger than this (atoms × bonds of one block, cycle rank 3
/// or more) are refused as too large: candidate generation is quadratic in
/// the block size.
pub(crate) const MAX_SYSTEM_WORK: usize = 4_000_000;

/// Most search steps spent looking for the cycles of one size through one
/// bond (symmetrisation).
const CYCLE_STEP_LIMIT: usize = 200_000;

/// Most search steps spent on the equivalent rings of one block.
const BLOCK_STEP_LIMIT: usize = 2_000_000;

const NONE: u32 = u32::MAX;

/// Rings stored flat: ring `r` is `atoms[atom_start[r]..atom_start[r+1]]`
/// in cycle order, with its bonds in the same way.
#[derive(Debug, Clone, Default)]
pub(crate) struct RingList {
    start: Vec<u32>,
    atoms: Vec<usize>,
    bonds: Vec<usize>,
}

impl RingList {
    pub fn len(&self) -> usize {
        self.start.len().saturating_sub(1)
    }

    pub fn is_empty(&self) -> bool {
        self.len() == 0
    }

    pub fn atoms(&self, r: usize) -> &[usize] {
        &self.atoms[self.start[r] as usize..self.start[r + 1] as usize]
    }

    pub fn bonds(&self, r: usize) -> &[usize] {
        &self.bonds[self.start[r] as usize..self.start[r + 1] as usize]
    }

    fn reserve(&mut self, rings: usize, atoms: usize) {
        self.start.reserve(rings + 1);
        self.atoms.reserve(atoms);
        self.bonds.reserve(atoms);
    }

    /// Push a ring whose bonds are known (bond k joins atoms k and k+1).
    fn push_known(&mut self, atoms: &[usize], bonds: &[usize]) {
        if self.start.is_empty() {
            self.start.push(0);
        }
        self.atoms.extend_from_slice(atoms);
        self.bonds.extend_from_slice(bonds);
        let to = self.atoms.len();
        self.bonds.resize(to, usize::MAX);
        self.start.push(to as u32);
    }

    fn push(&mut self, atoms: impl IntoIterator<Item = usize>, nb: &Adj) {
        if self.start.is_empty() {
            self.start.push(0);
        }
        let from = self.atoms.len();
        self.atoms.extend(atoms);
        let to = self.atoms.len();
        for i in from..to {
            let (a, b) = (
                self.atoms[i],
                self.atoms[if i + 1 < to { i + 1 } else { from }],
            );
            if let Some(x) = nb.get(a).iter().find(|x| x.atom == b) {
                self.bonds.push(x.bond);
            }
        }
        // Keep bonds aligned with atoms even if a bond were missing.
        self.bonds.resize(to, usize::MAX);
        self.start.push(to as u32);
    }
}

#[derive(Debug, Clone, Default)]
pub(crate) struct RingInfo {
    /// The rings (symmetrised SSSR).
    pub list: RingList,
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
    /// Cycle rank (SSSR size): ring bonds - ring atoms + ring blocks.
    pub sssr_count: usize,
}

/// Biconnected blocks of more than one bond: `block[b]` is the block of
/// bond `b` (NONE for bridges and skipped bonds); block `k` has the bonds
/// `edges[start[k]..start[k + 1]]`.
struct Blocks {
    block: Vec<u32>,
    edges: Vec<usize>,
    start: Vec<usize>,
}

/// Buffers of the ring perception, kept from one molecule to the next on
/// the same thread (every use clears or refills them first), so that an
/// ordinary molecule allocates only the ring information it returns.
#[derive(Default)]
struct Work {
    block: Vec<u32>,
    edges: Vec<usize>,
    start: Vec<usize>,
    disc: Vec<u32>,
    low: Vec<u32>,
    edge_stack: Vec<usize>,
    stack: Vec<(u32, u32, u32, u32)>,
    local: Vec<u32>,
    degree: Vec<u32>,
    local_bond: Vec<u32>,
    atoms: Vec<usize>,
    ring: Vec<usize>,
    ring_bonds: Vec<usize>,
}

thread_local! {
    static WORK: std::cell::Cell<Option<Box<Work>>> = const { std::cell::Cell::new(None) };
}

/// This thread's buffers (fresh ones if they are in use or gone).
fn take_work() -> Box<Work> {
    WORK.try_with(|c| c.take())
        .ok()
        .flatten()
        .unwrap_or_default()
}

/// Hand the buffers back for the next molecule.
fn give_work(w: Box<Work>) {
    let _ = WORK.try_with(|c| c.set(Some(w)));
}

/// `v` emptied and refilled with `len` copies of `value`.
fn refill<T: Copy>(mut v: Vec<T>, len: usize, value: T) -> Vec<T> {
    v.clear();
    v.resize(len, value);
    v
}

/// Iterative Tarjan search with an edge stack.
fn blocks(n: usize, n_bonds: usize, nb: &Adj, skip: &[bool], w: &mut Work) -> Blocks {
    let mut out = Blocks {
        block: refill(std::mem::take(&mut w.block), n_bonds, NONE),
        edges: std::mem::take(&mut w.edges),
        start: std::mem::take(&mut w.start),
    };
    out.edges.clear();
    out.start.clear();
    out.start.push(0);
    let skipped = |b: usize| skip.get(b).copied().unwrap_or(false);
    // disc 0 = not visited; times start at 1.
    let mut disc = refill(std::mem::take(&mut w.disc), n, 0u32);
    let mut low = refill(std::mem::take(&mut w.low), n, 0u32);
    let mut time = 0u32;
    let mut edge_stack: Vec<usize> = std::mem::take(&mut w.edge_stack);
    edge_stack.clear();
    // (atom, bond used to enter, next adjacency position, end position)
    let mut stack: Vec<(u32, u32, u32, u32)> = std::mem::take(&mut w.stack);
    stack.clear();
    for root in 0..n {
        if disc[root] != 0 || nb.start[root] == nb.start[root + 1] {
            continue;
        }
        time += 1;
        disc[root] = time;
        low[root] = time;
        stack.push((root as u32, NONE, nb.start[root], nb.start[root + 1]));
        while let Some(top) = stack.last_mut() {
            let (v, via, pos, end) = *top;
            let v = v as usize;
            if pos < end {
                top.2 += 1;
                let Neighbor { atom: w, bond: b } = nb.list[pos as usize];
                if b as u32 == via || skipped(b) {
                    continue;
                }
                if disc[w] == 0 {
                    edge_stack.push(b);
                    time += 1;
                    disc[w] = time;
                    low[w] = time;
                    stack.push((w as u32, b as u32, nb.start[w], nb.start[w + 1]));
                } else if disc[w] < disc[v] {
                    edge_stack.push(b);
                    if disc[w] < low[v] {
                        low[v] = disc[w];
                    }
                }
            } else {
                stack.pop();
                if let Some(&(parent, _, _, _)) = stack.last() {
                    let parent = parent as usize;
                    if low[v] < low[parent] {
                        low[parent] = low[v];
                    }
                    if low[v] >= disc[parent] {
                        // Bonds above `via` on the stack, and `via`, form a
                        // block.
                        let from = out.edges.len();
                        while let Some(e) = edge_stack.pop() {
                            out.edges.push(e);
                            if e as u32 == via {
                                break;
                            }
                        }
                        if out.edges.len() - from < 2 {
                            out.edges.truncate(from); // a bridge
                        } else {
                            let k = (out.start.len() - 1) as u32;
                            for &e in &out.edges[from..] {
                                out.block[e] = k;
                            }
                            out.start.push(out.edges.len());
                        }
                    }
                }
            }
        }
    }
    w.disc = disc;
    w.low = low;
    w.edge_stack = edge_stack;
    w.stack = stack;
    out
}

/// Scratch space shared by the blocks of one molecule.
struct Scratch {
    /// Per atom: local index in the current block (NONE outside it).
    local: Vec<u32>,
    /// Per atom: number of bonds of the current block at it.
    degree: Vec<u32>,
    /// Per bond: local index in the current block (NONE outside it).
    local_bond: Vec<u32>,
}

/// Perceive the rings of a molecule with `n` atoms, leaving out the bonds
/// marked in `skip` (may be shorter than `bonds`; missing entries are
/// false).
pub(crate) fn perceive(
    n: usize,
    bonds: &[Bond],
    nb: &Adj,
    skip: &[bool],
    smiles: &str,
) -> Result<RingInfo, MolError> {
    let mut w = take_work();
    let blocks = blocks(n, bonds.len(), nb, skip, &mut w);
    let mut info = RingInfo {
        atom_rings: vec![0; n],
        atom_smallest: vec![0; n],
        atom_ring_bonds: vec![0; n],
        bond_in_ring: blocks.block.iter().map(|&k| k != NONE).collect(),
        bond_rings: vec![0; bonds.len()],
        ..RingInfo::default()
    };
    let n_blocks = blocks.start.len() - 1;
    if n_blocks == 0 {
        (w.block, w.edges, w.start) = (blocks.block, blocks.edges, blocks.start);
        give_work(w);
        return Ok(info);
    }
    for &b in &blocks.edges {
        let [x, y] = bonds[b].atoms;
        info.atom_ring_bonds[x] = info.atom_ring_bonds[x].saturating_add(1);
        info.atom_ring_bonds[y] = info.atom_ring_bonds[y].saturating_add(1);
    }
    let mut local_bond = std::mem::take(&mut w.local_bond);
    local_bond.clear();
    let mut scratch = Scratch {
        local: refill(std::mem::take(&mut w.local), n, NONE),
        degree: refill(std::mem::take(&mut w.degree), n, 0),
        local_bond,
    };
    let mut atoms: Vec<usize> = std::mem::take(&mut w.atoms);
    let mut ring: Vec<usize> = std::mem::take(&mut w.ring);
    let mut ring_bonds: Vec<usize> = std::mem::take(&mut w.ring_bonds);
    atoms.clear();
    info.list.reserve(n_blocks * 2, blocks.edges.len() * 2);
    for k in 0..n_blocks {
        let edges = &blocks.edges[blocks.start[k]..blocks.start[k + 1]];
        atoms.clear();
        for &b in edges {
            for a in bonds[b].atoms {
                if scratch.degree[a] == 0 {
                    atoms.push(a);
                }
                scratch.degree[a] += 1;
            }
        }
        let rank = edges.len() + 1 - atoms.len();
        info.sssr_count += rank;
        let in_block = |b: usize| blocks.block.get(b) == Some(&(k as u32));
        if rank == 1 {
            // A single ring: walk it from its first atom.
            let start = atoms[0];
            ring.clear();
            ring_bonds.clear();
            let (mut cur, mut via) = (start, usize::MAX);
            let mut closed = false;
            while ring.len() < atoms.len() {
                ring.push(cur);
                match nb
                    .get(cur)
                    .iter()
                    .find(|x| in_block(x.bond) && x.bond != via)
                {
                    Some(x) => {
                        ring_bonds.push(x.bond);
                        if x.atom == start {
                            closed = true;
                            break;
                        }
                        via = x.bond;
                        cur = x.atom;
                    }
                    None => break,
                }
            }
            if closed && ring_bonds.len() == ring.len() {
                info.list.push_known(&ring, &ring_bonds);
            } else {
                info.list.push(ring.iter().copied(), nb);
            }
        } else if rank == 2 && theta(&atoms, &scratch.degree, &in_block, nb, &mut info.list) {
            // bicyclic block handled directly
        } else {
            if atoms.len().saturating_mul(edges.len()) > MAX_SYSTEM_WORK {
                return Err(MolError::new(
                    super::ErrorKind::TooLarge,
                    format!(
                        "a ring system of {} atoms and {} ring bonds is too large to analyse",
                        atoms.len(),
                        edges.len()
                    ),
                    None,
                    smiles,
                ));
            }
            atoms.sort_unstable();
            if scratch.local_bond.is_empty() {
                scratch.local_bond.resize(bonds.len(), NONE);
            }
            for (i, &a) in atoms.iter().enumerate() {
                scratch.local[a] = i as u32;
            }
            for (i, &b) in edges.iter().enumerate() {
                scratch.local_bond[b] = i as u32;
            }
            symmetrised_sssr(&atoms, edges, rank, bonds, nb, &scratch, &mut info.list);
            for &a in atoms.iter() {
                scratch.local[a] = NONE;
            }
            for &b in edges {
                scratch.local_bond[b] = NONE;
            }
        }
        for &a in atoms.iter() {
            scratch.degree[a] = 0;
        }
    }
    for r in 0..info.list.len() {
        let (ring, rb) = (info.list.atoms(r), info.list.bonds(r));
        let size = ring.len().min(u16::MAX as usize) as u16;
        for &a in ring {
            info.atom_rings[a] = info.atom_rings[a].saturating_add(1);
            if info.atom_smallest[a] == 0 || size < info.atom_smallest[a] {
                info.atom_smallest[a] = size;
            }
        }
        for &b in rb {
            if let Some(c) = info.bond_rings.get_mut(b) {
                *c = c.saturating_add(1);
            }
        }
    }
    (w.block, w.edges, w.start) = (blocks.block, blocks.edges, blocks.start);
    (w.local, w.degree, w.local_bond) = (scratch.local, scratch.degree, scratch.local_bond);
    (w.atoms, w.ring, w.ring_bonds) = (atoms, ring, ring_bonds);
    give_work(w);
    Ok(info)
}

/// Follow a chain of atoms with two block bonds from `first` until an atom
/// with more, appending the atoms after the start to `out`.
fn follow_chain(
    first: Neighbor,
    degree: &[u32],
    in_block: &impl Fn(usize) -> bool,
    nb: &Adj,
    limit: usize,
    out: &mut Vec<usize>,
) {
    out.push(first.atom);
    let mut cur = first.atom;
    let mut via = first.bond;
    let mut steps = 0;
    while degree[cur] == 2 && steps <= limit {
        let Some(next) = nb
            .get(cur)
            .iter()
            .find(|x| in_block(x.bond) && x.bond != via)
        else {
            break;
        };
        via = next.bond;
        cur = next.atom;
        out.push(cur);
        steps += 1;
    }
}

/// Rings of a block of cycle rank 2: three paths between two atoms. With
/// path lengths l1 <= l2 <= l3 the rings p1+p2 and p1+p3, and p2+p3 too
/// when l1 == l2 (the symmetrised SSSR). Returns false for any other shape
/// (left to the general method).
fn theta(
    atoms: &[usize],
    degree: &[u32],
    in_block: &impl Fn(usize) -> bool,
    nb: &Adj,
    out: &mut RingList,
) -> bool {
    let mut branch = [usize::MAX; 2];
    let mut n_branch = 0;
    for &a in atoms {
        if degree[a] > 2 {
            if n_branch == 2 || degree[a] != 3 {
                return false;
            }
            branch[n_branch] = a;
            n_branch += 1;
        }
    }
    if n_branch != 2 {
        return false;
    }
    let (a, b) = (branch[0], branch[1]);
    let mut buf: Vec<usize> = Vec::with_capacity(atoms.len() + 4);
    // Paths as ranges of `buf`, each ending at b.
    let mut paths = [(0usize, 0usize); 3];
    let mut k = 0;
    for &x in nb.get(a).iter().filter(|x| in_block(x.bond)) {
        if k == 3 {
            return false;
        }
        let from = buf.len();
        follow_chain(x, degree, in_block, nb, atoms.len(), &mut buf);
        if buf.last() != Some(&b) {
            return false;
        }
        paths[k] = (from, buf.len());
        k += 1;
    }
    if k != 3 {
        return false;
    }
    paths.sort_by_key(|p| p.1 - p.0);
    let len = |p: (usize, usize)| p.1 - p.0;
    let mut pairs = [(0, 1), (0, 2), (1, 2)].as_slice();
    if len(paths[0]) != len(paths[1]) {
        pairs = &pairs[..2];
    }
    for &(i, j) in pairs {
        // a, path i (ending at b), then path j reversed back towards a.
        let (pi, pj) = (paths[i], paths[j]);
        let ring = std::iter::once(a)
            .chain(buf[pi.0..pi.1].iter().copied())
            .chain(buf[pj.0..pj.1].iter().rev().skip(1).copied());
        out.push(ring, nb);
    }
    true
}
