//! The direct reader of the common SMILES subset (see [`fast_read`]): one
//! loop over the bytes, the same [`Builder`] calls purr's reader makes.

use super::*;

/// Reads the common subset of SMILES (organic-subset and bracket atoms,
/// bonds, branches, dots and ring-closure digits) into `b` with the same
/// calls purr's reader makes, without purr's recursion. Returns false when
/// the text uses anything else or is not valid SMILES; `b` is then to be
/// discarded and the text read by purr, which also words the error. Only
/// text purr accepts is accepted here. Iterative: no input makes it
/// recurse.
// <smiles> ::= <atom> ( <branch> | "." <atom> | <bond>? ( <atom> | <rnum> ) )*
// <branch> ::= "(" <bond>? <atom> ... ")"
pub(super) fn fast_read(
    s: &[u8],
    b: &mut Builder,
    spans: &mut Vec<Range<usize>>,
    rnums: &mut Vec<usize>,
) -> bool {
    // Stack depth at each open branch.
    let mut branches: Vec<usize> = Vec::new();
    let Some((atom, mut i)) = fast_atom(s, 0) else {
        return false;
    };
    spans.push(0..i);
    b.root_atom(atom);
    while let Some(&c) = s.get(i) {
        match c {
            b'(' => {
                let (order, dir, j) = fast_bond(s, i + 1);
                let Some((atom, next)) = fast_atom(s, j) else {
                    return false;
                };
                spans.push(j..next);
                branches.push(b.stack.len());
                b.extend_atom(order, dir, atom);
                i = next;
            }
            b')' => {
                let Some(depth) = branches.pop() else {
                    return false;
                };
                b.stack.truncate(depth);
                i += 1;
            }
            b'.' => {
                let Some((atom, next)) = fast_atom(s, i + 1) else {
                    return false;
                };
                spans.push(i + 1..next);
                b.root_atom(atom);
                i = next;
            }
            _ => {
                let (order, dir, j) = fast_bond(s, i);
                match s.get(j) {
                    Some(&d @ b'0'..=b'9') => {
                        rnums.push(j);
                        b.join_digit(order, dir, d - b'0');
                        i = j + 1;
                    }
                    Some(b'%') => match (s.get(j + 1), s.get(j + 2)) {
                        (Some(&d1 @ b'0'..=b'9'), Some(&d2 @ b'0'..=b'9')) => {
                            rnums.push(j);
                            b.join_digit(order, dir, (d1 - b'0') * 10 + (d2 - b'0'));
                            i = j + 3;
                        }
                        _ => return false,
                    },
                    _ => {
                        let Some((atom, next)) = fast_atom(s, j) else {
                            return false;
                        };
                        spans.push(j..next);
                        b.extend_atom(order, dir, atom);
                        i = next;
                    }
                }
            }
        }
    }
    branches.is_empty()
}

// <bond> ::= "-" | "=" | "#" | "$" | ":" | "/" | "\\"
/// The bond symbol at `i` (elided if none), its written direction (see
/// [`RawBond::dir`]) and the position after it.
fn fast_bond(s: &[u8], i: usize) -> (RawOrder, u8, usize) {
    let dir = match s.get(i) {
        Some(b'/') => 1,
        Some(b'\\') => 2,
        _ => 0,
    };
    let order = match s.get(i) {
        Some(b'-' | b'/' | b'\\') => RawOrder::Single,
        Some(b'=') => RawOrder::Double,
        Some(b'#') => RawOrder::Triple,
        Some(b'$') => RawOrder::Quadruple,
        Some(b':') => RawOrder::Aromatic,
        _ => return (RawOrder::Elided, 0, i),
    };
    (order, dir, i + 1)
}

// <atom> ::= <organic> | <bracket> | "*"
/// The atom at `i` and the position after it; None for anything else
/// (including `At` and `Ts`, left to purr).
fn fast_atom(s: &[u8], i: usize) -> Option<(RawAtom, usize)> {
    let c = *s.get(i)?;
    let next = s.get(i + 1).copied();
    let (atom, len) = match c {
        b'C' if next == Some(b'l') => (plain(17, false), 2),
        b'B' if next == Some(b'r') => (plain(35, false), 2),
        b'C' => (plain(6, false), 1),
        b'N' => (plain(7, false), 1),
        b'O' => (plain(8, false), 1),
        b'S' => (plain(16, false), 1),
        b'F' => (plain(9, false), 1),
        b'P' => (plain(15, false), 1),
        b'I' => (plain(53, false), 1),
        b'B' => (plain(5, false), 1),
        b'c' => (plain(6, true), 1),
        b'n' => (plain(7, true), 1),
        b'o' => (plain(8, true), 1),
        b's' => (plain(16, true), 1),
        b'p' => (plain(15, true), 1),
        b'b' => (plain(5, true), 1),
        b'*' => (plain(0, false), 1),
        b'[' => {
            let close = s.get(i..)?.iter().position(|&x| x == b']')?;
            let text = std::str::from_utf8(s.get(i..=i + close)?).ok()?;
            (bracket_atom(text)?, close + 1)
        }
        _ => return None,
    };
    Some((atom, i + len))
}
