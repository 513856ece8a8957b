//! Query expressions: atom and bond primitives combined with the SMARTS
//! logic operators.

/// One atom primitive. Counts follow RDKit's meaning of each SMARTS
/// primitive on a hydrogen-suppressed molecule.
#[derive(Debug, Clone, PartialEq, Eq)]
pub enum AtomPrim {
    /// `*`: any atom.
    Any,
    /// An element symbol: atomic number and, where the symbol says so,
    /// aromatic (lower case) or aliphatic (upper case). `[#n]` gives `None`.
    Element {
        /// Atomic number (6 for `C`, `c` and `#6`).
        number: u8,
        /// `Some(true)` for a lower-case (aromatic) symbol, `Some(false)`
        /// for an upper-case (aliphatic) one, `None` for `[#n]`.
        aromatic: Option<bool>,
    },
    /// `a` (true) or `A` (false).
    Aromatic(bool),
    /// `H n`: total hydrogen count.
    TotalH(u8),
    /// `h n`: implicit hydrogen count (RDKit counts the hydrogens carried by
    /// the atom itself, bracket or not); `h` alone means at least one.
    ImplicitH(Option<u8>),
    /// `D n`: explicit connections.
    Degree(u8),
    /// `X n`: total connections including hydrogens.
    Connectivity(u8),
    /// `v n`: total valence (bond orders, Kekulé form, plus hydrogens).
    Valence(u8),
    /// `R n`: number of SSSR rings containing the atom; `R` alone (None)
    /// means in any ring.
    RingCount(Option<u8>),
    /// `r n`: size of the smallest SSSR ring containing the atom (0 if
    /// none); `r` alone (None) means in any ring.
    RingSize(Option<u8>),
    /// `x n`: number of ring bonds on the atom; `x` alone (None) means at
    /// least one.
    RingBonds(Option<u8>),
    /// Formal charge (`+`, `-`, `+n`, `-n`, `++`, `--`).
    Charge(i8),
    /// Mass number written before the element (`[13C]`).
    Isotope(u16),
    /// `$( … )`: index into [`super::Pattern`]'s recursive sub-queries.
    Recursive(usize),
}

/// An atom expression tree.
#[derive(Debug, Clone, PartialEq, Eq)]
pub enum AtomExpr {
    /// A single primitive.
    Prim(AtomPrim),
    /// `!`: the inner expression does not hold.
    Not(Box<AtomExpr>),
    /// `&`, `;` or juxtaposition: every operand holds.
    And(Vec<AtomExpr>),
    /// `,`: at least one operand holds.
    Or(Vec<AtomExpr>),
}

/// One bond primitive.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum BondPrim {
    /// `-`: single, not aromatic.
    Single,
    /// `=`
    Double,
    /// `#`
    Triple,
    /// `:`
    Aromatic,
    /// `~`
    Any,
    /// `@`: bond in a ring.
    Ring,
    /// No bond symbol written: single or aromatic.
    Implicit,
}

/// A bond expression tree.
#[derive(Debug, Clone, PartialEq, Eq)]
pub enum BondExpr {
    /// A single primitive.
    Prim(BondPrim),
    /// `!`: the inner expression does not hold.
    Not(Box<BondExpr>),
    /// `&`, `;` or juxtaposition: every operand holds.
    And(Vec<BondExpr>),
    /// `,`: at least one operand holds.
    Or(Vec<BondExpr>),
}

impl AtomExpr {
    /// Element every match of this expression must have, if one is implied.
    pub fn required_element(&self) -> Option<u8> {
        match self {
            AtomExpr::Prim(AtomPrim::Element { number, .. }) => Some(*number),
            AtomExpr::Prim(_) | AtomExpr::Not(_) => None,
            AtomExpr::And(v) => v.iter().find_map(|e| e.required_element()),
            AtomExpr::Or(v) => {
                let first = v.first()?.required_element()?;
                v.iter()
                    .all(|e| e.required_element() == Some(first))
                    .then_some(first)
            }
        }
    }

    /// Does every match have to be aromatic?
    pub fn requires_aromatic(&self) -> bool {
        match self {
            AtomExpr::Prim(AtomPrim::Element {
                aromatic: Some(true),
                ..
            })
            | AtomExpr::Prim(AtomPrim::Aromatic(true)) => true,
            AtomExpr::Prim(_) | AtomExpr::Not(_) => false,
            AtomExpr::And(v) => v.iter().any(|e| e.requires_aromatic()),
            AtomExpr::Or(v) => !v.is_empty() && v.iter().all(|e| e.requires_aromatic()),
        }
    }

    /// Does every match have to be in a ring?
    pub fn requires_ring(&self) -> bool {
        match self {
            AtomExpr::Prim(AtomPrim::RingCount(n))
            | AtomExpr::Prim(AtomPrim::RingSize(n))
            | AtomExpr::Prim(AtomPrim::RingBonds(n)) => n.is_none_or(|n| n > 0),
            AtomExpr::Prim(_) | AtomExpr::Not(_) => false,
            AtomExpr::And(v) => v.iter().any(|e| e.requires_ring()),
            AtomExpr::Or(v) => !v.is_empty() && v.iter().all(|e| e.requires_ring()),
        }
    }

    /// A rough measure of how selective the expression is, used to choose
    /// the matching order (higher = fewer molecule atoms expected to match).
    pub fn selectivity(&self) -> u32 {
        match self {
            AtomExpr::Prim(p) => match p {
                AtomPrim::Any => 0,
                AtomPrim::Element { number: 6, .. } => 2,
                AtomPrim::Element { number: 7 | 8, .. } => 6,
                AtomPrim::Element { .. } => 9,
                AtomPrim::Aromatic(_) => 1,
                AtomPrim::Charge(c) if *c != 0 => 5,
                AtomPrim::Isotope(_) => 8,
                AtomPrim::Recursive(_) => 3,
                _ => 1,
            },
            AtomExpr::Not(_) => 1,
            AtomExpr::And(v) => v.iter().map(|e| e.selectivity()).sum(),
            AtomExpr::Or(v) => v.iter().map(|e| e.selectivity()).min().unwrap_or(0) / 2,
        }
    }

    /// Recursive parts that must match for the expression to hold (those
    /// and-ed at the top level).
    pub fn required_recursions(&self) -> Vec<usize> {
        match self {
            AtomExpr::Prim(AtomPrim::Recursive(id)) => vec![*id],
            AtomExpr::And(v) => v.iter().flat_map(|e| e.required_recursions()).collect(),
            _ => Vec::new(),
        }
    }

    /// Does the expression contain a recursive primitive?
    pub fn has_recursion(&self) -> bool {
        match self {
            AtomExpr::Prim(p) => matches!(p, AtomPrim::Recursive(_)),
            AtomExpr::Not(e) => e.has_recursion(),
            AtomExpr::And(v) | AtomExpr::Or(v) => v.iter().any(|e| e.has_recursion()),
        }
    }
}

impl BondExpr {
    /// Value of the expression for a dative bond (never in a ring): only
    /// `~` matches it, as in RDKit.
    pub fn eval_dative(&self) -> bool {
        match self {
            BondExpr::Prim(p) => matches!(p, BondPrim::Any),
            BondExpr::Not(e) => !e.eval_dative(),
            BondExpr::And(v) => v.iter().all(|e| e.eval_dative()),
            BondExpr::Or(v) => v.iter().any(|e| e.eval_dative()),
        }
    }

    /// Value of the expression for a bond of this order and ring state.
    pub fn eval(&self, order: crate::mol::BondOrder, in_ring: bool) -> bool {
        use crate::mol::BondOrder as O;
        match self {
            BondExpr::Prim(p) => match p {
                BondPrim::Single => order == O::Single,
                BondPrim::Double => order == O::Double,
                BondPrim::Triple => order == O::Triple,
                BondPrim::Aromatic => order == O::Aromatic,
                BondPrim::Any => true,
                BondPrim::Ring => in_ring,
                BondPrim::Implicit => matches!(order, O::Single | O::Aromatic),
            },
            BondExpr::Not(e) => !e.eval(order, in_ring),
            BondExpr::And(v) => v.iter().all(|e| e.eval(order, in_ring)),
            BondExpr::Or(v) => v.iter().any(|e| e.eval(order, in_ring)),
        }
    }

    /// The bond order every match must have, if the expression fixes one
    /// (double, triple or aromatic).
    pub fn required_order(&self) -> Option<BondPrim> {
        match self {
            BondExpr::Prim(p @ (BondPrim::Double | BondPrim::Triple | BondPrim::Aromatic)) => {
                Some(*p)
            }
            BondExpr::Prim(_) | BondExpr::Not(_) => None,
            BondExpr::And(v) => v.iter().find_map(|e| e.required_order()),
            BondExpr::Or(v) => {
                let first = v.first()?.required_order()?;
                v.iter()
                    .all(|e| e.required_order() == Some(first))
                    .then_some(first)
            }
        }
    }

    /// Does every match have to be a ring bond?
    pub fn requires_ring(&self) -> bool {
        match self {
            BondExpr::Prim(BondPrim::Ring) => true,
            BondExpr::Prim(_) | BondExpr::Not(_) => false,
            BondExpr::And(v) => v.iter().any(|e| e.requires_ring()),
            BondExpr::Or(v) => !v.is_empty() && v.iter().all(|e| e.requires_ring()),
        }
    }
}

/// The simple conjunctive part of an atom expression, tested by plain
/// comparisons before the remaining expression tree.
#[derive(Debug, Clone, Default, PartialEq, Eq)]
pub struct AtomFilter {
    /// Required atomic number; None: any element.
    pub element: Option<u8>,
    /// Required aromaticity (`a`/`A` or the case of the element symbol);
    /// None: either.
    pub aromatic: Option<bool>,
    /// Required total hydrogen count (`H n`); None: any.
    pub hydrogens: Option<u8>,
    /// Required explicit connections (`D n`); None: any.
    pub degree: Option<u8>,
    /// Required total connections including hydrogens (`X n`); None: any.
    pub connectivity: Option<u8>,
    /// Required formal charge; None: any.
    pub charge: Option<i8>,
    /// From `!H0`: at least one hydrogen.
    pub some_hydrogen: bool,
}

/// Bit layout of an atom signature (see [`atom_signature`]): element,
/// aromatic flag, "has hydrogen" flag, hydrogens, degree, connections and
/// charge, each in its own field, so that an [`AtomFilter`] is one mask and
/// one value.
const SIG_AROMATIC: u32 = 8;
const SIG_HAS_H: u32 = 9;
const SIG_H: u32 = 10;
const SIG_DEGREE: u32 = 18;
const SIG_X: u32 = 26;
const SIG_CHARGE: u32 = 34;
/// Set when the atom has a ring bond (see [`ring_signature`]).
pub(crate) const SIG_RING: u32 = 42;

/// The ring-membership part of an atom signature: bit [`SIG_RING`] as
/// (mask, value) when the top-level conjunction of `expr` fixes it (`R`,
/// `r`, `x` alone or negated, `R0`, `r0`, `x0`, `x n`); (0, 0) otherwise.
/// The primitives stay in the expression, so this only adds an early test.
/// Signature filter (mask, value) every atom matching `expr` passes:
/// the simple conjunctive primitives and ring membership as in
/// [`AtomFilter::split`] and [`ring_signature`], the fields on which all
/// alternatives of an `,` agree, and the filter of the first atom of a
/// recursive part. `depth` bounds the recursion through nested parts.
pub(crate) fn implied_signature(
    expr: &AtomExpr,
    recursive: &[super::Query],
    depth: usize,
) -> (u64, u64) {
    const MAX_DEPTH: usize = 8;
    if depth > MAX_DEPTH {
        return (0, 0);
    }
    match expr {
        AtomExpr::And(v) => {
            let (mut mask, mut value) = (0u64, 0u64);
            for e in v {
                let (m, x) = implied_signature(e, recursive, depth + 1);
                // Conflicting fields cannot both hold: any filter is then
                // correct, keep the first.
                let fresh = m & !mask;
                mask |= fresh;
                value |= x & fresh;
            }
            (mask, value)
        }
        AtomExpr::Or(v) => {
            let mut it = v.iter().map(|e| implied_signature(e, recursive, depth + 1));
            let Some((mut mask, mut value)) = it.next() else {
                return (0, 0);
            };
            for (m, x) in it {
                mask &= m & !(value ^ x);
                value &= mask;
            }
            (mask, value & mask)
        }
        AtomExpr::Prim(AtomPrim::Recursive(id)) => {
            let Some(q) = recursive.get(*id) else {
                return (0, 0);
            };
            let root = q.plan_anchor.first().map_or(0, |s| s.atom);
            match q.atoms.get(root) {
                Some(a) => implied_signature(&a.expr, recursive, depth + 1),
                None => (0, 0),
            }
        }
        _ => {
            let (f, _) = AtomFilter::split(expr);
            let (m, x) = f.signature();
            let (rm, rx) = ring_signature(expr);
            (m | rm, x | rx)
        }
    }
}

/// Elements (atomic numbers below 128, as bits) an atom matching `expr`
/// can have; None when any element can match. `depth` bounds the
/// recursion through nested recursive parts.
pub(crate) fn possible_elements(
    expr: &AtomExpr,
    recursive: &[super::Query],
    depth: usize,
) -> Option<u128> {
    const MAX_DEPTH: usize = 8;
    if depth > MAX_DEPTH {
        return None;
    }
    match expr {
        AtomExpr::Prim(AtomPrim::Element { number, .. }) => {
            (*number < 128).then(|| 1u128 << number)
        }
        AtomExpr::Prim(AtomPrim::Recursive(id)) => {
            let q = recursive.get(*id)?;
            let root = q.plan_anchor.first().map_or(0, |s| s.atom);
            possible_elements(&q.atoms.get(root)?.expr, recursive, depth + 1)
        }
        AtomExpr::Prim(_) | AtomExpr::Not(_) => None,
        AtomExpr::And(v) => v
            .iter()
            .filter_map(|e| possible_elements(e, recursive, depth + 1))
            .reduce(|a, b| a & b),
        AtomExpr::Or(v) => {
            let mut out = 0u128;
            for e in v {
                out |= possible_elements(e, recursive, depth + 1)?;
            }
            Some(out)
        }
    }
}

pub(crate) fn ring_signature(expr: &AtomExpr) -> (u64, u64) {
    let mut parts = Vec::new();
    flatten_and(expr, &mut parts);
    let bit = 1u64 << SIG_RING;
    for p in parts {
        let in_ring = match p {
            AtomExpr::Prim(
                AtomPrim::RingCount(n) | AtomPrim::RingSize(n) | AtomPrim::RingBonds(n),
            ) if n.is_none() => Some(true),
            AtomExpr::Prim(
                AtomPrim::RingCount(Some(0))
                | AtomPrim::RingSize(Some(0))
                | AtomPrim::RingBonds(Some(0)),
            ) => Some(false),
            AtomExpr::Prim(AtomPrim::RingBonds(Some(_))) => Some(true),
            AtomExpr::Not(inner) => match **inner {
                AtomExpr::Prim(
                    AtomPrim::RingCount(None)
                    | AtomPrim::RingSize(None)
                    | AtomPrim::RingBonds(None),
                ) => Some(false),
                _ => None,
            },
            _ => None,
        };
        if let Some(r) = in_ring {
            return (bit, if r { bit } else { 0 });
        }
    }
    (0, 0)
}

/// The signature of an atom (see [`AtomFilter::signature`]).
pub(crate) fn atom_signature(info: &super::target::AtomInfo) -> u64 {
    let x = (info.degree as u16 + info.hydrogens as u16).min(255) as u64;
    info.element as u64
        | (info.aromatic as u64) << SIG_AROMATIC
        | ((info.hydrogens > 0) as u64) << SIG_HAS_H
        | (info.hydrogens as u64) << SIG_H
        | (info.degree as u64) << SIG_DEGREE
        | x << SIG_X
        | (info.charge as u8 as u64) << SIG_CHARGE
}

impl AtomFilter {
    /// The filter as (mask, value): an atom passes when
    /// `atom_signature(atom) & mask == value`.
    pub(crate) fn signature(&self) -> (u64, u64) {
        let mut mask = 0u64;
        let mut value = 0u64;
        let mut put = |shift: u32, width: u32, v: u64| {
            let m = ((1u64 << width) - 1) << shift;
            mask |= m;
            value |= (v << shift) & m;
        };
        if let Some(e) = self.element {
            put(0, 8, e as u64);
        }
        if let Some(a) = self.aromatic {
            put(SIG_AROMATIC, 1, a as u64);
        }
        if self.some_hydrogen {
            put(SIG_HAS_H, 1, 1);
        }
        if let Some(h) = self.hydrogens {
            put(SIG_H, 8, h as u64);
        }
        if let Some(d) = self.degree {
            put(SIG_DEGREE, 8, d as u64);
        }
        if let Some(x) = self.connectivity {
            put(SIG_X, 8, x as u64);
        }
        if let Some(c) = self.charge {
            put(SIG_CHARGE, 8, c as u8 as u64);
        }
        (mask, value)
    }

    /// Split `expr` into a filter and what is left (None if nothing).
    pub fn split(expr: &AtomExpr) -> (AtomFilter, Option<AtomExpr>) {
        let mut parts = Vec::new();
        flatten_and(expr, &mut parts);
        let mut f = AtomFilter::default();
        let mut rest = Vec::new();
        for p in parts {
            if !f.absorb(p) {
                rest.push(p.clone());
            }
        }
        let rest = match rest.len() {
            0 => None,
            1 => rest.pop(),
            _ => Some(AtomExpr::And(rest)),
        };
        (f, rest)
    }

    /// Take `p` into the filter if it is simple and its slot is free.
    fn absorb(&mut self, p: &AtomExpr) -> bool {
        fn put<T: Copy>(slot: &mut Option<T>, v: T) -> bool {
            if slot.is_some() {
                return false;
            }
            *slot = Some(v);
            true
        }
        match p {
            AtomExpr::Prim(AtomPrim::Element { number, aromatic }) => {
                if self.element.is_some() || (aromatic.is_some() && self.aromatic.is_some()) {
                    return false;
                }
                self.element = Some(*number);
                if let Some(a) = aromatic {
                    self.aromatic = Some(*a);
                }
                true
            }
            AtomExpr::Prim(AtomPrim::Aromatic(a)) => put(&mut self.aromatic, *a),
            AtomExpr::Prim(AtomPrim::TotalH(n)) => put(&mut self.hydrogens, *n),
            AtomExpr::Prim(AtomPrim::Degree(n)) => put(&mut self.degree, *n),
            AtomExpr::Prim(AtomPrim::Connectivity(n)) => put(&mut self.connectivity, *n),
            AtomExpr::Prim(AtomPrim::Charge(c)) => put(&mut self.charge, *c),
            AtomExpr::Prim(AtomPrim::Any) => true,
            AtomExpr::Not(inner) if **inner == AtomExpr::Prim(AtomPrim::TotalH(0)) => {
                self.some_hydrogen = true;
                true
            }
            _ => false,
        }
    }
}

fn flatten_and<'e>(e: &'e AtomExpr, out: &mut Vec<&'e AtomExpr>) {
    match e {
        AtomExpr::And(v) => {
            for x in v {
                flatten_and(x, out);
            }
        }
        _ => out.push(e),
    }
}
