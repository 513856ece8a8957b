//! Non-induced subgraph matching by backtracking over a fixed atom order.
//!
//! The search is iterative (an explicit cursor per pattern atom), so its
//! stack use does not grow with the pattern; evaluating a recursive
//! `$( … )` primitive starts a nested search, whose depth is bounded by the
//! nesting limit of the parser.

use super::expr::{AtomExpr, AtomPrim};
use super::target::{NbrInfo, Target};
use super::{Pattern, Query, QueryBond, Reach, Step};
use crate::mol::BondOrder;
use std::cell::Cell;

/// Per-call state: the cache of recursive-primitive results
/// (`rec[id][atom]` is 0 unknown, 1 matches, 2 does not) and the search
/// budget (candidate atoms tried).
pub(crate) struct RecCache {
    rec: Vec<Vec<u8>>,
    steps_left: u64,
    pub exhausted: bool,
}

impl RecCache {
    fn get(&self, id: usize) -> Option<&Vec<u8>> {
        self.rec.get(id)
    }
    /// The slot of recursive part `id` (of `count`), created on first use.
    fn get_mut(&mut self, id: usize, count: usize) -> Option<&mut Vec<u8>> {
        if self.rec.len() < count {
            self.rec.resize(count, Vec::new());
        }
        self.rec.get_mut(id)
    }
}

/// A fresh per-call state; allocates nothing until a recursive part is
/// evaluated.
pub(crate) fn new_cache(max_steps: u64) -> RecCache {
    RecCache {
        rec: Vec::new(),
        steps_left: max_steps,
        exhausted: false,
    }
}

/// Does molecule atom `a` satisfy `expr`?
pub(crate) fn atom_matches(
    expr: &AtomExpr,
    a: usize,
    t: &Target,
    pat: &Pattern,
    cache: &mut RecCache,
) -> bool {
    match expr {
        AtomExpr::Prim(p) => prim_matches(p, a, t, pat, cache),
        AtomExpr::Not(e) => !atom_matches(e, a, t, pat, cache),
        AtomExpr::And(v) => v.iter().all(|e| atom_matches(e, a, t, pat, cache)),
        AtomExpr::Or(v) => v.iter().any(|e| atom_matches(e, a, t, pat, cache)),
    }
}

fn prim_matches(p: &AtomPrim, a: usize, t: &Target, pat: &Pattern, cache: &mut RecCache) -> bool {
    let Some(info) = t.atoms.get(a) else {
        return false;
    };
    match *p {
        AtomPrim::Any => true,
        AtomPrim::Element { number, aromatic } => {
            info.element == number && aromatic.is_none_or(|ar| ar == info.aromatic)
        }
        AtomPrim::Aromatic(ar) => info.aromatic == ar,
        AtomPrim::TotalH(n) => info.hydrogens == n,
        AtomPrim::ImplicitH(n) => match n {
            Some(n) => info.hydrogens == n,
            None => info.hydrogens > 0,
        },
        AtomPrim::Degree(n) => info.degree == n,
        AtomPrim::Connectivity(n) => info.degree as u16 + info.hydrogens as u16 == n as u16,
        AtomPrim::Valence(n) => info.valence == n,
        AtomPrim::RingCount(n) => match n {
            Some(0) => t.ring_bond_count(a) == 0,
            Some(n) => t.atom_ring_count(a) == n,
            None => t.ring_bond_count(a) > 0,
        },
        AtomPrim::RingSize(n) => match n {
            Some(0) => t.ring_bond_count(a) == 0,
            Some(n) => t.smallest_ring(a) == n,
            None => t.ring_bond_count(a) > 0,
        },
        AtomPrim::RingBonds(n) => match n {
            Some(n) => t.ring_bond_count(a) == n,
            None => t.ring_bond_count(a) > 0,
        },
        AtomPrim::Charge(c) => info.charge == c,
        AtomPrim::Isotope(i) => info.isotope == i,
        AtomPrim::Recursive(id) => recursive_matches(id, a, t, pat, cache),
    }
}

fn recursive_matches(id: usize, a: usize, t: &Target, pat: &Pattern, cache: &mut RecCache) -> bool {
    let Some(q) = pat.recursive.get(id) else {
        return false;
    };
    if let Some(slot) = cache.get(id) {
        if let Some(&v) = slot.get(a) {
            if v != 0 {
                return v == 1;
            }
        }
    }
    // The quick tests are not worth a cache slot (which allocates).
    let reach = q.plan_anchor.first().map_or(&[][..], |s| &s.reach);
    let root_ok = t.sig.get(a).is_some_and(|&s| {
        q.atoms
            .get(q.plan_anchor.first().map_or(0, |s| s.atom))
            .is_some_and(|qa| s & qa.sig_mask == qa.sig_value)
    }) && reach_ok(reach, a, usize::MAX, t);
    if !root_ok {
        return false;
    }
    let mut found = false;
    search(pat, q, &q.plan_anchor, t, cache, Some(a), None, &mut |_| {
        found = true;
        false
    });
    if cache.exhausted {
        return false;
    }
    if let Some(slot) = cache.get_mut(id, pat.recursive.len()) {
        if slot.len() != t.atoms.len() {
            *slot = vec![0; t.atoms.len()];
        }
        if let Some(v) = slot.get_mut(a) {
            *v = if found { 1 } else { 2 };
        }
    }
    found
}

/// Does molecule atom `a` (reached from `from`, or `usize::MAX` at the
/// start) meet every condition of `reach`, each with its own neighbour?
/// At most [`REACH_BUDGET`] neighbour tests are made; beyond that the
/// answer is yes (the test only has to be necessary). Recursion depth is
/// bounded by the depth the conditions were built with.
pub(crate) fn reach_ok(reach: &[Reach], a: usize, from: usize, t: &Target) -> bool {
    let mut budget = REACH_BUDGET;
    reach_within(reach, a, from, t, &mut budget)
}

/// Neighbour tests one [`reach_ok`] call may make.
const REACH_BUDGET: u32 = 400;

fn reach_within(reach: &[Reach], a: usize, from: usize, t: &Target, budget: &mut u32) -> bool {
    if reach.is_empty() {
        return true;
    }
    let nbrs = t.nbr_info(a);
    // The neighbour itself: bond and signature filter.
    let near = |r: &Reach, nb: &NbrInfo| -> bool {
        nb.sig & r.sig_mask == r.sig_value
            && r.bond_mask >> nb.state & 1 == 1
            && nb.atom as usize != from
    };
    // ... and what lies beyond it.
    let far = |r: &Reach, nb: &NbrInfo, budget: &mut u32| -> bool {
        if *budget == 0 {
            return true;
        }
        *budget -= 1;
        reach_within(&r.next, nb.atom as usize, a, t, budget)
    };
    const MAX_ALTS: usize = 8;
    if reach.len() == 1 || reach.len() > MAX_ALTS || nbrs.len() > 64 {
        return reach.iter().all(|r| nbrs.iter().any(|nb| near(r, nb)))
            && reach
                .iter()
                .all(|r| nbrs.iter().any(|nb| near(r, nb) && far(r, nb, budget)));
    }
    // Several conditions: they need different neighbours (a matching),
    // first on the neighbours alone, then with what lies beyond.
    let mut masks = [0u64; MAX_ALTS];
    for (r, mask) in reach.iter().zip(masks.iter_mut()) {
        for (j, nb) in nbrs.iter().enumerate() {
            if near(r, nb) {
                *mask |= 1 << j;
            }
        }
        if *mask == 0 {
            return false;
        }
    }
    let n = reach.len();
    if !has_matching(&masks[..n]) {
        return false;
    }
    let mut deep = false;
    for (r, mask) in reach.iter().zip(masks.iter_mut()) {
        if r.next.is_empty() {
            continue;
        }
        deep = true;
        let mut bits = *mask;
        while bits != 0 {
            let j = bits.trailing_zeros() as usize;
            bits &= bits - 1;
            if let Some(nb) = nbrs.get(j) {
                if !far(r, nb, budget) {
                    *mask &= !(1 << j);
                }
            }
        }
        if *mask == 0 {
            return false;
        }
    }
    !deep || has_matching(&masks[..n])
}

/// Can every condition (bit mask of the neighbours it accepts) have a
/// neighbour of its own?
fn has_matching(masks: &[u64]) -> bool {
    // Usually each condition can simply take its lowest free neighbour.
    let mut used = 0u64;
    if masks.iter().all(|&m| {
        let free = m & !used;
        used |= free & free.wrapping_neg();
        free != 0
    }) {
        return true;
    }
    let mut owner = [u8::MAX; 64];
    (0..masks.len()).all(|i| {
        let mut seen = 0u64;
        augment(i, masks, &mut owner, &mut seen)
    })
}

/// Kuhn's augmenting path for condition `i` over neighbour bit masks;
/// recursion depth is at most the number of conditions.
fn augment(i: usize, masks: &[u64], owner: &mut [u8; 64], seen: &mut u64) -> bool {
    let mut free = masks.get(i).copied().unwrap_or(0) & !*seen;
    while free != 0 {
        let j = free.trailing_zeros() as usize;
        free &= free - 1;
        *seen |= 1 << j;
        let holder = owner[j];
        if holder == u8::MAX || augment(holder as usize, masks, owner, seen) {
            owner[j] = i as u8;
            return true;
        }
    }
    false
}

/// Molecule atoms already found as anchors: a bit set on the stack for
/// molecules up to 128 atoms, a vector beyond.
pub(crate) enum DoneSet {
    Bits(Cell<u128>),
    Vec(Vec<Cell<bool>>),
}

impl DoneSet {
    pub(crate) fn new(n: usize) -> DoneSet {
        if n <= 128 {
            DoneSet::Bits(Cell::new(0))
        } else {
            DoneSet::Vec(vec![Cell::new(false); n])
        }
    }
    #[inline]
    pub(crate) fn get(&self, a: usize) -> bool {
        match self {
            DoneSet::Bits(b) => a < 128 && b.get() >> a & 1 == 1,
            DoneSet::Vec(v) => v.get(a).is_some_and(|c| c.get()),
        }
    }
    #[inline]
    pub(crate) fn set(&self, a: usize) {
        match self {
            DoneSet::Bits(b) => {
                if a < 128 {
                    b.set(b.get() | 1 << a);
                }
            }
            DoneSet::Vec(v) => {
                if let Some(c) = v.get(a) {
                    c.set(true);
                }
            }
        }
    }
    /// The atoms in the set, ascending.
    pub(crate) fn atoms(&self) -> Vec<usize> {
        match self {
            DoneSet::Bits(b) => {
                let mut bits = b.get();
                let mut out = Vec::with_capacity(bits.count_ones() as usize);
                while bits != 0 {
                    out.push(bits.trailing_zeros() as usize);
                    bits &= bits - 1;
                }
                out
            }
            DoneSet::Vec(v) => v
                .iter()
                .enumerate()
                .filter(|(_, c)| c.get())
                .map(|(i, _)| i)
                .collect(),
        }
    }
}

/// Bond orders in the order used by [`super::QueryBond::mask`]; state 5 is
/// a dative bond.
pub(crate) const ORDERS: [BondOrder; 5] = [
    BondOrder::Single,
    BondOrder::Double,
    BondOrder::Triple,
    BondOrder::Quadruple,
    BondOrder::Aromatic,
];

/// Number of bond states per ring flag (five orders and dative).
pub(crate) const STATES: u16 = 6;

/// Does molecule bond `b` satisfy pattern bond `q`?
#[inline]
pub(crate) fn bond_matches(q: &QueryBond, b: usize, t: &Target) -> bool {
    // A bond whose answer does not depend on ring membership has the same
    // bits in both halves of the mask.
    t.bond_state
        .get(b)
        .is_some_and(|&state| q.mask >> state & 1 == 1)
}

/// Cheap test of a pattern atom against a molecule atom, then the full
/// expression.
#[inline]
pub(crate) fn query_atom_matches(
    q: &Query,
    p: usize,
    a: usize,
    t: &Target,
    pat: &Pattern,
    cache: &mut RecCache,
) -> bool {
    let (Some(qa), Some(&sig)) = (q.atoms.get(p), t.sig.get(a)) else {
        return false;
    };
    if sig & qa.sig_mask != qa.sig_value {
        return false;
    }
    match &qa.rest {
        None => true,
        Some(rest) => atom_matches(rest, a, t, pat, cache),
    }
}

/// The start atom's cheap tests before its full expression: signature
/// filter, then the neighbourhood conditions.
#[inline]
fn root_passes(q: &Query, step: &Step, a: usize, t: &Target) -> bool {
    let (Some(qa), Some(&sig)) = (q.atoms.get(step.atom), t.sig.get(a)) else {
        return false;
    };
    sig & qa.sig_mask == qa.sig_value && reach_ok(&step.reach, a, usize::MAX, t)
}

/// Enumerate matches of `q` following `plan`. With `start`, the first plan
/// atom is fixed to that molecule atom. `visit` receives the mapping
/// (pattern atom -> molecule atom) and returns whether to continue. With
/// `skip = (p, done)`, pattern atom `p` is never placed on an atom marked
/// done (used to find each anchor atom once).
#[allow(clippy::too_many_arguments)] // internal; each argument is a distinct role
pub(crate) fn search(
    pat: &Pattern,
    q: &Query,
    plan: &[Step],
    t: &Target,
    cache: &mut RecCache,
    start: Option<usize>,
    skip: Option<(usize, &DoneSet)>,
    visit: &mut dyn FnMut(&[usize]) -> bool,
) {
    let depth = plan.len();
    if depth == 0 || depth > t.atoms.len() || q.atoms.len() != depth {
        return;
    }
    let n = t.atoms.len();
    // Mapping (by pattern atom), molecule atom chosen at each plan step, and
    // the cursor into that step's candidate list; on the stack for the
    // usual small patterns.
    const SMALL: usize = 16;
    let mut small = [usize::MAX; 3 * SMALL];
    let mut large = Vec::new();
    let buf: &mut [usize] = if depth <= SMALL {
        &mut small[..3 * depth]
    } else {
        large.resize(3 * depth, usize::MAX);
        &mut large
    };
    let (map, rest) = buf.split_at_mut(depth);
    let (chosen, cursor) = rest.split_at_mut(depth);
    cursor.fill(0);
    let skip_depth = skip.and_then(|(p, _)| plan.iter().position(|st| st.atom == p));
    // Candidates of a step without a placed neighbour: atoms of its
    // element, or all atoms.
    let root_list = |step: &Step| -> Option<&[usize]> {
        q.atoms
            .get(step.atom)
            .and_then(|qa| qa.filter.element)
            .map(|e| t.atoms_of_element(e))
    };
    let first_list = root_list(&plan[0]);
    let mut d = 0usize;
    loop {
        let step = &plan[d];
        let mut found = None;
        // Checks for one candidate molecule atom `a` at step `d`.
        macro_rules! accept {
            ($a:expr) => {{
                let a: usize = $a;
                // A nested search that ran out leaves steps_left at 0.
                if cache.steps_left == 0 {
                    cache.exhausted = true;
                    return;
                }
                cache.steps_left -= 1;
                !chosen[..d].contains(&a)
                    && !(skip_depth == Some(d) && skip.is_some_and(|(_, done)| done.get(a)))
                    && (d != 0 || root_passes(q, step, a, t))
                    && query_atom_matches(q, step.atom, a, t, pat, cache)
                    && step.closures.iter().all(|&(other, qb)| {
                        match (t.bond_between(a, map[other]), q.bonds.get(qb)) {
                            (Some(b), Some(qbond)) => bond_matches(qbond, b, t),
                            _ => false,
                        }
                    })
            }};
        }
        if let (0, Some(s)) = (d, start) {
            if cursor[0] == 0 && s < n {
                cursor[0] = 1;
                if accept!(s) {
                    found = Some(s);
                }
            }
        } else if let Some((pp, qb)) = step.parent {
            let nbrs = t.neighbors(map[pp]);
            let qbond = q.bonds.get(qb);
            while let Some(nb) = nbrs.get(cursor[d]) {
                cursor[d] += 1;
                if qbond.is_some_and(|qbond| bond_matches(qbond, nb.bond, t)) && accept!(nb.atom) {
                    found = Some(nb.atom);
                    break;
                }
            }
        } else if let Some(list) = if d == 0 { first_list } else { root_list(step) } {
            // Only atoms of the required element.
            while let Some(&a) = list.get(cursor[d]) {
                cursor[d] += 1;
                if accept!(a) {
                    found = Some(a);
                    break;
                }
            }
        } else {
            while cursor[d] < n {
                let a = cursor[d];
                cursor[d] += 1;
                if accept!(a) {
                    found = Some(a);
                    break;
                }
            }
        }
        match found {
            Some(a) => {
                map[step.atom] = a;
                chosen[d] = a;
                if d + 1 == depth {
                    if !visit(map) {
                        return;
                    }
                    // This anchor atom is done: go straight back to the
                    // anchor's step for its next candidate.
                    if let Some(ad) = skip_depth {
                        d = ad;
                    }
                } else {
                    d += 1;
                    cursor[d] = 0;
                }
            }
            None => {
                if d == 0 {
                    return;
                }
                chosen[d] = usize::MAX;
                d -= 1;
            }
        }
    }
}
