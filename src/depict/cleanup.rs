//! The clean-up pass: removes atom clashes and bond crossings left by the
//! placement.
//!
//! The drawing is scored by its crowded atom pairs (two atoms not bonded to
//! each other closer than [`CROWDED`] bond lengths, weighted by how close)
//! and its bond crossings. For each problem, the bonds outside rings on the
//! shortest path between the two atoms involved are tried as hinges: the
//! smaller side is mirrored across the bond (flipping a substituent) or
//! turned about the hinge atom by 30° to 150° either way. The best move
//! that lowers the score is kept, and the pass repeats until nothing
//! improves. Where no move helps and two atoms still nearly coincide, the
//! last resort stretches a hinge bond (the side moves out along the bond).
//! Molecules over a few hundred atoms get fewer rounds, so the pass stays
//! roughly linear in practice.

use super::geom::{reflect, segments_cross, Point};
use crate::mol::Molecule;
use std::collections::VecDeque;

/// Atom pairs closer than this (bond lengths) count as crowded.
pub(crate) const CROWDED: f64 = 0.85;

/// Score of a drawing: crowded pairs and crossings (lower is better).
fn score(mol: &Molecule, atoms: &[usize], pos: &[Point]) -> f64 {
    let mut s = 0.0;
    for (k, &i) in atoms.iter().enumerate() {
        for &j in &atoms[k + 1..] {
            let d = pos[i].dist(pos[j]);
            if d < CROWDED && mol.bond_between(i, j).is_none() {
                s += 1.0 + (CROWDED - d) * 4.0;
            }
        }
    }
    s + crossings(mol, atoms, pos).len() as f64
}

/// Bond pairs (by bond index) that cross, among bonds of `atoms`.
fn crossings(mol: &Molecule, atoms: &[usize], pos: &[Point]) -> Vec<(usize, usize)> {
    let mut inside = vec![false; mol.atom_count()];
    for &a in atoms {
        inside[a] = true;
    }
    let bonds: Vec<usize> = (0..mol.bond_count())
        .filter(|&b| inside[mol.bonds[b].atoms[0]])
        .collect();
    let mut out = Vec::new();
    for (k, &x) in bonds.iter().enumerate() {
        let [a, b] = mol.bonds[x].atoms;
        for &y in &bonds[k + 1..] {
            let [c, d] = mol.bonds[y].atoms;
            if a == c || a == d || b == c || b == d {
                continue;
            }
            if segments_cross(pos[a], pos[b], pos[c], pos[d]) {
                out.push((x, y));
            }
        }
    }
    out
}

/// The problems to work on: pairs of atoms (crowded pairs, then an end of
/// each of two crossing bonds).
fn problems(mol: &Molecule, atoms: &[usize], pos: &[Point]) -> Vec<(usize, usize)> {
    let mut out = Vec::new();
    for (k, &i) in atoms.iter().enumerate() {
        for &j in &atoms[k + 1..] {
            if pos[i].dist(pos[j]) < CROWDED && mol.bond_between(i, j).is_none() {
                out.push((i, j));
            }
        }
    }
    for (x, y) in crossings(mol, atoms, pos) {
        out.push((mol.bonds[x].atoms[0], mol.bonds[y].atoms[0]));
    }
    out
}

/// Shortest path from `a` to `b` as bond indices.
fn path_bonds(mol: &Molecule, a: usize, b: usize) -> Vec<usize> {
    let n = mol.atom_count();
    let mut prev: Vec<Option<(usize, usize)>> = vec![None; n];
    let mut seen = vec![false; n];
    seen[a] = true;
    let mut q = VecDeque::from([a]);
    while let Some(u) = q.pop_front() {
        if u == b {
            break;
        }
        for nb in mol.neighbors(u) {
            if !seen[nb.atom] {
                seen[nb.atom] = true;
                prev[nb.atom] = Some((u, nb.bond));
                q.push_back(nb.atom);
            }
        }
    }
    let mut out = Vec::new();
    let mut at = b;
    while let Some((p, bond)) = prev[at] {
        out.push(bond);
        at = p;
    }
    out
}

/// Atoms on `far`'s side of bond `bond` (none when the bond is in a ring).
fn side(mol: &Molecule, bond: usize, far: usize) -> Vec<usize> {
    let near = mol.bonds[bond].other(far);
    let mut seen = vec![far];
    let mut stack = vec![far];
    while let Some(u) = stack.pop() {
        for nb in mol.neighbors(u) {
            if nb.bond == bond && u == far {
                continue;
            }
            if nb.atom == near {
                return Vec::new();
            }
            if !seen.contains(&nb.atom) {
                seen.push(nb.atom);
                stack.push(nb.atom);
            }
        }
    }
    seen
}

/// Run the clean-up on one component (`atoms`), moving atoms in `pos`.
pub(crate) fn clean(mol: &Molecule, atoms: &[usize], pos: &mut [Point]) {
    let n = atoms.len();
    let rounds = if n <= 120 {
        40
    } else if n <= 400 {
        8
    } else {
        0
    };
    // Stereo double bonds drawn rightly stay so: moves that undo one are
    // refused.
    let keep = super::stereo::shown_double_bonds(mol, atoms, pos);
    let mut current = score(mol, atoms, pos);
    for _ in 0..rounds {
        if current <= 0.0 {
            return;
        }
        let probs = problems(mol, atoms, pos);
        let mut best: Option<(f64, Vec<(usize, Point)>)> = None;
        let mut tried_bonds: Vec<usize> = Vec::new();
        for &(x, y) in probs.iter().take(6) {
            for bond in path_bonds(mol, x, y) {
                if mol.bond_in_ring(bond) || tried_bonds.contains(&bond) {
                    continue;
                }
                tried_bonds.push(bond);
                let [p, q] = mol.bonds[bond].atoms;
                let (s1, s2) = (side(mol, bond, q), side(mol, bond, p));
                // Move the smaller side; its hinge is the other end.
                let (moving, hinge, far) = if s1.len() <= s2.len() {
                    (s1, p, q)
                } else {
                    (s2, q, p)
                };
                if moving.is_empty() {
                    continue;
                }
                for mv in 0..11 {
                    let trial: Vec<(usize, Point)> = moving
                        .iter()
                        .map(|&a| {
                            let pt = pos[a];
                            let np = match mv {
                                0 => reflect(pt, pos[hinge], pos[far]),
                                k => {
                                    let step = ((k + 1) / 2) as f64 * std::f64::consts::PI / 6.0;
                                    let ang = if k % 2 == 1 { step } else { -step };
                                    (pt - pos[hinge]).rotate(ang) + pos[hinge]
                                }
                            };
                            (a, np)
                        })
                        .collect();
                    let s = trial_score(mol, atoms, pos, &trial, &keep);
                    if s < current - 1e-9 && best.as_ref().is_none_or(|(b, _)| s < *b - 1e-9) {
                        best = Some((s, trial));
                    }
                }
            }
        }
        match best {
            Some((s, moves)) => {
                for (a, p) in moves {
                    pos[a] = p;
                }
                current = s;
            }
            None => {
                stretch(mol, atoms, pos);
                return;
            }
        }
    }
}

fn trial_score(
    mol: &Molecule,
    atoms: &[usize],
    pos: &mut [Point],
    trial: &[(usize, Point)],
    keep: &[usize],
) -> f64 {
    let saved: Vec<(usize, Point)> = trial.iter().map(|(a, _)| (*a, pos[*a])).collect();
    for (a, p) in trial {
        pos[*a] = *p;
    }
    let undone = keep
        .iter()
        .any(|&k| super::stereo::double_bond_shown(mol, pos, k) != Some(true));
    let s = if undone {
        f64::INFINITY
    } else {
        score(mol, atoms, pos)
    };
    for (a, p) in saved {
        pos[a] = p;
    }
    s
}

/// Last resort: for atoms that still nearly coincide (closer than 0.3), move
/// the smaller side of the first acyclic bond on the path between them out
/// along that bond by half a bond length.
fn stretch(mol: &Molecule, atoms: &[usize], pos: &mut [Point]) {
    for _ in 0..4 {
        let Some((x, y)) = atoms.iter().enumerate().find_map(|(k, &i)| {
            atoms[k + 1..]
                .iter()
                .find(|&&j| pos[i].dist(pos[j]) < 0.3 && mol.bond_between(i, j).is_none())
                .map(|&j| (i, j))
        }) else {
            return;
        };
        let Some(bond) = path_bonds(mol, x, y)
            .into_iter()
            .find(|&b| !mol.bond_in_ring(b))
        else {
            return;
        };
        let [p, q] = mol.bonds[bond].atoms;
        let (s1, s2) = (side(mol, bond, q), side(mol, bond, p));
        let (moving, hinge, far) = if s1.len() <= s2.len() {
            (s1, p, q)
        } else {
            (s2, q, p)
        };
        let d = (pos[far] - pos[hinge]).unit() * 0.5;
        for a in moving {
            pos[a] = pos[a] + d;
        }
    }
}
