//! Enolate sides: kinetic and thermodynamic sites of ketones and enones.

use super::estimate::{double_to_any, rank_key};
use super::{Regio, RuleSet, Scale, Site};
use crate::mol::{BondOrder, Molecule};

/// Ketone regiochemistry: for a ketone carbonyl with two enolisable
/// α-carbons in different sites, the side with more hydrogens (less
/// substituted) is kinetic and the other thermodynamic; with equal
/// hydrogen counts the more acidic side is thermodynamic.
pub(super) fn mark_regio(mol: &Molecule, set: &RuleSet, sites: &mut [Site]) {
    let is_ketone = |s: &Site| ketone_family(set, s);
    let site_of = |sites: &[Site], a: usize| sites.iter().position(|s| s.atoms.contains(&a));
    for c in 0..mol.atom_count() {
        let at = &mol.atoms[c];
        if at.element != 6 || at.aromatic || !double_to_any(mol, c, 8) {
            continue;
        }
        let alphas: Vec<usize> = mol
            .neighbors(c)
            .iter()
            .filter(|nb| matches!(mol.bonds[nb.bond].order, BondOrder::Single))
            .map(|nb| nb.atom)
            .collect();
        if alphas.len() != 2 || alphas.iter().any(|&a| mol.atoms[a].element != 6) {
            continue;
        }
        if mark_enone(mol, set, sites, &alphas) {
            continue;
        }
        let (Some(x), Some(y)) = (site_of(sites, alphas[0]), site_of(sites, alphas[1])) else {
            continue;
        };
        if x == y || !is_ketone(&sites[x]) || !is_ketone(&sites[y]) {
            continue;
        }
        let (hx, hy) = (sites[x].hydrogens, sites[y].hydrogens);
        let (kin, thermo) = if hx != hy {
            if hx > hy {
                (x, y)
            } else {
                (y, x)
            }
        } else {
            let (kx, ky) = (
                rank_key(&sites[x], Scale::Dmso),
                rank_key(&sites[y], Scale::Dmso),
            );
            if (kx - ky).abs() < 0.05 {
                continue;
            }
            if kx < ky {
                (y, x)
            } else {
                (x, y)
            }
        };
        sites[kin].regio = Some(Regio::Kinetic);
        sites[thermo].regio = Some(Regio::Thermodynamic);
    }
}

/// Enone regiochemistry: a ketone C=O with one sp3 α′-carbon (a ketone
/// site) and one α-carbon in a C=C. The α′ side gives the cross-conjugated
/// enolate, formed fastest by a hindered amide at low temperature (kinetic);
/// the γ-carbons (sites on the β-carbon's other neighbours) give the
/// extended dienolate favoured at equilibrium (thermodynamic). Returns true
/// when `alphas` is such a pair (whether or not a side was marked).
fn mark_enone(mol: &Molecule, set: &RuleSet, sites: &mut [Site], alphas: &[usize]) -> bool {
    let vinyl_beta = |a: usize| {
        mol.neighbors(a).iter().find_map(|nb| {
            (mol.atoms[nb.atom].element == 6
                && !mol.atoms[nb.atom].aromatic
                && matches!(mol.bonds[nb.bond].order, BondOrder::Double))
            .then_some(nb.atom)
        })
    };
    let (alpha_prime, alpha, beta) = match (vinyl_beta(alphas[0]), vinyl_beta(alphas[1])) {
        (None, Some(b)) => (alphas[0], alphas[1], b),
        (Some(b), None) => (alphas[1], alphas[0], b),
        _ => return false,
    };
    let site_of = |sites: &[Site], a: usize| sites.iter().position(|s| s.atoms.contains(&a));
    let Some(k) = site_of(sites, alpha_prime) else {
        return true;
    };
    if !ketone_family(set, &sites[k]) {
        return true;
    }
    let gammas: Vec<usize> = mol
        .neighbors(beta)
        .iter()
        .filter(|nb| nb.atom != alpha)
        .filter_map(|nb| site_of(sites, nb.atom))
        .filter(|&g| g != k && sites[g].is_carbon() && !sites[g].background)
        .collect();
    if gammas.is_empty() {
        return true;
    }
    sites[k].regio = Some(Regio::Kinetic);
    for g in gammas {
        sites[g].regio = Some(Regio::Thermodynamic);
    }
    true
}

/// A site whose class rule (its first rule use) is of the `carbonyl`
/// family of fragments/rules.tsv: with the structural test above (an
/// α-carbon of a C=O flanked by two carbons) that is a ketone α-C–H, the
/// sites that have kinetic and thermodynamic sides. Decided by the rule's
/// family (a validated selector), not by the wording of its class.
fn ketone_family(set: &RuleSet, s: &Site) -> bool {
    s.rules
        .first()
        .and_then(|u| set.rules.iter().find(|r| r.id == u.id))
        .is_some_and(|r| r.family == "carbonyl")
}
