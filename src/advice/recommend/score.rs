//! Ranking of acceptable bases: commonness, hazards, margin and the fit of the base family to the mode.

use super::*;

/// How common, cheap and easy to source a base is, as a ranking penalty:
/// the `rarity` column of `fragments/bases.tsv` (common practice: 0 for
/// everyday stock, 0.5 for reagents bought as solutions or costly, 1 for
/// specialist reagents, 2.5 for costly metal-free superbases).
pub fn commonness_penalty(base: &Base) -> f64 {
    base.rarity
}

/// Ranking of acceptable bases, lower first: a chemist picks the mildest
/// adequate, common and cheap base that meets the criteria. The score adds
/// (1) [`commonness_penalty`]; (2) excess strength: 0.1 per pKa unit beyond
/// 10 units more than needed (stronger than needed invites side reactions)
/// and, for a stoichiometric use, 0.2 per unit short of a 3-unit margin;
/// (3) handling hazards (pyrophoric 3, hydrogen evolution 0.4, cryogenic 0.4,
/// toxic 0.3); (4) the chemistry: marginal acceptance 2.5, no equilibrium
/// check in the base's own solvent 1, weakly nucleophilic base beside a
/// carbonyl or nitrile 0.7, a base that enolises a simple carbonyl compound
/// slowly or reversibly 2 (LDA -0.5 there), the alkoxide matching an ester
/// -0.8, carbonates and hydrides (heterogeneous) 0.3, a lithium amide,
/// organolithium or metal amide for an O–H, N–H or S–H target 1.5.
/// [`commonness_penalty`].
pub(super) fn base_penalty(b: &Base) -> f64 {
    b.rarity
}

/// Position of `b` in the catalogue when it is a catalogue entry.
pub(super) fn catalogue_slot(cat: &crate::advice::Catalogue, b: &Base) -> Option<usize> {
    let p = b as *const Base;
    cat.bases
        .as_ptr_range()
        .contains(&p)
        .then(|| (p as usize - cat.bases.as_ptr() as usize) / std::mem::size_of::<Base>())
}

pub(super) fn score(ctx: &Ctx, ev: &Eval, margin: f64) -> f64 {
    let b = ev.base;
    let f = ctx.f;
    let mut s = base_penalty(b);
    if ev.marginal {
        s += 2.5;
    }
    if ev.no_solvent_check {
        s += 1.0;
    }
    // Stronger than needed invites side reactions; keep a sensible margin.
    s += 0.1 * (margin - 10.0).max(0.0);
    match ctx.opts.purpose {
        Purpose::Stoichiometric => s += 0.2 * (3.0 - margin).max(0.0),
        // A catalyst need not convert the substrate: prefer the mildest.
        Purpose::Catalytic => s += 0.2 * (margin + 2.0).max(0.0),
        // The electrophile drains the equilibrium: the mildest base that
        // still reacts is best.
        Purpose::InSitu => s += 0.1 * margin.max(0.0),
    }
    if b.has_hazard(Hazard::Pyrophoric) {
        s += 3.0;
    }
    if b.has_hazard(Hazard::HydrogenEvolution) {
        s += 0.4;
    }
    if b.has_hazard(Hazard::Cryogenic) {
        s += 0.4;
    }
    if b.has_hazard(Hazard::Toxic) {
        s += 0.3;
    }
    let carbonyls = f.ketone || f.aldehyde || f.ester || f.nitrile;
    if b.nucleophilic == Nucleophilicity::Weak && carbonyls {
        s += 0.7;
    }
    let dicarbonyl = f
        .sites
        .get(ctx.target)
        .map(|x| x.dicarbonyl)
        .unwrap_or(false);
    let monocarbonyl =
        ctx.target_carbonyl && !dicarbonyl && ctx.opts.purpose == Purpose::Stoichiometric;
    if monocarbonyl && !matches!(b.family, BaseFamily::LithiumAmide | BaseFamily::Silylamide) {
        // Self-condensation competes unless enolisation is fast and complete.
        s += 2.0;
    }
    if monocarbonyl && b.family == BaseFamily::LithiumAmide && b.name == "LDA" {
        s -= 0.5;
    }
    // An O–H, N–H or S–H target gives up its proton fast to any base strong
    // enough: the cryogenic lithium amides and the organolithiums, kept for
    // C–H acids, buy nothing there over sodium hydride or an alkoxide
    // (common practice).
    let hetero_target = ctx
        .sites
        .sites
        .get(ctx.target)
        .map(|t| !t.is_carbon())
        .unwrap_or(false);
    if hetero_target
        && matches!(
            b.family,
            BaseFamily::LithiumAmide | BaseFamily::Alkyllithium | BaseFamily::MetalAmide
        )
    {
        s += 1.5;
    }
    if matches!(b.family, BaseFamily::Carbonate | BaseFamily::Hydride) {
        s += 0.3;
    }
    if b.family == BaseFamily::Alkoxide
        && f.ester
        && alkoxy_of(b)
            .map(|a| f.ester_alkoxy.iter().all(|e| e == a))
            .unwrap_or(false)
    {
        s -= 0.8;
    }
    if ctx.opts.purpose == Purpose::Catalytic && b.family.is_neutral() {
        // Amines and amidines are the usual catalytic bases; pyridines are
        // acyl-transfer catalysts and weak Brønsted bases.
        s -= if b.family == BaseFamily::Pyridine {
            -0.5
        } else {
            1.0
        };
    }
    s
}

pub(super) fn temperature(base: &Base) -> Temperature {
    Temperature {
        low_c: base.temp_min_c,
        high_c: base.temp_max_c,
    }
}
