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

    fn reserve(&mut self, rings: usize, atoms: usize) {
        self.start.reserve(rings + 1);
        self.atoms.reserve(atoms);
        self.bonds.reserve(atoms);
    }

    pub fn atoms(&self, r: usize) -> &[usize] {
        &self.atoms[self.start[r] as usize..self.start[r + 1] as usize]
    }

    pub fn bonds(&self, r: usize) -> &[usize] {
        &self.bonds[self.start[r] as usize..self.start[r + 1] as usize]
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
    /// The rings (relevant cycles).
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
    /// Cycle rank (SSSR size): bonds - atoms + components.
    pub sssr_count: usize,
}

/// Mark bridges with an iterative Tarjan low-link search. Returns
/// `in_ring` per bond.
fn ring_bonds(n: usize, bonds: &[Bond], nb: &Adj) -> Vec<bool> {
    let mut in_ring = vec![true; bonds.len()];
    if bonds.is_empty() {
        return in_ring;
    }
    // disc 0 = not visited; times start at 1.
    let mut disc = vec![0u32; n];
    let mut low = vec![0u32; n];
    let mut time = 0u32;
    // (atom, bond used to enter, next adjacency position, end position)
    let mut stack: Vec<(u32, u32, u32, u32)> = Vec::with_capacity(n);
    for root in 0..n {
        if disc[root] != 0 || nb.start[root] == nb.start[root + 1] {
            continue;
        }
        time += 1;
        disc[root] = time;
        low[root] = time;
        stack.push((root as u32, u32::MAX, nb.start[root], nb.start[root + 1]));
        while let Some(top) = stack.last_mut() {
            let (v, via, pos, end) = *top;
            let v = v as usize;
            if pos < end {
                top.2 += 1;
                let Neighbor { atom: w, bond: b } = nb.list[pos as usize];
                if b as u32 == via {
                    continue;
                }
                if disc[w] == 0 {
                    time += 1;
                    disc[w] = time;
                    low[w] = time;
                    stack.push((w as u32, b as u32, nb.start[w], nb.start[w + 1]));
                } else if disc[w] < low[v] {
                    low[v] = disc[w];
                }
            } else {
                stack.pop();
                if let Some(&(parent, _, _, _)) = stack.last() {
                    let parent = parent as usize;
                    if low[v] < low[parent] {
                        low[parent] = low[v];
                    }
                    if low[v] > disc[parent] {
                        in_ring[via as usize] = false;
                    }
                }
            }
        }
    }
    in_ring
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
    for (b, bond) in bonds.iter().enumerate() {
        if info.bond_in_ring[b] {
            info.atom_ring_bonds[bond.atoms[0]] += 1;
            info.atom_ring_bonds[bond.atoms[1]] += 1;
        }
    }
    // Ring systems: breadth-first over ring bonds; `sys_atoms` lists the
    // atoms system by system, `atom_off` where each system starts.
    let mut label = vec![u32::MAX; n];
    let mut sys_atoms: Vec<usize> = Vec::with_capacity(n);
    let mut atom_off: Vec<usize> = vec![0];
    for a in 0..n {
        if info.atom_ring_bonds[a] == 0 || label[a] != u32::MAX {
            continue;
        }
        let k = (atom_off.len() - 1) as u32;
        label[a] = k;
        let mut head = sys_atoms.len();
        sys_atoms.push(a);
        while head < sys_atoms.len() {
            let v = sys_atoms[head];
            head += 1;
            for x in nb.get(v) {
                if info.bond_in_ring[x.bond] && label[x.atom] == u32::MAX {
                    label[x.atom] = k;
                    sys_atoms.push(x.atom);
                }
            }
        }
        atom_off.push(sys_atoms.len());
    }
    let n_systems = atom_off.len() - 1;
    let ring_atom_total = sys_atoms.len();
    // Ring bonds grouped the same way (counting sort by system).
    let mut bond_off = vec![0usize; n_systems + 1];
    for (b, bond) in bonds.iter().enumerate() {
        if info.bond_in_ring[b] {
            bond_off[label[bond.atoms[0]] as usize + 1] += 1;
        }
    }
    for k in 0..n_systems {
        bond_off[k + 1] += bond_off[k];
    }
    let mut sys_bonds = vec![0usize; ring_bond_total];
    {
        let mut cursor = bond_off.clone();
        for (b, bond) in bonds.iter().enumerate() {
            if info.bond_in_ring[b] {
                let k = label[bond.atoms[0]] as usize;
                sys_bonds[cursor[k]] = b;
                cursor[k] += 1;
            }
        }
    }
    info.list.reserve(n_systems * 2, ring_atom_total * 2);
    for k in 0..n_systems {
        let atoms = &sys_atoms[atom_off[k]..atom_off[k + 1]];
        let sbonds = &sys_bonds[bond_off[k]..bond_off[k + 1]];
        let rank = sbonds.len() + 1 - atoms.len();
        info.sssr_count += rank;
        if rank == 1 {
            // A single ring: walk it from its first atom.
            let (start, in_ring) = (atoms[0], &info.bond_in_ring);
            let mut prev_bond = usize::MAX;
            let mut cur = start;
            let mut steps = 0;
            let walk = std::iter::from_fn(|| {
                if steps > atoms.len() {
                    return None;
                }
                let here = cur;
                if steps > 0 && here == start {
                    return None;
                }
                steps += 1;
                if let Some(x) = nb
                    .get(cur)
                    .iter()
                    .find(|x| in_ring[x.bond] && x.bond != prev_bond)
                {
                    prev_bond = x.bond;
                    cur = x.atom;
                }
                Some(here)
            });
            info.list.push(walk, nb);
        } else if rank == 2
            && two_ring_system(
                atoms,
                &info.atom_ring_bonds,
                &info.bond_in_ring,
                nb,
                &mut info.list,
            )
        {
            // bicyclic system handled directly
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
                &mut info.list,
            );
        }
    }
    for r in 0..info.list.len() {
        let (ring, rb) = (info.list.atoms(r), info.list.bonds(r));
        let size = ring.len() as u16;
        for &a in ring {
            info.atom_rings[a] += 1;
            if info.atom_smallest[a] == 0 || size < info.atom_smallest[a] {
                info.atom_smallest[a] = size;
            }
        }
        for &b in rb {
            if let Some(c) = info.bond_rings.get_mut(b) {
                *c += 1;
            }
        }
    }
    Ok(info)
}

/// Follow a chain of two-connected ring atoms from bond `first` until an
/// atom with more ring bonds, appending the atoms after the start to `out`.
/// Returns the bond by which the last atom was reached.
fn follow_chain(
    first: Neighbor,
    ring_degree: &[u8],
    in_ring: &[bool],
    nb: &Adj,
    limit: usize,
    out: &mut Vec<usize>,
) -> usize {
    out.push(first.atom);
    let mut cur = first.atom;
    let mut via = first.bond;
    let mut steps = 0;
    while ring_degree[cur] == 2 && steps <= limit {
        let Some(next) = nb
            .get(cur)
            .iter()
            .find(|x| in_ring[x.bond] && x.bond != via)
        else {
            break;
        };
        via = next.bond;
        cur = next.atom;
        out.push(cur);
        steps += 1;
    }
    via
}

/// Rings of a system of cycle rank 2: three paths between two branch atoms
/// (fused or bridged bicycle) or two loops at one atom (spiro). Relevant
/// cycles: with path lengths l1 <= l2 <= l3 the rings p1+p2 and p1+p3, and
/// p2+p3 too when l1 == l2 (bicyclo[2.2.2]octane). Returns false for any
/// other shape (left to the general method).
fn two_ring_system(
    atoms: &[usize],
    ring_degree: &[u8],
    in_ring: &[bool],
    nb: &Adj,
    out: &mut RingList,
) -> bool {
    let mut branch = [usize::MAX; 2];
    let mut n_branch = 0;
    for &a in atoms {
        if ring_degree[a] > 2 {
            if n_branch == 2 {
                return false;
            }
            branch[n_branch] = a;
            n_branch += 1;
        }
    }
    let limit = atoms.len();
    let mut buf: Vec<usize> = Vec::with_capacity(atoms.len() + 4);
    if n_branch == 2 && ring_degree[branch[0]] == 3 && ring_degree[branch[1]] == 3 {
        let (a, b) = (branch[0], branch[1]);
        // Paths as ranges of `buf`, each ending at b.
        let mut paths = [(0usize, 0usize); 3];
        let mut k = 0;
        for &x in nb.get(a).iter().filter(|x| in_ring[x.bond]) {
            if k == 3 {
                return false;
            }
            let from = buf.len();
            follow_chain(x, ring_degree, in_ring, nb, limit, &mut buf);
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
    } else if n_branch == 1 && ring_degree[branch[0]] == 4 {
        let c = branch[0];
        let mut closing = [usize::MAX; 2];
        let mut k = 0;
        for &x in nb.get(c).iter().filter(|x| in_ring[x.bond]) {
            if closing.contains(&x.bond) {
                continue;
            }
            if k == 2 {
                return false;
            }
            buf.clear();
            let last = follow_chain(x, ring_degree, in_ring, nb, limit, &mut buf);
            if buf.last() != Some(&c) {
                return false;
            }
            closing[k] = last;
            k += 1;
            out.push(
                std::iter::once(c).chain(buf[..buf.len() - 1].iter().copied()),
                nb,
            );
        }
        true
    } else {
        false
    }
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
    out: &mut RingList,
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
    let mut seen_keys: Vec<u64> = Vec::new();
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
            let [ga, gb] = bonds[b].atoms;
            let (x, y) = (local[ga] as usize, local[gb] as usize);
            // Cheap identity of the cycle (xor of mixed bond numbers) to skip
            // the copies found from its other atoms before materialising it.
            let mix = |bond: u32| {
                (bond as u64 + 1)
                    .wrapping_mul(0x9E37_79B9_7F4A_7C15)
                    .rotate_left(17)
            };
            let mut key = mix(b as u32);
            for start in [x, y] {
                let mut c = start;
                while c != r {
                    key ^= mix(pbond[base + c]);
                    c = par[base + c] as usize;
                }
            }
            if seen_keys.contains(&key) {
                continue;
            }
            seen_keys.push(key);
            // Materialise the cycle: r .. x, y .. r.
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
            let ring = path_x.iter().chain(path_y.iter()).map(|&l| atoms[l]);
            out.push(ring, nb);
        }
        for vct in &current.vectors[shorter.rank()..] {
            shorter.insert(vct.clone());
        }
        i = j;
    }
}
