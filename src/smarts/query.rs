//! The query graph a pattern compiles to: pattern atoms and bonds, the
//! matching order from each start atom and the [`Reach`] conditions
//! checked before a search starts.

use super::expr::{self, AtomExpr, AtomFilter, BondExpr, BondPrim};
use super::matcher;

/// One pattern atom.
#[derive(Debug, Clone)]
pub(crate) struct QueryAtom {
    pub expr: AtomExpr,
    pub map: Option<u16>,
    /// Character position of the atom in the pattern text.
    pub position: usize,
    /// Element every match must have (fast rejection), if implied.
    pub element: Option<u8>,
    /// Simple comparisons tested first ...
    pub filter: AtomFilter,
    /// ... and the rest of the expression, if any.
    pub rest: Option<AtomExpr>,
    /// The filter as a signature mask and value.
    pub sig_mask: u64,
    pub sig_value: u64,
}

/// One pattern bond.
#[derive(Debug, Clone)]
pub(crate) struct QueryBond {
    pub atoms: [usize; 2],
    pub expr: BondExpr,
    /// The expression tabulated over the twelve bond states (five orders
    /// and dative, in a ring or not): bit `state + 6 * ring`.
    pub mask: u16,
}

impl QueryBond {
    pub(crate) fn new(atoms: [usize; 2], expr: BondExpr) -> QueryBond {
        let states = matcher::STATES;
        let mut mask = 0u16;
        for ring in [false, true] {
            for k in 0..states {
                let hit = match matcher::ORDERS.get(k as usize) {
                    Some(&order) => expr.eval(order, ring),
                    None => expr.eval_dative(),
                };
                if hit {
                    mask |= 1 << (k + if ring { states } else { 0 });
                }
            }
        }
        QueryBond { atoms, expr, mask }
    }
}

/// One step of a matching order: the pattern atom placed, the already
/// placed atom it is reached from (with the pattern bond), and the further
/// bonds to already placed atoms that must be checked (ring closures).
#[derive(Debug, Clone)]
pub(crate) struct Step {
    pub atom: usize,
    pub parent: Option<(usize, usize)>,
    pub closures: Vec<(usize, usize)>,
    /// First step only: what the neighbourhood of a molecule atom must
    /// offer before this atom can be placed on it (see [`Reach`]).
    pub reach: Vec<Reach>,
}

/// A necessary condition on the surroundings of the atom a search starts
/// from: pattern atom `atom` needs a neighbour, reached through a bond
/// passing pattern bond `bond` and not the atom the walk came from, that
/// passes the atom's signature filter and in turn meets every condition of
/// `next`; the conditions of one list need different neighbours. Built
/// from the pattern's bonds out to [`REACH_DEPTH`] bonds from the start
/// atom. It looks at each path from the start on its own (two branches
/// may use the same molecule atom), so it can let a non-match through but
/// never rejects a match.
#[derive(Debug, Clone)]
pub(crate) struct Reach {
    pub atom: usize,
    pub bond: usize,
    pub next: Vec<Reach>,
    /// Copies of the atom's signature filter and the bond's state mask
    /// (filled in by [`Query::fill_reach`] once the filters are final).
    pub sig_mask: u64,
    pub sig_value: u64,
    pub bond_mask: u16,
}

/// How many bonds out from the start atom [`Reach`] conditions look.
const REACH_DEPTH: usize = 6;

/// Most [`Reach`] conditions built for one start atom.
const REACH_MAX: usize = 64;

/// A query graph (the main pattern or one recursive part).
#[derive(Debug, Clone, Default)]
pub(crate) struct Query {
    pub atoms: Vec<QueryAtom>,
    pub bonds: Vec<QueryBond>,
    /// Pattern adjacency: (neighbour pattern atom, pattern bond).
    pub adj: Vec<Vec<(usize, usize)>>,
    /// Order starting at the most selective atom.
    pub plan_free: Vec<Step>,
    /// Order starting at the anchor (atom 0 until [`Query::set_anchor`]).
    pub plan_anchor: Vec<Step>,
}

impl Query {
    /// Build adjacency and matching orders once parsing is done.
    pub(crate) fn finish(&mut self) {
        for a in &mut self.atoms {
            a.element = a.expr.required_element();
            let (filter, rest) = AtomFilter::split(&a.expr);
            (a.sig_mask, a.sig_value) = filter.signature();
            a.filter = filter;
            a.rest = rest;
        }
        self.adj = vec![Vec::new(); self.atoms.len()];
        for (i, b) in self.bonds.iter().enumerate() {
            let [x, y] = b.atoms;
            if x < self.atoms.len() && y < self.atoms.len() {
                self.adj[x].push((y, i));
                self.adj[y].push((x, i));
            }
        }
        let best = (0..self.atoms.len())
            .max_by_key(|&i| (self.score(i), std::cmp::Reverse(i)))
            .unwrap_or(0);
        self.plan_free = self.plan(best);
        self.plan_anchor = self.plan(0);
    }

    pub(super) fn set_anchor(&mut self, anchor: usize) {
        self.plan_anchor = self.plan(anchor);
    }

    /// Pattern bonds that can only match ring bonds: bonds on a cycle of
    /// the pattern none of whose bonds can match a dative bond. Their
    /// matches form a cycle of the molecule without dative bonds, which is
    /// a ring (the molecule's rings leave dative bonds out), so such bonds
    /// match only ring bonds and their atoms only ring atoms.
    fn ring_only_bonds(&self) -> Vec<bool> {
        const DATIVE: u16 = 1 << 5 | 1 << 11;
        let usable = |b: &QueryBond| b.mask & DATIVE == 0;
        let n = self.atoms.len();
        let mut out = vec![false; self.bonds.len()];
        let mut seen = vec![false; n];
        let mut stack: Vec<usize> = Vec::new();
        for (bi, b) in self.bonds.iter().enumerate() {
            let [u, v] = b.atoms;
            if !usable(b) || u >= n || v >= n || u == v {
                continue;
            }
            // Another path from u to v of at least two usable bonds.
            seen.iter_mut().for_each(|x| *x = false);
            stack.clear();
            seen[u] = true;
            stack.push(u);
            let mut found = false;
            while let Some(x) = stack.pop() {
                for &(y, b2) in self.adj.get(x).map(Vec::as_slice).unwrap_or(&[]) {
                    let Some(qb2) = self.bonds.get(b2) else {
                        continue;
                    };
                    // No direct u-v bond (this one or a parallel one).
                    let direct = (x == u && y == v) || (x == v && y == u);
                    if direct || !usable(qb2) || seen.get(y).copied().unwrap_or(true) {
                        continue;
                    }
                    if y == v {
                        found = true;
                        break;
                    }
                    seen[y] = true;
                    stack.push(y);
                }
                if found {
                    break;
                }
            }
            out[bi] = found;
        }
        out
    }

    /// Add the ring requirement of [`Query::ring_only_bonds`] to the atom
    /// filters, and copy the final atom filters and bond masks into the
    /// [`Reach`] conditions of both plans.
    pub(super) fn fill_reach(&mut self) {
        let ring_only = self.ring_only_bonds();
        let ring_bit = 1u64 << expr::SIG_RING;
        for (b, &r) in self.bonds.iter().zip(&ring_only) {
            if r {
                for a in b.atoms {
                    if let Some(qa) = self.atoms.get_mut(a) {
                        // Unless the filter already asks for no ring (then
                        // nothing matches anyway).
                        if qa.sig_mask & ring_bit == 0 {
                            qa.sig_mask |= ring_bit;
                            qa.sig_value |= ring_bit;
                        }
                    }
                }
            }
        }
        fn fill(list: &mut [Reach], atoms: &[QueryAtom], bonds: &[QueryBond], ring_only: &[bool]) {
            for r in list {
                if let Some(qa) = atoms.get(r.atom) {
                    (r.sig_mask, r.sig_value) = (qa.sig_mask, qa.sig_value);
                }
                // A bond index out of range never matches; a ring-only
                // bond keeps its in-ring states (bits 6 to 11).
                let ring_states = if ring_only.get(r.bond).copied().unwrap_or(false) {
                    0xfc0
                } else {
                    0xfff
                };
                r.bond_mask = bonds.get(r.bond).map_or(0, |qb| qb.mask & ring_states);
                fill(&mut r.next, atoms, bonds, ring_only);
            }
        }
        for plan in [&mut self.plan_free, &mut self.plan_anchor] {
            if let Some(first) = plan.first_mut() {
                fill(&mut first.reach, &self.atoms, &self.bonds, &ring_only);
            }
        }
    }

    fn score(&self, i: usize) -> u32 {
        // Multiple bonds are rarer than single ones, so an atom that needs
        // one is a better place to start.
        let bonds: u32 = self.adj[i]
            .iter()
            .map(|&(_, b)| match self.bonds[b].expr.required_order() {
                Some(BondPrim::Triple) => 10,
                Some(BondPrim::Double) => 6,
                Some(_) => 2,
                None => 1,
            })
            .sum();
        self.atoms[i].expr.selectivity() * 4 + bonds
    }

    /// Greedy order: start at `start`, then repeatedly the unplaced atom
    /// with most bonds to placed atoms (ties: most selective); a new
    /// component starts at its most selective atom.
    fn plan(&self, start: usize) -> Vec<Step> {
        let n = self.atoms.len();
        let mut placed = vec![false; n];
        let mut steps: Vec<Step> = Vec::with_capacity(n);
        let mut next = Some(start.min(n.saturating_sub(1)));
        while steps.len() < n {
            let a = match next.take() {
                Some(a) => a,
                None => {
                    // Frontier: unplaced atoms bonded to placed ones.
                    let frontier = (0..n)
                        .filter(|&i| !placed[i])
                        .filter(|&i| self.adj[i].iter().any(|&(x, _)| placed[x]))
                        .max_by_key(|&i| {
                            let links = self.adj[i].iter().filter(|&&(x, _)| placed[x]).count();
                            (links, self.score(i), std::cmp::Reverse(i))
                        });
                    match frontier {
                        Some(i) => i,
                        None => match (0..n)
                            .filter(|&i| !placed[i])
                            .max_by_key(|&i| (self.score(i), std::cmp::Reverse(i)))
                        {
                            Some(i) => i,
                            None => break,
                        },
                    }
                }
            };
            let mut parent = None;
            let mut closures = Vec::new();
            for &(x, b) in &self.adj[a] {
                if placed[x] {
                    if parent.is_none() {
                        parent = Some((x, b));
                    } else {
                        closures.push((x, b));
                    }
                }
            }
            placed[a] = true;
            steps.push(Step {
                atom: a,
                parent,
                closures,
                reach: Vec::new(),
            });
        }
        if let Some(first) = steps.first_mut() {
            let mut budget = REACH_MAX;
            first.reach = self.reach(first.atom, usize::MAX, REACH_DEPTH, &mut budget);
        }
        steps
    }

    /// [`Reach`] conditions for the neighbours of pattern atom `atom`
    /// other than `from`, `depth` bonds deep (recursion bounded by
    /// [`REACH_DEPTH`]).
    fn reach(&self, atom: usize, from: usize, depth: usize, budget: &mut usize) -> Vec<Reach> {
        let mut out = Vec::new();
        if depth == 0 {
            return out;
        }
        for &(x, b) in self.adj.get(atom).map(Vec::as_slice).unwrap_or(&[]) {
            if x == from || *budget == 0 {
                continue;
            }
            if x >= self.atoms.len() {
                continue;
            }
            *budget -= 1;
            out.push(Reach {
                atom: x,
                bond: b,
                next: self.reach(x, atom, depth - 1, budget),
                sig_mask: 0,
                sig_value: 0,
                bond_mask: u16::MAX,
            });
        }
        out
    }
}
