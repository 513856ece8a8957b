//! Symmetry classes by iterative refinement of atom invariants (colour
//! refinement, as in the Morgan algorithm).
//!
//! Each atom starts from a hash of its invariant (element, isotope, charge,
//! hydrogens, D/T count, degree, aromaticity, smallest ring). Each round an
//! atom's label becomes a hash of its own label and the multiset of
//! (neighbour label, bond order) pairs; rounds stop when the number of
//! distinct labels stops growing. Hashes are 64-bit mixes of our own (not
//! the randomly seeded std hasher), so labels do not depend on atom order or
//! on the run. Each round is linear (no sorting); a chain of n atoms needs
//! about n/2 rounds: the worst case, a 10,000-atom chain, takes about a
//! second; molecules of a few hundred atoms take microseconds.

use super::{BondOrder, Molecule};

/// splitmix64 finaliser.
fn mix(mut x: u64) -> u64 {
    x = x.wrapping_add(0x9E37_79B9_7F4A_7C15);
    x = (x ^ (x >> 30)).wrapping_mul(0xBF58_476D_1CE4_E5B9);
    x = (x ^ (x >> 27)).wrapping_mul(0x94D0_49BB_1331_11EB);
    x ^ (x >> 31)
}

/// Counts distinct labels with a reusable open-addressing table (labels
/// are already well mixed, so their low bits index it directly).
struct Distinct {
    slots: Vec<u64>,
    stamp: Vec<u32>,
    round: u32,
}

impl Distinct {
    fn new(n: usize) -> Self {
        let cap = (2 * n).next_power_of_two().max(16);
        Distinct {
            slots: vec![0; cap],
            stamp: vec![0; cap],
            round: 0,
        }
    }

    fn count(&mut self, labels: &[u64]) -> usize {
        self.round += 1;
        let mask = self.slots.len() - 1;
        let mut count = 0;
        for &v in labels {
            let mut k = (v as usize) & mask;
            loop {
                if self.stamp[k] != self.round {
                    self.stamp[k] = self.round;
                    self.slots[k] = v;
                    count += 1;
                    break;
                }
                if self.slots[k] == v {
                    break;
                }
                k = (k + 1) & mask;
            }
        }
        count
    }
}

pub(crate) fn classes(m: &Molecule) -> Vec<u32> {
    let n = m.atoms.len();
    if n == 0 {
        return Vec::new();
    }
    let mut label: Vec<u64> = (0..n)
        .map(|i| {
            let a = &m.atoms[i];
            let mut h = mix(a.element as u64);
            h = mix(h ^ a.isotope.unwrap_or(0) as u64);
            h = mix(h ^ (a.charge as i64 as u64));
            h = mix(h ^ a.hydrogens as u64);
            h = mix(h ^ a.heavy_hydrogens as u64);
            h = mix(h ^ m.degree(i) as u64);
            h = mix(h ^ a.aromatic as u64);
            mix(h ^ m.smallest_ring(i) as u64)
        })
        .collect();
    let mut seen = Distinct::new(n);
    let mut count = seen.count(&label);
    let mut next = vec![0u64; n];
    // Bond-order term of each bond, computed once.
    let order_term: Vec<u64> = m
        .bonds
        .iter()
        .map(|b| {
            let order = if b.order == BondOrder::Aromatic {
                5
            } else {
                b.kekule as u64
            };
            order.wrapping_mul(0xD6E8_FEB8_6659_FD93)
        })
        .collect();
    // Each round can only split classes, so at most n rounds.
    for _ in 0..n {
        if count == n {
            break;
        }
        for (i, out) in next.iter_mut().enumerate() {
            // Commutative sum over neighbours: order of neighbours is irrelevant.
            let mut around = 0u64;
            for x in m.neighbors(i) {
                let (Some(&l), Some(&o)) = (label.get(x.atom), order_term.get(x.bond)) else {
                    continue;
                };
                around = around.wrapping_add(mix(l ^ o));
            }
            *out = mix(label[i].wrapping_mul(31) ^ mix(around));
        }
        let c = seen.count(&next);
        std::mem::swap(&mut label, &mut next);
        if c == count {
            break;
        }
        count = c;
    }
    // Dense class numbers in order of label value (independent of atom order).
    let mut values: Vec<u64> = label.clone();
    values.sort_unstable();
    values.dedup();
    label
        .iter()
        .map(|v| values.binary_search(v).map_or(0, |k| k as u32))
        .collect()
}
