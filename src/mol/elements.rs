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

/// Normal valences of the main-group elements that SMILES gives implicit
/// hydrogens to (OpenSMILES organic subset: B 3; C 4; N 3, 5; O 2; P 3, 5;
/// S 2, 4, 6; halogens 1), extended to the same-group elements used by the
/// isoelectronic rule for charged bracket atoms (Si, Ge 4; As, Sb 3, 5;
/// Se, Te 2, 4, 6). Source: OpenSMILES specification, section 3.1.5.
pub(crate) fn normal_valences(z: u8) -> &'static [u8] {
    match z {
        5 | 13 => &[3],
        6 | 14 | 32 => &[4],
        7 | 15 | 33 | 51 => &[3, 5],
        8 => &[2],
        16 | 34 | 52 => &[2, 4, 6],
        9 | 17 | 35 | 53 | 85 | 117 => &[1],
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

/// Valence electrons in the outer shell of main-group elements (0 for
/// transition metals and the wildcard), as used for counting pi electrons.
pub(crate) fn outer_electrons(z: u8) -> i32 {
    match z {
        1 => 1,
        3 | 11 | 19 | 37 | 55 | 87 => 1,
        4 | 12 | 20 | 38 | 56 | 88 => 2,
        5 | 13 | 31 | 49 | 81 => 3,
        6 | 14 | 32 | 50 | 82 => 4,
        7 | 15 | 33 | 51 | 83 => 5,
        8 | 16 | 34 | 52 | 84 => 6,
        9 | 17 | 35 | 53 | 85 => 7,
        2 | 10 | 18 | 36 | 54 | 86 => 8,
        _ => 0,
    }
}

/// Default (lowest normal) valence of main-group elements, -1 where there
/// is none (metals, noble gases, wildcard).
pub(crate) fn default_valence(z: u8) -> i32 {
    match z {
        1 => 1,
        5 | 13 => 3,
        6 | 14 | 32 | 50 => 4,
        7 | 15 | 33 | 51 => 3,
        8 | 16 | 34 | 52 => 2,
        9 | 17 | 35 | 53 | 85 => 1,
        _ => -1,
    }
}

/// Pauling electronegativity, used only to compare two atoms
/// (common practice table values).
pub(crate) fn electronegativity(z: u8) -> f32 {
    match z {
        1 => 2.20,
        5 => 2.04,
        6 => 2.55,
        7 => 3.04,
        8 => 3.44,
        9 => 3.98,
        14 => 1.90,
        15 => 2.19,
        16 => 2.58,
        17 => 3.16,
        33 => 2.18,
        34 => 2.55,
        35 => 2.96,
        52 => 2.1,
        53 => 2.66,
        _ => 1.5,
    }
}

/// True for the elements counted as "organic" when choosing the main
/// component of a mixture: the component must contain carbon.
pub(crate) fn is_metal(z: u8) -> bool {
    matches!(z,
        3 | 4 | 11 | 12 | 13 | 19..=31 | 37..=50 | 55..=84 | 87..=118)
}
