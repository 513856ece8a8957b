//! Ring perception for matching: ring bonds (bonds that are not bridges),
//! and a smallest set of smallest rings "symmetrised" the way RDKit's ring
//! information is (rings of the same size that are interchangeable in the
//! basis are all kept, so cubane has six four-membered rings).
//!
//! The molecule core may perceive rings too; this private copy keeps the
//! SMARTS primitives `R`, `r`, `x` and `@` on exactly the ring set RDKit
//! uses, which the reference checks compare against.

use crate::mol::Molecule;

/// Ring information per atom and bond.
pub(crate) struct Adj<'a>(pub &'a Molecule);

impl Adj<'_> {
    fn len(&self) -> usize {
        self.0.atoms.len()
    }
    fn edge_count(&self) -> usize {
        self.0.bonds.len()
    }
    fn degree(&self, a: usize) -> usize {
        self.0.neighbors(a).len()
    }
    /// Dative bonds (to metals) take no part in rings, as in RDKit.
    fn dative(&self, b: usize) -> bool {
        self.0.dative_donor(b).is_some()
    }
    fn nth(&self, a: usize, i: usize) -> (usize, usize) {
        self.0
            .neighbors(a)
            .get(i)
            .map_or((a, usize::MAX), |n| (n.atom, n.bond))
    }
    fn of(&self, a: usize) -> impl Iterator<Item = (usize, usize)> + '_ {
        self.0
            .neighbors(a)
            .iter()
            .filter(|n| !self.dative(n.bond))
            .map(|n| (n.atom, n.bond))
    }
}

#[derive(Debug, Clone)]
pub(crate) struct Rings {
    pub atom_rings: Vec<u8>,
    pub atom_min_ring: Vec<u8>,
    pub count: usize,
}

/// Ring systems larger than this (vertices × edges; about 450 atoms in one
/// fused system) get an approximate
/// ring set (one ring per atom, smallest ring by breadth-first search)
/// instead of the full basis, so hostile input cannot make perception slow.
const EXACT_LIMIT: usize = 250_000;

/// Ring bonds only (cheap): bonds that are not bridges.
pub(crate) fn ring_bonds(adj: &Adj) -> Vec<bool> {
    let n = adj.len();
    let mut ring = vec![false; adj.edge_count()];
    if adj.edge_count() < n && is_forest(n, adj) {
        return ring;
    }
    mark_ring_bonds(n, adj, &mut ring);
    ring
}

/// The symmetrised SSSR, given the ring bonds.
pub(crate) fn perceive(adj: &Adj, bond_in_ring: &[bool]) -> Rings {
    let n = adj.len();
    let mut out = Rings {
        atom_rings: vec![0; n],
        atom_min_ring: vec![0; n],
        count: 0,
    };
    if !bond_in_ring.iter().any(|&r| r) {
        return out;
    }
    // Blocks (biconnected components): the ring set splits over them
    // exactly, so spiro-joined and bridge-linked rings are handled apart.
    let blocks = blocks(adj);
    for edges in blocks.iter().filter(|b| b.len() >= 2) {
        let mut in_block = vec![false; bond_in_ring.len()];
        let mut atoms: Vec<usize> = Vec::with_capacity(edges.len());
        for &b in edges {
            if let Some(f) = in_block.get_mut(b) {
                *f = true;
            }
        }
        for a in 0..n {
            if adj.of(a).any(|(_, b)| in_block.get(b) == Some(&true)) {
                atoms.push(a);
            }
        }
        ring_system(&atoms, adj, &in_block, &mut out);
    }
    out
}

/// Edge sets of the biconnected components, by an iterative depth-first
/// search with an edge stack (a bridge is a component of one edge).
fn blocks(adj: &Adj) -> Vec<Vec<usize>> {
    let n = adj.len();
    let mut disc = vec![usize::MAX; n];
    let mut low = vec![0usize; n];
    let mut time = 0;
    let mut edge_stack: Vec<usize> = Vec::new();
    let mut out: Vec<Vec<usize>> = Vec::new();
    for root in 0..n {
        if disc[root] != usize::MAX {
            continue;
        }
        disc[root] = time;
        low[root] = time;
        time += 1;
        // Frame: (atom, bond used to enter, next neighbour index)
        let mut stack: Vec<(usize, usize, usize)> = vec![(root, usize::MAX, 0)];
        while let Some(frame) = stack.last_mut() {
            let (a, via, i) = *frame;
            if i < adj.degree(a) {
                frame.2 += 1;
                let (x, b) = adj.nth(a, i);
                if b == via || x >= n || adj.dative(b) {
                    continue;
                }
                if disc[x] == usize::MAX {
                    edge_stack.push(b);
                    disc[x] = time;
                    low[x] = time;
                    time += 1;
                    stack.push((x, b, 0));
                } else if disc[x] < disc[a] {
                    edge_stack.push(b);
                    low[a] = low[a].min(disc[x]);
                }
            } else {
                stack.pop();
                if let Some(&(p, _, _)) = stack.last() {
                    low[p] = low[p].min(low[a]);
                    if low[a] >= disc[p] {
                        let mut block = Vec::new();
                        while let Some(e) = edge_stack.pop() {
                            block.push(e);
                            if e == via {
                                break;
                            }
                        }
                        out.push(block);
                    }
                }
            }
        }
    }
    out
}

fn is_forest(n: usize, adj: &Adj) -> bool {
    let mut seen = vec![false; n];
    for s in 0..n {
        if seen[s] {
            continue;
        }
        seen[s] = true;
        // (atom, bond used to reach it)
        let mut stack = vec![(s, usize::MAX)];
        while let Some((a, via)) = stack.pop() {
            for (x, b) in adj.of(a) {
                if b == via {
                    continue;
                }
                if seen[x] {
                    return false;
                }
                seen[x] = true;
                stack.push((x, b));
            }
        }
    }
    true
}

/// Bridges by iterative depth-first search with low-links; every other
/// bond is a ring bond.
fn mark_ring_bonds(n: usize, adj: &Adj, ring: &mut [bool]) {
    let mut disc = vec![usize::MAX; n];
    let mut low = vec![0usize; n];
    let mut time = 0;
    for root in 0..n {
        if disc[root] != usize::MAX {
            continue;
        }
        // Frame: (atom, bond used to enter, next neighbour index)
        let mut stack: Vec<(usize, usize, usize)> = vec![(root, usize::MAX, 0)];
        disc[root] = time;
        low[root] = time;
        time += 1;
        while let Some(frame) = stack.last_mut() {
            let (a, via, i) = *frame;
            if i < adj.degree(a) {
                frame.2 += 1;
                let (x, b) = adj.nth(a, i);
                if b == via || adj.dative(b) {
                    continue;
                }
                if disc[x] == usize::MAX {
                    disc[x] = time;
                    low[x] = time;
                    time += 1;
                    stack.push((x, b, 0));
                } else {
                    // A back edge closes a cycle.
                    low[a] = low[a].min(disc[x]);
                    if let Some(r) = ring.get_mut(b) {
                        *r = true;
                    }
                }
            } else {
                stack.pop();
                if let Some(&(p, _, _)) = stack.last() {
                    low[p] = low[p].min(low[a]);
                    if low[a] <= disc[p] {
                        // Not a bridge: the subtree at `a` reaches back.
                        if let Some(r) = ring.get_mut(via) {
                            *r = true;
                        }
                    }
                }
            }
        }
    }
}

type Bits = Vec<u64>;

fn bit_set(b: &mut Bits, i: usize) {
    b[i / 64] |= 1 << (i % 64);
}

fn xor_into(a: &mut Bits, b: &Bits) {
    for (x, y) in a.iter_mut().zip(b) {
        *x ^= *y;
    }
}

fn lowest_bit(b: &Bits) -> Option<usize> {
    b.iter()
        .enumerate()
        .find(|(_, w)| **w != 0)
        .map(|(i, w)| i * 64 + w.trailing_zeros() as usize)
}

/// A GF(2) basis in echelon form keyed by lowest set bit.
struct Basis {
    rows: Vec<(usize, Bits)>,
}

impl Basis {
    fn new() -> Self {
        Basis { rows: Vec::new() }
    }
    /// Reduce `v`; true if it was independent (and is then added).
    fn insert(&mut self, mut v: Bits) -> bool {
        loop {
            let Some(p) = lowest_bit(&v) else {
                return false;
            };
            match self.rows.iter().find(|(q, _)| *q == p) {
                Some((_, row)) => xor_into(&mut v, row),
                None => {
                    self.rows.push((p, v));
                    return true;
                }
            }
        }
    }
}

fn ring_system(atoms: &[usize], adj: &Adj, ring: &[bool], out: &mut Rings) {
    // Local edge numbering for this system's ring bonds.
    let mut local_edge: std::collections::HashMap<usize, usize> = Default::default();
    for &a in atoms {
        for (_, b) in adj.of(a) {
            if ring.get(b).copied().unwrap_or(false) {
                let k = local_edge.len();
                local_edge.entry(b).or_insert(k);
            }
        }
    }
    let e = local_edge.len();
    let v = atoms.len();
    let nullity = (e + 1).saturating_sub(v);
    if nullity == 0 {
        return;
    }
    if nullity == 1 {
        out.count += 1;
        let size = v.min(255) as u8;
        for &a in atoms {
            out.atom_rings[a] = out.atom_rings[a].saturating_add(1);
            if out.atom_min_ring[a] == 0 || out.atom_min_ring[a] > size {
                out.atom_min_ring[a] = size;
            }
        }
        return;
    }
    if v.saturating_mul(e) > EXACT_LIMIT {
        approximate(atoms, adj, ring, nullity, out);
        return;
    }
    let words = e.div_ceil(64);
    let in_system = |x: usize| atoms.binary_search(&x).is_ok();
    // Candidate cycles: for each root, breadth-first tree over ring bonds;
    // each non-tree edge (x, y) closes P(root, x) + (x, y) + P(y, root).
    let mut seen: std::collections::HashSet<Bits> = Default::default();
    let mut cands: Vec<(usize, Bits, Vec<usize>)> = Vec::new();
    let n = adj.len();
    let mut dist = vec![usize::MAX; n];
    let mut parent = vec![(usize::MAX, usize::MAX); n];
    for &root in atoms {
        for &a in atoms {
            dist[a] = usize::MAX;
            parent[a] = (usize::MAX, usize::MAX);
        }
        dist[root] = 0;
        let mut queue = std::collections::VecDeque::from([root]);
        let mut order = Vec::with_capacity(v);
        while let Some(a) = queue.pop_front() {
            order.push(a);
            for (x, b) in adj.of(a) {
                if ring[b] && in_system(x) && dist[x] == usize::MAX {
                    dist[x] = dist[a] + 1;
                    parent[x] = (a, b);
                    queue.push_back(x);
                }
            }
        }
        for &x in &order {
            for (y, b) in adj.of(x) {
                if !ring.get(b).copied().unwrap_or(false)
                    || x > y
                    || parent.get(x).is_none_or(|p| p.1 == b)
                    || parent.get(y).is_none_or(|p| p.1 == b)
                {
                    continue;
                }
                // Paths to the root must meet only at the root.
                let (Some(path_x), Some(path_y)) =
                    (tree_path(x, root, &parent), tree_path(y, root, &parent))
                else {
                    continue;
                };
                if path_x[..path_x.len() - 1]
                    .iter()
                    .any(|a| path_y[..path_y.len() - 1].contains(a))
                {
                    continue;
                }
                let mut bits = vec![0u64; words];
                let Some(&kb) = local_edge.get(&b) else {
                    continue;
                };
                bit_set(&mut bits, kb);
                let mut complete = true;
                for path in [&path_x, &path_y] {
                    for w in path.windows(2) {
                        match parent.get(w[0]).and_then(|p| local_edge.get(&p.1)) {
                            Some(&k) => bit_set(&mut bits, k),
                            None => complete = false,
                        }
                    }
                }
                if !complete {
                    continue;
                }
                if seen.insert(bits.clone()) {
                    let mut cyc: Vec<usize> = path_x.clone();
                    cyc.extend(path_y[..path_y.len() - 1].iter());
                    cands.push((cyc.len(), bits, cyc));
                }
            }
        }
    }
    cands.sort_by_key(|c| c.0);
    let mut basis = Basis::new();
    let mut chosen: Vec<usize> = Vec::new();
    for (i, c) in cands.iter().enumerate() {
        if chosen.len() == nullity {
            break;
        }
        if basis.insert(c.1.clone()) {
            chosen.push(i);
        }
    }
    // Symmetrise as RDKit does: a further ring joins if it could replace
    // one chosen ring of the same size, sharing a bond with it and keeping
    // every bond that only that ring provides.
    let mut bond_count = vec![0u32; e];
    for &i in &chosen {
        for (k, c) in bond_count.iter_mut().enumerate() {
            if cands[i].1[k / 64] >> (k % 64) & 1 == 1 {
                *c += 1;
            }
        }
    }
    let has = |bits: &Bits, k: usize| bits[k / 64] >> (k % 64) & 1 == 1;
    // Edge list of the system in local numbering.
    let mut ends = vec![(0usize, 0usize); e];
    for &a in atoms {
        for (x, b) in adj.of(a) {
            if let Some(&k) = local_edge.get(&b) {
                ends[k] = (a.min(x), a.max(x));
            }
        }
    }
    let mut extra_rings: Vec<Vec<usize>> = Vec::new();
    let mut budget = SYSTEM_STEP_LIMIT;
    let mut known: std::collections::HashSet<Bits> =
        chosen.iter().map(|&i| cands[i].1.clone()).collect();
    for &j in &chosen {
        let (len, bits, _) = &cands[j];
        let unique: Vec<usize> = (0..e)
            .filter(|&k| has(bits, k) && bond_count[k] == 1)
            .collect();
        let starts: Vec<usize> = if unique.is_empty() {
            (0..e).filter(|&k| has(bits, k)).collect()
        } else {
            vec![unique[0]]
        };
        for k in starts {
            for (cyc, cbits) in
                cycles_through(k, *len, &ends, &local_edge, adj, ring, words, &mut budget)
            {
                if unique.iter().all(|&u| has(&cbits, u)) && known.insert(cbits) {
                    extra_rings.push(cyc);
                }
            }
        }
    }
    let extra_cycles: Vec<(usize, Vec<usize>)> =
        extra_rings.into_iter().map(|c| (c.len(), c)).collect();
    let all = chosen
        .iter()
        .map(|&i| (cands[i].0, &cands[i].2))
        .chain(extra_cycles.iter().map(|(l, c)| (*l, c)));
    for (len, cyc) in all {
        let len = len.min(255) as u8;
        out.count += 1;
        for &a in cyc {
            out.atom_rings[a] = out.atom_rings[a].saturating_add(1);
            if out.atom_min_ring[a] == 0 || out.atom_min_ring[a] > len {
                out.atom_min_ring[a] = len;
            }
        }
    }
}

/// Path from `x` up the breadth-first tree to `root` (both included); None
/// if the tree does not lead there.
fn tree_path(x: usize, root: usize, parent: &[(usize, usize)]) -> Option<Vec<usize>> {
    let mut path = vec![x];
    let mut c = x;
    while c != root {
        c = parent.get(c)?.0;
        if path.len() > parent.len() {
            return None;
        }
        path.push(c);
    }
    Some(path)
}

/// Cheap stand-in for very large ring blocks: the block counts its
/// cyclomatic number of rings, each atom one ring, of the size of the
/// shortest cycle through it.
fn approximate(atoms: &[usize], adj: &Adj, ring: &[bool], nullity: usize, out: &mut Rings) {
    let n = adj.len();
    let mut dist = vec![usize::MAX; n];
    let mut branch = vec![usize::MAX; n];
    out.count += nullity;
    for &a in atoms {
        out.atom_rings[a] = out.atom_rings[a].saturating_add(1);
        // Shortest cycle through `a`: BFS labelling each vertex with the
        // first neighbour of `a` it came through.
        let mut touched = vec![a];
        dist[a] = 0;
        let mut queue = std::collections::VecDeque::from([a]);
        let mut best = usize::MAX;
        while let Some(x) = queue.pop_front() {
            if dist[x] * 2 >= best {
                break;
            }
            for (y, b) in adj.of(x) {
                if !ring.get(b).copied().unwrap_or(false) {
                    continue;
                }
                let bx = if x == a { y } else { branch[x] };
                if dist[y] == usize::MAX {
                    dist[y] = dist[x] + 1;
                    branch[y] = bx;
                    touched.push(y);
                    queue.push_back(y);
                } else if y != a && branch[y] != bx {
                    best = best.min(dist[x] + dist[y] + 1);
                }
            }
        }
        for t in touched {
            dist[t] = usize::MAX;
            branch[t] = usize::MAX;
        }
        let best = best.min(255) as u8;
        if out.atom_min_ring[a] == 0 || out.atom_min_ring[a] > best {
            out.atom_min_ring[a] = best;
        }
    }
}

/// Most search steps spent looking for the cycles through one bond.
const CYCLE_STEP_LIMIT: usize = 200_000;

/// Most search steps spent on the equivalent rings of one ring system.
const SYSTEM_STEP_LIMIT: usize = 2_000_000;

/// Simple cycles of exactly `len` atoms through local edge `k`, within the
/// ring bonds of one system, as (atoms, edge bits). Depth-first with an
/// explicit stack and distance pruning; stops after [`CYCLE_STEP_LIMIT`]
/// steps.
#[allow(clippy::too_many_arguments)] // internal helper
fn cycles_through(
    k: usize,
    len: usize,
    ends: &[(usize, usize)],
    local_edge: &std::collections::HashMap<usize, usize>,
    adj: &Adj,
    ring: &[bool],
    words: usize,
    budget: &mut usize,
) -> Vec<(Vec<usize>, Bits)> {
    let mut out = Vec::new();
    let Some(&(a, b)) = ends.get(k) else {
        return out;
    };
    // Distances to `a` over system ring bonds, not using edge k.
    let mut dist: std::collections::HashMap<usize, usize> = Default::default();
    dist.insert(a, 0);
    let mut queue = std::collections::VecDeque::from([a]);
    while let Some(x) = queue.pop_front() {
        let dx = dist[&x];
        for (y, bond) in adj.of(x) {
            if !ring.get(bond).copied().unwrap_or(false) || local_edge.get(&bond) == Some(&k) {
                continue;
            }
            if !local_edge.contains_key(&bond) || dist.contains_key(&y) {
                continue;
            }
            dist.insert(y, dx + 1);
            queue.push_back(y);
        }
    }
    // Path from b to a with len - 1 edges.
    let mut path = vec![b];
    let mut edges: Vec<usize> = Vec::new();
    let mut cursor = vec![0usize];
    let mut steps = 0usize;
    while let Some(&x) = path.last() {
        steps += 1;
        if steps > CYCLE_STEP_LIMIT || *budget == 0 {
            break;
        }
        *budget -= 1;
        let depth = path.len() - 1; // edges used so far
        let i = cursor[depth];
        if x == a || i >= adj.degree(x) {
            if x == a && depth == len - 1 {
                let mut bits = vec![0u64; words];
                bit_set(&mut bits, k);
                for &le in &edges {
                    bit_set(&mut bits, le);
                }
                out.push((path.clone(), bits));
            }
            path.pop();
            cursor.pop();
            edges.pop();
            continue;
        }
        cursor[depth] += 1;
        let (y, bond) = adj.nth(x, i);
        let Some(&le) = local_edge.get(&bond) else {
            continue;
        };
        if le == k || path.contains(&y) {
            continue;
        }
        if depth + 2 > len {
            continue;
        }
        let remaining = len - 2 - depth;
        match dist.get(&y) {
            Some(&d) if d <= remaining => {}
            _ => continue,
        }
        if y == a && remaining != 0 {
            continue;
        }
        path.push(y);
        cursor.push(0);
        edges.push(le);
    }
    out
}
