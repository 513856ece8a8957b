//! The symmetrised SSSR of a ring block of cycle rank 3 or more (see the
//! parent module): Horton candidates, the GF(2) basis, and the bounded
//! search for cycles equivalent to a chosen ring.

use super::*;

/// A GF(2) vector over the bonds of one block.
type Bits = Vec<u64>;

/// A cycle as local atoms in order and its bonds.
type Cycle = (Vec<usize>, Bits);

fn has(bits: &Bits, k: usize) -> bool {
    bits[k / 64] >> (k % 64) & 1 == 1
}

fn flip(bits: &mut Bits, k: usize) {
    bits[k / 64] ^= 1 << (k % 64);
}

fn lowest(bits: &Bits) -> Option<usize> {
    bits.iter()
        .enumerate()
        .find(|(_, w)| **w != 0)
        .map(|(i, w)| i * 64 + w.trailing_zeros() as usize)
}

/// Echelon basis keyed by lowest set bit.
struct Basis {
    by_pivot: Vec<u32>,
    vectors: Vec<Bits>,
}

impl Basis {
    fn new(bits: usize) -> Self {
        Basis {
            by_pivot: vec![NONE; bits],
            vectors: Vec::new(),
        }
    }

    /// Reduce `v` (a scratch copy) by the basis and keep it if it is
    /// independent; returns whether it was.
    fn insert(&mut self, v: &mut Bits) -> bool {
        while let Some(p) = lowest(v) {
            match self.by_pivot[p] {
                NONE => {
                    self.by_pivot[p] = self.vectors.len() as u32;
                    self.vectors.push(v.clone());
                    return true;
                }
                k => {
                    for (a, b) in v.iter_mut().zip(&self.vectors[k as usize]) {
                        *a ^= *b;
                    }
                }
            }
        }
        false
    }
}

/// The chosen rings of a block as an echelon basis whose rows remember
/// which chosen rings they combine.
struct Tracked {
    by_pivot: Vec<u32>,
    rows: Vec<(Bits, Bits)>,
}

impl Tracked {
    fn new(chosen: &[(Bits, Vec<usize>)], bits: usize) -> Self {
        let mut t = Tracked {
            by_pivot: vec![NONE; bits],
            rows: Vec::with_capacity(chosen.len()),
        };
        let words = chosen.len().div_ceil(64);
        for (i, (cb, _)) in chosen.iter().enumerate() {
            let mut v = cb.clone();
            let mut c: Bits = vec![0; words];
            flip(&mut c, i);
            if let Some(p) = t.reduce(&mut v, &mut c) {
                t.by_pivot[p] = t.rows.len() as u32;
                t.rows.push((v, c));
            }
        }
        t
    }

    /// Reduce `v`, recording in `c` the chosen rings used; the pivot of a
    /// nonzero remainder.
    fn reduce(&self, v: &mut Bits, c: &mut Bits) -> Option<usize> {
        while let Some(p) = lowest(v) {
            match self.by_pivot[p] {
                NONE => return Some(p),
                k => {
                    let (rv, rc) = &self.rows[k as usize];
                    v.iter_mut().zip(rv).for_each(|(a, b)| *a ^= *b);
                    c.iter_mut().zip(rc).for_each(|(a, b)| *a ^= *b);
                }
            }
        }
        None
    }

    /// Does cycle `bits` need chosen ring `j` (is it independent of the
    /// other chosen rings)?
    fn uses(&self, bits: &Bits, j: usize) -> bool {
        let mut v = bits.clone();
        let mut c: Bits = vec![0; self.rows.first().map_or(1, |r| r.1.len())];
        if self.reduce(&mut v, &mut c).is_some() {
            return true;
        }
        c.get(j / 64).is_some_and(|w| w >> (j % 64) & 1 == 1)
    }
}

/// The symmetrised SSSR of one block of cycle rank 3 or more. `atoms` are
/// ascending; `scratch.local` and `scratch.local_bond` number the block's
/// atoms and bonds.
pub(super) fn symmetrised_sssr(
    atoms: &[usize],
    edges: &[usize],
    rank: usize,
    bonds: &[Bond],
    nb: &Adj,
    scratch: &Scratch,
    out: &mut RingList,
) {
    let (local, local_bond) = (&scratch.local, &scratch.local_bond);
    let v = atoms.len();
    let e = edges.len();
    // Block bonds at each local atom as (local atom, global bond), in
    // adjacency order.
    let mut row_start = Vec::with_capacity(v + 1);
    let mut row: Vec<(u32, u32)> = Vec::with_capacity(2 * e);
    row_start.push(0);
    for &a in atoms {
        for x in nb.get(a) {
            if local_bond.get(x.bond).is_some_and(|&l| l != NONE) {
                row.push((local[x.atom], x.bond as u32));
            }
        }
        row_start.push(row.len());
    }
    let rows = |x: usize| &row[row_start[x]..row_start[x + 1]];
    // Breadth-first trees from every root: distance, parent atom, parent
    // bond, first atom after the root.
    let mut dist = vec![NONE; v * v];
    let mut par = vec![NONE; v * v];
    let mut pbond = vec![NONE; v * v];
    let mut branch = vec![NONE; v * v];
    // Candidates in generation order: (length, root, bond); each root's
    // tree leaves `rank` non-tree bonds, so at most `rank` per root.
    let mut cands: Vec<(u32, u32, u32)> = Vec::with_capacity(v.saturating_mul(rank));
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
            for &(y, b) in rows(x) {
                let y = y as usize;
                if dist[base + y] == NONE {
                    dist[base + y] = dist[base + x] + 1;
                    par[base + y] = x as u32;
                    pbond[base + y] = b;
                    branch[base + y] = if x == r { y as u32 } else { branch[base + x] };
                    queue.push(y);
                }
            }
        }
        for &x in &queue {
            for &(y, b) in rows(x) {
                let y = y as usize;
                if x > y || pbond[base + x] == b || pbond[base + y] == b {
                    continue;
                }
                if x == r || y == r || branch[base + x] != branch[base + y] {
                    cands.push((dist[base + x] + dist[base + y] + 1, r as u32, b));
                }
            }
        }
    }
    // Shortest first; the stable sort keeps generation order within a size.
    cands.sort_by_key(|c| c.0);
    let words = e.div_ceil(64);
    let mut basis = Basis::new(e);
    let mut chosen: Vec<(Bits, Vec<usize>)> = Vec::with_capacity(rank);
    let mut bits: Bits = vec![0; words];
    let mut work: Bits = vec![0; words];
    for &(_, r, b) in &cands {
        if chosen.len() == rank {
            break;
        }
        let (r, b) = (r as usize, b as usize);
        let base = r * v;
        let [ga, gb] = bonds[b].atoms;
        let (x, y) = (local[ga] as usize, local[gb] as usize);
        bits.iter_mut().for_each(|w| *w = 0);
        flip(&mut bits, local_bond[b] as usize);
        for start in [x, y] {
            let mut c = start;
            while c != r {
                flip(&mut bits, local_bond[pbond[base + c] as usize] as usize);
                c = par[base + c] as usize;
            }
        }
        work.copy_from_slice(&bits);
        if !basis.insert(&mut work) {
            continue;
        }
        // The ring in cycle order: r .. x, then y .. (child of r).
        let mut ring = Vec::with_capacity((dist[base + x] + dist[base + y] + 1) as usize);
        let mut c = x;
        while c != r {
            ring.push(c);
            c = par[base + c] as usize;
        }
        ring.push(r);
        ring.reverse();
        let mut c = y;
        while c != r {
            ring.push(c);
            c = par[base + c] as usize;
        }
        chosen.push((bits.clone(), ring));
    }
    drop((dist, par, pbond, branch));
    // Symmetrise: add the cycles of a chosen ring's size that contain every
    // bond only that ring provides.
    let mut bond_count = vec![0u32; e];
    for (cb, _) in &chosen {
        for (k, c) in bond_count.iter_mut().enumerate() {
            if has(cb, k) {
                *c += 1;
            }
        }
    }
    let mut ends = vec![(0u32, 0u32); e];
    for (k, &b) in edges.iter().enumerate() {
        let [ga, gb] = bonds[b].atoms;
        let (x, y) = (local[ga], local[gb]);
        ends[k] = (x.min(y), x.max(y));
    }
    let mut known: HashSet<Bits> = chosen.iter().map(|c| c.0.clone()).collect();
    let mut extra: Vec<Vec<usize>> = Vec::new();
    let mut search = CycleSearch {
        rows: &row,
        row_start: &row_start,
        local_bond,
        ends: &ends,
        words,
        dist: vec![NONE; v],
        queue: Vec::with_capacity(v),
        on_path: vec![false; v],
        budget: BLOCK_STEP_LIMIT,
    };
    // Cycles of one size over the whole block (lowest bond first, so each
    // once), listed on first need; and the chosen rings as a basis that
    // tracks combinations, built on first need.
    let mut by_size: Vec<(usize, Vec<Cycle>)> = Vec::new();
    let mut tracked: Option<Tracked> = None;
    for (j, (cb, ring)) in chosen.iter().enumerate() {
        let len = ring.len();
        let unique: Vec<usize> = (0..e)
            .filter(|&k| has(cb, k) && bond_count[k] == 1)
            .collect();
        if let Some(&k) = unique.first() {
            search.cycles_through(k, len, false, |path, pbits| {
                if unique.iter().all(|&u| has(pbits, u)) && !known.contains(pbits) {
                    known.insert(pbits.clone());
                    extra.push(path.to_vec());
                }
            });
            continue;
        }
        // Every bond shared with other chosen rings: a cycle of this size
        // replaces the ring only if it is independent of the other chosen
        // rings (hexaprismane: the second hexagon, not the six-cycles around
        // two adjacent squares), and it need not share a bond with it.
        let pos = match by_size.iter().position(|c| c.0 == len) {
            Some(p) => p,
            None => {
                let mut list = Vec::new();
                for k in 0..e {
                    search.cycles_through(k, len, true, |path, pbits| {
                        list.push((path.to_vec(), pbits.clone()));
                    });
                }
                by_size.push((len, list));
                by_size.len() - 1
            }
        };
        for (path, pbits) in &by_size[pos].1 {
            if known.contains(pbits) {
                continue;
            }
            let t = tracked.get_or_insert_with(|| Tracked::new(&chosen, e));
            if t.uses(pbits, j) {
                known.insert(pbits.clone());
                extra.push(path.clone());
            }
        }
    }
    for ring in chosen.iter().map(|c| &c.1).chain(&extra) {
        out.push(ring.iter().map(|&l| atoms[l]), nb);
    }
}

/// Depth-first search for the simple cycles of one size through one bond
/// of a block (local numbering).
struct CycleSearch<'a> {
    rows: &'a [(u32, u32)],
    row_start: &'a [usize],
    local_bond: &'a [u32],
    ends: &'a [(u32, u32)],
    words: usize,
    dist: Vec<u32>,
    queue: Vec<usize>,
    on_path: Vec<bool>,
    budget: usize,
}

impl CycleSearch<'_> {
    /// Call `found(atoms, bits)` for each simple cycle of exactly `len`
    /// atoms through local bond `k` (with `above`, only those whose other
    /// bonds all come after `k`), until [`CYCLE_STEP_LIMIT`] steps or the
    /// block's budget are spent.
    fn cycles_through(
        &mut self,
        k: usize,
        len: usize,
        above: bool,
        mut found: impl FnMut(&[usize], &Bits),
    ) {
        let Some(&(a, b)) = self.ends.get(k) else {
            return;
        };
        let (a, b) = (a as usize, b as usize);
        if len < 3 || self.budget == 0 {
            return;
        }
        let usable = |l: usize| l != k && (!above || l > k);
        let rows = |x: usize| &self.rows[self.row_start[x]..self.row_start[x + 1]];
        // Distances to `a` over usable bonds, up to len - 2 (all the search
        // asks about); the queue lists every atom given a distance.
        self.queue.clear();
        self.dist[a] = 0;
        self.queue.push(a);
        let mut head = 0;
        while head < self.queue.len() {
            let x = self.queue[head];
            head += 1;
            let dx = self.dist[x];
            if dx as usize + 2 >= len {
                continue;
            }
            for &(y, bond) in rows(x) {
                let y = y as usize;
                if !usable(self.local_bond[bond as usize] as usize) || self.dist[y] != NONE {
                    continue;
                }
                self.dist[y] = dx + 1;
                self.queue.push(y);
            }
        }
        self.budget = self.budget.saturating_sub(self.queue.len());
        // Paths from b to a of len - 1 bonds.
        let mut path = Vec::with_capacity(len);
        path.push(b);
        let mut cursor = Vec::with_capacity(len);
        cursor.push(0usize);
        let mut path_bonds: Vec<usize> = Vec::with_capacity(len);
        self.on_path[b] = true;
        let mut bits: Bits = vec![0; self.words];
        let mut steps = 0usize;
        while let Some(&x) = path.last() {
            steps += 1;
            if steps > CYCLE_STEP_LIMIT || self.budget == 0 {
                break;
            }
            self.budget -= 1;
            let depth = path.len() - 1; // bonds used so far
            let i = cursor[depth];
            let row = rows(x);
            if x == a || i >= row.len() {
                if x == a && depth == len - 1 {
                    bits.iter_mut().for_each(|w| *w = 0);
                    flip(&mut bits, k);
                    for &l in &path_bonds {
                        flip(&mut bits, l);
                    }
                    found(&path, &bits);
                }
                self.on_path[x] = false;
                path.pop();
                cursor.pop();
                path_bonds.pop();
                continue;
            }
            cursor[depth] += 1;
            let (y, bond) = row[i];
            let (y, l) = (y as usize, self.local_bond[bond as usize] as usize);
            if !usable(l) || self.on_path[y] || depth + 2 > len {
                continue;
            }
            let remaining = len - 2 - depth;
            if self.dist[y] as usize > remaining || (y == a && remaining != 0) {
                continue;
            }
            self.on_path[y] = true;
            path.push(y);
            cursor.push(0);
            path_bonds.push(l);
        }
        for &x in &path {
            self.on_path[x] = false;
        }
        for &x in &self.queue {
            self.dist[x] = NONE;
        }
    }
}
