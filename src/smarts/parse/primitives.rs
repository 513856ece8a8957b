//! The atom and bond expressions of the SMARTS reader (the productions
//! from `atom_low` and `bond_low` down, see the parent module's grammar)
//! and the element symbol tables they read.

use super::*;

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

impl Parser<'_> {
    // atom_low ::= atom_or ( ';' atom_or )*
    pub(super) fn atom_low(&mut self, first: bool) -> Result<AtomExpr, PatternError> {
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
    pub(super) fn bad_primitive(&self, c: char) -> PatternError {
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
    pub(super) fn digits(&mut self, max: u32) -> Result<Option<u32>, PatternError> {
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
    pub(super) fn bond_low(&mut self) -> Result<BondExpr, PatternError> {
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
