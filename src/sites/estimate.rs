//! The estimation engine: class rule, substituent increments, ring effects,
//! Hammett term; grouping of symmetry-equivalent atoms; ranking and
//! regiochemistry.

use super::hammett::{ring_positions, SigmaTable};
use super::rules::{Hammett, Rule, RuleSet, SigmaKind};
use super::{Options, RuleUse, Scale, Site, SiteReport};
use crate::mol::{BondOrder, Molecule};
use crate::smarts::Target;

/// One acidic atom before grouping.
#[derive(Debug, Clone)]
pub(super) struct Raw {
    pub(super) atom: usize,
    pub(super) rule: usize,
    pub(super) site: Site,
}

pub(super) fn elem_mask(mol: &Molecule, atoms: &[usize]) -> u128 {
    let mut m = 0u128;
    for &i in atoms {
        if let Some(a) = mol.atoms.get(i) {
            if a.element < 128 {
                m |= 1u128 << a.element;
            }
        }
    }
    m
}

fn has_multiple_bond(mol: &Molecule, i: usize) -> bool {
    mol.neighbors(i)
        .iter()
        .any(|nb| !matches!(mol.bonds[nb.bond].order, BondOrder::Single))
}

/// Cheap test: can a C–H on atom `i` be activated at all? Non-activated
/// sp3 C–H (all neighbours saturated and uncharged) is not a site.
fn carbon_candidate(mol: &Molecule, i: usize) -> bool {
    let a = &mol.atoms[i];
    if a.aromatic {
        // Azole C2–H: an aromatic C–H in a five-membered ring flanked by two
        // ring heteroatoms (imidazole, oxazole, thiazole and their cations).
        let het = mol
            .neighbors(i)
            .iter()
            .filter(|nb| {
                let b = &mol.atoms[nb.atom];
                b.aromatic && matches!(b.element, 7 | 8 | 16)
            })
            .count();
        return het >= 2;
    }
    if a.charge < 0 {
        return false;
    }
    let own_multiple = has_multiple_bond(mol, i);
    if own_multiple {
        // sp C–H of a terminal alkyne; vinyl and aldehyde C–H are not sites.
        return mol
            .neighbors(i)
            .iter()
            .any(|nb| matches!(mol.bonds[nb.bond].order, BondOrder::Triple))
            && a.element == 6;
    }
    // A divalent sulfur activates its C–H (thioether, thioacetal, the C2–H
    // of a 1,3-dithiane): the rules of the thio family decide how much.
    if mol
        .neighbors(i)
        .iter()
        .any(|nb| mol.atoms[nb.atom].element == 16)
    {
        return true;
    }
    // A haloform C–H (CHF3, CHCl3, CHBr3) is activated by its three
    // halogens (fluoroform since issue 11, second review).
    let halogens = mol
        .neighbors(i)
        .iter()
        .filter(|nb| matches!(mol.atoms[nb.atom].element, 9 | 17 | 35))
        .count();
    if halogens >= 3 {
        return true;
    }
    mol.neighbors(i).iter().any(|nb| {
        let b = &mol.atoms[nb.atom];
        b.charge > 0 || b.aromatic || has_multiple_bond(mol, nb.atom)
    })
}

/// Kind of a substituent atom `s` on the acidic atom `site`.
fn substituent_kind(mol: &Molecule, site: usize, s: usize) -> Option<&'static str> {
    let a = &mol.atoms[s];
    let others = || mol.neighbors(s).iter().filter(move |nb| nb.atom != site);
    let double_to = |el: u8| {
        others().any(|nb| {
            mol.atoms[nb.atom].element == el
                && matches!(mol.bonds[nb.bond].order, BondOrder::Double)
        })
    };
    if a.charge > 0 && !a.aromatic {
        let ammonio = a.element == 7
            && mol.neighbors(s).iter().all(|nb| {
                !mol.atoms[nb.atom].aromatic
                    && matches!(mol.bonds[nb.bond].order, BondOrder::Single)
                    && mol.atoms[nb.atom].element != 8
            });
        if ammonio {
            return Some("onium_n");
        }
        if matches!(a.element, 15 | 16) {
            return Some("onium_p");
        }
    }
    match a.element {
        6 => {
            if a.aromatic {
                let all_c = ring_positions(mol, s).is_some_and(|r| r.all_carbon);
                return Some(if all_c { "aryl" } else { "heteroaryl" });
            }
            if others().any(|nb| matches!(mol.bonds[nb.bond].order, BondOrder::Triple)) {
                return Some(if others().any(|nb| mol.atoms[nb.atom].element == 7) {
                    "cyano"
                } else {
                    "alkynyl"
                });
            }
            if double_to(8) {
                let single_o = others().any(|nb| {
                    mol.atoms[nb.atom].element == 8
                        && matches!(mol.bonds[nb.bond].order, BondOrder::Single)
                });
                return Some(if single_o { "ester" } else { "acyl" });
            }
            if double_to(6) {
                return Some("vinyl");
            }
            if has_multiple_bond(mol, s) {
                return None;
            }
            // A CH2/CH/C carrying a heteroatom or an acceptor: the β
            // inductive effect differs from plain alkyl.
            let ewg = others().any(|nb| {
                let b = &mol.atoms[nb.atom];
                b.charge != 0
                    || matches!(b.element, 7 | 8 | 9 | 16 | 17 | 35 | 53)
                    || (b.element == 6 && !b.aromatic && has_multiple_bond(mol, nb.atom))
            });
            Some(if ewg { "alkyl_ewg" } else { "alkyl" })
        }
        7 => {
            let o = others()
                .filter(|nb| mol.atoms[nb.atom].element == 8)
                .count();
            if o >= 2 {
                Some("nitro")
            } else if !has_multiple_bond(mol, s) && a.charge == 0 {
                Some("amino")
            } else {
                None
            }
        }
        8 => {
            let other = others().next().map(|nb| nb.atom);
            match other {
                Some(o) if mol.atoms[o].aromatic => Some("aryloxy"),
                Some(o) if double_to_any(mol, o, 8) && mol.atoms[o].element == 6 => Some("acyloxy"),
                _ if a.charge == 0 => Some("alkoxy"),
                _ => None,
            }
        }
        16 => {
            let o = others()
                .filter(|nb| mol.atoms[nb.atom].element == 8)
                .count();
            if o >= 2 {
                Some("sulfonyl")
            } else if o == 0 && a.charge == 0 && !a.aromatic {
                Some("thio")
            } else {
                None
            }
        }
        9 => Some("fluoro"),
        17 => Some("chloro"),
        35 => Some("bromo"),
        53 => Some("iodo"),
        _ => None,
    }
}

pub(super) fn double_to_any(mol: &Molecule, i: usize, el: u8) -> bool {
    mol.neighbors(i).iter().any(|nb| {
        mol.atoms[nb.atom].element == el && matches!(mol.bonds[nb.bond].order, BondOrder::Double)
    })
}

/// Smallest ring (3 or 4) through `i` that is not wholly inside `matched`.
fn small_ring(mol: &Molecule, i: usize, matched: &[usize]) -> Option<&'static str> {
    let nbs = mol.neighbors(i);
    for (x, a) in nbs.iter().enumerate() {
        for b in &nbs[x + 1..] {
            if bonded(mol, a.atom, b.atom)
                && !(matched.contains(&a.atom) && matched.contains(&b.atom))
            {
                return Some("ring3");
            }
        }
    }
    for (x, a) in nbs.iter().enumerate() {
        for b in &nbs[x + 1..] {
            for c in mol.neighbors(a.atom) {
                if c.atom != i
                    && bonded(mol, c.atom, b.atom)
                    && !(matched.contains(&a.atom)
                        && matched.contains(&b.atom)
                        && matched.contains(&c.atom))
                {
                    return Some("ring4");
                }
            }
        }
    }
    None
}

fn add(total: &mut Option<f64>, part: Option<f64>) {
    *total = match (*total, part) {
        (Some(t), Some(p)) => Some(t + p),
        _ => None,
    };
}

/// Hammett terms for the ring whose ipso atom is `ipso` (reached from the
/// acidic side through `from`).
fn hammett_terms(
    mol: &Molecule,
    ipso: usize,
    h: &Hammett,
    owner: &str,
    sigma: &SigmaTable,
    uses: &mut Vec<RuleUse>,
    var: &mut f64,
) {
    let Some(ring) = ring_positions(mol, ipso) else {
        return;
    };
    // Ortho substituents take their para σ (electronic part only; steric
    // and hydrogen-bond effects are not modelled and widen the
    // uncertainty).
    for &o in [ring.atoms[1], ring.atoms[5]].iter() {
        let subs = mol
            .neighbors(o)
            .iter()
            .filter(|nb| !ring.atoms.contains(&nb.atom) && mol.atoms[nb.atom].element > 1)
            .count();
        *var += 0.5 * 0.5 * subs as f64;
    }
    let positions = ring
        .meta
        .iter()
        .map(|&a| ('m', a))
        .chain(ring.para.map(|a| ('p', a)))
        .chain([('o', ring.atoms[1]), ('o', ring.atoms[5])]);
    for (pos, atom) in positions {
        for nb in mol.neighbors(atom) {
            if ring.atoms.contains(&nb.atom) {
                continue;
            }
            let Some(entry) = sigma.lookup(mol, atom, nb.atom) else {
                // Unknown substituent (or a fused ring): no term, wider error.
                *var += 0.5 * 0.5;
                continue;
            };
            // σp⁻ describes the exalted effect of π-acceptors in through
            // conjugation with the anion; a donor is not exalted, so the
            // larger (more withdrawing) of σp and σp⁻ is used.
            let s = match (pos, h.sigma) {
                ('m', _) => Some(entry.sigma_m),
                (_, SigmaKind::Para) => Some(entry.sigma_p),
                (_, SigmaKind::ParaMinus) => Some(
                    entry
                        .sigma_p_minus
                        .map_or(entry.sigma_p, |m| m.max(entry.sigma_p)),
                ),
            };
            let Some(s) = s else { continue };
            if s == 0.0 {
                continue;
            }
            let dmso = h.rho_dmso.map(|r| -r * s);
            let water = h.rho_water.map(|r| -r * s);
            let big = dmso.unwrap_or(0.0).abs().max(water.unwrap_or(0.0).abs());
            *var += (0.15 * big).powi(2);
            if dmso.is_none() || water.is_none() {
                // No ρ on one scale: that scale gets no term; allow for a
                // ρ of up to about 2.5 there.
                *var += (2.5 * s).powi(2) / 4.0;
            }
            let kind = match (pos, h.sigma) {
                ('m', _) => "m",
                ('o', SigmaKind::Para) => "o(p)",
                ('o', SigmaKind::ParaMinus) => "o(p-)",
                (_, SigmaKind::Para) => "p",
                (_, SigmaKind::ParaMinus) => "p-",
            };
            if pos == 'o' {
                *var += (0.3 * big).powi(2);
            }
            uses.push(RuleUse {
                id: format!("{owner}/sigma-{kind}:{}", entry.name),
                dmso,
                water,
            });
        }
    }
}

/// Add the increment rows for the classified substituents (`kinds`: kind
/// and the substituent atom). The n-th substituent of a kind takes the row
/// with the largest `nth` <= n for the rule's family.
fn apply_increments(
    mol: &Molecule,
    set: &RuleSet,
    sigma: &SigmaTable,
    rule: &Rule,
    kinds: Vec<(&'static str, usize)>,
    uses: &mut Vec<RuleUse>,
    var: &mut f64,
) {
    let mut counts: Vec<(&'static str, u8)> = Vec::new();
    for (kind, atom) in kinds {
        let n = match counts.iter_mut().find(|(k, _)| *k == kind) {
            Some(c) => {
                c.1 = c.1.saturating_add(1);
                c.1
            }
            None => {
                counts.push((kind, 1));
                1
            }
        };
        let find = |kind: &str| {
            set.increments_of(kind)
                .iter()
                .filter_map(|&k| set.increments.get(k))
                .filter(|r| {
                    r.kind == kind
                        && r.nth <= n
                        && r.families.iter().any(|f| f == "*" || *f == rule.family)
                })
                .max_by_key(|r| r.nth)
        };
        // A family without its own row for a substituted alkyl uses the
        // plain alkyl row.
        let inc = find(kind).or_else(|| {
            if kind == "alkyl_ewg" {
                find("alkyl")
            } else {
                None
            }
        });
        match inc {
            Some(inc) => {
                uses.push(RuleUse {
                    id: inc.id.clone(),
                    dmso: inc.dmso,
                    water: inc.water,
                });
                *var += inc.uncertainty * inc.uncertainty;
                if let (Some(h), true) = (&inc.hammett, mol.atoms[atom].aromatic) {
                    hammett_terms(mol, atom, h, &inc.id, sigma, uses, var);
                }
            }
            None => *var += 1.5 * 1.5,
        }
    }
}

/// Substituents of a heteroatom site (O–H, N–H): fluorine on a carbon two
/// bonds from the acidic atom (`fluoro_beta`, per fluorine) and a nitrogen
/// or oxygen on such a carbon (`hetero_beta`, per path X–C–C–Y). Atoms of
/// the class match are skipped.
fn hetero_kinds(mol: &Molecule, i: usize, matched: &[usize]) -> Vec<(&'static str, usize)> {
    let mut out = Vec::new();
    for c1 in mol.neighbors(i) {
        if mol.atoms[c1.atom].element != 6 || mol.atoms[c1.atom].aromatic {
            continue;
        }
        for c2 in mol.neighbors(c1.atom) {
            let b = &mol.atoms[c2.atom];
            if c2.atom == i || b.element != 6 || b.aromatic || matched.contains(&c2.atom) {
                continue;
            }
            for y in mol.neighbors(c2.atom) {
                if y.atom == c1.atom || matched.contains(&y.atom) {
                    continue;
                }
                match mol.atoms[y.atom].element {
                    9 => out.push(("fluoro_beta", y.atom)),
                    7 | 8 if !mol.atoms[y.atom].aromatic => out.push(("hetero_beta", y.atom)),
                    _ => {}
                }
            }
        }
    }
    out
}

/// Substituents of the sp3 carbon next to the C=O of a carboxylic O–H (the
/// α-carbon of the acid, matched by the class rule): their kinds, as for a
/// carbon site, with the α-carbon as the site. Atoms of the class match are
/// skipped. Empty for any other heteroatom site, and when that carbon is
/// aromatic or unsaturated (aryl and vinyl acids have their own rows).
fn acid_alpha_kinds(mol: &Molecule, i: usize, matched: &[usize]) -> Vec<(&'static str, usize)> {
    let mut out = Vec::new();
    let Some(carbonyl) = mol
        .neighbors(i)
        .iter()
        .map(|nb| nb.atom)
        .find(|&c| mol.atoms[c].element == 6 && double_to_any(mol, c, 8))
    else {
        return out;
    };
    for alpha in mol.neighbors(carbonyl) {
        let a = &mol.atoms[alpha.atom];
        if alpha.atom == i || a.element != 6 || a.aromatic || has_multiple_bond(mol, alpha.atom) {
            continue;
        }
        for s in mol.neighbors(alpha.atom) {
            if s.atom == carbonyl || matched.contains(&s.atom) || mol.atoms[s.atom].element == 1 {
                continue;
            }
            if let Some(k) = substituent_kind(mol, alpha.atom, s.atom) {
                out.push((k, s.atom));
            }
        }
    }
    out
}

fn round2(x: f64) -> f64 {
    (x * 100.0).round() / 100.0
}

/// Estimate the site on atom `i` given its class rule and match.
fn estimate_atom(
    mol: &Molecule,
    set: &RuleSet,
    sigma: &SigmaTable,
    i: usize,
    rule: &Rule,
    matched: &[usize],
) -> Site {
    let mut uses = vec![RuleUse {
        id: rule.id.clone(),
        dmso: rule.pka_dmso,
        water: rule.pka_water,
    }];
    let mut var = rule.uncertainty * rule.uncertainty;
    // Hammett term of the class rule: the first aromatic atom of the match
    // (pattern order) is the ipso atom of the ring conjugated with the site.
    if let Some(h) = &rule.hammett {
        if let Some(&ipso) = matched.iter().find(|&&a| mol.atoms[a].aromatic && a != i) {
            hammett_terms(mol, ipso, h, &rule.id, sigma, &mut uses, &mut var);
        }
    }
    let increments = rule.family != "none" && !rule.background;
    if rule.element != "C" && increments {
        let mut kinds = hetero_kinds(mol, i, matched);
        kinds.extend(acid_alpha_kinds(mol, i, matched));
        apply_increments(mol, set, sigma, rule, kinds, &mut uses, &mut var);
    }
    if rule.element == "C" && increments {
        let mut kinds: Vec<(&'static str, usize)> = Vec::new();
        for nb in mol.neighbors(i) {
            if matched.contains(&nb.atom) || mol.atoms[nb.atom].element == 1 {
                continue;
            }
            match substituent_kind(mol, i, nb.atom) {
                Some(k) => kinds.push((k, nb.atom)),
                None => var += 1.0,
            }
        }
        if let Some(k) = small_ring(mol, i, matched) {
            kinds.push((k, i));
        }
        apply_increments(mol, set, sigma, rule, kinds, &mut uses, &mut var);
    }
    // Contributions are rounded first so that the listed values add up.
    for u in &mut uses {
        u.dmso = u.dmso.map(round2);
        u.water = u.water.map(round2);
    }
    let mut dmso = Some(0.0);
    let mut water = Some(0.0);
    for u in &uses {
        // A Hammett term without ρ on one scale adds nothing there (its
        // uncertainty was widened when the term was made).
        let hammett = u.id.contains("/sigma-");
        if !(hammett && u.dmso.is_none()) {
            add(&mut dmso, u.dmso);
        }
        if !(hammett && u.water.is_none()) {
            add(&mut water, u.water);
        }
    }
    let a = &mol.atoms[i];
    Site {
        atoms: vec![i],
        element: crate::mol::Element::from_atomic_number(a.element)
            .unwrap_or(crate::mol::Element::H),
        hydrogens: a.hydrogens,
        deuterium: a.heavy_hydrogens - a.tritium.min(a.heavy_hydrogens),
        tritium: a.tritium.min(a.heavy_hydrogens),
        class: rule.class.clone(),
        pka_dmso: dmso.map(round2),
        pka_water: water.map(round2),
        uncertainty: round2(var.sqrt()),
        rules: uses,
        regio: None,
        background: rule.background,
    }
}

pub(super) fn rank_key(s: &Site, scale: Scale) -> f64 {
    s.ranking_pka(scale).map_or(f64::INFINITY, |(_, v)| v)
}

/// Run the rule set over the molecule's main component.
/// Is this counter-ion component a neutral acid that would protonate an
/// amine (hydrogen halide; sulfonic, sulfuric, phosphoric or carboxylic
/// acid written as a separate neutral component)?
fn is_acid_component(mol: &Molecule, comp: &[usize]) -> bool {
    if comp.iter().any(|&i| mol.atoms[i].charge != 0) {
        return false;
    }
    if let [x] = comp {
        let a = &mol.atoms[*x];
        return matches!(a.element, 17 | 35 | 53) && a.hydrogens == 1;
    }
    comp.iter().any(|&i| {
        let a = &mol.atoms[i];
        a.element == 8
            && a.hydrogens == 1
            && mol.neighbors(i).len() == 1
            && mol.neighbors(i).iter().any(|nb| {
                matches!(mol.atoms[nb.atom].element, 6 | 15 | 16) && double_to_any(mol, nb.atom, 8)
            })
    })
}

/// Basicity rank of a neutral nitrogen (lower = more basic): 0 for an
/// alkylamine, 1 for an azine / azole nitrogen without hydrogen; None for
/// amides, anilines, nitriles and the like.
fn base_rank(mol: &Molecule, i: usize) -> Option<u8> {
    let a = &mol.atoms[i];
    if a.element != 7 || a.charge != 0 {
        return None;
    }
    if a.aromatic {
        return (a.hydrogens == 0 && mol.neighbors(i).len() == 2).then_some(1);
    }
    let alkyl = !has_multiple_bond(mol, i)
        && mol.neighbors(i).iter().all(|nb| {
            let b = &mol.atoms[nb.atom];
            b.element == 6 && !b.aromatic && !has_multiple_bond(mol, nb.atom)
        });
    alkyl.then_some(0)
}

/// A salt written with the neutral acid as its own component
/// (`CCN(CC)CC.Cl`): the copy of the molecule with the most basic
/// nitrogen(s) of the main component protonated, one per acid component.
fn protonated_salt(mol: &Molecule, main: &[usize]) -> Option<Molecule> {
    let acids = mol
        .counter_ions()
        .iter()
        .filter(|c| is_acid_component(mol, c))
        .count();
    if acids == 0 || main.iter().any(|&i| mol.atoms[i].charge > 0) {
        return None;
    }
    let mut bases: Vec<(u8, usize)> = main
        .iter()
        .filter_map(|&i| base_rank(mol, i).map(|r| (r, i)))
        .collect();
    if bases.is_empty() {
        return None;
    }
    bases.sort_unstable();
    let mut out = mol.clone();
    for &(_, i) in bases.iter().take(acids) {
        let a = &mut out.atoms[i];
        a.charge = 1;
        a.hydrogens = a.hydrogens.saturating_add(1);
    }
    Some(out)
}

/// Run the rule set over the molecule's main component. A salt written as
/// amine plus neutral acid is read as the ammonium salt.
pub(crate) fn run(
    mol: &Molecule,
    target: Option<&Target>,
    set: &RuleSet,
    sigma: &SigmaTable,
    opts: &Options,
) -> SiteReport {
    let atoms = mol.main_component_atoms();
    if let Some(salt) = protonated_salt(mol, &atoms) {
        return run_on(&salt, &Target::new(&salt), atoms, set, sigma, opts);
    }
    match target {
        Some(t) => run_on(mol, t, atoms, set, sigma, opts),
        None => run_on(mol, &Target::new(mol), atoms, set, sigma, opts),
    }
}

fn run_on(
    mol: &Molecule,
    target: &Target,
    atoms: Vec<usize>,
    set: &RuleSet,
    sigma: &SigmaTable,
    opts: &Options,
) -> SiteReport {
    let mask = elem_mask(mol, &atoms);
    // One allocation for the raw sites (large values: growing would copy
    // them), at most one per atom.
    let mut raws: Vec<Raw> = Vec::with_capacity(atoms.len());
    // Per rule: 0 screen not run yet, 1 passed, 2 failed.
    let mut screened = vec![0u8; set.rules.len()];
    for &i in &atoms {
        if let Some(raw) = classify_atom(mol, target, set, sigma, mask, &mut screened, i) {
            raws.push(raw);
        }
    }
    super::states::after_removal(mol, &atoms, set, sigma, opts, &mut raws);
    let mut sites = group(mol, raws);
    sites.sort_by(|a, b| {
        a.background
            .cmp(&b.background)
            .then(rank_key(a, opts.scale).total_cmp(&rank_key(b, opts.scale)))
            .then(a.atoms.cmp(&b.atoms))
    });
    super::regio::mark_regio(mol, set, &mut sites);
    // Background sites come last and are never the top site.
    let top_overall = sites.iter().position(|s| !s.background);
    let top_carbon = sites.iter().position(|s| s.is_carbon() && !s.background);
    SiteReport {
        sites,
        top_carbon,
        top_overall,
    }
}

/// The class rule and estimate of the hydrogen-bearing atom `i` (None when
/// it bears no hydrogen or no rule matches). `mask` holds the elements of the
/// analysed part; `screened` caches the molecule-wide screen per rule
/// (0 not run, 1 passed, 2 failed) and belongs to `target`.
pub(super) fn classify_atom(
    mol: &Molecule,
    target: &Target,
    set: &RuleSet,
    sigma: &SigmaTable,
    mask: u128,
    screened: &mut [u8],
    i: usize,
) -> Option<Raw> {
    let a = &mol.atoms[i];
    if a.hydrogens == 0 {
        return None;
    }
    // A C–H with no activating neighbour is tried against the background
    // rows only (cheap; they come last in the file).
    // Other elements are tried only when the rule file has rows for them
    // (N, O, S, P, Se today: the data decides, not this function).
    let only_background = match a.element {
        6 => !carbon_candidate(mol, i),
        z if set.rules_for(z).is_empty() => return None,
        _ => false,
    };
    let candidates = if only_background {
        set.background_rules()
    } else {
        set.rules_for(a.element)
    };
    for &r in candidates {
        let Some(rule) = set.rules.get(r) else {
            continue;
        };
        if rule.z != a.element
            || rule.required_elements & !mask != 0
            || rule.anchor_aromatic.is_some_and(|ar| ar != a.aromatic)
        {
            continue;
        }
        // The molecule-wide screen once per rule and molecule.
        let passes = match screened.get(r).copied() {
            Some(0) => {
                let ok = rule.pattern.passes_screen(target);
                if let Some(x) = screened.get_mut(r) {
                    *x = if ok { 1 } else { 2 };
                }
                ok
            }
            Some(x) => x == 1,
            None => rule.pattern.passes_screen(target),
        };
        if !passes {
            continue;
        }
        if let Some(m) = rule.pattern.matches_at_screened(target, i) {
            let site = estimate_atom(mol, set, sigma, i, rule, &m);
            return Some(Raw {
                atom: i,
                rule: r,
                site,
            });
        }
    }
    None
}

/// Merge symmetry-equivalent atoms with the same estimate into one site.
fn group(mol: &Molecule, raws: Vec<Raw>) -> Vec<Site> {
    let same = |a: &Raw, b: &Raw| {
        a.rule == b.rule
            && a.site.rules == b.site.rules
            && (a.site.hydrogens, a.site.deuterium, a.site.tritium)
                == (b.site.hydrogens, b.site.deuterium, b.site.tritium)
    };
    // Symmetry classes are computed only if two atoms could be merged.
    let need = raws
        .iter()
        .enumerate()
        .any(|(x, a)| !a.site.background && raws[x + 1..].iter().any(|b| same(a, b)));
    let classes = if need {
        super::symmetry_classes(mol)
    } else {
        Vec::new()
    };
    let mut out: Vec<Site> = Vec::new();
    let mut reps: Vec<usize> = Vec::new();
    for (x, raw) in raws.iter().enumerate() {
        // Background atoms with the same hydrogen count form one site
        // whatever their symmetry (bounded output for large alkyl parts).
        let found = reps.iter().position(|&r| {
            let rep = &raws[r];
            same(rep, raw)
                && ((rep.site.background && raw.site.background)
                    || (classes.get(rep.atom).is_some()
                        && classes.get(rep.atom) == classes.get(raw.atom)))
        });
        match found {
            Some(k) => out[k].atoms.push(raw.atom),
            None => {
                reps.push(x);
                out.push(raw.site.clone());
            }
        }
    }
    out
}

fn bonded(mol: &Molecule, a: usize, b: usize) -> bool {
    mol.neighbors(a).iter().any(|nb| nb.atom == b)
}

/// Bond order as a small code (aromatic distinct from single).
pub(crate) fn order_code(o: BondOrder) -> u8 {
    match o {
        BondOrder::Single => 1,
        BondOrder::Double => 2,
        BondOrder::Triple => 3,
        BondOrder::Quadruple => 4,
        BondOrder::Aromatic => 5,
    }
}
