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
mod query;
mod target;

pub use expr::{AtomExpr, AtomFilter, AtomPrim, BondExpr, BondPrim};
pub use parse::{MAX_ATOMS, MAX_RECURSION_DEPTH};
pub use target::Target;

use crate::mol::Molecule;
use matcher::{new_cache, search, DoneSet};
pub(crate) use query::{Query, QueryAtom, QueryBond, Reach, Step};
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
