//! Element data: symbols, the OpenSMILES organic-subset valences used to add
//! implicit hydrogens, and the valence facts used by aromaticity perception
//! and validation.

/// Element symbols by atomic number (index 0 is the `*` wildcard).
pub(crate) const SYMBOLS: [&str; 119] = [
    "*", "H", "He", "Li", "Be", "B", "C", "N", "O", "F", "Ne", "Na", "Mg", "Al", "Si", "P", "S",
    "Cl", "Ar", "K", "Ca", "Sc", "Ti", "V", "Cr", "Mn", "Fe", "Co", "Ni", "Cu", "Zn", "Ga", "Ge",
    "As", "Se", "Br", "Kr", "Rb", "Sr", "Y", "Zr", "Nb", "Mo", "Tc", "Ru", "Rh", "Pd", "Ag", "Cd",
    "In", "Sn", "Sb", "Te", "I", "Xe", "Cs", "Ba", "La", "Ce", "Pr", "Nd", "Pm", "Sm", "Eu", "Gd",
    "Tb", "Dy", "Ho", "Er", "Tm", "Yb", "Lu", "Hf", "Ta", "W", "Re", "Os", "Ir", "Pt", "Au", "Hg",
    "Tl", "Pb", "Bi", "Po", "At", "Rn", "Fr", "Ra", "Ac", "Th", "Pa", "U", "Np", "Pu", "Am", "Cm",
    "Bk", "Cf", "Es", "Fm", "Md", "No", "Lr", "Rf", "Db", "Sg", "Bh", "Hs", "Mt", "Ds", "Rg", "Cn",
    "Nh", "Fl", "Mc", "Lv", "Ts", "Og",
];

/// Symbol of atomic number `z` (`*` for 0, `?` beyond the table).
pub fn symbol(z: u8) -> &'static str {
    SYMBOLS.get(z as usize).copied().unwrap_or("?")
}

/// Atomic number of an element symbol (case-sensitive, `*` gives 0).
pub fn atomic_number(symbol: &str) -> Option<u8> {
    SYMBOLS.iter().position(|s| *s == symbol).map(|z| z as u8)
}

/// A chemical element, by atomic number: the typed form of an element in
/// the library's results (an acidic site's atom, a counted proton), so
/// code compares elements, not symbol strings. Displayed and written in
/// records as its symbol.
///
/// ```
/// use acidsite::mol::Element;
/// assert_eq!(Element::from_symbol("O"), Some(Element::O));
/// assert_eq!(Element::C.symbol(), "C");
/// assert_eq!(Element::N.atomic_number(), 7);
/// assert!(Element::from_symbol("Xx").is_none());
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, PartialOrd, Ord)]
pub struct Element(u8);

impl Element {
    /// Hydrogen.
    pub const H: Element = Element(1);
    /// Carbon.
    pub const C: Element = Element(6);
    /// Nitrogen.
    pub const N: Element = Element(7);
    /// Oxygen.
    pub const O: Element = Element(8);
    /// Phosphorus.
    pub const P: Element = Element(15);
    /// Sulfur.
    pub const S: Element = Element(16);
    /// Selenium.
    pub const SE: Element = Element(34);

    /// The element of atomic number `z` (1 to 118), or None.
    pub fn from_atomic_number(z: u8) -> Option<Element> {
        (1..SYMBOLS.len() as u8).contains(&z).then_some(Element(z))
    }

    /// The element written `symbol` (case-sensitive), or None.
    pub fn from_symbol(symbol: &str) -> Option<Element> {
        atomic_number(symbol).and_then(Element::from_atomic_number)
    }

    /// Atomic number.
    pub fn atomic_number(self) -> u8 {
        self.0
    }

    /// Element symbol (`C`, `Cl`).
    pub fn symbol(self) -> &'static str {
        symbol(self.0)
    }
}

impl serde::Serialize for Element {
    fn serialize<S: serde::Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
        s.serialize_str(self.symbol())
    }
}

impl std::fmt::Display for Element {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str(self.symbol())
    }
}

/// Normal valences of the main-group elements that SMILES gives implicit
/// hydrogens to (OpenSMILES organic subset: B 3; C 4; N 3; O 2; P 3, 5;
/// S 2, 4, 6; halogens 1), as RDKit, our reference, applies them: neutral
/// N has only 3 (OpenSMILES also lists 5) and I has 1, 3, 5, extended to the same-group elements used by the
/// isoelectronic rule for charged bracket atoms (Si, Ge 4; As, Sb 3, 5;
/// Se, Te 2, 4, 6). Source: OpenSMILES specification, section 3.1.5.
pub(crate) fn normal_valences(z: u8) -> &'static [u8] {
    match z {
        5 | 13 => &[3],
        6 | 14 | 32 => &[4],
        7 => &[3],
        15 | 33 | 51 => &[3, 5],
        8 => &[2],
        16 | 34 | 52 => &[2, 4, 6],
        53 => &[1, 3, 5],
        9 | 17 | 35 | 85 | 117 => &[1],
        _ => &[],
    }
}

/// Valences of a possibly charged atom by the isoelectronic rule: N+ is
/// treated like C, O+ like N, C- like N, N- like O, B- like C, S+ like P.
/// Shifts that would leave the atom's row are not applied (empty result).
pub(crate) fn charged_valences(z: u8, charge: i8) -> &'static [u8] {
    if charge == 0 {
        return normal_valences(z);
    }
    let shifted = z as i16 - charge as i16;
    let row = |z: i16| match z {
        1..=2 => 1,
        3..=10 => 2,
        11..=18 => 3,
        19..=36 => 4,
        37..=54 => 5,
        _ => 6,
    };
    if !(1..=118).contains(&shifted) || row(shifted) != row(z as i16) {
        return &[];
    }
    normal_valences(shifted as u8)
}

/// Metals, for treating a bond from an over-valent donor atom (N, O, P, S)
/// to a metal as dative: alkali and alkaline-earth metals, Al, Ga, In, Sn,
/// Tl, Pb, Bi, Po and the transition, lanthanide and actinide metals.
pub(crate) fn is_metal(z: u8) -> bool {
    matches!(z, 3 | 4 | 11 | 12 | 13 | 19..=31 | 37..=50 | 55..=84 | 87..=112)
}
