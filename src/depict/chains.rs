//! Placement of one component: the largest ring system first (or, without
//! rings, one end of a longest chain), then a breadth-first walk that gives
//! each placed atom's unplaced neighbours their directions.
//!
//! * An atom with one placed neighbour continues a chain: with one more
//!   neighbour at 120° on the side opposite to the previous turn (a
//!   zig-zag), straight on at a triple bond or between two double bonds
//!   (linear atoms); with two more neighbours at ±120° (the larger branch
//!   continues the zig-zag); with more, spread evenly.
//! * An atom with two or more placed neighbours (a ring atom, a branch
//!   point) spreads its new neighbours evenly over the largest free angle.
//! * A neighbour in another ring system brings its whole system, laid out in
//!   its own frame (`rings`), turned so that the attachment atom points back
//!   along the bond, and mirrored if that clashes less.

use super::geom::{centroid, norm_angle, reflect, Point};
use super::rings::{place_system, RingSystem};
use crate::mol::{BondOrder, Molecule};
use std::collections::VecDeque;
use std::f64::consts::{PI, TAU};

const DEG120: f64 = 2.0 * PI / 3.0;

/// Shared state while placing one molecule.
pub(crate) struct Placer<'a> {
    pub mol: &'a Molecule,
    pub systems: &'a [RingSystem],
    pub sys_of: &'a [Option<usize>],
    pub pos: Vec<Point>,
    pub placed: Vec<bool>,
    /// Turn sign used when the atom was placed (zig-zag memory).
    turn: Vec<f64>,
}

impl<'a> Placer<'a> {
    pub fn new(mol: &'a Molecule, systems: &'a [RingSystem], sys_of: &'a [Option<usize>]) -> Self {
        let n = mol.atom_count();
        Placer {
            mol,
            systems,
            sys_of,
            pos: vec![Point::default(); n],
            placed: vec![false; n],
            turn: vec![1.0; n],
        }
    }

    /// Lay out the component holding `atoms` (index order) around the origin.
    pub fn place_component(&mut self, atoms: &[usize]) {
        let mut queue: VecDeque<usize> = VecDeque::new();
        // Start: the largest ring system of the component.
        let start_sys = atoms
            .iter()
            .filter_map(|&a| self.sys_of[a])
            .max_by_key(|&s| (self.systems[s].atoms.len(), usize::MAX - s));
        match start_sys {
            Some(s) => {
                let local = place_system(self.mol, &self.systems[s]);
                for &a in &self.systems[s].atoms {
                    self.pos[a] = local[a].unwrap_or_default();
                    self.placed[a] = true;
                    queue.push_back(a);
                }
            }
            None => {
                let Some(&first) = atoms.first() else { return };
                let start = self.chain_end(first);
                self.pos[start] = Point::default();
                self.placed[start] = true;
                queue.push_back(start);
            }
        }
        while let Some(u) = queue.pop_front() {
            self.expand(u, &mut queue);
        }
        // Anything unreached (cannot happen in a connected component).
        for &a in atoms {
            if !self.placed[a] {
                self.placed[a] = true;
                self.pos[a] = Point::new(a as f64, -3.0);
            }
        }
    }

    /// A far end of the chain through `from` (the last atom reached by a
    /// breadth-first search, lowest index on a tie): chains then run from
    /// one end.
    fn chain_end(&self, from: usize) -> usize {
        let n = self.mol.atom_count();
        let mut seen = vec![false; n];
        let mut q = VecDeque::from([from]);
        seen[from] = true;
        let mut last = from;
        while let Some(u) = q.pop_front() {
            last = u;
            for nb in self.mol.neighbors(u) {
                if !seen[nb.atom] {
                    seen[nb.atom] = true;
                    q.push_back(nb.atom);
                }
            }
        }
        last
    }

    /// Unplaced atoms reachable from `v` without passing a placed atom.
    fn branch_size(&self, v: usize, budget: usize) -> usize {
        let mut seen = vec![v];
        let mut stack = vec![v];
        while let Some(u) = stack.pop() {
            for nb in self.mol.neighbors(u) {
                if !self.placed[nb.atom] && !seen.contains(&nb.atom) {
                    seen.push(nb.atom);
                    if seen.len() >= budget {
                        return budget;
                    }
                    stack.push(nb.atom);
                }
            }
        }
        seen.len()
    }

    /// Atom `u` is linear: a triple bond, or two double bonds (cumulene).
    fn linear(&self, u: usize) -> bool {
        let mut doubles = 0;
        for nb in self.mol.neighbors(u) {
            match self.mol.bonds[nb.bond].order {
                BondOrder::Triple | BondOrder::Quadruple => return true,
                BondOrder::Double => doubles += 1,
                _ => {}
            }
        }
        doubles >= 2
    }

    /// Give the unplaced neighbours of `u` their places.
    fn expand(&mut self, u: usize, queue: &mut VecDeque<usize>) {
        let mol = self.mol;
        let nbs = mol.neighbors(u);
        let placed_dirs: Vec<f64> = nbs
            .iter()
            .filter(|n| self.placed[n.atom])
            .map(|n| (self.pos[n.atom] - self.pos[u]).angle())
            .collect();
        let mut todo: Vec<usize> = nbs
            .iter()
            .filter(|n| !self.placed[n.atom])
            .map(|n| n.atom)
            .collect();
        if todo.is_empty() {
            return;
        }
        todo.dedup();
        // Larger branches first (they take the zig-zag continuation).
        if todo.len() > 1 {
            let mut sized: Vec<(usize, usize)> =
                todo.iter().map(|&v| (self.branch_size(v, 64), v)).collect();
            sized.sort_by(|a, b| b.0.cmp(&a.0).then(a.1.cmp(&b.1)));
            todo = sized.into_iter().map(|(_, v)| v).collect();
        }
        let slots = self.slots(u, &placed_dirs, todo.len());
        for (v, (angle, turn)) in todo.into_iter().zip(slots) {
            if self.placed[v] {
                continue;
            }
            let at = self.pos[u] + Point::polar(angle);
            match self.sys_of[v] {
                Some(s) if self.sys_of[u] != Some(s) => {
                    self.attach_system(s, v, u, at, queue);
                }
                _ => {
                    self.pos[v] = at;
                    self.placed[v] = true;
                    self.turn[v] = turn;
                    queue.push_back(v);
                }
            }
        }
    }

    /// Directions (angle, turn sign) for `k` new neighbours of `u`.
    fn slots(&self, u: usize, placed: &[f64], k: usize) -> Vec<(f64, f64)> {
        match placed.len() {
            0 => match k {
                1 => vec![(-PI / 6.0, 1.0)],
                2 => vec![(-PI / 6.0, 1.0), (PI + PI / 6.0, -1.0)],
                _ => (0..k)
                    .map(|i| (-PI / 2.0 + TAU * i as f64 / k as f64, 1.0))
                    .collect(),
            },
            1 => {
                let back = placed[0];
                let t = self.turn[u];
                if k == 1 && self.linear(u) {
                    return vec![(back + PI, t)];
                }
                match k {
                    1 => vec![(back - t * DEG120, -t)],
                    2 => vec![(back - t * DEG120, -t), (back + t * DEG120, t)],
                    _ => (1..=k)
                        .map(|i| (back + TAU * i as f64 / (k + 1) as f64, 1.0))
                        .collect(),
                }
            }
            _ => {
                let mut a: Vec<f64> = placed.iter().map(|&x| norm_angle(x)).collect();
                a.sort_by(f64::total_cmp);
                let (mut g0, mut gs) = (a[a.len() - 1], a[0] + TAU - a[a.len() - 1]);
                for w in a.windows(2) {
                    if w[1] - w[0] > gs {
                        g0 = w[0];
                        gs = w[1] - w[0];
                    }
                }
                (0..k)
                    .map(|i| {
                        let t = if i % 2 == 0 { 1.0 } else { -1.0 };
                        (g0 + gs * (i + 1) as f64 / (k + 1) as f64, t)
                    })
                    .collect()
            }
        }
    }

    /// Place ring system `s` so that its atom `v` sits at `at`, bonded to the
    /// placed atom `u`.
    fn attach_system(
        &mut self,
        s: usize,
        v: usize,
        u: usize,
        at: Point,
        queue: &mut VecDeque<usize>,
    ) {
        let mol = self.mol;
        let sys = &self.systems[s];
        let local = place_system(mol, sys);
        let lv = local[v].unwrap_or_default();
        let inner = centroid(
            mol.neighbors(v)
                .iter()
                .filter_map(|n| local.get(n.atom).copied().flatten()),
        );
        let mut out = lv - inner;
        if out.len() < 1e-6 {
            out = Point::new(1.0, 0.0);
        }
        let want = self.pos[u] - at;
        let rot = want.angle() - out.angle();
        let mut best: Option<(f64, Vec<(usize, Point)>)> = None;
        for mirror in [false, true] {
            let pts: Vec<(usize, Point)> = sys
                .atoms
                .iter()
                .map(|&a| {
                    let mut p = (local[a].unwrap_or_default() - lv).rotate(rot) + at;
                    if mirror {
                        p = reflect(p, self.pos[u], at);
                    }
                    (a, p)
                })
                .collect();
            let score = self.crowding(pts.iter().map(|x| x.1));
            if best.as_ref().is_none_or(|(b, _)| score < *b - 1e-9) {
                best = Some((score, pts));
            }
        }
        if let Some((_, pts)) = best {
            for (a, p) in pts {
                self.pos[a] = p;
                self.placed[a] = true;
                queue.push_back(a);
            }
        }
    }

    /// How close the points come to atoms already placed.
    fn crowding(&self, pts: impl Iterator<Item = Point>) -> f64 {
        let placed: Vec<Point> = (0..self.pos.len())
            .filter(|&i| self.placed[i])
            .map(|i| self.pos[i])
            .collect();
        pts.map(|p| {
            placed
                .iter()
                .map(|q| {
                    let d = p.dist(*q);
                    if d < 1.5 {
                        1.5 - d
                    } else {
                        0.0
                    }
                })
                .sum::<f64>()
        })
        .sum()
    }
}
