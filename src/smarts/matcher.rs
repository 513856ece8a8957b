//! Non-induced subgraph matching by backtracking over a fixed atom order.
//!
//! The search is iterative (an explicit cursor per pattern atom), so its
//! stack use does not grow with the pattern; evaluating a recursive
//! `$( … )` primitive starts a nested search, whose depth is bounded by the
//! nesting limit of the parser.

use super::expr::{AtomExpr, AtomPrim, BondExpr, BondPrim};
use super::target::Target;
use super::{Pattern, Query, Step};
use crate::mol::BondOrder;

/// Per-call cache of recursive-primitive results: `cache[id][atom]` is 0
/// (unknown), 1 (matches) or 2 (does not).
pub(crate) type RecCache = Vec<Vec<u8>>;

pub(crate) fn new_cache(pat: &Pattern) -> RecCache {
    vec![Vec::new(); pat.recursive.len()]
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
            Some(n) => info.rings == n,
            None => info.rings > 0,
        },
        AtomPrim::RingSize(n) => match n {
            Some(n) => info.min_ring == n,
            None => info.min_ring > 0,
        },
        AtomPrim::RingBonds(n) => match n {
            Some(n) => info.ring_bonds == n,
            None => info.ring_bonds > 0,
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
    let mut found = false;
    search(pat, q, &q.plan_anchor, t, cache, Some(a), &mut |_| {
        found = true;
        false
    });
    if let Some(slot) = cache.get_mut(id) {
        if slot.len() != t.atoms.len() {
            *slot = vec![0; t.atoms.len()];
        }
        if let Some(v) = slot.get_mut(a) {
            *v = if found { 1 } else { 2 };
        }
    }
    found
}

/// Does molecule bond `b` satisfy `expr`?
pub(crate) fn bond_matches(expr: &BondExpr, b: usize, t: &Target) -> bool {
    match expr {
        BondExpr::Prim(p) => {
            let Some(&order) = t.bond_order.get(b) else {
                return false;
            };
            match p {
                BondPrim::Single => order == BondOrder::Single,
                BondPrim::Double => order == BondOrder::Double,
                BondPrim::Triple => order == BondOrder::Triple,
                BondPrim::Aromatic => order == BondOrder::Aromatic,
                BondPrim::Any => true,
                BondPrim::Ring => t.bond_ring.get(b).copied().unwrap_or(false),
                BondPrim::Implicit => matches!(order, BondOrder::Single | BondOrder::Aromatic),
            }
        }
        BondExpr::Not(e) => !bond_matches(e, b, t),
        BondExpr::And(v) => v.iter().all(|e| bond_matches(e, b, t)),
        BondExpr::Or(v) => v.iter().any(|e| bond_matches(e, b, t)),
    }
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
    let Some(qa) = q.atoms.get(p) else {
        return false;
    };
    if let Some(e) = qa.element {
        match t.atoms.get(a) {
            Some(info) if info.element == e => {}
            _ => return false,
        }
    }
    atom_matches(&qa.expr, a, t, pat, cache)
}

/// Enumerate matches of `q` following `plan`. With `start`, the first plan
/// atom is fixed to that molecule atom. `visit` receives the mapping
/// (pattern atom -> molecule atom) and returns whether to continue.
pub(crate) fn search(
    pat: &Pattern,
    q: &Query,
    plan: &[Step],
    t: &Target,
    cache: &mut RecCache,
    start: Option<usize>,
    visit: &mut dyn FnMut(&[usize]) -> bool,
) {
    let depth = plan.len();
    if depth == 0 || depth > t.atoms.len() || q.atoms.len() != depth {
        return;
    }
    let n = t.atoms.len();
    let mut map = vec![usize::MAX; depth];
    // Molecule atom chosen at each plan step, and the cursor into that
    // step's candidate list.
    let mut chosen = vec![usize::MAX; depth];
    let mut cursor = vec![0usize; depth];
    let mut d = 0usize;
    loop {
        let step = &plan[d];
        let mut found = None;
        loop {
            // Next candidate molecule atom (and the bond to the parent).
            let cand = match (d, start, step.parent) {
                (0, Some(s), _) => {
                    if cursor[0] == 0 && s < n {
                        cursor[0] = 1;
                        Some(s)
                    } else {
                        None
                    }
                }
                (_, _, Some((pp, qb))) => {
                    let from = map[pp];
                    let nbrs = t.adj.get(from).map(|v| v.as_slice()).unwrap_or(&[]);
                    let mut got = None;
                    while cursor[d] < nbrs.len() {
                        let (x, b) = nbrs[cursor[d]];
                        cursor[d] += 1;
                        if q.bonds
                            .get(qb)
                            .is_some_and(|qbond| bond_matches(&qbond.expr, b, t))
                        {
                            got = Some(x);
                            break;
                        }
                    }
                    got
                }
                _ => {
                    if cursor[d] < n {
                        cursor[d] += 1;
                        Some(cursor[d] - 1)
                    } else {
                        None
                    }
                }
            };
            let Some(a) = cand else { break };
            if chosen[..d].contains(&a) {
                continue;
            }
            if !query_atom_matches(q, step.atom, a, t, pat, cache) {
                continue;
            }
            let closures_ok = step.closures.iter().all(|&(other, qb)| {
                let m = map[other];
                match (t.bond_between(a, m), q.bonds.get(qb)) {
                    (Some(b), Some(qbond)) => bond_matches(&qbond.expr, b, t),
                    _ => false,
                }
            });
            if closures_ok {
                found = Some(a);
                break;
            }
        }
        match found {
            Some(a) => {
                map[step.atom] = a;
                chosen[d] = a;
                if d + 1 == depth {
                    if !visit(&map) {
                        return;
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
