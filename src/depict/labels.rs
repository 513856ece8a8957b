//! Atom labels: which atoms get one, the text parts (isotope, element,
//! hydrogens, charge) and on which side the hydrogens go.

use super::geom::Point;
use crate::mol::Molecule;

/// Where an atom label's hydrogens are written.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub(crate) enum HSide {
    Right,
    Left,
    Above,
    Below,
}

/// The parts of one atom label.
#[derive(Debug, Clone, PartialEq)]
pub(crate) struct Label {
    pub element: &'static str,
    pub hydrogens: u8,
    pub h_side: HSide,
    pub charge: i8,
    pub isotope: Option<u16>,
}

/// Atom `i` is drawn with a label (not as a bare vertex): every atom but
/// carbon, and carbon when charged, an isotope or alone.
pub(crate) fn has_label(mol: &Molecule, i: usize) -> bool {
    let a = &mol.atoms[i];
    a.element != 6 || a.charge != 0 || a.isotope.is_some() || mol.degree(i) == 0
}

/// The label of atom `i` at `pts` (drawing coordinates, y down), or None for
/// a vertex.
pub(crate) fn label(mol: &Molecule, i: usize, pts: &[Point]) -> Option<Label> {
    if !has_label(mol, i) {
        return None;
    }
    let a = &mol.atoms[i];
    let mut sum = Point::default();
    for nb in mol.neighbors(i) {
        sum = sum + (pts[nb.atom] - pts[i]).unit();
    }
    let deg = mol.degree(i);
    let mean = if deg > 0 {
        sum * (1.0 / deg as f64)
    } else {
        sum
    };
    // A lone hydride is written the usual way round: HCl, H2O, H2S, but NH3.
    let h_first = matches!(a.element, 8 | 9 | 16 | 17 | 34 | 35 | 53);
    let h_side = if deg == 0 && h_first {
        HSide::Left
    } else if deg == 0 || mean.x < -0.3 {
        HSide::Right
    } else if mean.x > 0.3 {
        HSide::Left
    } else if deg == 1 {
        HSide::Right
    } else if mean.y < 0.0 {
        HSide::Below
    } else {
        HSide::Above
    };
    Some(Label {
        element: a.symbol(),
        hydrogens: a.hydrogens,
        h_side,
        charge: a.charge,
        isotope: a.isotope,
    })
}

/// Approximate width of `text` in ems of a sans-serif font.
pub(crate) fn text_width(text: &str) -> f64 {
    text.chars()
        .map(|c| match c {
            'i' | 'l' | 'j' | '.' | ' ' => 0.3,
            'I' => 0.32,
            'W' | 'M' => 0.9,
            c if c.is_ascii_uppercase() => 0.72,
            c if c.is_ascii_digit() => 0.64,
            '#' => 0.84,
            _ => 0.6,
        })
        .sum()
}

/// Charge text: `+`, `−`, `2+`, `3−`.
pub(crate) fn charge_text(c: i8) -> String {
    let sign = if c > 0 { "+" } else { "\u{2212}" };
    match c.unsigned_abs() {
        0 => String::new(),
        1 => sign.to_string(),
        k => format!("{k}{sign}"),
    }
}
