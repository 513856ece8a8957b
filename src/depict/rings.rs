//! Ring systems: rings that share atoms, placed together in a local frame.
//!
//! The first ring of a system is a regular polygon (the largest ring when the
//! system holds a ring of more than eight atoms, so a macrocycle is a large
//! ring with its fused rings outside; otherwise the ring fused to most
//! others). Every further ring is taken in the order of most atoms already
//! placed. Its unplaced atoms form runs between two placed atoms; each run
//! is laid on the circular arc through those two atoms on which every bond
//! has length 1: for a ring fused on one bond that is the regular polygon,
//! for a perifused or bridged ring a flatter arc. The arc goes to the side
//! where it lands farther from the atoms already placed. A ring sharing a
//! single atom (spiro) is a regular polygon pointing away from that atom's
//! placed neighbours. A trans double bond written in a first ring of 8 or
//! more atoms gets a notch: one end mirrored into the ring.

use super::geom::{centroid, Point};
use crate::mol::Molecule;
use std::f64::consts::{PI, TAU};

/// Atoms and rings of one ring system.
#[derive(Debug, Clone)]
pub(crate) struct RingSystem {
    /// Atoms, in index order.
    pub atoms: Vec<usize>,
    /// Ring numbers (into `Molecule::ring_atoms`).
    pub rings: Vec<usize>,
}

/// The ring systems of the molecule (rings joined when they share an atom)
/// and, per atom, its system number.
pub(crate) fn ring_systems(mol: &Molecule) -> (Vec<RingSystem>, Vec<Option<usize>>) {
    let nr = mol.ring_total();
    let mut parent: Vec<usize> = (0..nr).collect();
    fn find(p: &mut [usize], mut x: usize) -> usize {
        while p[x] != x {
            p[x] = p[p[x]];
            x = p[x];
        }
        x
    }
    let mut first_ring: Vec<Option<usize>> = vec![None; mol.atom_count()];
    for r in 0..nr {
        for &a in mol.ring_atoms(r) {
            match first_ring[a] {
                None => first_ring[a] = Some(r),
                Some(o) => {
                    let (x, y) = (find(&mut parent, o), find(&mut parent, r));
                    if x != y {
                        parent[x.max(y)] = x.min(y);
                    }
                }
            }
        }
    }
    let mut sys_of_root: Vec<Option<usize>> = vec![None; nr];
    let mut systems: Vec<RingSystem> = Vec::new();
    for r in 0..nr {
        let root = find(&mut parent, r);
        let s = *sys_of_root[root].get_or_insert_with(|| {
            systems.push(RingSystem {
                atoms: Vec::new(),
                rings: Vec::new(),
            });
            systems.len() - 1
        });
        systems[s].rings.push(r);
    }
    let mut of_atom = vec![None; mol.atom_count()];
    for (a, fr) in first_ring.iter().enumerate() {
        if let Some(r) = fr {
            let s = sys_of_root[find(&mut parent, *r)];
            of_atom[a] = s;
            if let Some(s) = s {
                systems[s].atoms.push(a);
            }
        }
    }
    (systems, of_atom)
}

/// Radius of the regular polygon with `n` sides of length 1.
fn polygon_radius(n: usize) -> f64 {
    1.0 / (2.0 * (PI / n.max(3) as f64).sin())
}

/// Local coordinates of every atom of the system (indexed by atom; `None`
/// for atoms outside it).
pub(crate) fn place_system(mol: &Molecule, sys: &RingSystem) -> Vec<Option<Point>> {
    let mut pos: Vec<Option<Point>> = vec![None; mol.atom_count()];
    let rings: Vec<&[usize]> = sys.rings.iter().map(|&r| mol.ring_atoms(r)).collect();
    if rings.is_empty() {
        return pos;
    }
    let start = start_ring(&rings);
    let first = rings[start];
    let n = first.len();
    let r = polygon_radius(n);
    // Vertices so that the first bond is vertical on the right-hand side.
    let base = -PI / n as f64;
    for (k, &a) in first.iter().enumerate() {
        pos[a] = Some(Point::polar(base + TAU * k as f64 / n as f64) * r);
    }
    if n >= 8 {
        dent_trans_bonds(mol, first, &rings, &mut pos);
    }
    let mut done = vec![false; rings.len()];
    done[start] = true;
    loop {
        // The unplaced ring with most atoms placed (lowest number on a tie).
        let mut best: Option<(usize, usize)> = None;
        for (i, ring) in rings.iter().enumerate() {
            if done[i] {
                continue;
            }
            let c = ring.iter().filter(|&&a| pos[a].is_some()).count();
            if c == ring.len() {
                done[i] = true;
                continue;
            }
            if c > 0 && best.is_none_or(|(_, bc)| c > bc) {
                best = Some((i, c));
            }
        }
        let Some((i, c)) = best else { break };
        done[i] = true;
        if c == 1 {
            place_spiro(mol, rings[i], &mut pos);
        } else {
            place_runs(rings[i], &mut pos);
        }
    }
    // Atoms of the system no ring reached (cannot happen for a connected
    // system; kept safe): put them at the origin side by side.
    for (k, &a) in sys.atoms.iter().enumerate() {
        if pos[a].is_none() {
            pos[a] = Some(Point::new(k as f64 * 0.7, 3.0));
        }
    }
    pos
}

/// A regular polygon draws every ring double bond with its two ring
/// neighbours on the same side. For a double bond of a large first ring
/// whose written configuration puts them on opposite sides, one end (an
/// atom in no other ring, fewest neighbours first) is mirrored across the
/// line through its two ring neighbours: bond lengths stay 1 and the ring
/// gets a notch that shows the trans bond.
fn dent_trans_bonds(mol: &Molecule, ring: &[usize], rings: &[&[usize]], pos: &mut [Option<Point>]) {
    let n = ring.len();
    for st in mol.double_bond_stereo() {
        let [u, v] = mol.bonds[st.bond].atoms;
        let (Some(iu), Some(iv)) = (
            ring.iter().position(|&a| a == u),
            ring.iter().position(|&a| a == v),
        ) else {
            continue;
        };
        // Ring neighbours: x of u, y of v (the ring order may run either way).
        let (x, y) = if (iu + 1) % n == iv {
            (ring[(iu + n - 1) % n], ring[(iv + 1) % n])
        } else if (iv + 1) % n == iu {
            (ring[(iu + 1) % n], ring[(iv + n - 1) % n])
        } else {
            continue;
        };
        let ring_cis = st.cis ^ (st.refs[0] != x) ^ (st.refs[1] != y);
        let (Some(pu), Some(pv), Some(px), Some(py)) = (pos[u], pos[v], pos[x], pos[y]) else {
            continue;
        };
        let shown = crate::mol::cis_from_2d([pu.x, pu.y], [pv.x, pv.y], [px.x, px.y], [py.x, py.y]);
        if shown != Some(!ring_cis) {
            continue;
        }
        let in_one_ring = |a: usize| rings.iter().filter(|r| r.contains(&a)).count() == 1;
        // (atom to move, its other ring neighbour).
        let mut choices = [(v, y, u), (u, x, v)];
        choices.sort_by_key(|c| mol.degree(c.0));
        if let Some(&(m, a, b)) = choices.iter().find(|c| in_one_ring(c.0)) {
            if let (Some(pa), Some(pb), Some(pm)) = (pos[a], pos[b], pos[m]) {
                pos[m] = Some(super::geom::reflect(pm, pa, pb));
            }
        }
    }
}

/// The ring to draw first.
fn start_ring(rings: &[&[usize]]) -> usize {
    if let Some((i, _)) = rings
        .iter()
        .enumerate()
        .filter(|(_, r)| r.len() > 8)
        .max_by_key(|(i, r)| (r.len(), usize::MAX - i))
    {
        return i;
    }
    let fused = |i: usize| {
        rings
            .iter()
            .enumerate()
            .filter(|(j, o)| *j != i && rings[i].iter().filter(|a| o.contains(a)).count() >= 2)
            .count()
    };
    (0..rings.len())
        .max_by_key(|&i| (fused(i), rings[i].len() == 6, usize::MAX - i))
        .unwrap_or(0)
}

/// A ring sharing one placed atom: a regular polygon pointing away from that
/// atom's placed neighbours.
fn place_spiro(mol: &Molecule, ring: &[usize], pos: &mut [Option<Point>]) {
    let Some(k0) = ring.iter().position(|&a| pos[a].is_some()) else {
        return;
    };
    let a = ring[k0];
    let pa = pos[a].unwrap_or_default();
    let nb = centroid(
        mol.neighbors(a)
            .iter()
            .filter_map(|n| pos.get(n.atom).copied().flatten()),
    );
    let mut dir = (pa - nb).unit();
    if dir.len() < 0.5 {
        dir = Point::new(1.0, 0.0);
    }
    let n = ring.len();
    let r = polygon_radius(n);
    let c = pa + dir * r;
    let a0 = (pa - c).angle();
    for k in 1..n {
        let atom = ring[(k0 + k) % n];
        if pos[atom].is_none() {
            pos[atom] = Some(c + Point::polar(a0 + TAU * k as f64 / n as f64) * r);
        }
    }
}

/// Place every run of unplaced atoms of `ring` on an arc between the placed
/// atoms that bound it.
fn place_runs(ring: &[usize], pos: &mut [Option<Point>]) {
    let n = ring.len();
    let Some(s) = (0..n).find(|&k| pos[ring[k]].is_some()) else {
        return;
    };
    // Walk the ring once from a placed atom, collecting runs.
    let mut k = 0;
    while k < n {
        let a = ring[(s + k) % n];
        let mut j = k + 1;
        while j < n + 1 && pos[ring[(s + j) % n]].is_none() {
            j += 1;
        }
        if j > k + 1 {
            let run: Vec<usize> = (k + 1..j).map(|t| ring[(s + t) % n]).collect();
            let b = ring[(s + j) % n];
            if let (Some(pa), Some(pb)) = (pos[a], pos[b]) {
                place_arc(pa, pb, &run, pos);
            }
        }
        k = j;
    }
}

/// Place `run` (m atoms) on the arc from `pa` to `pb` with m + 1 bonds of
/// length 1, on the side farther from the atoms already placed.
fn place_arc(pa: Point, pb: Point, run: &[usize], pos: &mut [Option<Point>]) {
    let placed: Vec<Point> = pos.iter().flatten().copied().collect();
    let mut best: Option<(f64, Vec<Point>)> = None;
    for side in [1.0, -1.0] {
        let pts = arc_points(pa, pb, run.len(), side);
        let score: f64 = pts
            .iter()
            .map(|p| {
                placed
                    .iter()
                    .map(|q| {
                        let d = p.dist(*q);
                        if d < 1.2 {
                            (1.2 - d) * 10.0
                        } else {
                            -0.001 * d.min(10.0)
                        }
                    })
                    .sum::<f64>()
            })
            .sum();
        if best.as_ref().is_none_or(|(s, _)| score < *s - 1e-9) {
            best = Some((score, pts));
        }
    }
    if let Some((_, pts)) = best {
        for (a, p) in run.iter().zip(pts) {
            pos[*a] = Some(p);
        }
    }
}

/// Points of the arc from `a` to `b` carrying `m` atoms (m + 1 unit bonds),
/// bulging towards `side` (±1) of the directed line a → b.
pub(crate) fn arc_points(a: Point, b: Point, m: usize, side: f64) -> Vec<Point> {
    let k = (m + 1) as f64;
    let d = a.dist(b);
    let u = if d > 1e-9 {
        (b - a) * (1.0 / d)
    } else {
        Point::new(1.0, 0.0)
    };
    let nrm = u.perp() * side;
    if d >= k - 1e-9 {
        // Cannot span with unit bonds: a straight, stretched run.
        return (1..=m).map(|i| a + (b - a) * (i as f64 / k)).collect();
    }
    if d < 1e-6 {
        // Coincident ends: a regular polygon through the point.
        let n = m + 1;
        let r = polygon_radius(n.max(3));
        let c = a + nrm * r;
        let a0 = (a - c).angle();
        return (1..=m)
            .map(|i| c + Point::polar(a0 + TAU * i as f64 / n as f64) * r)
            .collect();
    }
    // Total arc angle phi with sin(phi/2) / sin(phi/(2k)) = d (decreasing in phi).
    let f = |phi: f64| (phi / 2.0).sin() / (phi / (2.0 * k)).sin();
    let (mut lo, mut hi) = (1e-9, TAU - 1e-9);
    for _ in 0..60 {
        let mid = 0.5 * (lo + hi);
        if f(mid) > d {
            lo = mid;
        } else {
            hi = mid;
        }
    }
    let phi = 0.5 * (lo + hi);
    let r = 1.0 / (2.0 * (phi / (2.0 * k)).sin());
    let mid = (a + b) * 0.5;
    let c = mid - nrm * (r * (phi / 2.0).cos());
    let a0 = (a - c).angle();
    // Sweep direction that passes the bulge side.
    let apex = c + nrm * r;
    let t = if (c + Point::polar(a0 + phi / 2.0) * r).dist(apex)
        <= (c + Point::polar(a0 - phi / 2.0) * r).dist(apex)
    {
        1.0
    } else {
        -1.0
    };
    (1..=m)
        .map(|i| c + Point::polar(a0 + t * phi * i as f64 / k) * r)
        .collect()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn arc_points_given_fused_hexagon_gives_unit_bonds() {
        // Four atoms between two atoms one bond apart: a regular hexagon.
        let a = Point::new(0.0, 0.0);
        let b = Point::new(0.0, 1.0);
        let pts = arc_points(a, b, 4, 1.0);
        let mut all = vec![a];
        all.extend(pts);
        all.push(b);
        for w in all.windows(2) {
            assert!((w[0].dist(w[1]) - 1.0).abs() < 1e-6);
        }
        // Regular hexagon: atoms two apart are sqrt(3) apart, opposite ones
        // 2 apart (geometry), and the ring lies on the +normal side.
        for k in 0..6 {
            assert!((all[k].dist(all[(k + 2) % 6]) - 3f64.sqrt()).abs() < 1e-6);
            assert!((all[k].dist(all[(k + 3) % 6]) - 2.0).abs() < 1e-6);
        }
    }
}
