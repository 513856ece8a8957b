//! SMARTS reader: one grammar production per function, the production in a
//! comment above it. Positions are 0-based character indices.
//!
//! ```text
//! pattern      ::= chain ( '.' chain )*            (dots may also sit inside chains)
//! chain        ::= atom ( bond? ( atom | closure ) | branch | '.' atom )*
//! branch       ::= '(' ( bond? | '.' ) chain ')'
//! closure      ::= digit | '%' digit digit | '%(' digits ')'
//! atom         ::= organic | '*' | 'A' | 'a' | bracket
//! organic      ::= 'B' | 'C' | 'N' | 'O' | 'P' | 'S' | 'F' | 'Cl' | 'Br' | 'I'
//!                | 'b' | 'c' | 'n' | 'o' | 'p' | 's'
//! bracket      ::= '[' atom_low ( ':' digits )? ']'
//! atom_low     ::= atom_or ( ';' atom_or )*
//! atom_or      ::= atom_and ( ',' atom_and )*
//! atom_and     ::= atom_not ( '&'? atom_not )*
//! atom_not     ::= '!'* primitive
//! primitive    ::= digits | element | '#' digits | '*' | 'A' | 'a'
//!                | 'H' digits? | 'h' digits? | 'D' digits? | 'X' digits?
//!                | 'v' digits? | 'R' digits? | 'r' digits? | 'x' digits?
//!                | charge | '$(' pattern ')'
//! charge       ::= '+' digits? | '+'+ | '-' digits? | '-'+
//! bond         ::= bond_low
//! bond_low     ::= bond_or ( ';' bond_or )*
//! bond_or      ::= bond_and ( ',' bond_and )*
//! bond_and     ::= bond_not ( '&'? bond_not )*
//! bond_not     ::= '!'* bond_prim
//! bond_prim    ::= '-' | '=' | '#' | ':' | '~' | '@'
//! ```

use super::expr::{AtomExpr, AtomPrim, BondExpr, BondPrim};
use super::{PatternError, Query, QueryAtom, QueryBond};

/// Deepest nesting of `$( … )` accepted.
pub const MAX_RECURSION_DEPTH: usize = 8;
/// Most atoms accepted in one pattern (all recursive parts together).
pub const MAX_ATOMS: usize = 1000;

/// Two-letter element symbols accepted inside brackets (aliphatic form).
/// `Nh`, `Lv` and heavier artificial elements are left out so that `[Nh]`
/// reads as nitrogen with an implicit hydrogen, as RDKit reads it.
#[rustfmt::skip]
const TWO_LETTER: &[(&str, u8)] = &[
    ("He", 2), ("Li", 3), ("Be", 4), ("Ne", 10), ("Na", 11), ("Mg", 12), ("Al", 13), ("Si", 14),
    ("Cl", 17), ("Ar", 18), ("Ca", 20), ("Sc", 21), ("Ti", 22), ("Cr", 24), ("Mn", 25),
    ("Fe", 26), ("Co", 27), ("Ni", 28), ("Cu", 29), ("Zn", 30), ("Ga", 31), ("Ge", 32),
    ("As", 33), ("Se", 34), ("Br", 35), ("Kr", 36), ("Rb", 37), ("Sr", 38), ("Zr", 40),
    ("Nb", 41), ("Mo", 42), ("Tc", 43), ("Ru", 44), ("Rh", 45), ("Pd", 46), ("Ag", 47),
    ("Cd", 48), ("In", 49), ("Sn", 50), ("Sb", 51), ("Te", 52), ("Xe", 54), ("Cs", 55),
    ("Ba", 56), ("La", 57), ("Ce", 58), ("Pr", 59), ("Nd", 60), ("Pm", 61), ("Sm", 62),
    ("Eu", 63), ("Gd", 64), ("Tb", 65), ("Dy", 66), ("Ho", 67), ("Er", 68), ("Tm", 69),
    ("Yb", 70), ("Lu", 71), ("Hf", 72), ("Ta", 73), ("Re", 75), ("Os", 76), ("Ir", 77),
    ("Pt", 78), ("Au", 79), ("Hg", 80), ("Tl", 81), ("Pb", 82), ("Bi", 83), ("Po", 84),
    ("At", 85), ("Rn", 86), ("Fr", 87), ("Ra", 88), ("Ac", 89), ("Th", 90), ("Pa", 91),
    ("Np", 93), ("Pu", 94), ("Am", 95), ("Cm", 96), ("Bk", 97), ("Cf", 98), ("Es", 99),
    ("Fm", 100), ("Md", 101), ("No", 102), ("Lr", 103),
];

/// One-letter element symbols accepted inside brackets.
#[rustfmt::skip]
const ONE_LETTER: &[(char, u8)] = &[
    ('B', 5), ('C', 6), ('N', 7), ('O', 8), ('F', 9), ('P', 15), ('S', 16), ('K', 19),
    ('V', 23), ('Y', 39), ('I', 53), ('W', 74), ('U', 92),
];

/// Aromatic symbols accepted inside brackets.
#[rustfmt::skip]
const AROMATIC: &[(&str, u8)] = &[
    ("se", 34), ("as", 33), ("te", 52), ("si", 14), ("b", 5), ("c", 6), ("n", 7), ("o", 8),
    ("p", 15), ("s", 16),
];

/// Result of parsing a whole pattern: the main query and every recursive
/// sub-query, referenced by index from `AtomPrim::Recursive`.
pub struct Parsed {
    pub main: Query,
    pub recursive: Vec<Query>,
}

pub fn parse(text: &str) -> Result<Parsed, PatternError> {
    let mut p = Parser {
        chars: text.chars().collect(),
        pos: 0,
        text,
        recursive: Vec::new(),
        depth: 0,
        atoms_total: 0,
    };
    if p.chars.is_empty() {
        return Err(p.error(0, "empty pattern"));
    }
    let main = p.pattern()?;
    if p.pos < p.chars.len() {
        let c = p.chars[p.pos];
        return Err(p.unexpected(c));
    }
    Ok(Parsed {
        main,
        recursive: p.recursive,
    })
}

struct Parser<'a> {
    chars: Vec<char>,
    pos: usize,
    text: &'a str,
    recursive: Vec<Query>,
    depth: usize,
    atoms_total: usize,
}

/// Open ring closure: the atom it started at, its bond (if written) and
/// where it was written.
struct OpenRing {
    label: u32,
    atom: usize,
    bond: Option<BondExpr>,
    position: usize,
}

impl<'a> Parser<'a> {
    fn error(&self, position: usize, message: impl Into<String>) -> PatternError {
        PatternError {
            message: message.into(),
            position,
            pattern: self.text.to_string(),
        }
    }

    fn peek(&self) -> Option<char> {
        self.chars.get(self.pos).copied()
    }

    fn peek_at(&self, offset: usize) -> Option<char> {
        self.chars.get(self.pos + offset).copied()
    }

    /// Error for a character that cannot start anything here, naming the
    /// unsupported SMARTS feature where the character belongs to one.
    fn unexpected(&self, c: char) -> PatternError {
        let what = match c {
            '>' => "reaction SMARTS ('>') is not supported".to_string(),
            '/' | '\\' => format!("directional bond '{c}' is not supported"),
            '@' => "chirality ('@') is not supported".to_string(),
            '$' => "'$' outside brackets (quadruple bond) is not supported".to_string(),
            '{' | '}' => "ranges ('{…}') are not supported".to_string(),
            ')' => "unmatched ')'".to_string(),
            ']' => "unmatched ']'".to_string(),
            _ => format!("unexpected character '{c}'"),
        };
        self.error(self.pos, what)
    }

    // pattern ::= chain ( '.' chain )*
    // Parsed iteratively: branches are kept on an explicit stack so that
    // hostile nesting cannot exhaust the call stack.
    fn pattern(&mut self) -> Result<Query, PatternError> {
        let mut q = Query::default();
        // Stack of atoms that open branches, with the '(' position.
        let mut branches: Vec<(usize, usize)> = Vec::new();
        let mut rings: Vec<OpenRing> = Vec::new();
        // Atom the next atom bonds to, if any.
        let mut prev: Option<usize> = None;
        // Bond written before the next atom, with its position.
        let mut pending: Option<(BondExpr, usize)> = None;
        // Whether a '.' was just read (the next atom starts a component).
        let mut dot_at: Option<usize> = None;
        while let Some(c) = self.peek() {
            match c {
                '(' => {
                    let Some(a) = prev else {
                        return Err(self.error(
                            self.pos,
                            "branch '(' without a preceding atom (component grouping is not supported)",
                        ));
                    };
                    if pending.is_some() {
                        return Err(self.error(self.pos, "bond before '('"));
                    }
                    branches.push((a, self.pos));
                    self.pos += 1;
                    if self.peek() == Some(')') {
                        return Err(self.error(self.pos, "empty branch '()'"));
                    }
                }
                ')' => {
                    if self.depth > 0 && branches.is_empty() {
                        // End of a recursive pattern: the caller consumes ')'.
                        break;
                    }
                    let Some((a, _)) = branches.pop() else {
                        return Err(self.error(self.pos, "unmatched ')'"));
                    };
                    if let Some((_, p)) = pending {
                        return Err(self.error(p, "bond without a following atom"));
                    }
                    if let Some(p) = dot_at {
                        return Err(self.error(p, "'.' without a following atom"));
                    }
                    prev = Some(a);
                    self.pos += 1;
                }
                ']' if self.depth > 0 => break,
                '.' => {
                    if prev.is_none() || pending.is_some() || dot_at.is_some() {
                        return Err(self.error(self.pos, "'.' must separate two atoms"));
                    }
                    dot_at = Some(self.pos);
                    prev = None;
                    self.pos += 1;
                }
                '0'..='9' | '%' => {
                    let Some(a) = prev else {
                        return Err(self.error(self.pos, "ring closure without a preceding atom"));
                    };
                    let start = self.pos;
                    let label = self.closure()?;
                    let bond = pending.take().map(|(b, _)| b);
                    self.ring_closure(&mut q, &mut rings, a, label, bond, start)?;
                }
                '-' | '=' | '#' | ':' | '~' | '@' | '!' => {
                    if prev.is_none() {
                        return Err(self.error(self.pos, "bond without a preceding atom"));
                    }
                    if pending.is_some() {
                        return Err(self.error(self.pos, "two bonds in a row"));
                    }
                    let start = self.pos;
                    let b = self.bond_low()?;
                    pending = Some((b, start));
                }
                _ => {
                    let start = self.pos;
                    let expr_map = self.atom()?;
                    let Some((expr, map)) = expr_map else {
                        return Err(self.unexpected(c));
                    };
                    self.atoms_total += 1;
                    if self.atoms_total > MAX_ATOMS {
                        return Err(
                            self.error(start, format!("pattern has more than {MAX_ATOMS} atoms"))
                        );
                    }
                    let idx = q.atoms.len();
                    q.atoms.push(QueryAtom {
                        expr,
                        map,
                        position: start,
                        element: None,
                        filter: Default::default(),
                        rest: None,
                        sig_mask: 0,
                        sig_value: 0,
                    });
                    if let Some(p) = prev {
                        let bond = pending
                            .take()
                            .map(|(b, _)| b)
                            .unwrap_or(BondExpr::Prim(BondPrim::Implicit));
                        q.bonds.push(QueryBond::new([p, idx], bond));
                    } else if q.atoms.len() > 1 && dot_at.is_none() {
                        // Only reachable after a closing ')' at depth 0,
                        // which always sets prev; kept as a guard.
                        return Err(self.error(start, "atom without a connection"));
                    }
                    dot_at = None;
                    prev = Some(idx);
                }
            }
        }
        if let Some((_, p)) = pending {
            return Err(self.error(p, "bond without a following atom"));
        }
        if let Some(p) = dot_at {
            return Err(self.error(p, "'.' without a following atom"));
        }
        if let Some((_, p)) = branches.last() {
            return Err(self.error(*p, "unclosed branch '('"));
        }
        if let Some(r) = rings.first() {
            return Err(self.error(r.position, format!("unclosed ring closure {}", r.label)));
        }
        if q.atoms.is_empty() {
            return Err(self.error(self.pos, "pattern has no atoms"));
        }
        q.finish();
        Ok(q)
    }

    // closure ::= digit | '%' digit digit | '%(' digits ')'
    fn closure(&mut self) -> Result<u32, PatternError> {
        let start = self.pos;
        match self.peek() {
            Some(d @ '0'..='9') => {
                self.pos += 1;
                Ok(d as u32 - '0' as u32)
            }
            Some('%') => {
                self.pos += 1;
                if self.peek() == Some('(') {
                    self.pos += 1;
                    let n = self
                        .digits(99_999)?
                        .ok_or_else(|| self.error(self.pos, "expected digits after '%('"))?;
                    if self.peek() != Some(')') {
                        return Err(self.error(self.pos, "expected ')' to close '%('"));
                    }
                    self.pos += 1;
                    Ok(n)
                } else {
                    match (self.peek(), self.peek_at(1)) {
                        (Some(a @ '0'..='9'), Some(b @ '0'..='9')) => {
                            self.pos += 2;
                            Ok((a as u32 - '0' as u32) * 10 + (b as u32 - '0' as u32))
                        }
                        _ => Err(self.error(start, "'%' must be followed by two digits")),
                    }
                }
            }
            _ => Err(self.error(start, "expected a ring-closure label")),
        }
    }

    fn ring_closure(
        &mut self,
        q: &mut Query,
        rings: &mut Vec<OpenRing>,
        atom: usize,
        label: u32,
        bond: Option<BondExpr>,
        position: usize,
    ) -> Result<(), PatternError> {
        if let Some(i) = rings.iter().position(|r| r.label == label) {
            let open = rings.remove(i);
            if open.atom == atom {
                return Err(self.error(
                    position,
                    format!("ring closure {label} bonds an atom to itself"),
                ));
            }
            if q.bonds
                .iter()
                .any(|b| b.atoms == [open.atom, atom] || b.atoms == [atom, open.atom])
            {
                return Err(self.error(
                    position,
                    format!("ring closure {label} duplicates an existing bond"),
                ));
            }
            let expr = bond
                .or(open.bond)
                .unwrap_or(BondExpr::Prim(BondPrim::Implicit));
            q.bonds.push(QueryBond::new([open.atom, atom], expr));
        } else {
            rings.push(OpenRing {
                label,
                atom,
                bond,
                position,
            });
        }
        Ok(())
    }

    // atom ::= organic | '*' | 'A' | 'a' | bracket
    // Returns None (without consuming) if no atom starts here.
    fn atom(&mut self) -> Result<Option<(AtomExpr, Option<u16>)>, PatternError> {
        let Some(c) = self.peek() else {
            return Ok(None);
        };
        let elem = |number: u8, aromatic: bool| {
            AtomExpr::Prim(AtomPrim::Element {
                number,
                aromatic: Some(aromatic),
            })
        };
        let expr = match c {
            '[' => return self.bracket().map(Some),
            '*' => AtomExpr::Prim(AtomPrim::Any),
            'A' => AtomExpr::Prim(AtomPrim::Aromatic(false)),
            'a' => AtomExpr::Prim(AtomPrim::Aromatic(true)),
            'C' if self.peek_at(1) == Some('l') => {
                self.pos += 1;
                elem(17, false)
            }
            'B' if self.peek_at(1) == Some('r') => {
                self.pos += 1;
                elem(35, false)
            }
            'B' => elem(5, false),
            'C' => elem(6, false),
            'N' => elem(7, false),
            'O' => elem(8, false),
            'P' => elem(15, false),
            'S' => elem(16, false),
            'F' => elem(9, false),
            'I' => elem(53, false),
            'b' => elem(5, true),
            'c' => elem(6, true),
            'n' => elem(7, true),
            'o' => elem(8, true),
            'p' => elem(15, true),
            's' => elem(16, true),
            _ => return Ok(None),
        };
        self.pos += 1;
        Ok(Some((expr, None)))
    }

    // bracket ::= '[' atom_low ( ':' digits )? ']'
    fn bracket(&mut self) -> Result<(AtomExpr, Option<u16>), PatternError> {
        let open = self.pos;
        self.pos += 1; // '['
        if self.peek() == Some(']') {
            return Err(self.error(self.pos, "empty bracket atom '[]'"));
        }
        let expr = self.atom_low(true)?;
        let mut map = None;
        if self.peek() == Some(':') {
            self.pos += 1;
            let at = self.pos;
            let n = self
                .digits(65_535)?
                .ok_or_else(|| self.error(at, "expected an atom-map number after ':'"))?;
            map = Some(n as u16);
        }
        match self.peek() {
            Some(']') => {
                self.pos += 1;
                Ok((expr, map))
            }
            None => Err(self.error(open, "unclosed bracket atom '['")),
            Some(c) => Err(self.bad_primitive(c)),
        }
    }

    // atom_low ::= atom_or ( ';' atom_or )*
    fn atom_low(&mut self, first: bool) -> Result<AtomExpr, PatternError> {
        let mut parts = vec![self.atom_or(first)?];
        while self.peek() == Some(';') {
            self.pos += 1;
            parts.push(self.atom_or(false)?);
        }
        Ok(collapse(parts, AtomExpr::And))
    }

    // atom_or ::= atom_and ( ',' atom_and )*
    fn atom_or(&mut self, first: bool) -> Result<AtomExpr, PatternError> {
        let mut parts = vec![self.atom_and(first)?];
        while self.peek() == Some(',') {
            self.pos += 1;
            parts.push(self.atom_and(false)?);
        }
        Ok(collapse(parts, AtomExpr::Or))
    }

    // atom_and ::= atom_not ( '&'? atom_not )*
    fn atom_and(&mut self, first: bool) -> Result<AtomExpr, PatternError> {
        let mut parts = vec![self.atom_not(first)?];
        loop {
            match self.peek() {
                Some('&') => {
                    self.pos += 1;
                    parts.push(self.atom_not(false)?);
                }
                Some(';' | ',' | ']' | ':') | None => break,
                Some(_) => parts.push(self.atom_not(false)?),
            }
        }
        Ok(collapse(parts, AtomExpr::And))
    }

    // atom_not ::= '!'* primitive
    fn atom_not(&mut self, first: bool) -> Result<AtomExpr, PatternError> {
        let mut negate = false;
        let mut any = false;
        while self.peek() == Some('!') {
            negate = !negate;
            any = true;
            self.pos += 1;
        }
        let p = self.primitive(first && !any)?;
        Ok(if negate {
            AtomExpr::Not(Box::new(p))
        } else {
            p
        })
    }

    /// Error for a character that is not a supported primitive.
    fn bad_primitive(&self, c: char) -> PatternError {
        let what = match c {
            '@' => "chirality ('@') is not supported".to_string(),
            '$' => "'$name' macros are not supported (only recursive '$( … )')".to_string(),
            '^' => "hybridisation primitive '^' is not supported".to_string(),
            'z' | 'Z' | 'i' | 'e' | 'q' | 'Q' | 'y' | 'Y' => {
                format!("primitive '{c}' is not supported")
            }
            '>' => "reaction SMARTS ('>') is not supported".to_string(),
            '[' => "'[' inside a bracket atom".to_string(),
            ']' | ';' | ',' | '&' => format!("missing primitive before '{c}'"),
            _ => format!("unsupported or unknown primitive '{c}'"),
        };
        self.error(self.pos, what)
    }

    // primitive ::= digits | element | '#' digits | '*' | 'A' | 'a'
    //             | 'H' digits? | 'h' digits? | 'D' digits? | 'X' digits?
    //             | 'v' digits? | 'R' digits? | 'r' digits? | 'x' digits?
    //             | charge | '$(' pattern ')'
    fn primitive(&mut self, first: bool) -> Result<AtomExpr, PatternError> {
        let start = self.pos;
        let Some(c) = self.peek() else {
            return Err(self.error(start, "unclosed bracket atom: expected a primitive"));
        };
        let prim = |p| Ok(AtomExpr::Prim(p));
        match c {
            '0'..='9' => {
                let n = self.digits(999)?.unwrap_or(0);
                // `[2H]`: an isotope followed by H is the element hydrogen.
                if self.peek() == Some('H') && self.hydrogen_element_follows(1) {
                    self.pos += 1;
                    return Ok(AtomExpr::And(vec![
                        AtomExpr::Prim(AtomPrim::Isotope(n as u16)),
                        AtomExpr::Prim(AtomPrim::Element {
                            number: 1,
                            aromatic: None,
                        }),
                    ]));
                }
                prim(AtomPrim::Isotope(n as u16))
            }
            '#' => {
                self.pos += 1;
                let at = self.pos;
                let n = self
                    .digits(255)?
                    .ok_or_else(|| self.error(at, "expected an atomic number after '#'"))?;
                prim(AtomPrim::Element {
                    number: n as u8,
                    aromatic: None,
                })
            }
            '*' => {
                self.pos += 1;
                prim(AtomPrim::Any)
            }
            '$' => {
                if self.peek_at(1) != Some('(') {
                    return Err(self.bad_primitive('$'));
                }
                self.recursive()
            }
            '+' | '-' => self.charge(),
            'H' if !self.two_letter_here() => {
                if first && self.hydrogen_element_follows(1) {
                    self.pos += 1;
                    return prim(AtomPrim::Element {
                        number: 1,
                        aromatic: None,
                    });
                }
                self.pos += 1;
                let n = self.digits(255)?.unwrap_or(1);
                prim(AtomPrim::TotalH(n as u8))
            }
            'h' => {
                self.pos += 1;
                let n = self.digits(255)?;
                prim(AtomPrim::ImplicitH(n.map(|n| n as u8)))
            }
            'D' if !self.two_letter_here() => {
                self.pos += 1;
                let n = self.digits(255)?.unwrap_or(1);
                prim(AtomPrim::Degree(n as u8))
            }
            'X' if !self.two_letter_here() => {
                self.pos += 1;
                let n = self.digits(255)?.unwrap_or(1);
                prim(AtomPrim::Connectivity(n as u8))
            }
            'v' => {
                self.pos += 1;
                let n = self.digits(255)?.unwrap_or(1);
                prim(AtomPrim::Valence(n as u8))
            }
            'R' if !self.two_letter_here() => {
                self.pos += 1;
                let n = self.digits(255)?;
                prim(AtomPrim::RingCount(n.map(|n| n as u8)))
            }
            'r' => {
                self.pos += 1;
                let n = self.digits(255)?;
                prim(AtomPrim::RingSize(n.map(|n| n as u8)))
            }
            'x' => {
                self.pos += 1;
                let n = self.digits(255)?;
                prim(AtomPrim::RingBonds(n.map(|n| n as u8)))
            }
            'A' if !self.two_letter_here() => {
                self.pos += 1;
                prim(AtomPrim::Aromatic(false))
            }
            'a' if !self.aromatic_two_letter_here() => {
                self.pos += 1;
                prim(AtomPrim::Aromatic(true))
            }
            _ => {
                if let Some(e) = self.element()? {
                    return Ok(e);
                }
                Err(self.bad_primitive(c))
            }
        }
    }

    /// Is the 'H' at offset `k - 1` the element hydrogen (`[H]`, `[H+]`,
    /// `[2H]`, `[H:1]`) rather than a hydrogen count?
    fn hydrogen_element_follows(&self, k: usize) -> bool {
        matches!(self.peek_at(k), Some(']' | '+' | '-' | ':'))
    }

    fn two_letter_here(&self) -> bool {
        match (self.peek(), self.peek_at(1)) {
            (Some(a), Some(b)) => {
                let mut s = String::with_capacity(2);
                s.push(a);
                s.push(b);
                TWO_LETTER.iter().any(|(sym, _)| *sym == s)
            }
            _ => false,
        }
    }

    fn aromatic_two_letter_here(&self) -> bool {
        matches!((self.peek(), self.peek_at(1)), (Some('a'), Some('s')))
    }

    // element ::= two-letter symbol | one-letter symbol | aromatic symbol
    fn element(&mut self) -> Result<Option<AtomExpr>, PatternError> {
        let a = self.peek();
        let b = self.peek_at(1);
        if let (Some(a), Some(b)) = (a, b) {
            let mut s = String::with_capacity(2);
            s.push(a);
            s.push(b);
            if let Some((_, n)) = TWO_LETTER.iter().find(|(sym, _)| *sym == s) {
                self.pos += 2;
                return Ok(Some(AtomExpr::Prim(AtomPrim::Element {
                    number: *n,
                    aromatic: Some(false),
                })));
            }
            if let Some((_, n)) = AROMATIC.iter().find(|(sym, _)| *sym == s) {
                self.pos += 2;
                return Ok(Some(AtomExpr::Prim(AtomPrim::Element {
                    number: *n,
                    aromatic: Some(true),
                })));
            }
        }
        let Some(a) = a else { return Ok(None) };
        if let Some((_, n)) = ONE_LETTER.iter().find(|(sym, _)| *sym == a) {
            self.pos += 1;
            return Ok(Some(AtomExpr::Prim(AtomPrim::Element {
                number: *n,
                aromatic: Some(false),
            })));
        }
        let s = a.to_string();
        if let Some((_, n)) = AROMATIC.iter().find(|(sym, _)| *sym == s) {
            self.pos += 1;
            return Ok(Some(AtomExpr::Prim(AtomPrim::Element {
                number: *n,
                aromatic: Some(true),
            })));
        }
        Ok(None)
    }

    // charge ::= '+' digits? | '+'+ | '-' digits? | '-'+
    fn charge(&mut self) -> Result<AtomExpr, PatternError> {
        let sign = self.peek();
        let start = self.pos;
        let unit: i32 = if sign == Some('+') { 1 } else { -1 };
        self.pos += 1;
        let mut count: i32 = 1;
        if let Some(n) = self.digits(15)? {
            count = n as i32;
        } else {
            while self.peek() == sign {
                self.pos += 1;
                count += 1;
                if count > 15 {
                    return Err(self.error(start, "charge out of range"));
                }
            }
        }
        Ok(AtomExpr::Prim(AtomPrim::Charge((unit * count) as i8)))
    }

    // '$(' pattern ')'
    fn recursive(&mut self) -> Result<AtomExpr, PatternError> {
        let start = self.pos;
        if self.depth >= MAX_RECURSION_DEPTH {
            return Err(self.error(
                start,
                format!("recursive SMARTS nested deeper than {MAX_RECURSION_DEPTH} levels"),
            ));
        }
        self.pos += 2; // "$("
        self.depth += 1;
        let q = self.pattern();
        self.depth -= 1;
        let q = match q {
            Ok(q) => q,
            Err(e) if self.peek().is_none() => {
                // Report the unclosed '$(' rather than what ran off the end.
                let _ = e;
                return Err(self.error(start, "unclosed recursive SMARTS '$('"));
            }
            Err(e) => return Err(e),
        };
        if self.peek() != Some(')') {
            return Err(self.error(start, "unclosed recursive SMARTS '$('"));
        }
        self.pos += 1;
        let id = self.recursive.len();
        self.recursive.push(q);
        Ok(AtomExpr::Prim(AtomPrim::Recursive(id)))
    }

    /// Digits as a number no larger than `max`; None if no digit here.
    fn digits(&mut self, max: u32) -> Result<Option<u32>, PatternError> {
        let start = self.pos;
        let mut n: u32 = 0;
        let mut any = false;
        while let Some(d @ '0'..='9') = self.peek() {
            any = true;
            n = n.saturating_mul(10).saturating_add(d as u32 - '0' as u32);
            self.pos += 1;
        }
        if !any {
            return Ok(None);
        }
        if n > max {
            return Err(self.error(start, format!("number {n} is larger than {max}")));
        }
        Ok(Some(n))
    }

    // bond_low ::= bond_or ( ';' bond_or )*
    fn bond_low(&mut self) -> Result<BondExpr, PatternError> {
        let mut parts = vec![self.bond_or()?];
        while self.peek() == Some(';') {
            self.pos += 1;
            parts.push(self.bond_or()?);
        }
        Ok(collapse(parts, BondExpr::And))
    }

    // bond_or ::= bond_and ( ',' bond_and )*
    fn bond_or(&mut self) -> Result<BondExpr, PatternError> {
        let mut parts = vec![self.bond_and()?];
        while self.peek() == Some(',') {
            self.pos += 1;
            parts.push(self.bond_and()?);
        }
        Ok(collapse(parts, BondExpr::Or))
    }

    // bond_and ::= bond_not ( '&'? bond_not )*
    fn bond_and(&mut self) -> Result<BondExpr, PatternError> {
        let mut parts = vec![self.bond_not()?];
        loop {
            match self.peek() {
                Some('&') => {
                    self.pos += 1;
                    parts.push(self.bond_not()?);
                }
                Some('-' | '=' | '#' | ':' | '~' | '@' | '!') => parts.push(self.bond_not()?),
                _ => break,
            }
        }
        Ok(collapse(parts, BondExpr::And))
    }

    // bond_not ::= '!'* bond_prim
    fn bond_not(&mut self) -> Result<BondExpr, PatternError> {
        let mut negate = false;
        while self.peek() == Some('!') {
            negate = !negate;
            self.pos += 1;
        }
        let p = self.bond_prim()?;
        Ok(if negate {
            BondExpr::Not(Box::new(p))
        } else {
            p
        })
    }

    // bond_prim ::= '-' | '=' | '#' | ':' | '~' | '@'
    fn bond_prim(&mut self) -> Result<BondExpr, PatternError> {
        let p = match self.peek() {
            Some('-') => BondPrim::Single,
            Some('=') => BondPrim::Double,
            Some('#') => BondPrim::Triple,
            Some(':') => BondPrim::Aromatic,
            Some('~') => BondPrim::Any,
            Some('@') => BondPrim::Ring,
            Some(c @ ('/' | '\\' | '$' | '>')) => return Err(self.unexpected(c)),
            Some(c) => {
                return Err(self.error(self.pos, format!("expected a bond symbol, found '{c}'")))
            }
            None => return Err(self.error(self.pos, "expected a bond symbol at end of pattern")),
        };
        self.pos += 1;
        Ok(BondExpr::Prim(p))
    }
}

/// A single part stays as it is; several are combined with `make`.
fn collapse<T>(mut parts: Vec<T>, make: fn(Vec<T>) -> T) -> T {
    if parts.len() == 1 {
        if let Some(p) = parts.pop() {
            return p;
        }
    }
    make(parts)
}
