//! Stereo from a molfile's 2D drawing (issue 12): a wedge (V2000 bond
//! stereo 1, V3000 `CFG=1`) or hashed wedge (6, `CFG=3`) whose narrow end
//! (the bond's first atom) is an atom with four neighbours counting
//! hydrogens (or three and no hydrogen on S, Se, P) gives that atom's
//! configuration, read from the coordinates of all its neighbours
//! (written hydrogens included) by [`anticlockwise_from_2d`]; a centre with
//! an "either" bond (4, `CFG=2`) or an undecided reading gets none. A
//! double bond that is not "either" (3, `CFG=2`), with one or two other
//! neighbours at each end, outside rings of fewer than 8 atoms, gets its
//! cis/trans from the coordinates ([`cis_from_2d`]) when the two other
//! neighbours of an end are not symmetry-equivalent. Only 2D molfiles are
//! read for stereo (any z coordinate other than 0 means 3D: none is read).

use super::{RawOrder, Table};
use crate::mol::stereo::{anticlockwise_from_2d, cis_from_2d, Chirality, DoubleBondStereo};
use crate::mol::{BondOrder, Molecule};

/// Set `mol`'s stereo from the table it was read from.
pub(super) fn assign(table: &Table, mol: &mut Molecule) {
    let n = table.atoms.len();
    let has_stereo_bond = table.stereo.iter().any(|&s| s == 1 || s == 6);
    let has_double = table.bonds.iter().any(|b| b.2 == RawOrder::Double);
    if !(has_stereo_bond || has_double) || table.atoms.iter().any(|a| a.xyz[2].abs() > 1e-4) {
        return;
    }
    if table
        .atoms
        .iter()
        .all(|a| a.xyz[0] == 0.0 && a.xyz[1] == 0.0)
    {
        return;
    }
    // Neighbours per table atom: (other atom, bond index).
    let mut nbs: Vec<Vec<(usize, usize)>> = vec![Vec::new(); n];
    for (k, &(a, b, _, _)) in table.bonds.iter().enumerate() {
        nbs[a].push((b, k));
        nbs[b].push((a, k));
    }
    // Molecule index of each table atom (hydrogens folded as the core does).
    let folded = |i: usize| {
        let a = &table.atoms[i];
        a.element == 1
            && a.charge == 0
            && nbs[i].len() == 1
            && table.bonds[nbs[i][0].1].2 == RawOrder::Single
            && table.atoms[nbs[i][0].0].element != 1
    };
    let mut index = vec![None; n];
    let mut next = 0;
    for (i, slot) in index.iter_mut().enumerate() {
        if !folded(i) {
            *slot = Some(next);
            next += 1;
        }
    }
    if next != mol.atom_count() {
        return;
    }
    // Drawing coordinates, y down as in `depict`.
    let xy = |i: usize| [table.atoms[i].xyz[0], -table.atoms[i].xyz[1]];

    let mut centres = Vec::new();
    for c in 0..n {
        let Some(mc) = index[c] else { continue };
        let starts_wedge = nbs[c]
            .iter()
            .any(|&(_, k)| table.bonds[k].0 == c && matches!(table.stereo[k], 1 | 6));
        if !starts_wedge || nbs[c].iter().any(|&(_, k)| table.stereo[k] == 4) {
            continue;
        }
        let mut order: Vec<Option<([f64; 2], f64)>> = Vec::with_capacity(4);
        let mut refs: Vec<Option<usize>> = Vec::with_capacity(4);
        for &(o, k) in &nbs[c] {
            let z = match (table.bonds[k].0 == c, table.stereo[k]) {
                (true, 1) => 1.0,
                (true, 6) => -1.0,
                _ => 0.0,
            };
            order.push(Some((xy(o), z)));
            refs.push(index[o]);
        }
        // Hydrogens not written as atoms.
        let drawn_h = refs.iter().filter(|r| r.is_none()).count();
        let unwritten = (mol.atoms[mc].hydrogens as usize).saturating_sub(drawn_h);
        let lone_pair =
            matches!(mol.atoms[mc].element, 15 | 16 | 34) && mol.atoms[mc].hydrogens == 0;
        if order.len() == 3 && (unwritten == 1 || lone_pair) {
            order.push(None);
            refs.push(None);
        }
        if order.len() != 4 || refs.iter().filter(|r| r.is_none()).count() > 1 {
            continue;
        }
        let o = [order[0], order[1], order[2], order[3]];
        let Some(anticlockwise) = anticlockwise_from_2d(xy(c), &o) else {
            continue;
        };
        centres.push(Chirality {
            atom: mc,
            order: [refs[0], refs[1], refs[2], refs[3]],
            anticlockwise,
        });
    }
    centres.sort_by_key(|c| c.atom);

    let mut double_bonds = Vec::new();
    let classes = if has_double {
        mol.symmetry_classes()
    } else {
        Vec::new()
    };
    for (k, &(a, b, order, _)) in table.bonds.iter().enumerate() {
        if order != RawOrder::Double || table.stereo[k] == 3 {
            continue;
        }
        let (Some(ma), Some(mb)) = (index[a], index[b]) else {
            continue;
        };
        let Some(bond) = mol.bond_between(ma, mb) else {
            continue;
        };
        if mol.bonds[bond].order != BondOrder::Double {
            continue;
        }
        if mol
            .rings()
            .any(|r| r.len() < 8 && r.contains(&ma) && r.contains(&mb))
        {
            continue;
        }
        // One reference per end: a heavy neighbour other than the partner;
        // an end with two symmetry-equivalent ones (or none) has no E/Z.
        let pick = |end: usize, other: usize| -> Option<usize> {
            let heavy: Vec<usize> = nbs[end]
                .iter()
                .filter(|&&(o, _)| o != other && index[o].is_some())
                .map(|&(o, _)| o)
                .collect();
            let m_end = index[end]?;
            let total = heavy.len() + mol.atoms[m_end].hydrogens as usize;
            match heavy.as_slice() {
                [x] if total <= 2 => Some(*x),
                [x, y] if classes[index[*x]?] != classes[index[*y]?] => Some(*x),
                _ => None,
            }
        };
        let (Some(x), Some(y)) = (pick(a, b), pick(b, a)) else {
            continue;
        };
        let Some(cis) = cis_from_2d(xy(a), xy(b), xy(x), xy(y)) else {
            continue;
        };
        let (rx, ry) = (index[x].unwrap_or(0), index[y].unwrap_or(0));
        let refs = if mol.bonds[bond].atoms[0] == ma {
            [rx, ry]
        } else {
            [ry, rx]
        };
        double_bonds.push(DoubleBondStereo { bond, refs, cis });
    }
    double_bonds.sort_by_key(|d| d.bond);
    mol.stereo.centres = centres;
    mol.stereo.double_bonds = double_bonds;
}
