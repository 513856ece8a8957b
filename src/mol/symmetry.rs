//! Symmetry classes by iterative refinement of atom invariants.

use super::Molecule;

/// Dense ranks of `keys` (equal keys share a rank, ranks ordered by key).
fn rank<K: Ord + Clone>(keys: &[K]) -> Vec<u32> {
    let mut order: Vec<usize> = (0..keys.len()).collect();
    order.sort_by(|&a, &b| keys[a].cmp(&keys[b]));
    let mut ranks = vec![0u32; keys.len()];
    let mut r = 0u32;
    for k in 0..order.len() {
        if k > 0 && keys[order[k]] != keys[order[k - 1]] {
            r += 1;
        }
        ranks[order[k]] = r;
    }
    ranks
}

/// Starting invariant: element, isotope, charge, hydrogens, D/T count,
/// degree, aromaticity, smallest ring.
type Invariant = (u8, u16, i8, u8, u8, usize, bool, usize);

pub(crate) fn classes(m: &Molecule) -> Vec<u32> {
    let n = m.atoms.len();
    if n == 0 {
        return Vec::new();
    }
    let initial: Vec<Invariant> = (0..n)
        .map(|i| {
            let a = &m.atoms[i];
            (
                a.element,
                a.isotope.unwrap_or(0),
                a.charge,
                a.hydrogens,
                a.heavy_hydrogens,
                m.degree(i),
                a.aromatic,
                m.smallest_ring(i),
            )
        })
        .collect();
    let mut class = rank(&initial);
    let mut count = class.iter().max().map_or(0, |c| *c + 1);
    // Each round can only split classes, so at most n rounds.
    for _ in 0..n {
        let keys: Vec<(u32, Vec<(u32, u8)>)> = (0..n)
            .map(|i| {
                let mut around: Vec<(u32, u8)> = m
                    .neighbors(i)
                    .iter()
                    .map(|x| {
                        let b = &m.bonds[x.bond];
                        let order = if b.order == super::BondOrder::Aromatic {
                            5
                        } else {
                            b.kekule
                        };
                        (class[x.atom], order)
                    })
                    .collect();
                around.sort_unstable();
                (class[i], around)
            })
            .collect();
        let next = rank(&keys);
        let next_count = next.iter().max().map_or(0, |c| *c + 1);
        class = next;
        if next_count == count {
            break;
        }
        count = next_count;
    }
    class
}
