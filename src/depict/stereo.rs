//! Stereo in the drawing: double bonds drawn with their substituents on
//! the written sides, and one wedge or hashed wedge per tetrahedral centre.
//!
//! Double bonds: after placement (and again after the clean-up, which
//! refuses moves that would undo one) every double bond with a written
//! configuration whose drawing shows the other one has its smaller side
//! mirrored across the bond's line. A double bond in a ring (8 atoms or
//! more) cannot be fixed this way; the ring placement notches a trans one
//! (`rings`), and a ring double bond outside the first ring of its system
//! may stay wrong.
//!
//! Wedges ([`wedges`]): per centre, in atom order, each single bond from
//! the centre to a neighbour is a candidate; the wedge's narrow end is at
//! the centre. Preferred, in this order: a bond that carries no wedge yet
//! and whose far atom is not the wide end of another wedge; a bond outside
//! rings; a far atom that is not a stereocentre itself; a terminal far
//! atom; then the clearest reading (largest volume). The wedge or hash is
//! the one whose reading from the drawing ([`anticlockwise_from_2d`])
//! equals the written configuration; a candidate whose reading is
//! undecided (neighbours in a line) is skipped.

use super::geom::{reflect, Point};
use super::Layout;
use crate::mol::{anticlockwise_from_2d, cis_from_2d, BondOrder, Chirality, Molecule};

/// One wedge of a drawing.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct Wedge {
    /// The bond drawn as a wedge.
    pub bond: usize,
    /// The stereocentre, at the wedge's narrow end.
    pub centre: usize,
    /// The atom at the wide end.
    pub far: usize,
    /// Hashed (pointing away from the viewer) rather than solid (towards).
    pub hash: bool,
}

fn xy(p: Point) -> [f64; 2] {
    [p.x, p.y]
}

/// Whether the drawing shows double bond `k`'s written configuration:
/// Some(true) yes, Some(false) the other one, None undecided.
pub(crate) fn double_bond_shown(mol: &Molecule, pos: &[Point], k: usize) -> Option<bool> {
    let st = mol.double_bond_stereo().iter().find(|d| d.bond == k)?;
    let [u, v] = mol.bonds[st.bond].atoms;
    let [x, y] = st.refs;
    cis_from_2d(xy(pos[u]), xy(pos[v]), xy(pos[x]), xy(pos[y])).map(|c| c == st.cis)
}

/// Atoms on `far`'s side of bond `bond` (empty when the bond is in a ring).
/// Linear in the size of the molecule.
fn side(mol: &Molecule, bond: usize, far: usize) -> Vec<usize> {
    let near = mol.bonds[bond].other(far);
    let mut seen = vec![false; mol.atom_count()];
    seen[far] = true;
    let mut out = vec![far];
    let mut stack = vec![far];
    while let Some(u) = stack.pop() {
        for nb in mol.neighbors(u) {
            if nb.bond == bond {
                continue;
            }
            if nb.atom == near {
                return Vec::new();
            }
            if !seen[nb.atom] {
                seen[nb.atom] = true;
                out.push(nb.atom);
                stack.push(nb.atom);
            }
        }
    }
    out
}

/// Mirror the smaller side of every stereo double bond of `atoms` that is
/// drawn with the other configuration.
pub(crate) fn fix_double_bonds(mol: &Molecule, atoms: &[usize], pos: &mut [Point]) {
    for st in mol.double_bond_stereo() {
        let [u, v] = mol.bonds[st.bond].atoms;
        let here = atoms
            .first()
            .is_some_and(|&a| mol.component_of(a) == mol.component_of(u));
        if !here || double_bond_shown(mol, pos, st.bond) != Some(false) {
            continue;
        }
        let (su, sv) = (side(mol, st.bond, u), side(mol, st.bond, v));
        let moving = if su.len() <= sv.len() { su } else { sv };
        let (a, b) = (pos[u], pos[v]);
        for m in moving {
            pos[m] = reflect(pos[m], a, b);
        }
    }
}

/// The stereo double bonds of `atoms` that the drawing shows rightly.
pub(crate) fn shown_double_bonds(mol: &Molecule, atoms: &[usize], pos: &[Point]) -> Vec<usize> {
    mol.double_bond_stereo()
        .iter()
        .filter(|st| {
            atoms.first().is_some_and(|&a| {
                mol.component_of(a) == mol.component_of(mol.bonds[st.bond].atoms[0])
            })
        })
        .filter(|st| double_bond_shown(mol, pos, st.bond) == Some(true))
        .map(|st| st.bond)
        .collect()
}

/// Reading of a centre from the drawing with one wedge (`height` on the
/// bond to `far`: +1 solid, -1 hashed) and the other bonds flat.
pub fn reading(c: &Chirality, pos: &[Point], far: usize, height: f64) -> Option<bool> {
    let mut order = [None; 4];
    for (k, r) in c.order.iter().enumerate() {
        order[k] = r.map(|a| (xy(pos[a]), if a == far { height } else { 0.0 }));
    }
    anticlockwise_from_2d(xy(pos[c.atom]), &order)
}

/// Ranking of a wedge candidate (see the module documentation), compared
/// in order.
type Preference = (u8, u8, u8, u8, u8);

/// One wedge or hash per tetrahedral centre of `mol`, chosen on `layout`
/// so that the drawing reads as the written configuration. Centres where
/// no bond gives a clear reading get none.
pub fn wedges(mol: &Molecule, layout: &Layout) -> Vec<Wedge> {
    let centres = mol.chirality();
    if centres.is_empty() || layout.points.len() < mol.atom_count() {
        return Vec::new();
    }
    let pos = &layout.points;
    let is_centre = |a: usize| centres.iter().any(|c| c.atom == a);
    let mut out: Vec<Wedge> = Vec::with_capacity(centres.len());
    for c in centres {
        let mut best: Option<(Preference, f64, Wedge)> = None;
        for nb in mol.neighbors(c.atom) {
            let b = &mol.bonds[nb.bond];
            if b.order != BondOrder::Single || b.kekule != 1 {
                continue;
            }
            if !c.order.contains(&Some(nb.atom)) {
                continue;
            }
            let Some(up) = reading(c, pos, nb.atom, 1.0) else {
                continue;
            };
            // Clarity: how far the wedge's far atom is from the line of
            // the flat neighbours' balance (bigger reads better).
            let clarity = clarity(c, pos, nb.atom);
            let free_bond = !out.iter().any(|w| w.bond == nb.bond);
            if !free_bond {
                continue;
            }
            let key = (
                u8::from(!out.iter().any(|w| w.far == nb.atom)),
                u8::from(!mol.bond_in_ring(nb.bond)),
                u8::from(!is_centre(nb.atom)),
                u8::from(mol.degree(nb.atom) == 1),
                u8::from(mol.atoms[nb.atom].hydrogens == 0),
            );
            let w = Wedge {
                bond: nb.bond,
                centre: c.atom,
                far: nb.atom,
                hash: up != c.anticlockwise,
            };
            let better = match &best {
                None => true,
                Some((k, cl, _)) => key > *k || (key == *k && clarity > *cl + 1e-9),
            };
            if better {
                best = Some((key, clarity, w));
            }
        }
        if let Some((_, _, w)) = best {
            out.push(w);
        }
    }
    out
}

/// Smallest angle (radians) between the candidate bond and the other drawn
/// bonds of the centre: a wedge squeezed between two bonds reads poorly.
fn clarity(c: &Chirality, pos: &[Point], far: usize) -> f64 {
    let p = pos[c.atom];
    let d = pos[far] - p;
    c.order
        .iter()
        .flatten()
        .filter(|&&a| a != far)
        .map(|&a| {
            let e = pos[a] - p;
            (d.cross(e)).atan2(d.dot(e)).abs()
        })
        .fold(std::f64::consts::PI, f64::min)
}
