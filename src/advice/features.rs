//! Functional-group facts the recommender needs, gathered in one place so
//! the detection method (graph walks today, SMARTS patterns when the
//! pattern matcher is available) can change without touching the advice.
//!
//! Everything here is plain data and can be built by hand in tests.

use super::catalogue::Scale;
use super::equilibrium::{AcidUnit, Microsite};
use crate::mol::{BondOrder, Molecule};
use crate::sites::SiteReport;

/// Facts about the molecule as a whole and about each site.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct MoleculeFeatures {
    pub ketone: bool,
    pub aldehyde: bool,
    pub ester: bool,
    /// Alkoxy groups of the esters: "methyl", "ethyl", "tert-butyl",
    /// "isopropyl", "benzyl" or "other".
    pub ester_alkoxy: Vec<String>,
    pub carboxylic_acid: bool,
    pub amide: bool,
    pub nitrile: bool,
    pub acyl_halide: bool,
    pub anhydride: bool,
    /// sp3 C–Cl, C–Br, C–I or a sulfonate ester: an alkylating agent.
    pub alkyl_halide: bool,
    pub nitro: bool,
    /// Per site (same order as `SiteReport::sites`).
    pub sites: Vec<SiteFeatures>,
    /// Unit id per site: carbon sites that are alternative positions of one
    /// anion (bonded or sharing a neighbour, e.g. both α-carbons of a
    /// ketone) share an id; every other site has its own.
    pub site_unit: Vec<usize>,
}

/// Facts about one site.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct SiteFeatures {
    /// Leaving group on a carbon next to the site (E1cB elimination after
    /// deprotonation), e.g. "chloride", "alkoxy/hydroxy", "acyloxy".
    pub beta_leaving_group: Option<String>,
    /// The site carbon is a stereocentre bearing the acidic H (it is
    /// planarised on deprotonation: epimerisation / racemisation).
    pub stereocentre: bool,
    /// Flanked by two C=O groups (1,3-dicarbonyl): the anion can be
    /// alkylated on O as well as C.
    pub dicarbonyl: bool,
}

const C: u8 = 6;
const N: u8 = 7;
const O: u8 = 8;
const S: u8 = 16;

struct Graph<'a> {
    mol: &'a Molecule,
    adj: Vec<Vec<(usize, usize)>>,
}

impl<'a> Graph<'a> {
    fn new(mol: &'a Molecule) -> Self {
        let n = mol.atoms.len();
        let mut adj = vec![Vec::new(); n];
        for (bi, b) in mol.bonds.iter().enumerate() {
            let [a, c] = b.atoms;
            if a < n && c < n && a != c {
                adj[a].push((c, bi));
                adj[c].push((a, bi));
            }
        }
        Graph { mol, adj }
    }
    fn el(&self, i: usize) -> u8 {
        self.mol.atoms.get(i).map(|a| a.element).unwrap_or(0)
    }
    fn h(&self, i: usize) -> u8 {
        self.mol.atoms.get(i).map(|a| a.hydrogens).unwrap_or(0)
    }
    fn nbrs(&self, i: usize) -> &[(usize, usize)] {
        self.adj.get(i).map(Vec::as_slice).unwrap_or(&[])
    }
    fn order(&self, bond: usize) -> u8 {
        match self.mol.bonds.get(bond) {
            Some(b) if b.order == BondOrder::Aromatic => 4,
            Some(b) => b.kekule.max(match b.order {
                BondOrder::Double => 2,
                BondOrder::Triple => 3,
                BondOrder::Quadruple => 4,
                _ => 1,
            }),
            None => 0,
        }
    }
    fn aromatic(&self, i: usize) -> bool {
        self.mol.atoms.get(i).map(|a| a.aromatic).unwrap_or(false)
    }
    /// C=O carbon (exocyclic double bond to O, not aromatic).
    fn is_carbonyl(&self, i: usize) -> bool {
        self.el(i) == C
            && self
                .nbrs(i)
                .iter()
                .any(|&(j, b)| self.el(j) == O && self.order(b) == 2)
    }
    fn single_o(&self, i: usize) -> impl Iterator<Item = usize> + '_ {
        self.nbrs(i)
            .iter()
            .filter(move |&&(j, b)| self.el(j) == O && self.order(b) == 1)
            .map(|&(j, _)| j)
    }
    fn is_sp3_carbon(&self, i: usize) -> bool {
        self.el(i) == C
            && !self.aromatic(i)
            && self.nbrs(i).iter().all(|&(_, b)| self.order(b) == 1)
    }
    fn is_halogen(el: u8) -> bool {
        matches!(el, 9 | 17 | 35 | 53)
    }
    /// Sulfonyl sulfur: S with two S=O.
    fn is_sulfonyl(&self, i: usize) -> bool {
        self.el(i) == S
            && self
                .nbrs(i)
                .iter()
                .filter(|&&(j, b)| self.el(j) == O && self.order(b) == 2)
                .count()
                >= 2
    }

    /// Bounded environment signature of the branch entered from `parent` at `atom`.
    fn signature(&self, atom: usize, parent: usize, depth: u8) -> String {
        let a = match self.mol.atoms.get(atom) {
            Some(a) => a,
            None => return String::new(),
        };
        let mut s = format!(
            "{}:{}:{}:{}",
            a.element, a.charge, a.hydrogens, a.aromatic as u8
        );
        if depth == 0 {
            return s;
        }
        let mut kids: Vec<String> = self
            .nbrs(atom)
            .iter()
            .filter(|&&(j, _)| j != parent)
            .map(|&(j, b)| format!("{}{}", self.order(b), self.signature(j, atom, depth - 1)))
            .collect();
        kids.sort();
        s.push('(');
        s.push_str(&kids.join(","));
        s.push(')');
        s
    }
}

/// Gather the features of `mol` for the sites of `sites`.
pub fn detect_features(mol: &Molecule, sites: &SiteReport) -> MoleculeFeatures {
    let g = Graph::new(mol);
    let n = mol.atoms.len();
    let mut f = MoleculeFeatures::default();
    for i in 0..n {
        let el = g.el(i);
        if el == C && g.is_carbonyl(i) {
            let nb = g.nbrs(i);
            let carbons = nb
                .iter()
                .filter(|&&(j, b)| g.el(j) == C && g.order(b) == 1)
                .count();
            let has_n = nb.iter().any(|&(j, _)| g.el(j) == N);
            let halide = nb.iter().any(|&(j, _)| Graph::is_halogen(g.el(j)));
            let mut ester_like = false;
            for o in g.single_o(i) {
                let others: Vec<usize> = g
                    .nbrs(o)
                    .iter()
                    .map(|&(k, _)| k)
                    .filter(|&k| k != i)
                    .collect();
                if others.is_empty() {
                    if g.h(o) > 0 && !has_n {
                        f.carboxylic_acid = true;
                    }
                } else if others.iter().any(|&k| g.is_carbonyl(k)) {
                    f.anhydride = true;
                } else if let Some(&k) = others.iter().find(|&&k| g.el(k) == C) {
                    ester_like = true;
                    if !has_n {
                        f.ester = true;
                        f.ester_alkoxy.push(alkoxy_name(&g, k));
                    }
                }
            }
            if halide {
                f.acyl_halide = true;
            } else if has_n {
                f.amide = true;
            } else if !ester_like && g.single_o(i).next().is_none() {
                if carbons >= 2 {
                    f.ketone = true;
                } else if g.h(i) >= 1 {
                    f.aldehyde = true;
                }
            }
        }
        if el == C
            && g.nbrs(i)
                .iter()
                .any(|&(j, b)| g.el(j) == N && g.order(b) == 3)
        {
            f.nitrile = true;
        }
        if el == N
            && g.nbrs(i).iter().filter(|&&(j, _)| g.el(j) == O).count() >= 2
            && g.nbrs(i).iter().any(|&(j, _)| g.el(j) == C)
        {
            f.nitro = true;
        }
        if g.is_sp3_carbon(i) {
            for &(j, _) in g.nbrs(i) {
                let ej = g.el(j);
                if matches!(ej, 17 | 35 | 53) {
                    f.alkyl_halide = true;
                }
                if ej == O && g.nbrs(j).iter().any(|&(k, _)| k != i && g.is_sulfonyl(k)) {
                    f.alkyl_halide = true;
                }
            }
        }
    }
    f.ester_alkoxy.sort();
    f.ester_alkoxy.dedup();

    for site in &sites.sites {
        let mut sf = SiteFeatures::default();
        if site.is_carbon() {
            for &t in &site.atoms {
                if sf.beta_leaving_group.is_none() {
                    sf.beta_leaving_group = beta_leaving_group(&g, t);
                }
                let carbonyls = g.nbrs(t).iter().filter(|&&(j, _)| g.is_carbonyl(j)).count();
                if carbonyls >= 2 {
                    sf.dicarbonyl = true;
                }
                if g.h(t) == 1 && g.is_sp3_carbon(t) && g.nbrs(t).len() == 3 {
                    let mut sigs: Vec<String> = g
                        .nbrs(t)
                        .iter()
                        .map(|&(j, _)| g.signature(j, t, 4))
                        .collect();
                    sigs.sort();
                    sigs.dedup();
                    if sigs.len() == 3 {
                        sf.stereocentre = true;
                    }
                }
            }
        }
        f.sites.push(sf);
    }
    f.site_unit = group_units(&g, sites);
    f
}

fn alkoxy_name(g: &Graph, k: usize) -> String {
    let carbons: Vec<usize> = g
        .nbrs(k)
        .iter()
        .map(|&(j, _)| j)
        .filter(|&j| g.el(j) == C)
        .collect();
    let heavy = g.nbrs(k).len();
    if g.aromatic(k) {
        return "aryl".into();
    }
    match (g.h(k), heavy) {
        (3, 1) => "methyl".into(),
        (2, 2) if carbons.len() == 1 => {
            let other = carbons
                .iter()
                .find(|&&c| g.nbrs(c).iter().all(|&(x, _)| x == k || g.el(x) != O));
            match other {
                Some(&c) if g.h(c) == 3 && g.nbrs(c).len() == 1 => "ethyl".into(),
                Some(&c) if g.aromatic(c) => "benzyl".into(),
                _ => "other".into(),
            }
        }
        (1, 3) if carbons.len() == 2 && carbons.iter().filter(|&&c| g.h(c) == 3).count() == 2 => {
            "isopropyl".into()
        }
        (0, 4)
            if carbons
                .iter()
                .filter(|&&c| g.h(c) == 3 && g.nbrs(c).len() == 1)
                .count()
                == 3 =>
        {
            "tert-butyl".into()
        }
        _ => "other".into(),
    }
}

fn beta_leaving_group(g: &Graph, t: usize) -> Option<String> {
    for &(a, b) in g.nbrs(t) {
        if g.el(a) != C || g.order(b) != 1 || g.is_carbonyl(a) || !g.is_sp3_carbon(a) {
            continue;
        }
        for &(x, _) in g.nbrs(a) {
            if x == t {
                continue;
            }
            let ex = g.el(x);
            let name = match ex {
                9 => Some("fluoride"),
                17 => Some("chloride"),
                35 => Some("bromide"),
                53 => Some("iodide"),
                O => {
                    if g.nbrs(x).iter().any(|&(k, _)| k != a && g.is_sulfonyl(k)) {
                        Some("sulfonate")
                    } else if g.nbrs(x).iter().any(|&(k, _)| k != a && g.is_carbonyl(k)) {
                        Some("acyloxy")
                    } else {
                        Some("alkoxy/hydroxy")
                    }
                }
                N if g.mol.atoms.get(x).map(|a| a.charge > 0).unwrap_or(false)
                    && g.nbrs(x).iter().all(|&(k, _)| g.el(k) == C) =>
                {
                    Some("ammonium")
                }
                S if g.is_sulfonyl(x) => Some("sulfonyl"),
                _ => None,
            };
            if let Some(nm) = name {
                return Some(nm.to_string());
            }
        }
    }
    None
}

fn group_units(g: &Graph, sites: &SiteReport) -> Vec<usize> {
    let n = sites.sites.len();
    let mut parent: Vec<usize> = (0..n).collect();
    fn find(p: &mut [usize], mut i: usize) -> usize {
        while p[i] != i {
            p[i] = p[p[i]];
            i = p[i];
        }
        i
    }
    let near = |a: usize, b: usize| -> bool {
        if a == b {
            return true;
        }
        let na: Vec<usize> = g.nbrs(a).iter().map(|&(x, _)| x).collect();
        if na.contains(&b) {
            return true;
        }
        g.nbrs(b).iter().any(|&(x, _)| na.contains(&x))
    };
    for i in 0..n {
        for j in (i + 1)..n {
            let (si, sj) = (&sites.sites[i], &sites.sites[j]);
            if !(si.is_carbon() && sj.is_carbon()) {
                continue;
            }
            if si
                .atoms
                .iter()
                .any(|&a| sj.atoms.iter().any(|&b| near(a, b)))
            {
                let (ri, rj) = (find(&mut parent, i), find(&mut parent, j));
                if ri != rj {
                    parent[rj] = ri;
                }
            }
        }
    }
    (0..n).map(|i| find(&mut parent, i)).collect()
}

/// Acid units for the solver on one scale: carbon sites grouped by
/// `site_unit`; each atom of an O–H, N–H or S–H site is its own unit.
/// Sites without a value on the scale are left out (said in `notes`).
pub(crate) fn site_units(
    sites: &SiteReport,
    site_unit: &[usize],
    scale: Scale,
    notes: &mut Vec<String>,
) -> Vec<AcidUnit> {
    let mut units: Vec<(Option<usize>, AcidUnit)> = Vec::new();
    for (i, s) in sites.sites.iter().enumerate() {
        let pka = match scale {
            Scale::Water => s.pka_water,
            _ => s.pka_dmso,
        };
        let Some(pka) = pka else {
            notes.push(format!(
                "site at atoms {:?} has no {} value and is left out",
                s.atoms,
                scale.name()
            ));
            continue;
        };
        if s.is_carbon() {
            let uid = site_unit.get(i).copied().unwrap_or(usize::MAX - i);
            let m = Microsite {
                site: i,
                atoms: s.atoms.clone(),
                pka,
            };
            if let Some((_, u)) = units.iter_mut().find(|(k, _)| *k == Some(uid)) {
                u.alternatives.push(m);
            } else {
                units.push((
                    Some(uid),
                    AcidUnit {
                        alternatives: vec![m],
                    },
                ));
            }
        } else {
            for &a in &s.atoms {
                units.push((
                    None,
                    AcidUnit {
                        alternatives: vec![Microsite {
                            site: i,
                            atoms: vec![a],
                            pka,
                        }],
                    },
                ));
            }
        }
    }
    units.into_iter().map(|(_, u)| u).collect()
}
