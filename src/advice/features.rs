//! Functional-group facts the recommender needs, gathered in one place so
//! the detection method (graph walks today, SMARTS patterns when the
//! pattern matcher is available) can change without touching the advice.
//!
//! Functional groups, β-leaving groups and 1,3-dicarbonyl sites are found
//! with SMARTS patterns ([`crate::smarts::Pattern`]); stereocentres and the
//! grouping of alternative sites use a short walk over the bond graph.
//! Everything here is plain data and can be built by hand in tests.

use super::catalogue::Scale;
use super::equilibrium::{AcidUnit, Microsite};
use crate::mol::{BondOrder, Molecule, Neighbor};
use crate::sites::SiteReport;
use crate::smarts::{Pattern, Target as SmartsTarget};
use std::sync::OnceLock;

/// Facts about the molecule as a whole and about each site.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct MoleculeFeatures {
    /// A ketone C=O with carbon on both sides (`[#6][CX3](=O)[#6]`).
    pub ketone: bool,
    /// An aldehyde: a C(H)=O on carbon, or formaldehyde.
    pub aldehyde: bool,
    /// A carboxylic ester (carbamates and anhydrides excluded).
    pub ester: bool,
    /// Alkoxy groups of the esters: "methyl", "ethyl", "tert-butyl",
    /// "isopropyl", "benzyl" or "other".
    pub ester_alkoxy: Vec<String>,
    /// A carboxylic acid O–H (`[CX3](=O)[OX2H1]`).
    pub carboxylic_acid: bool,
    /// An amide, lactam, carbamate or urea C(=O)N.
    pub amide: bool,
    /// A nitrile C≡N.
    pub nitrile: bool,
    /// An acyl halide C(=O)X (X = F, Cl, Br, I).
    pub acyl_halide: bool,
    /// A carboxylic anhydride C(=O)OC(=O).
    pub anhydride: bool,
    /// sp3 C–Cl, C–Br, C–I or a sulfonate ester: an alkylating agent.
    pub alkyl_halide: bool,
    /// Halide or sulfonate on a carbon next to C=O (α-halo ketone or ester).
    pub alpha_halo_carbonyl: bool,
    /// A C-nitro group, in either charge-separated or pentavalent form.
    pub nitro: bool,
    /// Per site (same order as `SiteReport::sites`).
    pub sites: Vec<SiteFeatures>,
    /// Unit id per site: carbon sites that are alternative positions of one
    /// anion (bonded or sharing a neighbour, e.g. both α-carbons of a
    /// ketone) share an id; every other site has its own.
    pub site_unit: Vec<usize>,
    /// Per site: the pKa shift of a second deprotonation. A carbon site
    /// next to a much more acidic carbon site (the γ-CH3 of a β-keto ester
    /// beside its CH2) is not an alternative position of that anion but a
    /// second proton, removed only after the first; it forms its own unit
    /// and its pKa is raised by `DIANION_SHIFT` (10 units). 0 for every other site.
    pub second_stage_shift: Vec<f64>,
}

/// Two neighbouring carbon sites whose pKa (DMSO, else water) differ by at
/// least this much are a first and a second deprotonation, not alternative
/// positions of one anion (from memory: a β-dicarbonyl CH2 at 11–14 against
/// its γ-CH3 at about 25–27 in DMSO; both α-sides of a ketone lie within
/// about 2 units).
pub const DIANION_SPLIT: f64 = 5.0;
/// pKa shift of the second deprotonation of a monoanion (electrostatic
/// penalty; from memory: β-keto ester and β-diketone dianions form with
/// n-BuLi or LDA but not with NaH or alkoxides, which fits a second pKa some
/// 8–12 units above the neutral γ-C–H in DMSO). Uncertain by several units.
pub const DIANION_SHIFT: f64 = 10.0;

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
    /// Next to a C=O: an enolate (self-condensation, Claisen) can form.
    pub alpha_carbonyl: bool,
    /// A deuterium or tritium sits on the site's atoms.
    pub labelled: bool,
}

const C: u8 = 6;

/// Read-only helpers over the molecule's bond graph (its own compressed
/// adjacency; the reader rejects self-bonds, so every entry is a real
/// neighbour).
struct Graph<'a> {
    mol: &'a Molecule,
}

impl<'a> Graph<'a> {
    fn new(mol: &'a Molecule) -> Self {
        Graph { mol }
    }
    fn el(&self, i: usize) -> u8 {
        self.mol.atoms.get(i).map(|a| a.element).unwrap_or(0)
    }
    fn h(&self, i: usize) -> u8 {
        self.mol.atoms.get(i).map(|a| a.hydrogens).unwrap_or(0)
    }
    fn nbrs(&self, i: usize) -> &'a [Neighbor] {
        self.mol.neighbors(i)
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
    fn is_sp3_carbon(&self, i: usize) -> bool {
        self.el(i) == C
            && !self.aromatic(i)
            && self.nbrs(i).iter().all(|nb| self.order(nb.bond) == 1)
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
            .filter(|nb| nb.atom != parent)
            .map(|nb| {
                format!(
                    "{}{}",
                    self.order(nb.bond),
                    self.signature(nb.atom, atom, depth - 1)
                )
            })
            .collect();
        kids.sort();
        s.push('(');
        s.push_str(&kids.join(","));
        s.push(')');
        s
    }

    /// Hash of what [`Graph::signature`] describes (same arguments), built
    /// without allocating: the children are combined by a sum and an xor of
    /// their mixed hashes, so their order does not matter and equal
    /// signatures always give equal hashes.
    fn branch_hash(&self, atom: usize, parent: usize, depth: u8) -> u64 {
        let Some(a) = self.mol.atoms.get(atom) else {
            return 0;
        };
        let label = u64::from(a.element)
            | u64::from(a.charge as u8) << 8
            | u64::from(a.hydrogens) << 16
            | u64::from(a.aromatic) << 24
            | u64::from(depth) << 32;
        let mut h = mix64(label ^ 0x5163_7a2b_9e37_79b9);
        if depth == 0 {
            return h;
        }
        let (mut sum, mut xor, mut count) = (0u64, 0u64, 0u64);
        for nb in self.nbrs(atom) {
            if nb.atom == parent {
                continue;
            }
            let kid = mix64(
                self.branch_hash(nb.atom, atom, depth - 1)
                    ^ u64::from(self.order(nb.bond)).wrapping_mul(0x9e37_79b9_7f4a_7c15),
            );
            sum = sum.wrapping_add(kid);
            xor ^= kid.rotate_left(29);
            count += 1;
        }
        h = mix64(h ^ sum);
        mix64(h ^ xor ^ count.wrapping_mul(0xd6e8_feb8_6659_fd93))
    }
}

/// Are the three branches at `t` pairwise different up to four bonds out
/// (compared by [`Graph::signature`])? Equal branches give equal
/// [`Graph::branch_hash`] values, so three different hashes settle it
/// without building the signatures; otherwise the signatures decide.
fn three_distinct_branches(g: &Graph, t: usize) -> bool {
    let nbrs = g.nbrs(t);
    let [x, y, z] = nbrs else {
        return false;
    };
    let (hx, hy, hz) = (
        g.branch_hash(x.atom, t, 4),
        g.branch_hash(y.atom, t, 4),
        g.branch_hash(z.atom, t, 4),
    );
    if hx != hy && hx != hz && hy != hz {
        return true;
    }
    // Branches with different hashes differ, so only a pair with equal
    // hashes is compared by signature; each signature is built at most
    // once (the large ring branches cost the most).
    let hashes = [hx, hy, hz];
    let mut sigs: [Option<String>; 3] = [None, None, None];
    for (a, b) in [(0, 1), (0, 2), (1, 2)] {
        if hashes[a] != hashes[b] {
            continue;
        }
        for k in [a, b] {
            if sigs[k].is_none() {
                sigs[k] = Some(g.signature(nbrs[k].atom, t, 4));
            }
        }
        if sigs[a] == sigs[b] {
            return false;
        }
    }
    true
}

/// 64-bit mixing step (the SplitMix64 finaliser).
fn mix64(mut x: u64) -> u64 {
    x = (x ^ (x >> 30)).wrapping_mul(0xbf58_476d_1ce4_e5b9);
    x = (x ^ (x >> 27)).wrapping_mul(0x94d0_49bb_1331_11eb);
    x ^ (x >> 31)
}

/// SMARTS patterns for the molecule-wide groups (name, pattern).
const GROUP_PATTERNS: [(&str, &str); 15] = [
    ("alpha_halo_carbonyl", "[CX4]([Cl,Br,I])[CX3]=O"),
    ("ketone", "[#6][CX3](=O)[#6]"),
    ("aldehyde", "[CX3H1](=O)[#6]"),
    ("aldehyde", "[CH2X3]=O"),
    ("ester", "[CX3;!$(C[#7])](=O)[OX2][#6;!$([#6]=O)]"),
    ("carboxylic_acid", "[CX3](=O)[OX2H1]"),
    ("amide", "[CX3](=O)[#7]"),
    ("nitrile", "[CX2]#[NX1]"),
    ("acyl_halide", "[CX3](=O)[F,Cl,Br,I]"),
    ("anhydride", "[CX3](=O)[OX2][CX3]=O"),
    ("alkyl_halide", "[CX4][Cl,Br,I]"),
    ("alkyl_halide", "[CX4][OX2][SX4](=O)=O"),
    ("nitro", "[#6][N+](=O)[O-]"),
    ("nitro", "[#6]N(=O)=O"),
    ("ester_alkoxy", "[CX3;!$(C[#7])](=O)[OX2:1][#6;!$([#6]=O)]"),
];

/// Alkoxy groups of esters, anchored on the ester oxygen.
const ALKOXY_PATTERNS: [(&str, &str); 6] = [
    ("methyl", "[OX2:1]([CH3])[CX3]=O"),
    ("ethyl", "[OX2:1]([CH2][CH3])[CX3]=O"),
    ("isopropyl", "[OX2:1]([CH1]([CH3])[CH3])[CX3]=O"),
    ("tert-butyl", "[OX2:1](C([CH3])([CH3])[CH3])[CX3]=O"),
    ("benzyl", "[OX2:1]([CH2]c)[CX3]=O"),
    ("aryl", "[OX2:1](c)[CX3]=O"),
];

/// Leaving groups on the carbon next to a site carbon (anchored on the site).
const BETA_LG_PATTERNS: [(&str, &str); 9] = [
    ("fluoride", "[#6:1]-[CX4]-F"),
    ("chloride", "[#6:1]-[CX4]-Cl"),
    ("bromide", "[#6:1]-[CX4]-Br"),
    ("iodide", "[#6:1]-[CX4]-I"),
    ("sulfonate", "[#6:1]-[CX4]-[OX2]-[SX4](=O)=O"),
    ("acyloxy", "[#6:1]-[CX4]-[OX2]-[CX3]=O"),
    (
        "alkoxy/hydroxy",
        "[#6:1]-[CX4]-[OX2;!$(O[SX4](=O)=O);!$(O[CX3]=O)]",
    ),
    ("ammonium", "[#6:1]-[CX4]-[NX4+]"),
    ("sulfonyl", "[#6:1]-[CX4]-[SX4](=O)(=O)[#6]"),
];

const DICARBONYL_PATTERN: &str = "[#6:1]([CX3]=O)[CX3]=O";
/// A carbon next to a C=O (an enolisable position of a ketone, aldehyde,
/// ester, amide, acid or lactone).
const ALPHA_CARBONYL_PATTERN: &str = "[#6:1][CX3]=[OX1]";

struct Compiled {
    groups: Vec<(&'static str, Pattern)>,
    alkoxy: Vec<(&'static str, Pattern)>,
    beta: Vec<(&'static str, Pattern)>,
    dicarbonyl: Option<Pattern>,
    alpha_carbonyl: Option<Pattern>,
}

fn compiled() -> &'static Compiled {
    static CELL: OnceLock<Compiled> = OnceLock::new();
    CELL.get_or_init(|| {
        let list = |v: &[(&'static str, &'static str)]| {
            v.iter()
                .filter_map(|(n, p)| Pattern::parse(p).ok().map(|pat| (*n, pat)))
                .collect::<Vec<_>>()
        };
        Compiled {
            groups: list(&GROUP_PATTERNS),
            alkoxy: list(&ALKOXY_PATTERNS),
            beta: list(&BETA_LG_PATTERNS),
            dicarbonyl: Pattern::parse(DICARBONYL_PATTERN).ok(),
            alpha_carbonyl: Pattern::parse(ALPHA_CARBONYL_PATTERN).ok(),
        }
    })
}

/// Every SMARTS pattern used here parses (checked by a test).
pub fn patterns_all_parse() -> Result<(), crate::smarts::PatternError> {
    for (_, p) in GROUP_PATTERNS
        .iter()
        .chain(ALKOXY_PATTERNS.iter())
        .chain(BETA_LG_PATTERNS.iter())
    {
        Pattern::parse(p)?;
    }
    Pattern::parse(DICARBONYL_PATTERN).map(|_| ())
}

/// Gather the features of `mol` for the sites of `sites`: functional groups
/// by SMARTS pattern, per-site facts, and the grouping of alternative sites.
pub fn detect_features(mol: &Molecule, sites: &SiteReport) -> MoleculeFeatures {
    detect_features_in(mol, &SmartsTarget::new(mol), sites)
}

/// [`detect_features`] on a pattern-matching view of `mol` that the caller
/// already built; `target` must come from `smarts::Target::new(mol)`.
pub fn detect_features_in(
    mol: &Molecule,
    target: &SmartsTarget,
    sites: &SiteReport,
) -> MoleculeFeatures {
    detect_features_for(mol, target, sites, |_| true)
}

/// [`detect_features_in`] with the per-site facts worked out only for the
/// sites `wanted` selects (the others get [`SiteFeatures::default`]). The
/// advice reads them for its target and the target's unit only, and
/// background C–H sites (many atoms each: every aryl or alkane C–H) are
/// neither unless one is the target; skipping them spares most of the
/// per-site pattern matches on the bulk path.
pub(crate) fn detect_features_for(
    mol: &Molecule,
    target: &SmartsTarget,
    sites: &SiteReport,
    wanted: impl Fn(usize) -> bool,
) -> MoleculeFeatures {
    let g = Graph::new(mol);
    let pats = compiled();
    let mut f = MoleculeFeatures::default();
    for (name, p) in &pats.groups {
        if *name == "ester_alkoxy" {
            // The same pattern as "ester" (the oxygen labelled): no ester,
            // no matches.
            if !f.ester {
                continue;
            }
            let oxygen = p.anchor().unwrap_or(0);
            for m in p.unique_matches_in(target) {
                let Some(&o) = m.get(oxygen) else { continue };
                let kind = pats
                    .alkoxy
                    .iter()
                    .find(|(_, a)| a.matches_at_in(target, o).is_some())
                    .map(|(n, _)| *n)
                    .unwrap_or("other");
                f.ester_alkoxy.push(kind.to_string());
            }
            continue;
        }
        if !p.is_match_in(target) {
            continue;
        }
        match *name {
            "ketone" => f.ketone = true,
            "aldehyde" => f.aldehyde = true,
            "ester" => f.ester = true,
            "carboxylic_acid" => f.carboxylic_acid = true,
            "amide" => f.amide = true,
            "nitrile" => f.nitrile = true,
            "acyl_halide" => f.acyl_halide = true,
            "anhydride" => f.anhydride = true,
            "alkyl_halide" => f.alkyl_halide = true,
            "alpha_halo_carbonyl" => f.alpha_halo_carbonyl = true,
            "nitro" => f.nitro = true,
            _ => {}
        }
    }
    f.ester_alkoxy.sort();
    f.ester_alkoxy.dedup();

    for (i, site) in sites.sites.iter().enumerate() {
        if !wanted(i) {
            f.sites.push(SiteFeatures::default());
            continue;
        }
        let mut sf = SiteFeatures {
            labelled: site.atoms.iter().any(|&a| {
                mol.atoms
                    .get(a)
                    .map(|x| x.heavy_hydrogens > 0)
                    .unwrap_or(false)
            }),
            ..SiteFeatures::default()
        };
        if site.is_carbon() {
            for &t in &site.atoms {
                if sf.beta_leaving_group.is_none() {
                    sf.beta_leaving_group = pats
                        .beta
                        .iter()
                        .find(|(_, p)| p.matches_at_in(target, t).is_some())
                        .map(|(n, _)| n.to_string());
                }
                if pats
                    .dicarbonyl
                    .as_ref()
                    .map(|p| p.matches_at_in(target, t).is_some())
                    .unwrap_or(false)
                {
                    sf.dicarbonyl = true;
                }
                if pats
                    .alpha_carbonyl
                    .as_ref()
                    .map(|p| p.matches_at_in(target, t).is_some())
                    .unwrap_or(false)
                {
                    sf.alpha_carbonyl = true;
                }
                if g.h(t) == 1
                    && g.is_sp3_carbon(t)
                    && g.nbrs(t).len() == 3
                    && three_distinct_branches(&g, t)
                {
                    sf.stereocentre = true;
                }
            }
        }
        f.sites.push(sf);
    }
    let (units, shift) = group_units(&g, sites);
    f.site_unit = units;
    f.second_stage_shift = shift;
    f
}

fn group_units(g: &Graph, sites: &SiteReport) -> (Vec<usize>, Vec<f64>) {
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
        let na = g.nbrs(a);
        if na.iter().any(|x| x.atom == b) {
            return true;
        }
        g.nbrs(b)
            .iter()
            .any(|x| na.iter().any(|y| y.atom == x.atom))
    };
    let pk = |s: &crate::sites::Site| s.pka_dmso.or(s.pka_water);
    let mut shift = vec![0.0; n];
    for i in 0..n {
        for j in (i + 1)..n {
            let (si, sj) = (&sites.sites[i], &sites.sites[j]);
            // Background C–H (issue 11) is never an alternative position of
            // a real site's unit (toluene's ring C–H is not part of its
            // benzylic unit).
            if !(si.is_carbon() && sj.is_carbon()) || si.background || sj.background {
                continue;
            }
            if si
                .atoms
                .iter()
                .any(|&a| sj.atoms.iter().any(|&b| near(a, b)))
            {
                if let (Some(a), Some(b)) = (pk(si), pk(sj)) {
                    if (a - b).abs() >= DIANION_SPLIT {
                        shift[if a > b { i } else { j }] = DIANION_SHIFT;
                        continue;
                    }
                }
                let (ri, rj) = (find(&mut parent, i), find(&mut parent, j));
                if ri != rj {
                    parent[rj] = ri;
                }
            }
        }
    }
    let units = (0..n).map(|i| find(&mut parent, i)).collect();
    (units, shift)
}

/// Acid units for the solver on one scale: carbon sites grouped by
/// `site_unit`; each atom of an O–H, N–H or S–H site is its own unit.
/// Sites without a value on the scale are left out (said in `notes`).
/// Background sites (unactivated C–H listed for completeness, issue 11)
/// take part only when listed in `keep` (the target's unit) or when the
/// report has no other site: their extrapolated values (aryl C–H about 43,
/// below n-BuLi's 50) describe equilibria that are kinetically out of
/// reach, so they must not draw base away from a real site.
pub(crate) fn site_units(
    sites: &SiteReport,
    site_unit: &[usize],
    second_stage_shift: &[f64],
    scale: Scale,
    keep: &[usize],
    notes: &mut Vec<String>,
) -> Vec<AcidUnit> {
    let mut units: Vec<(Option<usize>, AcidUnit)> = Vec::new();
    let only_background = sites.sites.iter().all(|s| s.background);
    for (i, s) in sites.sites.iter().enumerate() {
        if s.background && !only_background && !keep.contains(&i) {
            continue;
        }
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
                pka: pka + second_stage_shift.get(i).copied().unwrap_or(0.0),
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

#[cfg(test)]
mod tests {
    use super::*;

    /// The decision by signatures alone, as made before the hash shortcut.
    fn by_signatures(g: &Graph, t: usize) -> bool {
        let mut sigs: Vec<String> = g
            .nbrs(t)
            .iter()
            .map(|nb| g.signature(nb.atom, t, 4))
            .collect();
        sigs.sort();
        sigs.dedup();
        sigs.len() == 3
    }

    #[test]
    fn three_distinct_branches_given_molecules_agrees_with_signatures() {
        // Common practice: C2 of butan-2-ol and of 2-methylcyclohexanone are
        // stereocentres; the CH of isobutane, of pentan-3-ol and C4 of
        // 4-methylcyclohexanone are not (two equal branches).
        let cases = [
            ("CC(O)CC", 1, true),
            ("CC1CCCCC1=O", 1, true),
            ("CC(C)C", 1, false),
            ("CCC(O)CC", 2, false),
            ("CC1CCC(=O)CC1", 1, false),
        ];
        for (smiles, atom, expected) in cases {
            let mol = Molecule::from_smiles(smiles).expect("parses");
            let g = Graph::new(&mol);
            assert_eq!(three_distinct_branches(&g, atom), expected, "{smiles}");
        }
        // Every atom with three neighbours in a few larger molecules: the
        // shortcut gives the signature answer.
        for smiles in [
            "CC(C)(C)OC(=O)N[C@@H](Cc1ccccc1)C(=O)N1CCC[C@H]1C(=O)O",
            "OC1C(O)C(O)C(O)C(O)C1O",
            "CC12CCC3c4ccc(O)cc4CCC3C1CCC2O",
            "C1C2CC3CC1CC(C2)C3",
        ] {
            let mol = Molecule::from_smiles(smiles).expect("parses");
            let g = Graph::new(&mol);
            for t in 0..mol.atoms.len() {
                if g.nbrs(t).len() == 3 {
                    assert_eq!(
                        three_distinct_branches(&g, t),
                        by_signatures(&g, t),
                        "{smiles} atom {t}"
                    );
                }
            }
        }
    }
}
