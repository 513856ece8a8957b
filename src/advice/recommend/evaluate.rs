//! One catalogue base judged for the target under the mode in use, and the notes of a reported base.

use super::*;

pub(super) fn evaluate<'a>(ctx: &Ctx, base: &'a Base) -> Eval<'a> {
    let opts = ctx.opts;
    let t = &ctx.sites.sites[ctx.target];
    let solvent: Cow<'a, str> = match &opts.solvent {
        Some(s) => Cow::Owned(s.clone()),
        None => Cow::Borrowed(base.usual_solvent()),
    };
    let protic_solvent = base
        .acid_solvent
        .as_ref()
        .filter(|p| p.name.eq_ignore_ascii_case(solvent.trim()));
    let mut ev = Eval {
        base,
        solvent: solvent.clone(),
        scale: None,
        scale_note: String::new(),
        counted: ctx.none_counted.0.clone(),
        equivalents: 0.0,
        conversion: 0.0,
        lean: None,
        eq_notes: Vec::new(),
        exclude: ctx.none_counted.1.clone(),
        reasons: Vec::new(),
        notes: Vec::new(),
        score: 0.0,
        marginal: false,
        no_solvent_check: false,
        words: None,
    };
    let requested = ctx
        .requested
        .map(|r| std::ptr::eq(r, base))
        .unwrap_or(false);
    // Reasons are worded unless the caller wants the kinds only; a
    // requested base's reasons always are (they become its warning).
    let word = opts.word_rejections || requested;
    // Notes are worded only for a base that is reported (accepted or
    // requested); rejected bases report their reasons only.
    let target_has = |sc: Scale| match sc {
        Scale::Dmso => t.pka_dmso.is_some(),
        Scale::Water => t.pka_water.is_some(),
        Scale::Thf => false,
    };
    // Criterion scale: consistent, DMSO first; but a hydroxide or alkoxide in
    // a protic medium is levelled by it (its conjugate acid is water or an
    // alcohol), so it is judged on the water scale, never through the DMSO
    // value of water or the alcohol (issue 5).
    let levelled = matches!(base.family, BaseFamily::Hydroxide | BaseFamily::Alkoxide)
        && protic_medium(&solvent);
    if levelled && opts.scale.is_none() && !target_has(Scale::Water) {
        ev.reasons.push((
            RejectKind::NoComparablePka,
            worded(word, || format!(
                "judged on the water scale in {solvent} (levelled by its conjugate acid); the target has no water-scale estimate"
            )),
        ));
        side_reaction_checks(ctx.f, base, word, &mut ev.reasons);
        if requested {
            ev.notes.extend(unusual_solvent_note(opts, base));
        }
        return ev;
    }
    let Some(choice) = choose_scale(base, levelled, opts.scale, target_has) else {
        ev.reasons.push((
            RejectKind::NoComparablePka,
            worded(word, || "no pKa scale shared with the target".into()),
        ));
        if requested {
            ev.notes.extend(unusual_solvent_note(opts, base));
        }
        return ev;
    };
    let (scale, base_pka, mismatch) = (choice.site_scale, choice.base_pka, choice.mismatch);
    ev.scale = Some(scale);
    let Some(t_pka) = pka_on(t, scale) else {
        ev.reasons.push((
            RejectKind::NoComparablePka,
            worded(word, || "the target has no value on this scale".into()),
        ));
        if requested {
            ev.notes.extend(unusual_solvent_note(opts, base));
            ev.scale_note = choice.note.clone();
        }
        return ev;
    };
    let (counted, counted_sites) = counted_for(ctx, base, scale, protic_solvent.is_some());
    ev.counted = counted;
    let n_counted: usize = ev.counted.iter().map(|c| c.protons).sum();
    let needed = match opts.purpose {
        Purpose::Stoichiometric | Purpose::InSitu => {
            ctx.plan.per_target + ctx.plan.extra + n_counted as f64 + PRACTICAL_EXCESS
        }
        Purpose::Catalytic => n_counted as f64 + ctx.plan.per_target,
    };
    ev.equivalents = opts.equivalents.unwrap_or(needed);
    // Counted protons are removed first: their sites leave the equilibrium
    // together with the base they consume.
    let left = |eq: f64| (eq - n_counted as f64).max(0.0);
    // Acceptance is judged at the needed equivalents; the reported
    // composition uses the requested equivalents when given.
    let crit = solve_lean(ctx, base_pka, scale, left(needed), 0.0, &counted_sites);
    let crit_conv = crit.map(|e| e.1).unwrap_or(0.0);
    let reported = if opts.equivalents.is_some() {
        solve_lean(
            ctx,
            base_pka,
            scale,
            left(ev.equivalents),
            0.0,
            &counted_sites,
        )
    } else {
        crit
    };
    ev.conversion = reported.map(|e| e.1).unwrap_or(0.0);
    ev.lean = reported.map(|e| e.0);
    let mut solvent_conv: Option<f64> = None;
    // In the base's own protic solvent: water scale, solvent counted.
    let mut no_water_in: Option<&ProticSolvent> = None;
    let mut in_solvent_eq: Option<InSolvent> = None;
    if let Some(p) = protic_solvent {
        let in_solvent = choose_scale(base, true, None, target_has)
            .filter(|c| c.mismatch == 0.0 && c.site_scale == Scale::Water);
        match in_solvent {
            None => {
                ev.no_solvent_check = true;
                no_water_in = Some(p);
            }
            Some(c2) => {
                let (sc2, bp2) = (c2.site_scale, c2.base_pka);
                let at_needed = solve_lean(ctx, bp2, sc2, left(needed), p.molar, &counted_sites);
                solvent_conv = at_needed.map(|e| e.1);
                let rep = if opts.equivalents.is_some() {
                    solve_lean(ctx, bp2, sc2, left(ev.equivalents), p.molar, &counted_sites)
                } else {
                    at_needed
                };
                if let Some((e2, conv2)) = rep {
                    ev.conversion = conv2;
                    ev.scale = Some(sc2);
                    ev.lean = Some(e2);
                    in_solvent_eq = Some(InSolvent {
                        solvent: p,
                        choice: c2,
                        conversion: conv2,
                    });
                }
            }
        }
    }
    // Marginal acceptance (central and optimistic conversion, sigma, mixed
    // scales) and the drained-equilibrium fraction, worded at the end.
    let mut marginal_note: Option<(f64, f64, f64, bool)> = None;
    let mut drained_note: Option<f64> = None;
    match opts.purpose {
        Purpose::Stoichiometric => {
            // In its own solvent (NaOEt in EtOH) a levelled base is judged by
            // the equilibrium with the solvent counted (below); elsewhere by
            // the 99 % rule on the water scale.
            let own_solvent_rule = levelled && solvent_conv.is_some();
            let mut weak_crit = crit_conv < ctx.plan.min_fraction && !own_solvent_rule;
            if weak_crit {
                // Within the combined uncertainty of the target estimate and
                // any scale mismatch? Solved only where it can matter: a base
                // below the marginal floor at the central values is rejected
                // anyway.
                let sigma = (t.uncertainty.max(0.0).powi(2) + mismatch.powi(2)).sqrt();
                if sigma > 0.0 && crit_conv >= MIN_MARGINAL_CONVERSION {
                    let optimistic = solve_lean(
                        ctx,
                        base_pka + sigma,
                        scale,
                        left(needed),
                        0.0,
                        &counted_sites,
                    )
                    .map(|e| e.1)
                    .unwrap_or(0.0);
                    if optimistic >= ctx.plan.min_fraction {
                        weak_crit = false;
                        ev.marginal = true;
                        marginal_note = Some((crit_conv, optimistic, sigma, mismatch > 0.0));
                    }
                }
            }
            let acc_solvent = solvent_conv.unwrap_or(crit_conv);
            let weak_solvent = solvent_conv.is_some() && acc_solvent < MIN_IN_SOLVENT_CONVERSION;
            if weak_crit || weak_solvent {
                let mut uncounted: Option<(&[usize], f64)> = None;
                if let Some((e, _)) = &crit {
                    // Units that cannot reach 1 % are skipped unsolved: a
                    // microsite's fraction is at most its unit's, and that
                    // is below 10^b / (1 + 10^b) for b = the largest
                    // log10 K of the unit + s + log10(microsites).
                    let units = &cached_units(ctx, e.scale).0;
                    for u in units {
                        let n = u.alternatives.len();
                        let top = u
                            .alternatives
                            .iter()
                            .filter(|m| !counted_sites.contains(&m.site))
                            .map(|m| e.base_pka - m.pka)
                            .fold(f64::NEG_INFINITY, f64::max);
                        let bound = top + e.s + if n > 1 { (n as f64).log10() } else { 0.0 };
                        // (NaN, which cannot arise, would not be skipped
                        // wrongly either: no fraction passes x > 0.01 then.)
                        if bound.is_nan() || bound < -2.0 {
                            continue;
                        }
                        let stop = unit_sites(ctx, e, &counted_sites, u, &mut |m, x| {
                            let hit = !ctx.target_unit.contains(&m.site)
                                && !ev.counted.iter().any(|c| c.site == m.site)
                                && x > 0.01;
                            if hit {
                                uncounted = Some((&m.atoms, m.pka));
                            }
                            hit
                        });
                        if stop {
                            break;
                        }
                    }
                }
                let mut reason = String::new();
                match uncounted {
                    Some(_) if weak_crit && !word => {
                        ev.reasons.push((RejectKind::UncountedProton, reason));
                    }
                    _ if !word => ev.reasons.push((RejectKind::TooWeak, reason)),
                    Some(u) if weak_crit => {
                        reason.reserve(112);
                        reason.push_str("also takes the uncounted proton at atoms [");
                        for (k, a) in u.0.iter().enumerate() {
                            if k > 0 {
                                reason.push_str(", ");
                            }
                            numfmt::push_usize(&mut reason, *a);
                        }
                        reason.push_str("] (pKa ");
                        numfmt::push_fixed1(&mut reason, u.1);
                        reason.push_str("); target only ");
                        push_conv_text(&mut reason, crit_conv);
                        ev.reasons.push((RejectKind::UncountedProton, reason));
                    }
                    _ => {
                        reason.reserve(112);
                        let conv = if weak_solvent { acc_solvent } else { crit_conv };
                        reason.push_str("too weak: pKa ");
                        reason.push_str(&choice.base_pka_text);
                        reason.push_str(" vs target ");
                        reason.push_str(target_pka_text(ctx, scale, t_pka));
                        reason.push_str(", ");
                        push_conv_text(&mut reason, conv);
                        reason.push_str(" at equilibrium ");
                        if weak_solvent {
                            reason.push_str("in ");
                            reason.push_str(&ev.solvent);
                        } else {
                            reason.push_str("on the ");
                            reason.push_str(scale.name());
                            reason.push_str(" scale");
                        }
                        ev.reasons.push((RejectKind::TooWeak, reason));
                    }
                }
            } else if solvent_conv.is_some() && acc_solvent < ctx.plan.min_fraction {
                drained_note = Some(acc_solvent);
            }
        }
        Purpose::InSitu => {
            let acc = solvent_conv.unwrap_or(crit_conv);
            if acc < ctx.plan.min_fraction {
                let reason = worded(word, || {
                    small_fraction_reason(
                        "too weak even with the electrophile present: ",
                        acc,
                        &choice.base_pka_text,
                        target_pka_text(ctx, scale, t_pka),
                        scale,
                    )
                });
                ev.reasons.push((RejectKind::TooWeak, reason));
            }
        }
        Purpose::Catalytic => {
            if matches!(
                base.family,
                BaseFamily::LithiumAmide
                    | BaseFamily::Silylamide
                    | BaseFamily::Alkyllithium
                    | BaseFamily::Hydride
                    | BaseFamily::MetalAmide
            ) {
                ev.reasons.push((
                    RejectKind::NotCatalytic,
                    worded(word, || "a stoichiometric reagent that is consumed irreversibly; not used in catalytic amounts".into()),
                ));
            }
            let acc = solvent_conv.unwrap_or(crit_conv);
            if acc < ctx.plan.min_fraction {
                let reason = worded(word, || {
                    small_fraction_reason(
                        "too weak even for catalytic use: ",
                        acc,
                        &choice.base_pka_text,
                        target_pka_text(ctx, scale, t_pka),
                        scale,
                    )
                });
                ev.reasons.push((RejectKind::TooWeak, reason));
            }
        }
    }
    ev.exclude = counted_sites;
    side_reaction_checks(ctx.f, base, word, &mut ev.reasons);
    let accepted = ev.reasons.is_empty();
    if accepted || requested {
        ev.words = Some(Box::new(Words {
            choice,
            scale,
            crit_conv,
            n_counted,
            accepted,
            no_water_in,
            in_solvent: in_solvent_eq,
            marginal: marginal_note,
            drained: drained_note,
        }));
    }
    // The score only ranks acceptable bases.
    if accepted {
        ev.score = score(ctx, &ev, base_pka - t_pka);
    }
    ev
}

/// Writes the notes, scale note and equilibrium notes of a reported base
/// (see [`Words`]), in their reported order: solvent, the equilibrium in the
/// base's own solvent, the equilibrium's own notes (accepted bases only),
/// then marginal acceptance and a drained equilibrium.
pub(super) fn word_notes(ctx: &Ctx, ev: &mut Eval) {
    let Some(w) = ev.words.take() else {
        return;
    };
    ev.notes.extend(unusual_solvent_note(ctx.opts, ev.base));
    ev.scale_note = w.choice.note.clone();
    if let Some(p) = w.no_water_in {
        ev.notes.push(format!(
            "the target has no water-scale value, so the equilibrium in {} was not computed; the {} comparison overstates an alkoxide or hydroxide in its own solvent",
            p.name,
            w.scale.name()
        ));
    }
    if let Some(ins) = &w.in_solvent {
        let p = ins.solvent;
        ev.eq_notes = vec![
            ins.choice.note.clone(),
            format!(
                "{} counted at {} mol/L as the base's conjugate acid",
                p.name, p.molar
            ),
        ];
        ev.notes.push(format!(
            "in {} ({} mol/L, water scale) {:.3}% of the target is deprotonated at equilibrium",
            p.name,
            p.molar,
            100.0 * ins.conversion
        ));
        ev.scale_note = format!(
            "{} (criterion checked on {}: {:.1}%)",
            ins.choice.note,
            w.scale.name(),
            100.0 * w.crit_conv
        );
    }
    let notes_at = ev.lean.is_some().then_some(ev.notes.len());
    if let Some((central, optimistic, sigma, mixed)) = w.marginal {
        ev.notes.push(format!(
            "marginal: {:.1}% at the central estimates, {:.1}% one standard uncertainty ({sigma:.1} units{}) in the base's favour",
            100.0 * central,
            100.0 * optimistic,
            if mixed { ", including the scale mismatch" } else { "" }
        ));
    }
    if let Some(acc) = w.drained {
        ev.notes.push(format!(
            "the equilibrium in {} lies {:.0}% to the anion; the electrophile pulls it over as the anion is consumed (common practice)",
            ev.solvent,
            100.0 * acc
        ));
    }
    if let (Some(at), true) = (notes_at, w.accepted) {
        // Notes of the equilibrium itself (counted protons, acid units).
        let unit_notes: &[String] = &cached_units(ctx, w.scale).1;
        let mut notes = Vec::with_capacity(unit_notes.len() + 1);
        if w.n_counted > 0 {
            let n = format!(
                "the {} counted proton(s) go first and consume base; the conversion is the whole equilibrium at these equivalents",
                w.n_counted
            );
            if !ev.eq_notes.contains(&n) {
                notes.push(n);
            }
        }
        notes.extend(
            unit_notes
                .iter()
                .filter(|n| !ev.eq_notes.contains(n))
                .cloned(),
        );
        ev.notes.splice(at..at, notes);
    }
}

/// The note on a requested solvent that is not among the base's usual ones
/// (None when no solvent was requested or it is a usual one).
pub(super) fn unusual_solvent_note(opts: &AdviceOptions, base: &Base) -> Option<String> {
    let sv = opts.solvent.as_ref()?;
    let usual = base
        .solvents
        .iter()
        .any(|x| x.eq_ignore_ascii_case(sv.trim()));
    (!usual).then(|| {
        format!(
            "{} is not among the usual solvents for {} ({}); solubility and aggregation may differ from what the pKa comparison assumes",
            sv,
            base.name,
            base.solvents.join(", ")
        )
    })
}

/// "too weak …: X of the target as anion at equilibrium (pKa B against T,
/// SCALE scale)", the reason of a base below the fraction its mode needs.
fn small_fraction_reason(
    lead: &str,
    fraction: f64,
    base_pka: &str,
    target_pka: &str,
    scale: Scale,
) -> String {
    let mut reason = String::with_capacity(112);
    reason.push_str(lead);
    push_conv_text(&mut reason, fraction);
    reason.push_str(" of the target as anion at equilibrium (pKa ");
    reason.push_str(base_pka);
    reason.push_str(" against ");
    reason.push_str(target_pka);
    reason.push_str(", ");
    reason.push_str(scale.name());
    reason.push_str(" scale)");
    reason
}

/// The text of a rejection reason, or an empty string when reasons are not
/// worded ([`AdviceOptions::word_rejections`]): bulk records that name the
/// ruled-out bases only spare the formatting of every reason.
pub(super) fn worded(word: bool, text: impl FnOnce() -> String) -> String {
    if word {
        text()
    } else {
        String::new()
    }
}
