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

mod primitives;

/// Deepest nesting of `$( … )` accepted.
pub const MAX_RECURSION_DEPTH: usize = 8;
/// Most atoms accepted in one pattern (all recursive parts together).
pub const MAX_ATOMS: usize = 1000;

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
}
