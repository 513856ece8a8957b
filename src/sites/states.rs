//! Charged states: the estimate of a site once the more acidic X–H
//! protons of the molecule are counted as removed (issue 11).
//!
//! The sites of a molecule are ranked, and the advice counts every more
//! acidic proton as gone before its target. A site's estimate should
//! therefore describe the species that actually gives up that proton: once
//! an ammonium or a carboxylic acid (any N–H, O–H or S–H site) lies at
//! least [`MARGIN`] units below a site on the ranking scale, that site sees
//! an amine or a carboxylate, not the charged or neutral acid. Its class
//! rule is matched again on a copy of the molecule in which every atom of
//! those heteroatom sites has lost one hydrogen (N⁺–H becomes N, O–H
//! becomes O⁻), so the increments and Hammett terms follow the deprotonated
//! group: the α-C–H of glycine methyl ester hydrochloride is an ester next
//! to an amino group (about 29.5 in DMSO), not one next to an ammonio group
//! (about 21.5), and the phenol of 4-aminophenol hydrochloride feels an
//! NH2, not an NH3⁺. A chemist expects this: with one equivalent of base
//! the ammonium is gone before any C–H is touched, and the remaining
//! protons are those of the free amine.
//!
//! Only O–H, S–H and Se–H sites and cationic N–H and P–H sites (ammonium,
//! anilinium, azinium, phosphonium) count as removed. C–H sites do not (a
//! carbanion is a reactive intermediate, not a resting state), nor do
//! neutral N–H sites (amides, lactams, sulfonamides, azoles): the rows for the α-C–H of those groups
//! already describe the step after the N–H (their notes say so), and the
//! anion of an amide would no longer match them. Sites within [`MARGIN`] of
//! each other ionise together and keep their estimates in the neutral
//! molecule. A site with no rule matching in the copy keeps its first
//! estimate.

use super::estimate::{classify_atom, elem_mask, rank_key, Raw};
use super::hammett::SigmaTable;
use super::rules::RuleSet;
use super::Options;
use crate::mol::Molecule;
use crate::smarts::Target;

/// Gap on the ranking scale (pKa units) from which a more acidic X–H site
/// counts as removed before a site is estimated: at 3 units the first
/// proton is 99.9 % gone at the half-equivalence point of the second.
pub(super) const MARGIN: f64 = 3.0;

/// Re-estimate the sites of `raws` that lie at least [`MARGIN`] above an
/// X–H site on the ranking scale, on a copy of `mol` with those X–H sites
/// deprotonated (see the module notes).
pub(super) fn after_removal(
    mol: &Molecule,
    atoms: &[usize],
    set: &RuleSet,
    sigma: &SigmaTable,
    opts: &Options,
    raws: &mut [Raw],
) {
    let mut acids: Vec<(f64, usize)> = raws
        .iter()
        .filter(|r| {
            let a = &mol.atoms[r.atom];
            // chalcogen X–H (O, S, Se) and cationic X–H (ammonium,
            // azinium, phosphonium): never a C–H or a neutral N–H / P–H
            !r.site.background
                && a.element != 6
                && (matches!(a.element, 8 | 16 | 34) || a.charge > 0)
        })
        .map(|r| (rank_key(&r.site, opts.scale), r.atom))
        .filter(|(k, _)| k.is_finite())
        .collect();
    if acids.is_empty() {
        return;
    }
    acids.sort_by(|a, b| a.0.total_cmp(&b.0));
    let mask = elem_mask(mol, atoms);
    // Number of acids removed before each site; one copy of the molecule
    // per distinct number (the removal sets are nested).
    // Background C–H sites are not re-estimated: their rows take no
    // increments or Hammett terms, so the copy would give the same value
    // (and skipping them spares the copy for most molecules).
    let removed: Vec<usize> = raws
        .iter()
        .map(|r| {
            if r.site.background {
                return 0;
            }
            let key = rank_key(&r.site, opts.scale);
            acids.iter().take_while(|(k, _)| *k + MARGIN <= key).count()
        })
        .collect();
    let mut counts: Vec<usize> = removed.iter().copied().filter(|&n| n > 0).collect();
    counts.sort_unstable();
    counts.dedup();
    for n in counts {
        let mut m = mol.clone();
        for &(_, a) in &acids[..n] {
            if let Some(at) = m.atoms.get_mut(a) {
                if at.hydrogens > 0 {
                    at.hydrogens -= 1;
                    at.charge -= 1;
                }
            }
        }
        let t = Target::new(&m);
        let mut screened = vec![0u8; set.rules.len()];
        for (raw, _) in raws.iter_mut().zip(&removed).filter(|(_, &k)| k == n) {
            if let Some(new) = classify_atom(&m, &t, set, sigma, mask, &mut screened, raw.atom) {
                *raw = new;
            }
        }
    }
}
