//! The equilibrium set up for a catalogue base and a site report: the
//! options, the choice of pKa scale and the acid units.

use super::*;

/// Options for [`equilibrium_for`].
#[derive(Debug, Clone, PartialEq)]
pub struct EquilibriumOptions {
    /// Base name as in the catalogue.
    pub base: String,
    /// Base equivalents relative to substrate (1.0 = one mole of base per
    /// mole of substrate); default 1.0.
    pub equivalents: f64,
    /// Substrate concentration, mol/L; default 0.5.
    pub concentration: f64,
    /// Solvent name; when it is the base's conjugate acid (EtOH for NaOEt)
    /// the solvent enters the mass balance at its neat molarity.
    /// None: the base's usual solvent.
    pub solvent: Option<String>,
    /// Force a pKa scale; None: the water scale in the base's own protic
    /// solvent, else DMSO, else water, else the base's THF value against the
    /// sites' DMSO values.
    pub scale: Option<Scale>,
}

impl EquilibriumOptions {
    /// The equilibrium with `base` (a catalogue name): 1 equivalent,
    /// substrate 0.5 mol/L, the base's usual solvent, the scale chosen
    /// automatically.
    pub fn new(base: &str) -> EquilibriumOptions {
        EquilibriumOptions {
            base: base.to_string(),
            equivalents: 1.0,
            concentration: 0.5,
            solvent: None,
            scale: None,
        }
    }
}

/// Extra uncertainty (pKa units) when a base's THF value stands in for its
/// DMSO value.
pub const THF_FOR_DMSO_UNCERTAINTY: f64 = 2.0;
/// Extra uncertainty when a base's DMSO or THF value is compared with a
/// site's water value (carbon acids differ by several units between them).
pub const CROSS_SCALE_UNCERTAINTY: f64 = 4.0;

/// The pKa scale used for one base against the sites.
#[derive(Debug, Clone, PartialEq)]
pub(crate) struct ScaleChoice {
    /// Scale of the site values.
    pub site_scale: Scale,
    /// Conjugate-acid pKa used (possibly from another scale).
    pub base_pka: f64,
    /// `base_pka` as the reasons write it (one decimal), set by
    /// [`choose_scale`].
    pub base_pka_text: String,
    pub note: String,
    /// Extra uncertainty from comparing values of different scales.
    pub mismatch: f64,
}

/// Scale choice for a base and a set of sites in a solvent, in order:
/// a requested scale; the water scale when the solvent is the base's own
/// protic conjugate acid (the nearer guide in a hydroxylic medium); DMSO
/// when base and sites have DMSO values; water when both have water values;
/// the base's THF value against DMSO site values; finally the base's DMSO
/// (or THF) value against water site values. Mixed comparisons say so in
/// the note and carry an extra uncertainty.
pub(crate) fn choose_scale(
    base: &Base,
    protic: bool,
    forced: Option<Scale>,
    site_has: impl Fn(Scale) -> bool,
) -> Option<Rc<ScaleChoice>> {
    // The choice depends only on the base, the flags and which scales the
    // sites have: cache it per thread, one slot per catalogue base and
    // combination of flags, so the note is formatted once per catalogue
    // base rather than once per molecule, and shared (not copied) after.
    const FLAGS: usize = 32;
    thread_local! {
        static CACHE: std::cell::RefCell<Vec<Option<Option<Rc<ScaleChoice>>>>> =
            const { std::cell::RefCell::new(Vec::new()) };
    }
    let (has_dmso, has_water) = (site_has(Scale::Dmso), site_has(Scale::Water));
    let flags = usize::from(protic)
        | (match forced {
            None => 0,
            Some(Scale::Dmso) => 1,
            Some(Scale::Water) => 2,
            Some(Scale::Thf) => 3,
        }) << 1
        | usize::from(has_dmso) << 3
        | usize::from(has_water) << 4;
    // Only the embedded catalogue's bases live at a fixed address for the
    // whole run; the slot is the base's position in it. A base of another
    // catalogue (the caller's own, which may be dropped and its memory
    // reused) is never cached, so two catalogues cannot share an entry.
    let slot = catalogue().ok().and_then(|c| {
        let i = c
            .bases
            .as_ptr_range()
            .contains(&(base as *const Base))
            .then(|| {
                (base as *const Base as usize - c.bases.as_ptr() as usize)
                    / std::mem::size_of::<Base>()
            })?;
        Some((i * FLAGS + flags, c.bases.len() * FLAGS))
    });
    if let Some((k, _)) = slot {
        if let Some(Some(hit)) = CACHE.with(|c| c.borrow().get(k).cloned()) {
            return hit;
        }
    }
    let v = choose_scale_uncached(base, protic, forced, &|s| match s {
        Scale::Dmso => has_dmso,
        Scale::Water => has_water,
        Scale::Thf => site_has(Scale::Thf),
    })
    .map(|mut c| {
        c.base_pka_text = crate::advice::numfmt::fixed1(c.base_pka);
        Rc::new(c)
    });
    if let Some((k, n)) = slot {
        CACHE.with(|c| {
            let mut c = c.borrow_mut();
            if c.len() < n {
                c.resize(n, None);
            }
            if let Some(e) = c.get_mut(k) {
                *e = Some(v.clone());
            }
        });
    }
    v
}

fn choose_scale_uncached(
    base: &Base,
    protic: bool,
    forced: Option<Scale>,
    site_has: &dyn Fn(Scale) -> bool,
) -> Option<ScaleChoice> {
    let src = |s: Scale| base.pka_source(s).unwrap_or("-").to_string();
    let same = |sc: Scale, p: f64, why: &str| ScaleChoice {
        site_scale: sc,
        base_pka: p,
        base_pka_text: String::new(),
        note: format!(
            "{} scale{why} ({} conjugate acid pKa {p}, {})",
            sc.name(),
            base.name,
            src(sc)
        ),
        mismatch: 0.0,
    };
    if let Some(f) = forced {
        if let (Some(p), true) = (base.pka(f), site_has(f)) {
            return Some(same(f, p, " as requested"));
        }
        let mut fallback = choose_scale_uncached(base, protic, None, site_has)?;
        fallback.note = format!(
            "the requested {} scale has no value for {} or the sites; {}",
            f.name(),
            base.name,
            fallback.note
        );
        return Some(fallback);
    }
    if protic {
        if let (Some(p), true) = (base.pka(Scale::Water), site_has(Scale::Water)) {
            return Some(same(
                Scale::Water,
                p,
                ", the nearer guide in a protic solvent",
            ));
        }
    }
    for sc in [Scale::Dmso, Scale::Water] {
        if let (Some(p), true) = (base.pka(sc), site_has(sc)) {
            return Some(same(sc, p, ""));
        }
    }
    if let (Some(p), true) = (base.pka(Scale::Thf), site_has(Scale::Dmso)) {
        return Some(ScaleChoice {
            site_scale: Scale::Dmso,
            base_pka: p,
            base_pka_text: String::new(),
            note: format!(
                "no DMSO value for {}: its THF value {p} ({}) is compared with DMSO values of the sites (approximate)",
                base.name,
                src(Scale::Thf)
            ),
            mismatch: THF_FOR_DMSO_UNCERTAINTY,
        });
    }
    for sc in [Scale::Dmso, Scale::Thf] {
        if let (Some(p), true) = (base.pka(sc), site_has(Scale::Water)) {
            return Some(ScaleChoice {
                site_scale: Scale::Water,
                base_pka: p,
                base_pka_text: String::new(),
                note: format!(
                    "no common scale: the {} value {p} of {} ({}) is compared with water values of the sites (rough; carbon acids differ by several units between the scales)",
                    sc.name(),
                    base.name,
                    src(sc)
                ),
                mismatch: CROSS_SCALE_UNCERTAINTY,
            });
        }
    }
    None
}

/// Equilibrium for a molecule and a catalogue base: every acidic site of
/// the report takes part (alternative α-positions of one carbonyl form one
/// unit; each O–H, N–H, S–H atom is its own unit); background C–H sites
/// take part only when the report has no other site.
pub fn equilibrium_for(
    mol: &Molecule,
    sites: &SiteReport,
    opts: &EquilibriumOptions,
) -> Result<Equilibrium, EquilibriumError> {
    let cat = catalogue().map_err(EquilibriumError::Catalogue)?;
    equilibrium_for_using(mol, sites, opts, cat)
}

/// [`equilibrium_for`] with the base looked up in a catalogue the caller
/// parsed from its own file ([`Catalogue::parse`](crate::advice::Catalogue::parse)):
/// its conjugate-acid pKa values, solvents and protic solvent are used.
///
/// # Example
///
/// ```
/// use acidsite::advice::{equilibrium_for_using, Catalogue, EquilibriumError, EquilibriumOptions};
/// use acidsite::mol::Molecule;
/// use acidsite::sites::find_sites;
///
/// // A one-base catalogue: LDA only (diisopropylamine about 36 in THF,
/// // common practice).
/// let header = "# version: mine-1\nname\tfull_name\tfamily\tconjugate_acid\tpka_dmso\tsrc_dmso\tpka_water\tsrc_water\tpka_thf\tsrc_thf\tcounter_ion\tnucleophilic\thindered\tsolvents\ttemp_min_c\ttemp_max_c\tacid_solvent\thazards\tnotes\trarity\n";
/// let lda = "LDA\tlithium diisopropylamide\tlithium-amide\tCC(C)NC(C)C\t-\t-\t-\t-\t36\tcommon-practice\tLi\tno\tyes\tTHF\t-78\t0\t-\tcorrosive\t-\t0\n";
/// let sources = "key\treference\ncommon-practice\tcommon laboratory practice\n";
/// let cat = Catalogue::parse(&format!("{header}{lda}"), "mine.tsv", sources).expect("valid");
///
/// let mol = Molecule::from_smiles("CC(=O)C").expect("valid SMILES");
/// let sites = find_sites(&mol);
/// let eq = equilibrium_for_using(&mol, &sites, &EquilibriumOptions::new("LDA"), &cat)
///     .expect("solvable");
/// assert_eq!(eq.base, "LDA");
/// // A base outside the caller's catalogue is unknown, even if the
/// // embedded one has it.
/// let naoh = equilibrium_for_using(&mol, &sites, &EquilibriumOptions::new("NaOH"), &cat);
/// assert!(matches!(naoh, Err(EquilibriumError::UnknownBase(_))));
/// ```
pub fn equilibrium_for_using(
    mol: &Molecule,
    sites: &SiteReport,
    opts: &EquilibriumOptions,
    cat: &crate::advice::Catalogue,
) -> Result<Equilibrium, EquilibriumError> {
    let base = cat
        .get(&opts.base)
        .ok_or_else(|| EquilibriumError::UnknownBase(opts.base.clone()))?;
    let features = detect_features(mol, sites);
    solve_for_base(
        sites,
        &features.site_unit,
        &features.second_stage_shift,
        base,
        opts,
    )
}

/// Shared by [`equilibrium_for`] and the recommender.
pub(crate) fn solve_for_base(
    sites: &SiteReport,
    site_unit: &[usize],
    second_stage_shift: &[f64],
    base: &Base,
    opts: &EquilibriumOptions,
) -> Result<Equilibrium, EquilibriumError> {
    let mut notes = Vec::new();
    let solvent = opts
        .solvent
        .clone()
        .unwrap_or_else(|| base.usual_solvent().to_string());
    let protic = base
        .acid_solvent
        .as_ref()
        .filter(|p| p.name.eq_ignore_ascii_case(solvent.trim()));
    let site_has = |sc: Scale| {
        sites.sites.iter().any(|s| match sc {
            Scale::Dmso => s.pka_dmso.is_some(),
            Scale::Water => s.pka_water.is_some(),
            Scale::Thf => false,
        })
    };
    let choice = choose_scale(base, protic.is_some(), opts.scale, site_has)
        .ok_or_else(|| EquilibriumError::NoCommonScale(base.name.clone()))?;
    let (scale, base_pka) = (choice.site_scale, choice.base_pka);
    notes.push(choice.note.clone());
    if base.family.is_metal_base() && protic.is_none() {
        let pka = |x: &crate::sites::Site| match scale {
            Scale::Water => x.pka_water,
            _ => x.pka_dmso,
        };
        let min_carbon = sites
            .sites
            .iter()
            .filter(|x| x.is_carbon() && !x.background)
            .filter_map(pka)
            .fold(f64::INFINITY, f64::min);
        if sites
            .sites
            .iter()
            .any(|x| !x.is_carbon() && pka(x).map(|p| p > min_carbon).unwrap_or(false))
        {
            notes.push(format!(
                "this is the equilibrium composition; in practice {} takes O–H, N–H and S–H protons first (fast proton transfer), even where their pKa is higher than the C–H (common practice)",
                base.name
            ));
        }
    }
    let units = site_units(sites, site_unit, second_stage_shift, scale, &[], &mut notes);
    if units.is_empty() {
        return Err(EquilibriumError::NoSites);
    }
    let a0 = protic.map(|p| p.molar).unwrap_or(0.0);
    if let Some(p) = protic {
        notes.push(format!(
            "the solvent {} is the base's conjugate acid and is counted at {} mol/L (neat liquid)",
            p.name, p.molar
        ));
    }
    notes.push(format!(
        "substrate {} mol/L, {} equiv {} in {}; activities taken as concentrations",
        opts.concentration, opts.equivalents, base.name, solvent
    ));
    let mut e = solve(&EquilibriumInput {
        units,
        base_pka,
        equivalents: opts.equivalents,
        concentration: opts.concentration,
        acid_solvent_molar: a0,
    })?;
    e.base = base.name.clone();
    e.scale = scale;
    e.acid_solvent = protic.map(|p| (p.name.clone(), p.molar));
    e.notes = notes;
    Ok(e)
}
