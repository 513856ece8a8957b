//! The equilibrium behind each judgement: counted protons, the lean solver and its memo, the full equilibrium of the reported base.

use super::*;
use crate::mol::Element;

pub(super) fn pka_on(site: &Site, scale: Scale) -> Option<f64> {
    match scale {
        Scale::Water => site.pka_water,
        _ => site.pka_dmso,
    }
}

/// Is `solvent` a protic medium: water or an alcohol, alone or in a mixture
/// ("water/THF", "EtOH")?
pub(super) fn protic_medium(solvent: &str) -> bool {
    solvent
        .split(|c: char| !c.is_ascii_alphanumeric())
        .any(|w| {
            [
                "water",
                "h2o",
                "meoh",
                "etoh",
                "iproh",
                "tbuoh",
                "methanol",
                "ethanol",
                "isopropanol",
                "propanol",
                "butanol",
            ]
            .iter()
            .any(|p| w.eq_ignore_ascii_case(p))
        })
}

pub(super) fn alkoxy_of(base: &Base) -> Option<&'static str> {
    match base.conjugate_acid.as_str() {
        "CO" => Some("methyl"),
        "CCO" => Some("ethyl"),
        "CC(C)(C)O" => Some("tert-butyl"),
        "CC(C)O" => Some("isopropyl"),
        _ => None,
    }
}

/// A small number for a catalogue base's counter-ion (0: none), the same
/// for every base with the same ion; None for a base outside the catalogue
/// in use. The embedded catalogue's table is built once for the run; another
/// catalogue's once per call of the recommender (in `ctx`), so two
/// catalogues never share numbers.
pub(super) fn counter_ion_id(ctx: &Ctx, base: &Base) -> Option<u32> {
    static EMBEDDED: std::sync::OnceLock<Vec<u32>> = std::sync::OnceLock::new();
    let slot = catalogue_slot(ctx.cat, base)?;
    let table = match catalogue() {
        Ok(e) if std::ptr::eq(e, ctx.cat) => EMBEDDED.get_or_init(|| counter_ion_table(e)),
        _ => ctx.counter_ions.get_or_init(|| counter_ion_table(ctx.cat)),
    };
    table.get(slot).copied()
}

/// Counter-ion numbers per catalogue slot, in order of first appearance.
fn counter_ion_table(cat: &Catalogue) -> Vec<u32> {
    let mut seen: Vec<&str> = Vec::new();
    cat.bases
        .iter()
        .map(|b| match b.counter_ion.as_deref() {
            None => 0,
            Some(ion) => match seen.iter().position(|s| *s == ion) {
                Some(p) => p as u32 + 1,
                None => {
                    seen.push(ion);
                    seen.len() as u32
                }
            },
        })
        .collect()
}

pub(super) fn counted_for(ctx: &Ctx, base: &Base, scale: Scale, protic: bool) -> CountedSet {
    let metal = base.family.is_metal_base();
    // The counter-ion is named only by the fast-transfer rule of a metal
    // base outside a protic solvent; elsewhere it does not split the memo.
    let ion = if metal && !protic {
        counter_ion_id(ctx, base)
    } else {
        Some(0)
    };
    let Some(ion) = ion else {
        // Not a catalogue base: no memo.
        let protons = count_protons(ctx, base, scale, protic);
        let sites: Rc<[usize]> = protons.iter().map(|c| c.site).collect();
        return (Rc::new(protons), sites);
    };
    let sc = match scale {
        Scale::Dmso => 0,
        Scale::Water => 1,
        Scale::Thf => 2,
    };
    let key: CountedKey = sc | u32::from(metal) << 2 | u32::from(protic) << 3 | ion << 4;
    if let Some((_, v)) = ctx.counted_memo.borrow().iter().find(|(k, _)| *k == key) {
        return v.clone();
    }
    let protons = count_protons(ctx, base, scale, protic);
    let sites: Rc<[usize]> = protons.iter().map(|c| c.site).collect();
    let v = (Rc::new(protons), sites);
    ctx.counted_memo.borrow_mut().push((key, v.clone()));
    v
}

pub(super) fn lean_key(base_pka: f64, scale: Scale, equivalents: f64, a0: f64) -> LeanKey {
    let sc = match scale {
        Scale::Dmso => 0,
        Scale::Water => 1,
        Scale::Thf => 2,
    };
    (base_pka.to_bits(), sc, equivalents.to_bits(), a0.to_bits())
}

/// Position of the memo entry for these inputs (no allocation; keys are
/// unique, and the newest entries, searched first, are the likeliest hits:
/// neighbouring catalogue bases often share a pKa).
pub(super) fn memo_position(ctx: &Ctx, key: LeanKey, exclude: &[usize]) -> Option<usize> {
    ctx.lean_memo
        .borrow()
        .iter()
        .rposition(|e| e.key == key && *e.exclude == *exclude)
}

/// In catalytic use a C–H site is counted (takes its own equivalent of
/// base) only when it is at least this many pKa units more acidic than the
/// target (common practice: sites of similar acidity exchange the catalyst
/// reversibly).
pub(super) const CATALYTIC_CH_GAP: f64 = 3.0;

/// Across scales (one site with only a water value, the other with only a
/// DMSO value) a site is counted as more acidic only when its pKa is this
/// much lower: the same acid differs by up to several units between water
/// and DMSO (carbon acids most, ammoniums least; common practice).
pub(super) const CROSS_SCALE_GAP: f64 = 8.0;

pub(super) fn count_protons(
    ctx: &Ctx,
    base: &Base,
    scale: Scale,
    protic: bool,
) -> Vec<CountedProton> {
    let t = &ctx.sites.sites[ctx.target];
    let t_pka = pka_on(t, scale);
    let mut out: Vec<CountedProton> = Vec::new();
    let mut units_seen: Vec<usize> = Vec::new();
    for (i, s) in ctx.sites.sites.iter().enumerate() {
        // Background C–H (issue 11) never consumes base meant for a real
        // site: see `site_units`.
        if ctx.target_unit.contains(&i) || s.background {
            continue;
        }
        // Compare on the chosen scale, else on the other one; values on
        // different scales (an ammonium with only a water value against a
        // C–H with only a DMSO value) count only across a wide gap.
        let cmp = match (pka_on(s, scale), t_pka) {
            (Some(a), Some(b)) => Some((a, b)),
            _ => match (s.pka_dmso.or(s.pka_water), t.pka_dmso.or(t.pka_water)) {
                (Some(a), Some(b)) if s.pka_dmso.is_some() == t.pka_dmso.is_some() => Some((a, b)),
                (Some(a), Some(b)) if a + CROSS_SCALE_GAP < b => Some((a, b)),
                _ => None,
            },
        };
        let cross_scale = pka_on(s, scale).is_none() || t_pka.is_none();
        let hetero = matches!(s.element, Element::O | Element::N | Element::S);
        // A catalytic amount of base is not titrated by a C–H of about the
        // target's acidity: that anion forms and gives its proton back as
        // reversibly as the target's. Only a C–H well below the target
        // (a dianion's gap) takes its own equivalent.
        let gap = if !hetero && ctx.opts.purpose == Purpose::Catalytic {
            CATALYTIC_CH_GAP
        } else {
            0.0
        };
        let more_acidic = cmp.map(|(a, b)| a + gap < b).unwrap_or(false);
        let metal_rule = hetero
            && base.family.is_metal_base()
            && !protic
            && match s.element {
                Element::O | Element::S => true,
                _ => match (s.pka_dmso, t.pka_dmso) {
                    (Some(a), Some(b)) => a <= b + 6.0,
                    _ => false,
                },
            };
        if !(more_acidic || metal_rule) {
            continue;
        }
        let protons = if hetero {
            s.atoms.len()
        } else {
            let u = ctx.f.site_unit.get(i).copied().unwrap_or(usize::MAX - i);
            if units_seen.contains(&u) {
                continue;
            }
            units_seen.push(u);
            1
        };
        let reason = if more_acidic {
            let mut r = String::with_capacity(48);
            r.push_str("more acidic than the target (");
            if cross_scale {
                let name = |x: &crate::sites::Site| {
                    if x.pka_dmso.is_some() {
                        "dmso"
                    } else {
                        "water"
                    }
                };
                r.push_str(name(s));
                r.push_str(" pKa ");
                numfmt::push_fixed1(&mut r, cmp.map(|c| c.0).unwrap_or(f64::NAN));
                r.push_str(" vs ");
                r.push_str(name(t));
                r.push(' ');
            } else {
                r.push_str(scale.name());
                r.push_str(" pKa ");
                numfmt::push_fixed1(&mut r, cmp.map(|c| c.0).unwrap_or(f64::NAN));
                r.push_str(" vs ");
            }
            numfmt::push_fixed1(&mut r, cmp.map(|c| c.1).unwrap_or(f64::NAN));
            r.push(')');
            r
        } else {
            let mut r = String::with_capacity(160);
            r.push_str(s.element.symbol());
            r.push_str("–H proton transfer is fast: ");
            r.push_str(base.counter_ion.as_deref().unwrap_or("metal"));
            r.push_str(" bases in aprotic solvents take it before the C–H even though its DMSO pKa is somewhat higher (common practice)");
            r
        };
        out.push(CountedProton {
            site: i,
            atoms: s.atoms.clone(),
            element: s.element,
            class: s.class.clone(),
            pka: pka_on(s, scale),
            protons,
            reason,
        });
    }
    out
}

pub(super) fn solve_with(
    ctx: &Ctx,
    base_pka: f64,
    scale: Scale,
    equivalents: f64,
    a0: f64,
    exclude: &[usize],
    notes: &mut Vec<String>,
) -> Option<Equilibrium> {
    let (cached, cached_notes) = match scale {
        Scale::Water => &ctx.units_water,
        _ => &ctx.units_dmso,
    };
    notes.extend(cached_notes.iter().cloned());
    let units: Vec<_> = cached
        .iter()
        .cloned()
        .filter_map(|mut u| {
            u.alternatives.retain(|m| !exclude.contains(&m.site));
            (!u.alternatives.is_empty()).then_some(u)
        })
        .collect();
    solve(&EquilibriumInput {
        units,
        base_pka,
        equivalents,
        concentration: ctx.opts.concentration,
        acid_solvent_molar: a0,
    })
    .ok()
}

pub(super) fn cached_units<'c>(ctx: &'c Ctx, scale: Scale) -> &'c (Vec<AcidUnit>, Vec<String>) {
    match scale {
        Scale::Water => &ctx.units_water,
        _ => &ctx.units_dmso,
    }
}

/// log10 of a unit's summed K over its microsites not in `exclude`
/// (`-inf` when none is left).
pub(super) fn unit_logk(u: &AcidUnit, shift: f64, exclude: &[usize]) -> f64 {
    // Most units have one microsite: its own value (the sum is exact then).
    if let [m] = u.alternatives.as_slice() {
        return if exclude.contains(&m.site) {
            f64::NEG_INFINITY
        } else {
            shift - m.pka
        };
    }
    log10_sum_exp10(
        u.alternatives
            .iter()
            .filter(|m| !exclude.contains(&m.site))
            .map(move |m| shift - m.pka),
    )
}

/// The same equilibrium as [`solve_with`] without allocating per site (one
/// buffer of unit constants, reused across calls), with the target's
/// conversion; memoised per molecule (several catalogue bases share a pKa).
pub(super) fn solve_lean(
    ctx: &Ctx,
    base_pka: f64,
    scale: Scale,
    equivalents: f64,
    a0: f64,
    exclude: &Rc<[usize]>,
) -> Option<(Lean, f64)> {
    let key = lean_key(base_pka, scale, equivalents, a0);
    if let Some(p) = memo_position(ctx, key, exclude) {
        return ctx.lean_memo.borrow()[p].solution;
    }
    let solution = solve_lean_uncached(ctx, base_pka, scale, equivalents, a0, exclude)
        .map(|l| (l, lean_conversion_uncached(ctx, &l, exclude)));
    ctx.lean_memo.borrow_mut().push(LeanMemo {
        key,
        exclude: exclude.clone(),
        solution,
    });
    solution
}

pub(super) fn solve_lean_uncached(
    ctx: &Ctx,
    base_pka: f64,
    scale: Scale,
    equivalents: f64,
    a0: f64,
    exclude: &[usize],
) -> Option<Lean> {
    if !(0.0..=1000.0).contains(&equivalents) || !base_pka.is_finite() || base_pka.abs() > 200.0 {
        return None;
    }
    let c = ctx.opts.concentration;
    let mut buf = ctx.logk_buf.borrow_mut();
    buf.clear();
    buf.extend(
        cached_units(ctx, scale)
            .0
            .iter()
            .map(|u| unit_logk(u, base_pka, exclude)),
    );
    let (s, _) = solve_log_ratio(&buf, c, equivalents * c, a0);
    Some(Lean {
        base_pka,
        scale,
        equivalents,
        a0,
        s,
    })
}

/// Deprotonated fraction of every microsite of the units holding the
/// target, in the order of [`solve`]'s `sites`, passed to
/// `visit(microsite, fraction)`; stops when `visit` returns true.
pub(super) fn lean_sites<'c>(
    ctx: &'c Ctx,
    l: &Lean,
    exclude: &[usize],
    mut visit: impl FnMut(&'c Microsite, f64) -> bool,
) {
    let units = &cached_units(ctx, l.scale).0;
    let tu = match l.scale {
        Scale::Water => &ctx.target_units_water,
        _ => &ctx.target_units_dmso,
    };
    for &i in tu {
        if let Some(u) = units.get(i) {
            if unit_sites(ctx, l, exclude, u, &mut visit) {
                return;
            }
        }
    }
}

/// The fractions of one unit's microsites (see [`lean_sites`]); true when
/// `visit` asked to stop.
pub(super) fn unit_sites<'c>(
    ctx: &'c Ctx,
    l: &Lean,
    exclude: &[usize],
    u: &'c AcidUnit,
    visit: &mut impl FnMut(&'c Microsite, f64) -> bool,
) -> bool {
    let b0 = l.equivalents * ctx.opts.concentration;
    let lx = unit_logk(u, l.base_pka, exclude);
    if lx == f64::NEG_INFINITY {
        return false;
    }
    let f = if b0 == 0.0 {
        0.0
    } else {
        let l2 = if let [m] = u.alternatives.as_slice() {
            // One microsite (not excluded: lx is finite).
            l.base_pka - m.pka + l.s
        } else {
            log10_sum_exp10(
                u.alternatives
                    .iter()
                    .filter(|m| !exclude.contains(&m.site))
                    .map(|m| l.base_pka - m.pka + l.s),
            )
        };
        if l2 == f64::NEG_INFINITY {
            0.0
        } else {
            1.0 / (1.0 + exp10(-l2))
        }
    };
    if let [m] = u.alternatives.as_slice() {
        // Its share of the unit is 1 (exactly: 10^0).
        return visit(m, f.clamp(0.0, 1.0));
    }
    for m in u.alternatives.iter().filter(|m| !exclude.contains(&m.site)) {
        let share = exp10(l.base_pka - m.pka - lx);
        if visit(m, (f * share).clamp(0.0, 1.0)) {
            return true;
        }
    }
    false
}

pub(super) fn lean_conversion_uncached(ctx: &Ctx, l: &Lean, exclude: &[usize]) -> f64 {
    let mut total = 0.0;
    lean_sites(ctx, l, exclude, |m, x| {
        if ctx.target_unit.contains(&m.site) {
            total += x;
        }
        false
    });
    total.clamp(0.0, 1.0)
}

/// The full equilibrium (every microsite, anion populations) of a base's
/// reported lean solution.
///
/// Every site takes part (counted protons are not set aside) and the base
/// is the whole of the equivalents advised, so that the conversion reported
/// is the one `acidsite equilibrium` gives for the same base, equivalents
/// and concentration (issue 10).
pub(super) fn full_equilibrium(ctx: &Ctx, ev: &Eval) -> Option<Equilibrium> {
    let l = ev.lean?;
    let mut scratch = Vec::new();
    let mut e = solve_with(
        ctx,
        l.base_pka,
        l.scale,
        ev.equivalents,
        l.a0,
        &[],
        &mut scratch,
    )?;
    e.notes = ev.eq_notes.clone();
    Some(e)
}

/// The target's pKa on `scale` as the reasons write it, worked out once per
/// molecule and scale.
pub(super) fn target_pka_text<'c>(ctx: &'c Ctx, scale: Scale, t_pka: f64) -> &'c str {
    let cell = match scale {
        Scale::Water => &ctx.target_text_water,
        _ => &ctx.target_text_dmso,
    };
    cell.get_or_init(|| numfmt::fixed1(t_pka))
}

/// All reasons in words, separated by "; ".
pub(super) fn join_reasons(reasons: &[(RejectKind, String)]) -> String {
    let mut out = String::with_capacity(reasons.iter().map(|r| r.1.len() + 2).sum());
    for (i, r) in reasons.iter().enumerate() {
        if i > 0 {
            out.push_str("; ");
        }
        out.push_str(&r.1);
    }
    out
}

/// `c` as the advice prose writes a conversion: `{:.1e}` below 0.1 %, else
/// a percentage with one decimal.
pub(super) fn push_conv_text(out: &mut String, c: f64) {
    if c < 1e-3 {
        numfmt::push_exp1(out, c);
    } else {
        numfmt::push_fixed1(out, 100.0 * c);
        out.push('%');
    }
}
