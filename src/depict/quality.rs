//! Three plain figures of a drawing's quality, the same ones the reference
//! script `tests/reference/depict_rdkit.py` computes for RDKit's layout.

use super::geom::{segments_cross, Point};
use crate::mol::Molecule;

/// Defects of one drawing.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub struct Quality {
    /// Two atoms not bonded to each other are closer than 0.4 x the median
    /// bond length.
    pub clash: bool,
    /// Two bonds without a shared atom cross.
    pub crossing: bool,
    /// A bond's length differs from the median bond length by more than
    /// 30 % of the median.
    pub bad_bond: bool,
}

/// Assess the drawing `points` (one per atom) of `mol`.
///
/// ```
/// use acidsite::{depict, mol::Molecule};
/// let m = Molecule::from_smiles("c1ccccc1CC(=O)O").unwrap();
/// let q = depict::assess(&m, &depict::layout(&m).points);
/// assert!(!q.clash && !q.crossing && !q.bad_bond);
/// ```
pub fn assess(mol: &Molecule, points: &[Point]) -> Quality {
    let mut q = Quality::default();
    if points.len() != mol.atom_count() || mol.bond_count() == 0 {
        return q;
    }
    let mut lengths: Vec<f64> = mol
        .bonds
        .iter()
        .map(|b| points[b.atoms[0]].dist(points[b.atoms[1]]))
        .collect();
    let bond_len = lengths.clone();
    lengths.sort_by(f64::total_cmp);
    let k = lengths.len();
    let median = if k % 2 == 1 {
        lengths[k / 2]
    } else {
        0.5 * (lengths[k / 2 - 1] + lengths[k / 2])
    };
    q.bad_bond = bond_len.iter().any(|l| (l - median).abs() > 0.3 * median);
    let n = points.len();
    'outer: for i in 0..n {
        for j in i + 1..n {
            if points[i].dist(points[j]) < 0.4 * median && mol.bond_between(i, j).is_none() {
                q.clash = true;
                break 'outer;
            }
        }
    }
    'cross: for (x, bx) in mol.bonds.iter().enumerate() {
        let [a, b] = bx.atoms;
        for by in &mol.bonds[x + 1..] {
            let [c, d] = by.atoms;
            if a == c || a == d || b == c || b == d {
                continue;
            }
            if segments_cross(points[a], points[b], points[c], points[d]) {
                q.crossing = true;
                break 'cross;
            }
        }
    }
    q
}
