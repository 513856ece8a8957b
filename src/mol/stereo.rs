//! Stereo kept from the input: tetrahedral centres (`@`, `@@`, `@TH1`,
//! `@TH2`) and double-bond configurations (`/`, `\`), as small typed data
//! on the molecule, and the 2D geometry that turns drawn coordinates (with
//! wedge heights) back into the same data, used by the drawing and its
//! tests.
//!
//! Kept only where the atom can be a stereocentre: four neighbours counting
//! hydrogens (at most one hydrogen), or three neighbours and no hydrogen on
//! S, Se or P (the lone pair counts as the fourth, in the place an implicit
//! hydrogen would take). Other marks (`[C@H2]`, a mark on a carbon of an
//! allene, `@AL`, `@SP`, `@TB`, `@OH`) are dropped without error.
//! Symmetry is not checked: `C[C@H](C)O` keeps its (meaningless) mark.
//! A double bond keeps a configuration when it is not aromatic, each end
//! has one or two other neighbours, one neighbour of each end carries a
//! direction mark, and any ring holding it has at least 8 atoms.

use super::read::{RawAtom, RawBond};
use super::{BondOrder, Molecule};

/// A tetrahedral centre as written.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct Chirality {
    /// The centre.
    pub atom: usize,
    /// Its neighbours in written order (0-based atom indices); `None` is
    /// the atom's one hydrogen (bracket count, implicit or a folded `[H]`)
    /// or, on a three-coordinate centre, its lone pair.
    pub order: [Option<usize>; 4],
    /// `@`: looking from `order[0]` towards the centre, `order[1..]` run
    /// anticlockwise. `false` is `@@` (clockwise).
    pub anticlockwise: bool,
}

impl Chirality {
    /// Whether `self` and `other` (on the same atom, any neighbour order)
    /// describe the same configuration. None if they name different
    /// neighbours.
    pub fn same_as(&self, other: &Chirality) -> Option<bool> {
        let mut perm = [0usize; 4];
        for (k, r) in self.order.iter().enumerate() {
            perm[k] = other.order.iter().position(|o| o == r)?;
        }
        let parity_odd = permutation_is_odd(perm);
        Some((self.anticlockwise == other.anticlockwise) != parity_odd)
    }
}

/// A double bond's configuration as written.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct DoubleBondStereo {
    /// The double bond (index into `Molecule::bonds`).
    pub bond: usize,
    /// A reference neighbour of `bonds[bond].atoms[0]` and one of
    /// `bonds[bond].atoms[1]`.
    pub refs: [usize; 2],
    /// The two reference atoms are on the same side (Z-like); false is
    /// opposite sides.
    pub cis: bool,
}

/// The stereo of a molecule (both lists empty, no allocation, when the
/// input has none).
#[derive(Debug, Clone, Default, PartialEq)]
pub(crate) struct Stereo {
    pub centres: Vec<Chirality>,
    pub double_bonds: Vec<DoubleBondStereo>,
}

/// A marked centre: (atom, neighbours with their order keys, 1 = `@` /
/// 2 = `@@`).
type MarkedCentre = (usize, Vec<(u32, Option<usize>)>, u8);

/// Stereo marks gathered from the written atoms and bonds, in molecule
/// indices.
#[derive(Debug, Default)]
pub(crate) struct Marks {
    centres: Vec<MarkedCentre>,
    /// (a, b, direction from a to b: 1 `/`, 2 `\`).
    dirs: Vec<(usize, usize, u8)>,
}

/// Gather the marks; `index(i)` is raw atom i's molecule index (None for
/// a folded hydrogen).
pub(crate) fn collect(
    atoms: &[RawAtom],
    bonds: &[RawBond],
    index: impl Fn(usize) -> Option<usize>,
) -> Marks {
    let mut marks = Marks::default();
    for (r, a) in atoms.iter().enumerate() {
        if a.chiral == 0 {
            continue;
        }
        let Some(me) = index(r) else { continue };
        let mut list: Vec<(u32, Option<usize>)> = Vec::with_capacity(4);
        for b in bonds {
            let (key, other) = if b.a as usize == r {
                (b.ka, b.b as usize)
            } else if b.b as usize == r {
                (b.kb, b.a as usize)
            } else {
                continue;
            };
            list.push((key, index(other)));
        }
        for _ in 0..a.hcount.unwrap_or(0).min(4) {
            list.push((2 * a.t + 1, None));
        }
        // A lone pair takes the place of an implicit hydrogen.
        let three_ok = matches!(a.element, 15 | 16 | 34);
        if list.len() == 3 && list.iter().all(|e| e.1.is_some()) && three_ok {
            list.push((2 * a.t + 1, None));
        }
        marks.centres.push((me, list, a.chiral));
    }
    for b in bonds.iter().filter(|b| b.dir != 0) {
        if let (Some(x), Some(y)) = (index(b.a as usize), index(b.b as usize)) {
            marks.dirs.push((x, y, b.dir));
        }
    }
    marks
}

/// Turn the marks into stereo on `mol`, dropping marks that cannot apply.
pub(crate) fn perceive(mol: &Molecule, mut marks: Marks) -> Stereo {
    let mut out = Stereo::default();
    for (atom, list, mark) in &mut marks.centres {
        let hs = list.iter().filter(|e| e.1.is_none()).count();
        if list.len() != 4 || hs > 1 {
            continue;
        }
        list.sort_by_key(|e| e.0);
        let order = [list[0].1, list[1].1, list[2].1, list[3].1];
        out.centres.push(Chirality {
            atom: *atom,
            order,
            anticlockwise: *mark == 1,
        });
    }
    if !marks.dirs.is_empty() {
        for (k, b) in mol.bonds.iter().enumerate() {
            if b.order != BondOrder::Double {
                continue;
            }
            let [u, v] = b.atoms;
            if !(2..=3).contains(&mol.degree(u)) || !(2..=3).contains(&mol.degree(v)) {
                continue;
            }
            if mol.bond_in_ring(k)
                && mol
                    .rings()
                    .any(|r| r.len() < 8 && r.contains(&u) && r.contains(&v))
            {
                continue;
            }
            let (Some((x, sx)), Some((y, sy))) = (
                end_side(mol, &marks.dirs, u, v),
                end_side(mol, &marks.dirs, v, u),
            ) else {
                continue;
            };
            out.double_bonds.push(DoubleBondStereo {
                bond: k,
                refs: [x, y],
                cis: sx == sy,
            });
        }
    }
    out
}

/// The first marked neighbour of double-bond end `u` (other end `v`) and
/// its side (+1 above, -1 below, in the written sense); None if no
/// neighbour is marked or two marks on the same end contradict.
fn end_side(
    mol: &Molecule,
    dirs: &[(usize, usize, u8)],
    u: usize,
    v: usize,
) -> Option<(usize, i8)> {
    let mut found: Option<(usize, i8)> = None;
    for nb in mol.neighbors(u) {
        if nb.atom == v {
            continue;
        }
        let x = nb.atom;
        let side = dirs.iter().find_map(|&(a, b, d)| {
            let up = if d == 1 { 1 } else { -1 };
            if a == x && b == u {
                Some(-up)
            } else if a == u && b == x {
                Some(up)
            } else {
                None
            }
        });
        if let Some(s) = side {
            match found {
                None => found = Some((x, s)),
                // Two neighbours of one end on the same side contradict.
                Some((_, s0)) if s0 == s => return None,
                Some(_) => {}
            }
        }
    }
    found
}

fn permutation_is_odd(mut p: [usize; 4]) -> bool {
    let mut swaps = 0;
    for i in 0..4 {
        while p[i] != i {
            let j = p[i];
            if j >= 4 {
                return false;
            }
            p.swap(i, j);
            swaps += 1;
        }
    }
    swaps % 2 == 1
}

/// The configuration a 2D drawing shows at a centre: `centre` and the
/// points of `order`'s neighbours are drawing coordinates (y down, as in
/// `depict`), each with a height: +1 for a wedge (towards the viewer),
/// -1 for a hashed wedge, 0 in the plane; `None` is an undrawn hydrogen or
/// lone pair, placed opposite the others. Returns `anticlockwise` in the
/// sense of [`Chirality`], or None when the drawing does not decide it.
pub fn anticlockwise_from_2d(
    centre: [f64; 2],
    order: &[Option<([f64; 2], f64)>; 4],
) -> Option<bool> {
    let mut v = [[0.0f64; 3]; 4];
    let mut sum = [0.0f64; 3];
    let mut missing = None;
    for (k, o) in order.iter().enumerate() {
        match o {
            Some((p, z)) => {
                // Right-handed: y up.
                let (dx, dy) = (p[0] - centre[0], centre[1] - p[1]);
                let l = (dx * dx + dy * dy).sqrt();
                if l < 1e-9 {
                    return None;
                }
                v[k] = [dx / l, dy / l, *z];
                for d in 0..3 {
                    sum[d] += v[k][d];
                }
            }
            None if missing.is_none() => missing = Some(k),
            None => return None,
        }
    }
    if let Some(k) = missing {
        v[k] = [-sum[0], -sum[1], -sum[2]];
        let l = (sum[0] * sum[0] + sum[1] * sum[1] + sum[2] * sum[2]).sqrt();
        if l < 1e-6 {
            return None;
        }
        for x in v[k].iter_mut() {
            *x /= l;
        }
    }
    let a = sub(v[1], v[0]);
    let b = sub(v[2], v[0]);
    let c = sub(v[3], v[0]);
    let det = a[0] * (b[1] * c[2] - b[2] * c[1]) - a[1] * (b[0] * c[2] - b[2] * c[0])
        + a[2] * (b[0] * c[1] - b[1] * c[0]);
    if det.abs() < 0.05 {
        return None;
    }
    Some(det < 0.0)
}

fn sub(a: [f64; 3], b: [f64; 3]) -> [f64; 3] {
    [a[0] - b[0], a[1] - b[1], a[2] - b[2]]
}

/// Whether a drawing shows two reference atoms `x` (bonded to `u`) and `y`
/// (bonded to `v`) of the double bond `u`=`v` on the same side; None when
/// one of them lies (nearly) on the bond's line.
pub fn cis_from_2d(u: [f64; 2], v: [f64; 2], x: [f64; 2], y: [f64; 2]) -> Option<bool> {
    let d = [v[0] - u[0], v[1] - u[1]];
    let cross = |p: [f64; 2], o: [f64; 2]| d[0] * (p[1] - o[1]) - d[1] * (p[0] - o[0]);
    let len2 = d[0] * d[0] + d[1] * d[1];
    let (cx, cy) = (cross(x, u), cross(y, v));
    let tol = 0.05 * len2;
    if cx.abs() < tol || cy.abs() < tol {
        return None;
    }
    Some((cx > 0.0) == (cy > 0.0))
}
