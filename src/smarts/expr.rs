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
    Element { number: u8, aromatic: Option<bool> },
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
    Prim(AtomPrim),
    Not(Box<AtomExpr>),
    And(Vec<AtomExpr>),
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
    Prim(BondPrim),
    Not(Box<BondExpr>),
    And(Vec<BondExpr>),
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
