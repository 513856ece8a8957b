//! SMILES reading. The common subset is read by [`fast_read`], which
//! makes the calls purr's reader would make on a [`Builder`] and records
//! spans and ring-closure positions itself. Other text goes through purr:
//! it checks the syntax and walks the string; a [`Follower`] of our own
//! collects atoms and bonds directly (no intermediate graph), and a small
//! lexer over the already-validated text recovers each atom's character
//! span and each ring-closure digit's position, so errors found after
//! parsing still point into the input.

use std::ops::Range;

use purr::feature::{
    Aliphatic, Aromatic, AtomKind, BondKind, BracketAromatic, BracketSymbol, Configuration, Rnum,
};
use purr::walk::Follower;

use super::error::{ErrorKind, MolError};

mod fast;
use fast::fast_read;

/// Largest number of atoms accepted (heavy atoms plus hydrogens written as
/// atoms). Larger inputs are refused with [`ErrorKind::TooLarge`] before any
/// perception work is done.
pub const MAX_ATOMS: usize = 10_000;

/// Longest input accepted, in characters. Checked before parsing.
pub const MAX_CHARS: usize = 200_000;

/// An atom as written.
#[derive(Debug, Clone)]
pub(crate) struct RawAtom {
    pub element: u8,
    pub aromatic: bool,
    pub charge: i8,
    pub isotope: Option<u16>,
    /// Bracket hydrogen count (`[CH3]` gives 3); None outside brackets.
    pub hcount: Option<u8>,
    pub map: Option<u16>,
    pub bracket: bool,
    /// Tetrahedral mark: 0 none, 1 `@` (`@TH1`), 2 `@@` (`@TH2`). Other
    /// stereo classes (`@AL`, `@SP`, `@TB`, `@OH`) are read as none.
    pub chiral: u8,
    /// Event time of the atom in the walk (see [`RawBond::ka`]).
    pub t: u32,
}

/// Bond order as written.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub(crate) enum RawOrder {
    Elided,
    Single,
    Double,
    Triple,
    Quadruple,
    Aromatic,
}

/// A bond as written (atom indices fit in u32: at most [`MAX_ATOMS`]).
#[derive(Debug, Clone)]
pub(crate) struct RawBond {
    pub a: u32,
    pub b: u32,
    pub order: RawOrder,
    /// Index of the ring-closure digit that closed this bond, if any.
    pub join: Option<u32>,
    /// Written direction from `a` to `b`: 0 none, 1 `/`, 2 `\`.
    pub dir: u8,
    /// Neighbour-order keys at `a` and at `b`: twice the walk time of the
    /// event that wrote the bond at that atom (a chain bond's time, or the
    /// ring-closure digit's), so the written neighbour order of an atom is
    /// its bonds sorted by key; an atom's own hydrogens sort at `2 t + 1`.
    pub ka: u32,
    pub kb: u32,
}

/// The parse result: atoms and bonds in written order.
#[derive(Debug)]
pub(crate) struct Raw {
    pub atoms: Vec<RawAtom>,
    pub bonds: Vec<RawBond>,
    pub spans: Vec<Range<usize>>,
    /// Any tetrahedral or bond-direction mark was read.
    pub stereo: bool,
}

fn order_of(kind: &BondKind) -> RawOrder {
    match kind {
        BondKind::Elided => RawOrder::Elided,
        BondKind::Single | BondKind::Up | BondKind::Down => RawOrder::Single,
        BondKind::Double => RawOrder::Double,
        BondKind::Triple => RawOrder::Triple,
        BondKind::Quadruple => RawOrder::Quadruple,
        BondKind::Aromatic => RawOrder::Aromatic,
    }
}

/// Written direction of a bond symbol: 0 none, 1 `/`, 2 `\`.
fn dir_of(kind: &BondKind) -> u8 {
    match kind {
        BondKind::Up => 1,
        BondKind::Down => 2,
        _ => 0,
    }
}

fn aliphatic_number(a: Aliphatic) -> u8 {
    match a {
        Aliphatic::B => 5,
        Aliphatic::C => 6,
        Aliphatic::N => 7,
        Aliphatic::O => 8,
        Aliphatic::S => 16,
        Aliphatic::P => 15,
        Aliphatic::F => 9,
        Aliphatic::Cl => 17,
        Aliphatic::Br => 35,
        Aliphatic::I => 53,
        Aliphatic::At => 85,
        Aliphatic::Ts => 117,
    }
}

fn aromatic_number(a: Aromatic) -> u8 {
    match a {
        Aromatic::B => 5,
        Aromatic::C => 6,
        Aromatic::N => 7,
        Aromatic::O => 8,
        Aromatic::P => 15,
        Aromatic::S => 16,
    }
}

fn bracket_aromatic_number(a: BracketAromatic) -> u8 {
    match a {
        BracketAromatic::B => 5,
        BracketAromatic::C => 6,
        BracketAromatic::N => 7,
        BracketAromatic::O => 8,
        BracketAromatic::S => 16,
        BracketAromatic::P => 15,
        BracketAromatic::Se => 34,
        BracketAromatic::As => 33,
    }
}

/// An atom written without brackets.
fn plain(element: u8, aromatic: bool) -> RawAtom {
    RawAtom {
        element,
        aromatic,
        charge: 0,
        isotope: None,
        hcount: None,
        map: None,
        bracket: false,
        chiral: 0,
        t: 0,
    }
}

fn convert(kind: AtomKind) -> RawAtom {
    match kind {
        AtomKind::Star => plain(0, false),
        AtomKind::Aliphatic(a) => plain(aliphatic_number(a), false),
        AtomKind::Aromatic(a) => plain(aromatic_number(a), true),
        AtomKind::Bracket {
            isotope,
            symbol,
            configuration,
            hcount,
            charge,
            map,
        } => {
            let (element, aromatic) = match symbol {
                BracketSymbol::Star => (0, false),
                // purr's Element enum lists the elements in order from H.
                BracketSymbol::Element(e) => (e as u8 + 1, false),
                BracketSymbol::Aromatic(a) => (bracket_aromatic_number(a), true),
            };
            RawAtom {
                element,
                aromatic,
                charge: charge.as_ref().map(|c| c.into()).unwrap_or(0),
                isotope: isotope.as_ref().map(u16::from),
                hcount: Some(hcount.as_ref().map(|h| h.into()).unwrap_or(0)),
                map: map.as_ref().map(u16::from),
                bracket: true,
                chiral: match configuration {
                    Some(Configuration::TH1) => 1,
                    Some(Configuration::TH2) => 2,
                    _ => 0,
                },
                t: 0,
            }
        }
    }
}

/// What went wrong in the follower; positions are resolved afterwards.
#[derive(Debug, Clone)]
enum Trouble {
    TooLarge,
    /// Ring closure digit `join` bonds an atom to itself.
    SelfBond(usize),
    /// The two ends of ring closure `join` give different bond orders.
    Mismatch(usize),
}

/// Collects atoms and bonds as purr walks the string.
struct Builder {
    atoms: Vec<RawAtom>,
    bonds: Vec<RawBond>,
    stack: Vec<usize>,
    /// Open ring closures: (digit, atom, bond kind, join index, written
    /// direction, walk time).
    opens: Vec<(u8, usize, RawOrder, usize, u8, u32)>,
    /// Walk time: one tick per atom and per ring-closure digit.
    clock: u32,
    /// A stereo mark was seen.
    stereo: bool,
    joins: usize,
    trouble: Option<Trouble>,
    /// Ring-closure numbers in written order, from the lexer.
    digits: Vec<u8>,
}

impl Builder {
    fn new(capacity: usize, digits: Vec<u8>) -> Self {
        Builder {
            atoms: Vec::with_capacity(capacity),
            bonds: Vec::with_capacity(capacity + 4),
            stack: Vec::with_capacity(capacity),
            opens: Vec::new(),
            joins: 0,
            trouble: None,
            digits,
            clock: 0,
            stereo: false,
        }
    }

    fn push_atom(&mut self, mut atom: RawAtom) -> Option<usize> {
        if self.atoms.len() >= MAX_ATOMS {
            self.trouble.get_or_insert(Trouble::TooLarge);
            return None;
        }
        self.clock += 1;
        atom.t = self.clock;
        self.stereo |= atom.chiral != 0;
        self.atoms.push(atom);
        Some(self.atoms.len() - 1)
    }

    /// First atom of a component.
    fn root_atom(&mut self, atom: RawAtom) {
        if let Some(id) = self.push_atom(atom) {
            self.stack.push(id);
        }
    }

    /// A bond from the head atom to a new atom.
    fn extend_atom(&mut self, order: RawOrder, dir: u8, atom: RawAtom) {
        let head = self.stack.last().copied();
        if let Some(id) = self.push_atom(atom) {
            if let Some(head) = head {
                self.stereo |= dir != 0;
                let k = 2 * self.clock;
                self.bonds.push(RawBond {
                    a: head as u32,
                    b: id as u32,
                    order,
                    join: None,
                    dir,
                    ka: k,
                    kb: k,
                });
            }
            self.stack.push(id);
        }
    }

    /// A ring-closure digit at the head atom; `fallback` is the ring number
    /// used if the lexer's digits ran out (never for accepted text).
    fn join_digit(&mut self, order: RawOrder, dir: u8, fallback: u8) {
        let join = self.joins;
        self.joins += 1;
        self.clock += 1;
        let now = self.clock;
        self.stereo |= dir != 0;
        let Some(&head) = self.stack.last() else {
            return;
        };
        // purr 0.9 reads `%73` as ring 74; the digits come from our own lexer
        // of the same text (valid whenever purr accepts the string).
        let digit = self.digits.get(join).copied().unwrap_or(fallback);
        match self.opens.iter().position(|o| o.0 == digit) {
            None => self.opens.push((digit, head, order, join, dir, now)),
            Some(k) => {
                let (_, other, other_order, _, other_dir, then) = self.opens.swap_remove(k);
                if other == head {
                    self.trouble.get_or_insert(Trouble::SelfBond(join));
                    return;
                }
                let order = match (other_order, order) {
                    (RawOrder::Elided, o) | (o, RawOrder::Elided) => o,
                    (a, b) if a == b => a,
                    _ => {
                        self.trouble.get_or_insert(Trouble::Mismatch(join));
                        return;
                    }
                };
                // A direction written at the closing digit runs from here
                // (b) back to the opener (a).
                let dir = match (other_dir, dir) {
                    (0, d) => (3 - d) % 3,
                    (d, _) => d,
                };
                self.bonds.push(RawBond {
                    a: other as u32,
                    b: head as u32,
                    order,
                    join: Some(join as u32),
                    dir,
                    ka: 2 * then,
                    kb: 2 * now,
                });
            }
        }
    }
}

impl Follower for Builder {
    fn root(&mut self, root: AtomKind) {
        self.root_atom(convert(root));
    }

    fn extend(&mut self, bond_kind: BondKind, atom_kind: AtomKind) {
        self.extend_atom(order_of(&bond_kind), dir_of(&bond_kind), convert(atom_kind));
    }

    fn join(&mut self, bond_kind: BondKind, rnum: Rnum) {
        self.join_digit(order_of(&bond_kind), dir_of(&bond_kind), rnum as u8);
    }

    fn pop(&mut self, depth: usize) {
        let keep = self.stack.len().saturating_sub(depth);
        self.stack.truncate(keep);
    }
}

/// Character spans of the atoms and positions of the ring-closure digits
/// of a string purr has accepted, in written order.
pub(crate) fn lex(chars: &[u8]) -> (Vec<Range<usize>>, Vec<usize>) {
    let mut atoms = Vec::with_capacity(chars.len());
    let mut rnums = Vec::with_capacity(16);
    let mut i = 0;
    while i < chars.len() {
        let c = chars[i];
        match c {
            b'[' => {
                let start = i;
                while i < chars.len() && chars[i] != b']' {
                    i += 1;
                }
                atoms.push(start..(i + 1).min(chars.len()));
            }
            b'%' => {
                rnums.push(i);
                i += 2;
            }
            b'0'..=b'9' => rnums.push(i),
            b'B' | b'C' | b'A' | b'T' => {
                let two = matches!(
                    (c, chars.get(i + 1)),
                    (b'B', Some(b'r'))
                        | (b'C', Some(b'l'))
                        | (b'A', Some(b't'))
                        | (b'T', Some(b's'))
                );
                if two {
                    atoms.push(i..i + 2);
                    i += 1;
                } else {
                    atoms.push(i..i + 1);
                }
            }
            b'N' | b'O' | b'P' | b'S' | b'F' | b'I' | b'b' | b'c' | b'n' | b'o' | b'p' | b's'
            | b'*' => atoms.push(i..i + 1),
            _ => {}
        }
        i += 1;
    }
    (atoms, rnums)
}

/// Depth of the call chain purr needs for this input is about one level per
/// atom; inputs above this many atom-like characters are read on a thread
/// with a stack sized for them.
const DIRECT_READ_LIMIT: usize = 1_500;

/// Read the syntax of `smiles` into atoms and bonds in written order.
pub(crate) fn read_raw(smiles: &str) -> Result<Raw, MolError> {
    read_raw_with(smiles, true)
}

/// [`read_raw`], optionally without the direct reader of the common subset
/// (every text through purr), so tests can compare the two.
pub(crate) fn read_raw_with(smiles: &str, direct: bool) -> Result<Raw, MolError> {
    if smiles.trim().is_empty() {
        return Err(MolError::new(
            ErrorKind::Empty,
            "empty input: no SMILES given",
            Some(0),
            smiles,
        ));
    }
    // Every valid SMILES is ASCII; for other input purr reports the first
    // bad character and positions are counted in characters.
    let chars: Vec<char> = if smiles.is_ascii() {
        Vec::new()
    } else {
        smiles.chars().collect()
    };
    let bytes = smiles.as_bytes();
    let n_chars = if smiles.is_ascii() {
        bytes.len()
    } else {
        chars.len()
    };
    if n_chars > MAX_CHARS {
        return Err(MolError::new(
            ErrorKind::TooLarge,
            format!(
                "input has {} characters; the limit is {}",
                n_chars, MAX_CHARS
            ),
            Some(MAX_CHARS),
            smiles,
        ));
    }
    // purr does not know the aromatic tellurium symbol `[te]` (RDKit and
    // common practice accept it): read it as `[se]`, which has the same
    // length, and correct the element afterwards.
    let tellurium = tellurium_brackets(bytes);
    let rewritten: Option<String> = if tellurium.is_empty() || !smiles.is_ascii() {
        None
    } else {
        let mut c2 = bytes.to_vec();
        for &(_, t) in &tellurium {
            c2[t] = b's';
        }
        String::from_utf8(c2).ok()
    };
    let to_read: &str = rewritten.as_deref().unwrap_or(smiles);
    // The common subset is read directly, recording atom spans and
    // ring-closure positions as it goes; anything else (and every error)
    // is lexed and read by purr.
    let mut fast = None;
    if direct && smiles.is_ascii() {
        // Room for the atoms of typical text (about one per two
        // characters) without growing.
        let room = (bytes.len() * 2 / 3 + 2).min(DIRECT_READ_LIMIT);
        let mut b = Builder::new(room, Vec::new());
        let mut spans = Vec::with_capacity(room);
        let mut rnums = Vec::new();
        if fast_read(to_read.as_bytes(), &mut b, &mut spans, &mut rnums)
            && b.atoms.len() <= DIRECT_READ_LIMIT
        {
            fast = Some((b, spans, rnums));
        }
    }
    let (builder, spans, rnums) = match fast {
        Some(read) => read,
        None => {
            let rough_atoms = bytes
                .iter()
                .filter(|c| c.is_ascii_alphabetic() || **c == b'*')
                .count();
            // Lex first: atom spans, ring-closure positions and their numbers
            // (meaningful only if purr accepts the text).
            let (spans, rnums) = lex(bytes);
            let digits: Vec<u8> = rnums
                .iter()
                .map(|&p| match bytes.get(p) {
                    Some(b'%') => {
                        let d =
                            |k: usize| bytes.get(p + k).map_or(0, |c| c.wrapping_sub(b'0') % 10);
                        d(1) * 10 + d(2)
                    }
                    Some(c) => c.wrapping_sub(b'0') % 10,
                    None => 0,
                })
                .collect();
            let (result, builder) = if rough_atoms <= DIRECT_READ_LIMIT {
                guarded_read(to_read, rough_atoms, digits)
            } else {
                // One stack frame chain per atom: give the reader room for it.
                let owned = to_read.to_string();
                let stack = (1 << 20) + rough_atoms * 2048;
                let handle = std::thread::Builder::new()
                    .stack_size(stack)
                    .spawn(move || guarded_read(&owned, rough_atoms, digits));
                match handle.map(|h| h.join()) {
                    Ok(Ok(pair)) => pair,
                    _ => {
                        return Err(MolError::new(
                            ErrorKind::TooLarge,
                            "input too large to read",
                            None,
                            smiles,
                        ))
                    }
                }
            };
            let builder = match (result, builder) {
                (Ok(()), Some(b)) => b,
                (Err(ReadFailure::Syntax(purr::read::Error::Character(p))), _) => {
                    return Err(syntax_error(smiles, p))
                }
                (Err(ReadFailure::Syntax(purr::read::Error::EndOfLine)), _) => {
                    return Err(syntax_error(smiles, n_chars))
                }
                (Err(ReadFailure::Panic), _) | (Ok(()), None) => {
                    return Err(MolError::new(
                        ErrorKind::Unsupported,
                        "the SMILES reader could not handle this input",
                        None,
                        smiles,
                    ))
                }
            };
            if !smiles.is_ascii() {
                return Err(MolError::new(
                    ErrorKind::Syntax,
                    "non-ASCII character in SMILES",
                    chars.iter().position(|c| !c.is_ascii()),
                    smiles,
                ));
            }
            (builder, spans, rnums)
        }
    };
    let rnum_pos = |j: usize| rnums.get(j).copied();
    if let Some(t) = builder.trouble {
        return Err(match t {
            Trouble::TooLarge => MolError::new(
                ErrorKind::TooLarge,
                format!("more than {} atoms", MAX_ATOMS),
                spans.get(MAX_ATOMS).map(|s| s.start),
                smiles,
            ),
            Trouble::SelfBond(j) => MolError::new(
                ErrorKind::RingClosure,
                "ring closure bonds an atom to itself",
                rnum_pos(j),
                smiles,
            ),
            Trouble::Mismatch(j) => MolError::new(
                ErrorKind::RingClosure,
                "the two ends of this ring closure give different bond orders",
                rnum_pos(j),
                smiles,
            ),
        });
    }
    if let Some(open) = builder.opens.iter().map(|o| o.3).min() {
        return Err(MolError::new(
            ErrorKind::RingClosure,
            "ring closure digit is opened but never closed",
            rnum_pos(open),
            smiles,
        ));
    }
    if spans.len() != builder.atoms.len() {
        return Err(MolError::new(
            ErrorKind::Unsupported,
            "internal disagreement between reader and lexer",
            None,
            smiles,
        ));
    }
    // Two ring closures (or a closure and a chain bond) joining the same
    // pair. Chain bonds each bring a new atom, so only a closure can repeat
    // a pair: look for one first, then find the one to report.
    let repeated = builder.bonds.iter().enumerate().any(|(k, b)| {
        b.join.is_some()
            && builder.bonds[..k]
                .iter()
                .any(|o| (o.a == b.a && o.b == b.b) || (o.a == b.b && o.b == b.a))
    });
    let mut pairs: Vec<(u32, u32, usize)> = if repeated {
        builder
            .bonds
            .iter()
            .enumerate()
            .map(|(k, b)| (b.a.min(b.b), b.a.max(b.b), k))
            .collect()
    } else {
        Vec::new()
    };
    pairs.sort_unstable();
    for w in pairs.windows(2) {
        if w[0].0 == w[1].0 && w[0].1 == w[1].1 {
            let later = builder.bonds[w[0].2.max(w[1].2)].join.map(|j| j as usize);
            return Err(MolError::new(
                ErrorKind::RingClosure,
                "this ring closure duplicates a bond between the same two atoms",
                later.and_then(rnum_pos),
                smiles,
            ));
        }
    }
    let mut atoms = builder.atoms;
    for &(start, _) in &tellurium {
        if let Ok(k) = spans.binary_search_by_key(&start, |s| s.start) {
            atoms[k].element = 52;
        }
    }
    Ok(Raw {
        atoms,
        bonds: builder.bonds,
        spans,
        stereo: builder.stereo,
    })
}

/// Takes the one atom of a bracket-atom text read alone by purr.
#[derive(Default)]
struct OneAtom {
    atom: Option<AtomKind>,
    other: bool,
}

impl Follower for OneAtom {
    fn root(&mut self, root: AtomKind) {
        if self.atom.is_some() {
            self.other = true;
        }
        self.atom = Some(root);
    }

    fn extend(&mut self, _: BondKind, _: AtomKind) {
        self.other = true;
    }

    fn join(&mut self, _: BondKind, _: Rnum) {
        self.other = true;
    }

    fn pop(&mut self, _: usize) {
        self.other = true;
    }
}

/// A bracket atom (`[13CH3+:4]`) read by purr's bracket grammar.
fn bracket_atom(text: &str) -> Option<RawAtom> {
    let run = std::panic::catch_unwind(|| {
        let mut one = OneAtom::default();
        let r = purr::read::read(text, &mut one, None);
        (r, one)
    });
    match run {
        Ok((
            Ok(()),
            OneAtom {
                atom: Some(a),
                other: false,
            },
        )) => Some(convert(a)),
        _ => None,
    }
}

/// Bracket atoms written `[te...]` (optionally with an isotope): (bracket
/// position, position of the `t`).
fn tellurium_brackets(chars: &[u8]) -> Vec<(usize, usize)> {
    let mut out = Vec::new();
    if !chars.windows(2).any(|w| w == b"te") {
        return out;
    }
    for (i, &c) in chars.iter().enumerate() {
        if c != b'[' {
            continue;
        }
        let mut j = i + 1;
        while j < chars.len() && chars[j].is_ascii_digit() {
            j += 1;
        }
        if chars.get(j) == Some(&b't') && chars.get(j + 1) == Some(&b'e') {
            out.push((i, j));
        }
    }
    out
}

enum ReadFailure {
    Syntax(purr::read::Error),
    Panic,
}

fn guarded_read(
    smiles: &str,
    capacity: usize,
    digits: Vec<u8>,
) -> (Result<(), ReadFailure>, Option<Builder>) {
    let run = std::panic::catch_unwind(|| {
        let mut builder = Builder::new(capacity.min(MAX_ATOMS), digits);
        let r = purr::read::read(smiles, &mut builder, None);
        (r, builder)
    });
    match run {
        Ok((Ok(()), b)) => (Ok(()), Some(b)),
        Ok((Err(e), _)) => (Err(ReadFailure::Syntax(e)), None),
        Err(_) => (Err(ReadFailure::Panic), None),
    }
}

fn is_bond_symbol(c: char) -> bool {
    matches!(c, '-' | '=' | '#' | '$' | ':' | '/' | '\\')
}

fn syntax_error(smiles: &str, p: usize) -> MolError {
    let chars: Vec<char> = smiles.chars().collect();
    let message = match chars.get(p) {
        None => {
            let open_brackets = chars.iter().filter(|c| **c == '[').count()
                > chars.iter().filter(|c| **c == ']').count();
            let open_branches = chars.iter().filter(|c| **c == '(').count()
                > chars.iter().filter(|c| **c == ')').count();
            if open_brackets {
                "unexpected end of input: a bracket atom is not closed with ']'".to_string()
            } else if open_branches {
                "unexpected end of input: a branch is not closed with ')'".to_string()
            } else {
                "unexpected end of input: an atom is missing".to_string()
            }
        }
        Some(c) if c.is_whitespace() => "unexpected white space".to_string(),
        Some('(') if p > 0 && chars[p - 1] == '%' => {
            "ring-closure numbers above 99 (written %(n)) are not supported".to_string()
        }
        Some(c)
            if is_bond_symbol(*c)
                && p > 0
                && chars.get(p - 1).is_some_and(|b| is_bond_symbol(*b)) =>
        {
            if *c == '\\' && chars[p - 1] == '\\' {
                "two bond symbols in a row: '\\\\' is usually an escaped '\\' (write it once)"
                    .to_string()
            } else {
                format!("two bond symbols in a row ('{}{}')", chars[p - 1], c)
            }
        }
        Some(c) => format!("unexpected character '{}'", c),
    };
    MolError::new(ErrorKind::Syntax, message, Some(p), smiles)
}
