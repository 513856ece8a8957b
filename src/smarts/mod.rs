//! Substructure patterns: a documented SMARTS subset parsed into a query
//! graph, and a non-induced backtracking matcher over [`crate::mol::Molecule`].
//!
//! # Supported SMARTS
//!
//! * Atoms outside brackets: the organic subset `B C N O P S F Cl Br I`,
//!   aromatic `b c n o p s`, `*`, `A`, `a`.
//! * Bracket primitives: element symbols (upper case aliphatic, lower case
//!   aromatic, two-letter symbols), `#n`, `*`, `A`, `a`, `H n` (total H),
//!   `h n` (hydrogens on the atom; alone: at least one), `D n` (explicit
//!   connections), `X n` (connections including H), `v n` (total valence),
//!   `R` / `R n` (number of SSSR rings), `r` / `r n` (smallest SSSR ring
//!   size), `x` / `x n` (ring bonds), charges `+ - +n -n ++ --`, isotope
//!   (`[13C]`), atom map `:n`, recursive `$( … )`. A number left off means
//!   1 for `H D X v`, and "any ring / at least one" for `R r x h`.
//! * Logic: `!` binds tightest, then `&` (and the implicit "and" of
//!   juxtaposition), then `,`, then `;`.
//! * Bonds: `- = # : ~ @` with `! & , ;`; no symbol means single or
//!   aromatic. Branches, ring closures (`1`, `%12`, `%(123)`), `.`
//!   components (which may match atoms of one molecular fragment).
//! * Not supported (clear error with position): chirality `@` in atoms,
//!   directional bonds `/ \`, `$name` macros, reaction SMARTS `>`,
//!   component grouping `( … ).( … )`, ranges `{…}`, RDKit extensions
//!   such as `^`, `z`, `Z`.
//!
//! Primitives follow RDKit's meaning on a hydrogen-suppressed molecule:
//! every hydrogen is folded into its heavy atom, so `h n` equals `H n`
//! (RDKit's `h` counts the hydrogens an atom carries, bracket or not).
//! `v` is the sum of Kekulé bond orders plus hydrogens. Bonds the molecule
//! core marks dative (amine to metal and the like) match only `~` (and
//! negations), leave the donor's `v` and make no rings, as in RDKit. Ring primitives
//! use the SSSR symmetrised as RDKit does (cubane has six rings, so every
//! atom is `R3`); `R`, `r`, `x` alone and `@` only need ring bonds. The
//! reference test compares unique match counts with RDKit's for 94
//! patterns over 2,436 molecules.
//!
//! Limits: at most [`MAX_ATOMS`] pattern atoms and [`MAX_RECURSION_DEPTH`]
//! levels of `$( … )`; the parser and the search keep their own stacks, so
//! no input can overflow the call stack. A pattern that is very general for
//! a molecule (`*~*~*~*~*~*~*~*`) can still have a great many matches: the
//! `*_limited` methods stop after a given number of steps.
//!
//! # Matching
//!
//! Matching is non-induced (pattern bonds must be present; extra molecule
//! bonds between matched atoms are allowed), by backtracking over an atom
//! order that starts at the most selective atom (or the anchor) and grows
//! through connected atoms; ring-closure bonds are checked as soon as both
//! ends are placed. Unique matches count each set of molecule atoms once,
//! as RDKit's `GetSubstructMatches(uniquify=True)` does. Recursive
//! primitives are evaluated once per molecule atom and call. Cheap screens
//! (atom, element, aromatic-atom, multiple-bond and ring counts) reject most
//! molecules without a search.
//!
//! # Use
//!
//! ```
//! use acidsite::mol::Molecule;
//! use acidsite::smarts::{Pattern, Target};
//!
//! // Alpha C-H of a ketone; the anchor is the `:1` atom.
//! let p = Pattern::parse("[CX4;!H0:1][CX3](=O)[#6]").unwrap();
//! let m = Molecule::from_smiles("CC(=O)CC").unwrap();
//! assert_eq!(p.anchor(), Some(0));
//! assert!(p.matches_at(&m, 3).is_some());
//! // Both alpha carbons give the same atom set {0, 1, 2, 3}: one unique
//! // match. Use the anchored calls to list sites.
//! assert_eq!(p.count_unique(&m), 1);
//!
//! // Many patterns over one molecule: prepare it once.
//! let t = Target::new(&m);
//! assert_eq!(p.anchored_atoms_in(&t), vec![0, 3]);
//! ```

#![warn(missing_docs)]

mod expr;
mod matcher;
mod parse;
mod target;

pub use expr::{AtomExpr, AtomFilter, AtomPrim, BondExpr, BondPrim};
pub use parse::{MAX_ATOMS, MAX_RECURSION_DEPTH};
pub use target::Target;

use crate::mol::Molecule;
use matcher::{new_cache, search, DoneSet};
use std::collections::HashSet;

/// A parse error with the character position in the pattern.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct PatternError {
    /// What is wrong, naming the unsupported feature where there is one.
    pub message: String,
    /// 0-based character position in the pattern.
    pub position: usize,
    /// The pattern text.
    pub pattern: String,
}

impl std::fmt::Display for PatternError {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        write!(
            f,
            "SMARTS error at character {}: {}",
            self.position, self.message
        )
    }
}

impl std::error::Error for PatternError {}

/// Which bound stopped [`Pattern::count_unique_bounded`].
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
#[non_exhaustive]
pub enum CountBound {
    /// More matches than the match bound.
    Matches,
    /// The step budget ran out.
    Steps,
}

/// A bounded search ran out of steps before finishing.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct LimitReached {
    /// The step budget that was exhausted.
    pub max_steps: u64,
}

impl std::fmt::Display for LimitReached {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        write!(
            f,
            "substructure search stopped after {} steps (pattern too general for this molecule)",
            self.max_steps
        )
    }
}

impl std::error::Error for LimitReached {}

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

    fn set_anchor(&mut self, anchor: usize) {
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
    fn fill_reach(&mut self) {
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

/// Lower bounds a molecule must meet before matching is tried.
#[derive(Debug, Clone, Default)]
struct Screen {
    atoms: usize,
    elements: Vec<(u8, u16)>,
    /// Per pattern atom that allows several elements only: the molecule
    /// needs an atom of one of them (bits as in
    /// [`expr::possible_elements`]).
    element_sets: Vec<u128>,
    aromatic: usize,
    ring: bool,
    double: usize,
    triple: usize,
    aromatic_bonds: usize,
}

/// A compiled SMARTS pattern.
#[derive(Debug, Clone)]
pub struct Pattern {
    /// The pattern text as given.
    pub source: String,
    main: Query,
    recursive: Vec<Query>,
    anchor: Option<usize>,
    screen: Screen,
}

impl Pattern {
    /// Parse a SMARTS pattern of the supported subset (see the module
    /// documentation). Errors carry the 0-based character position.
    pub fn parse(smarts: &str) -> Result<Pattern, PatternError> {
        let parse::Parsed {
            mut main,
            mut recursive,
        } = parse::parse(smarts)?;
        // Signature filters implied by whole expressions (alternatives and
        // recursive parts included), computed once all parts are known.
        let implied: Vec<Vec<(u64, u64)>> = recursive
            .iter()
            .map(|q| {
                q.atoms
                    .iter()
                    .map(|a| expr::implied_signature(&a.expr, &recursive, 0))
                    .collect()
            })
            .collect();
        for (q, sigs) in recursive.iter_mut().zip(implied) {
            for (a, sig) in q.atoms.iter_mut().zip(sigs) {
                (a.sig_mask, a.sig_value) = sig;
            }
        }
        for a in &mut main.atoms {
            (a.sig_mask, a.sig_value) = expr::implied_signature(&a.expr, &recursive, 0);
        }
        let anchor = main.atoms.iter().position(|a| a.map == Some(1));
        if let Some(a) = anchor {
            main.set_anchor(a);
        }
        for q in recursive.iter_mut().chain(std::iter::once(&mut main)) {
            q.fill_reach();
        }
        let mut screen = Screen {
            atoms: main.atoms.len(),
            ..Screen::default()
        };
        let mut counts = [0u16; 256];
        // Recursive parts that every match needs (and-ed at the top level
        // of an atom): the molecule must contain their elements too. They
        // may overlap the main pattern, so they raise counts to their own
        // need rather than adding to it.
        for a in &main.atoms {
            for id in a.expr.required_recursions() {
                let mut need = [0u16; 256];
                for ra in recursive.get(id).map(|q| q.atoms.as_slice()).unwrap_or(&[]) {
                    if let Some(e) = ra.element {
                        need[e as usize] = need[e as usize].saturating_add(1);
                    }
                }
                for (c, n) in counts.iter_mut().zip(need) {
                    *c = (*c).max(n);
                }
            }
        }
        let mut main_counts = [0u16; 256];
        for a in &main.atoms {
            if let Some(e) = a.element {
                main_counts[e as usize] = main_counts[e as usize].saturating_add(1);
            }
            if a.expr.requires_aromatic() {
                screen.aromatic += 1;
            }
            if a.expr.requires_ring() {
                screen.ring = true;
            }
        }
        for (c, n) in counts.iter_mut().zip(main_counts) {
            *c = (*c).max(n);
        }
        for b in &main.bonds {
            if b.expr.requires_ring() {
                screen.ring = true;
            }
            match b.expr.required_order() {
                Some(BondPrim::Double) => screen.double += 1,
                Some(BondPrim::Triple) => screen.triple += 1,
                Some(BondPrim::Aromatic) => screen.aromatic_bonds += 1,
                _ => {}
            }
        }
        screen.elements = counts
            .iter()
            .enumerate()
            .filter(|(_, &c)| c > 0)
            .map(|(e, &c)| (e as u8, c))
            .collect();
        for a in &main.atoms {
            if let Some(set) = expr::possible_elements(&a.expr, &recursive, 0) {
                if set.count_ones() != 1 && !screen.element_sets.contains(&set) {
                    screen.element_sets.push(set);
                }
            }
        }
        Ok(Pattern {
            source: smarts.to_string(),
            main,
            recursive,
            anchor,
            screen,
        })
    }

    /// Index (in the pattern) of the atom labelled with atom-map `:1`, the
    /// anchor whose hydrogen a rule is about; None if unlabelled.
    pub fn anchor(&self) -> Option<usize> {
        self.anchor
    }

    /// The atom [`Pattern::matches_at`] places: the `:1` atom, else atom 0.
    pub fn anchor_or_first(&self) -> usize {
        self.anchor.unwrap_or(0)
    }

    /// Number of atoms in the pattern (not counting recursive parts).
    pub fn atom_count(&self) -> usize {
        self.main.atoms.len()
    }

    /// Number of bonds in the pattern (not counting recursive parts).
    pub fn bond_count(&self) -> usize {
        self.main.bonds.len()
    }

    /// The pattern bonds as pairs of pattern atom indices (not counting
    /// recursive parts), in the order written (ring closures at the
    /// closing digit).
    pub fn bond_atoms(&self) -> Vec<[usize; 2]> {
        self.main.bonds.iter().map(|b| b.atoms).collect()
    }

    /// Atom-map label of pattern atom `i`, if it has one.
    pub fn map_label(&self, i: usize) -> Option<u16> {
        self.main.atoms.get(i).and_then(|a| a.map)
    }

    /// First pattern atom carrying atom-map label `label`.
    pub fn atom_with_map(&self, label: u16) -> Option<usize> {
        self.main.atoms.iter().position(|a| a.map == Some(label))
    }

    /// Character position of pattern atom `i` in the pattern text.
    pub fn atom_position(&self, i: usize) -> Option<usize> {
        self.main.atoms.get(i).map(|a| a.position)
    }

    /// Could the pattern match this molecule at all? Cheap checks only
    /// (atom count, element counts, aromatic atoms, double, triple and
    /// aromatic bonds, rings); `false` means
    /// it certainly does not match.
    pub fn passes_screen(&self, t: &Target) -> bool {
        let s = &self.screen;
        if t.atom_count() < s.atoms
            || t.aromatic_count < s.aromatic
            || t.double_count < s.double
            || t.triple_count < s.triple
            || t.aromatic_bond_count < s.aromatic_bonds
        {
            return false;
        }
        if !s
            .elements
            .iter()
            .all(|&(e, c)| t.element_count.get(e as usize).copied().unwrap_or(0) >= c)
        {
            return false;
        }
        if !s.element_sets.iter().all(|&set| set & t.element_mask != 0) {
            return false;
        }
        !s.ring || t.has_ring()
    }

    /// Unique matches (the same set of molecule atoms counts once). Each
    /// match maps pattern atom index -> molecule atom index.
    pub fn unique_matches(&self, mol: &Molecule) -> Vec<Vec<usize>> {
        self.unique_matches_in(&Target::new(mol))
    }

    /// Number of unique matches (see [`Pattern::unique_matches`]).
    pub fn count_unique(&self, mol: &Molecule) -> usize {
        self.count_unique_in(&Target::new(mol))
    }

    /// Does the pattern match anywhere?
    pub fn is_match(&self, mol: &Molecule) -> bool {
        self.is_match_in(&Target::new(mol))
    }

    /// Does the pattern match with its anchor atom on molecule atom `atom`?
    /// Returns one such mapping (pattern atom -> molecule atom).
    pub fn matches_at(&self, mol: &Molecule, atom: usize) -> Option<Vec<usize>> {
        self.matches_at_in(&Target::new(mol), atom)
    }

    /// All unique matches with the anchor atom on molecule atom `atom`.
    pub fn matches_at_all(&self, mol: &Molecule, atom: usize) -> Vec<Vec<usize>> {
        self.matches_at_all_in(&Target::new(mol), atom)
    }

    /// Molecule atoms (ascending) on which the anchor atom can be placed.
    pub fn anchored_atoms(&self, mol: &Molecule) -> Vec<usize> {
        self.anchored_atoms_in(&Target::new(mol))
    }

    /// [`Pattern::unique_matches`] on a prepared molecule.
    pub fn unique_matches_in(&self, t: &Target) -> Vec<Vec<usize>> {
        let mut out = Vec::new();
        self.each_unique(t, None, u64::MAX, &mut |m| {
            out.push(m.to_vec());
            true
        });
        out
    }

    /// [`Pattern::count_unique`] on a prepared molecule.
    pub fn count_unique_in(&self, t: &Target) -> usize {
        let mut n = 0;
        self.each_unique(t, None, u64::MAX, &mut |_| {
            n += 1;
            true
        });
        n
    }

    /// [`Pattern::count_unique_in`] that gives up after trying `max_steps`
    /// candidate atoms (recursive parts included), for patterns from
    /// untrusted input: a pattern such as `*~*~*~*~*~*~*~*` has very many
    /// matches in a large molecule. About 10^7 steps take well under a
    /// second.
    pub fn count_unique_limited(&self, t: &Target, max_steps: u64) -> Result<usize, LimitReached> {
        let mut n = 0;
        let complete = self.each_unique(t, None, max_steps, &mut |_| {
            n += 1;
            true
        });
        if complete {
            Ok(n)
        } else {
            Err(LimitReached { max_steps })
        }
    }

    /// Unique matches counted with two bounds, for patterns from untrusted
    /// input (`--flag`): at most `max_matches` matches and `max_steps`
    /// matcher steps. Returns the count and, when a bound stopped the
    /// count, which one (the count is then a lower bound).
    pub fn count_unique_bounded(
        &self,
        t: &Target,
        max_matches: usize,
        max_steps: u64,
    ) -> (usize, Option<CountBound>) {
        let mut n = 0usize;
        let complete = self.each_unique(t, None, max_steps, &mut |_| {
            n += 1;
            n <= max_matches
        });
        if n > max_matches {
            (max_matches, Some(CountBound::Matches))
        } else if !complete {
            (n, Some(CountBound::Steps))
        } else {
            (n, None)
        }
    }

    /// [`Pattern::is_match`] on a prepared molecule.
    pub fn is_match_in(&self, t: &Target) -> bool {
        if !self.passes_screen(t) {
            return false;
        }
        let mut cache = new_cache(u64::MAX);
        let mut found = false;
        search(
            self,
            &self.main,
            &self.main.plan_free,
            t,
            &mut cache,
            None,
            None,
            &mut |_| {
                found = true;
                false
            },
        );
        found
    }

    /// [`Pattern::matches_at`] on a prepared molecule.
    pub fn matches_at_in(&self, t: &Target, atom: usize) -> Option<Vec<usize>> {
        if !self.passes_screen(t) {
            return None;
        }
        self.matches_at_screened(t, atom)
    }

    /// [`Pattern::matches_at_in`] for a caller that has already seen
    /// [`Pattern::passes_screen`] hold for this target (when trying one
    /// pattern on many atoms).
    pub(crate) fn matches_at_screened(&self, t: &Target, atom: usize) -> Option<Vec<usize>> {
        // The anchor's simple comparisons first: they reject most atoms at
        // once; the rest of its expression is tested by the search.
        let qa = self.main.atoms.get(self.anchor_or_first())?;
        if t.sig.get(atom)? & qa.sig_mask != qa.sig_value {
            return None;
        }
        let first = self.main.plan_anchor.first()?;
        if !matcher::reach_ok(&first.reach, atom, usize::MAX, t) {
            return None;
        }
        let mut cache = new_cache(u64::MAX);
        self.anchored_one(t, atom, &mut cache)
    }

    /// [`Pattern::matches_at_all`] on a prepared molecule.
    pub fn matches_at_all_in(&self, t: &Target, atom: usize) -> Vec<Vec<usize>> {
        let mut out = Vec::new();
        if atom >= t.atom_count() {
            return out;
        }
        self.each_unique(t, Some(atom), u64::MAX, &mut |m| {
            out.push(m.to_vec());
            true
        });
        out
    }

    /// [`Pattern::anchored_atoms`] on a prepared molecule.
    pub fn anchored_atoms_in(&self, t: &Target) -> Vec<usize> {
        self.anchored_atoms_limited(t, u64::MAX).unwrap_or_default()
    }

    /// [`Pattern::anchored_atoms_in`] that gives up after trying
    /// `max_steps` candidate atoms (see [`Pattern::count_unique_limited`]).
    pub fn anchored_atoms_limited(
        &self,
        t: &Target,
        max_steps: u64,
    ) -> Result<Vec<usize>, LimitReached> {
        let mut out = Vec::new();
        if !self.passes_screen(t) {
            return Ok(out);
        }
        let mut cache = new_cache(max_steps);
        let anchor = self.anchor_or_first();
        // One search from the most selective atom; each anchor atom is
        // recorded once and never tried again.
        let done = DoneSet::new(t.atom_count());
        search(
            self,
            &self.main,
            &self.main.plan_free,
            t,
            &mut cache,
            None,
            Some((anchor, &done)),
            &mut |m| {
                if let Some(&a) = m.get(anchor) {
                    done.set(a);
                }
                true
            },
        );
        if cache.exhausted {
            return Err(LimitReached { max_steps });
        }
        out = done.atoms();
        Ok(out)
    }

    fn anchored_one(
        &self,
        t: &Target,
        atom: usize,
        cache: &mut matcher::RecCache,
    ) -> Option<Vec<usize>> {
        let mut result = None;
        search(
            self,
            &self.main,
            &self.main.plan_anchor,
            t,
            cache,
            Some(atom),
            None,
            &mut |m| {
                result = Some(m.to_vec());
                false
            },
        );
        result
    }

    /// Visit each unique match (optionally with the anchor fixed).
    /// Returns false if the search budget ran out first.
    fn each_unique(
        &self,
        t: &Target,
        anchored: Option<usize>,
        max_steps: u64,
        f: &mut dyn FnMut(&[usize]) -> bool,
    ) -> bool {
        if !self.passes_screen(t) {
            return true;
        }
        let mut cache = new_cache(max_steps);
        let mut seen: HashSet<Vec<usize>> = HashSet::new();
        let plan = if anchored.is_some() {
            &self.main.plan_anchor
        } else {
            &self.main.plan_free
        };
        search(
            self,
            &self.main,
            plan,
            t,
            &mut cache,
            anchored,
            None,
            &mut |m| {
                let mut key = m.to_vec();
                key.sort_unstable();
                if seen.insert(key) {
                    f(m)
                } else {
                    true
                }
            },
        );
        !cache.exhausted
    }
}
