//! The recommender itself: target, reaction and practice row, evaluation of every base, choice of base or reagent system, and the advice assembled.

use super::evaluate::worded;
use super::*;

pub(super) fn advise_core<'d>(
    f: &MoleculeFeatures,
    sites: &SiteReport,
    opts_in: &AdviceOptions,
    smarts_target: Option<&crate::smarts::Target>,
    advice_data: AdviceData<'d>,
) -> Result<Advice<'d>, AdviceError> {
    let cat: &'d Catalogue = advice_data.catalogue();
    let data: &'d Practice = advice_data.practice();
    let opts = opts_in;
    let c = opts.concentration;
    if !(c.is_finite() && c > 0.0 && c <= 20.0) {
        return Err(AdviceError::Invalid("concentration (mol/L)", c));
    }
    if let Some(e) = opts.equivalents {
        if !(e.is_finite() && e > 0.0 && e <= 100.0) {
            return Err(AdviceError::Invalid("equivalents", e));
        }
    }
    let requested = match &opts.base {
        Some(name) => Some(
            cat.get(name)
                .ok_or_else(|| AdviceError::UnknownBase(name.clone()))?,
        ),
        None => None,
    };
    let has_pka = |s: &Site| s.pka_dmso.is_some() || s.pka_water.is_some();
    let (target, chosen_by) = match opts.site {
        Some(atom) => {
            let i = sites
                .sites
                .iter()
                .position(|s| s.atoms.contains(&atom) && has_pka(s))
                .ok_or(AdviceError::NotAcidicAtom(atom))?;
            (i, format!("the site containing atom {atom}, as requested"))
        }
        None => match sites
            .top_carbon
            .filter(|&i| sites.sites.get(i).map(has_pka).unwrap_or(false))
        {
            // `--control` names the side: the site of that side in the same
            // unit as the most acidic C–H (the other α-carbon of the ketone).
            Some(i)
                if opts.control.is_some()
                    && sites.sites[i].regio.is_some()
                    && side_of(opts.control) != sites.sites[i].regio =>
            {
                let unit = f.site_unit.get(i).copied();
                match (0..sites.sites.len()).find(|&j| {
                    f.site_unit.get(j).copied() == unit
                        && sites.sites[j].regio == side_of(opts.control)
                        && has_pka(&sites.sites[j])
                }) {
                    Some(j) => (
                        j,
                        format!(
                            "the {} side of the most acidic C–H unit, as the control asked for",
                            opts.control.map(|c| c.name()).unwrap_or("")
                        ),
                    ),
                    None => (i, "the most acidic C–H site".to_string()),
                }
            }
            Some(i) => (i, "the most acidic C–H site".to_string()),
            None => {
                let i = sites
                    .top_overall
                    .filter(|&i| sites.sites.get(i).map(has_pka).unwrap_or(false))
                    .or_else(|| sites.sites.iter().position(|s| has_pka(s) && !s.background))
                    .ok_or(AdviceError::NoSites)?;
                (
                    i,
                    "the most acidic site (the molecule has no activated C–H with an estimate)"
                        .to_string(),
                )
            }
        },
    };
    let tsite = &sites.sites[target];
    // The planned reaction, the control and the practice row.
    let legacy_catalytic = opts.reaction.is_none() && opts.purpose == Purpose::Catalytic;
    let reaction = opts.reaction.unwrap_or(Reaction::Alkylation);
    let control = opts.control.or(match tsite.regio {
        Some(Regio::Kinetic) => Some(Control::Kinetic),
        Some(Regio::Thermodynamic) => Some(Control::Thermodynamic),
        None => None,
    });
    let row: Option<&'d PracticeRow> = if legacy_catalytic {
        None
    } else {
        smarts_target.and_then(|t| data.find(t, &tsite.atoms, reaction, control))
    };
    let mode = if legacy_catalytic {
        Mode::Catalytic
    } else {
        row.map(|r| r.mode).unwrap_or(data.reaction(reaction).mode)
    };
    let mode_row = data.mode(mode);
    let mut derived = opts_in.clone();
    derived.purpose = match mode {
        Mode::Preformed => Purpose::Stoichiometric,
        Mode::InSitu => Purpose::InSitu,
        _ => Purpose::Catalytic,
    };
    let plan = Plan {
        min_fraction: row
            .and_then(|r| r.min_fraction)
            .unwrap_or(mode_row.min_fraction),
        per_target: row
            .and_then(|r| r.equivalents)
            .unwrap_or(mode_row.equivalents),
        extra: if row.and_then(|r| r.equivalents).is_some() || mode == Mode::Catalytic {
            0.0
        } else {
            data.reaction(reaction).extra_equivalents
        },
    };
    let opts = &derived;
    let tunit = f.site_unit.get(target).copied();
    let target_unit: Vec<usize> = (0..sites.sites.len())
        .filter(|&i| {
            i == target
                || (tunit.is_some()
                    && f.site_unit.get(i).copied() == tunit
                    && sites.sites[i].is_carbon()
                    && tsite.is_carbon())
        })
        .collect();
    let cache = |sc: Scale| {
        let mut notes = Vec::new();
        let units = site_units(
            sites,
            &f.site_unit,
            &f.second_stage_shift,
            sc,
            &target_unit,
            &mut notes,
        );
        (units, notes)
    };
    let units_dmso = cache(Scale::Dmso);
    let units_water = cache(Scale::Water);
    let holding_target = |units: &[AcidUnit]| -> Vec<usize> {
        units
            .iter()
            .enumerate()
            .filter(|(_, u)| u.alternatives.iter().any(|m| target_unit.contains(&m.site)))
            .map(|(i, _)| i)
            .collect()
    };
    let target_units_dmso = holding_target(&units_dmso.0);
    let target_units_water = holding_target(&units_water.0);
    let ctx = Ctx {
        cat,
        data,
        counter_ions: std::cell::OnceCell::new(),
        f,
        sites,
        opts,
        plan,
        target,
        target_unit,
        units_dmso,
        units_water,
        target_units_dmso,
        target_units_water,
        logk_buf: std::cell::RefCell::new(Vec::new()),
        target_carbonyl: f
            .sites
            .get(target)
            .map(|x| x.alpha_carbonyl)
            .unwrap_or(false),
        lean_memo: std::cell::RefCell::new(Vec::new()),
        requested,
        counted_memo: std::cell::RefCell::new(Vec::new()),
        none_counted: (Rc::new(Vec::new()), Rc::from([])),
        target_text_dmso: std::cell::OnceCell::new(),
        target_text_water: std::cell::OnceCell::new(),
    };
    let mut evals: Vec<Eval> = cat.bases.iter().map(|b| evaluate(&ctx, b)).collect();
    // Practice: bases ruled out for this kind of site and reaction, and a
    // preferred base that the equilibrium finds only just short of complete
    // conversion for a preformed anion (lithium and sodium silylamides with
    // esters and amides at -78 °C) accepted with a note.
    // Rank of each catalogue base in the row's preference (by catalogue
    // slot, worked out once per row at load time).
    // Rank of each catalogue base (by its slot, the index into `evals`) in
    // the row's preference, worked out once per row at load time.
    let pref_rank = |slot: usize| -> usize {
        row.and_then(|r| r.rank_by_slot.get(slot).copied())
            .unwrap_or(usize::MAX)
    };
    // Reasons are worded for every base, or for a requested one only
    // (`AdviceOptions::word_rejections`).
    let word_for = |b: &Base| opts.word_rejections || requested.is_some_and(|r| std::ptr::eq(r, b));
    if let Some(r) = row {
        let kind = match r.exclude_kind.as_deref() {
            Some("regio") => RejectKind::Regio,
            Some("mode") => RejectKind::Mode,
            _ => RejectKind::SideReaction,
        };
        for (slot, ev) in evals.iter_mut().enumerate() {
            if r.excluded_by_slot.get(slot).copied().unwrap_or(false) {
                let text = worded(word_for(ev.base), || r.exclude_text.clone());
                ev.reasons.insert(0, (kind, text));
            }
            // The practice row names this base for this kind of site and
            // reaction: the generic concern about a nucleophilic base (an
            // amine with an ester in a Knoevenagel reaction) is one practice
            // has weighed.
            if pref_rank(slot) != usize::MAX
                && ev
                    .reasons
                    .iter()
                    .any(|(k, _)| *k == RejectKind::Nucleophile)
            {
                ev.reasons.retain(|(k, _)| *k != RejectKind::Nucleophile);
                ev.notes.push(format!(
                    "nucleophilic, but the usual base for this reaction and site in practice ({})",
                    r.id
                ));
                if ev.reasons.is_empty() && ev.words.is_none() {
                    // Its notes were not prepared (it looked rejected): the
                    // record shows the practice note alone.
                    ev.score = score(&ctx, ev, 0.0);
                }
            }
            if mode == Mode::Preformed
                && pref_rank(slot) != usize::MAX
                && !ev.reasons.is_empty()
                && ev.reasons.iter().all(|(k, _)| *k == RejectKind::TooWeak)
                && ev.conversion >= MIN_MARGINAL_CONVERSION
            {
                ev.reasons.clear();
                ev.marginal = true;
                // No figure here: the conversion shown beside the base is
                // the whole equilibrium at the advised equivalents, which
                // differs from this criterion (counted protons set aside).
                ev.notes.push(format!(
                    "accepted by practice ({}): the equilibrium estimate is low, but within the uncertainty of the scales; use it as the practice row says, at low temperature with the substrate added to the base",
                    r.id
                ));
                ev.score = score(&ctx, ev, 0.0);
            }
        }
    }
    // The regiochemistry guard (fragments/regio.tsv): under a control, a
    // C–H target is never offered a base of the other side's families,
    // whatever practice row matched (or none). Not for a catalytic
    // reaction: there the enolates interconvert anyway and the product
    // decides (a catalytic hydroxide condenses 2-methylcyclohexanone with an
    // aldehyde on the less substituted side). A side read from the target
    // (not asked for) binds only an enolate (the target next to a C=O
    // group).
    let guarded = mode != Mode::Catalytic && (opts_in.control.is_some() || ctx.target_carbonyl);
    if let (Some(c), true, true) = (control, tsite.is_carbon(), guarded) {
        if let Some(g) = data.regio(c) {
            let text = format!("not for the {} enolate: {}", c.name(), g.reason);
            for ev in evals.iter_mut() {
                let fam = ev.base.family.name();
                // Only a base that would otherwise be offered needs it: one
                // already ruled out says its own reason.
                if g.families.iter().any(|f| f == fam) && ev.reasons.is_empty() {
                    let text = worded(word_for(ev.base), || text.clone());
                    ev.reasons.insert(0, (RejectKind::Regio, text));
                    ev.words = None;
                }
            }
        }
    }
    // Acceptable bases as indices into `evals`: practice's preferred bases
    // first in their order, then the rest best score first (a stable sort:
    // ties keep catalogue order).
    let mut accepted: Vec<usize> = (0..evals.len())
        .filter(|&i| evals[i].reasons.is_empty())
        .collect();
    accepted.sort_by(|&a, &b| {
        pref_rank(a).cmp(&pref_rank(b)).then(
            evals[a]
                .score
                .partial_cmp(&evals[b].score)
                .unwrap_or(std::cmp::Ordering::Equal),
        )
    });
    // A reagent system or route preferred ahead of every acceptable base.
    let system: Option<&'d System> = if requested.is_some() {
        None
    } else {
        row.and_then(|r| {
            let best_base = accepted.first().map(|&i| pref_rank(i));
            r.prefer
                .iter()
                .enumerate()
                .find(|(k, p)| {
                    data.system(p).is_some() && best_base.map(|b| *k < b).unwrap_or(true)
                })
                .and_then(|(_, p)| data.system(p))
        })
    };
    let system_eval: Option<usize> = system
        .and_then(|sy| sy.base.as_deref())
        .and_then(|b| evals.iter().position(|e| e.base.name == b));
    let mut warnings: Vec<Warning> = Vec::new();
    let chosen_at: Option<usize> = match requested {
        Some(b) => {
            let i = evals.iter().position(|e| e.base.name == b.name);
            if let Some(e) = i.map(|i| &evals[i]) {
                if !e.reasons.is_empty() {
                    warnings.push(Warning {
                        kind: WarningKind::RequestedBase,
                        message: format!(
                            "the requested base {} is not suitable here: {}",
                            b.name,
                            join_reasons(&e.reasons)
                        ),
                    });
                }
            }
            i
        }
        None if system.is_some() => system_eval,
        None => accepted.first().copied(),
    };
    // Rejections take their reasons over (nothing reads them after this).
    // Bases the data cannot judge are not chemical rejections: one pass
    // sorts them apart, each list in catalogue order.
    let mut rejected: Vec<Rejection> = Vec::with_capacity(evals.len());
    let mut not_judged: Vec<NotJudged> = Vec::new();
    for e in evals.iter_mut().filter(|e| !e.reasons.is_empty()) {
        let reasons = std::mem::take(&mut e.reasons);
        let kinds: Vec<RejectKind> = reasons.iter().map(|r| r.0).collect();
        let reason = if !word_for(e.base) {
            String::new()
        } else if reasons.len() == 1 {
            reasons.into_iter().next().map(|r| r.1).unwrap_or_default()
        } else {
            join_reasons(&reasons)
        };
        let base = e.base.name.as_str();
        if kinds.iter().all(|k| *k == RejectKind::NoComparablePka) {
            not_judged.push(NotJudged {
                base,
                missing: reason,
            });
        } else {
            rejected.push(Rejection {
                base,
                kind: kinds[0],
                kinds,
                reason,
            });
        }
    }
    // The alternatives listed: acceptable bases other than the chosen one,
    // best first, as many as asked for; only these and the chosen base get
    // their notes worded.
    // Where practice names the bases for this site and reaction, only those
    // are offered as alternatives (a base the equilibrium accepts but
    // nobody uses for the reaction is not advice).
    let practice_listed = row.map(|r| !r.prefer.is_empty()).unwrap_or(false);
    let others: Vec<usize> = accepted
        .iter()
        .copied()
        .filter(|&i| Some(i) != chosen_at)
        .filter(|&i| !practice_listed || pref_rank(i) != usize::MAX)
        .collect();
    let shown = others.len().min(opts.alternatives.unwrap_or(usize::MAX));
    let alternatives_omitted = others.len() - shown;
    for &i in chosen_at.iter().chain(&others[..shown]) {
        if let Some(e) = evals.get_mut(i) {
            word_notes(&ctx, e);
        }
    }
    let chosen: Option<&Eval> = chosen_at.map(|i| &evals[i]);
    if let (Some(r), Some(e), None, None) = (row, chosen, system, requested) {
        if chosen_at.map(pref_rank) == Some(usize::MAX) && !r.prefer.is_empty() {
            warnings.push(Warning {
                kind: WarningKind::NoBase,
                message: format!(
                    "none of the bases practice names for this site and reaction ({}) passes the checks here; {} is the best the catalogue offers: check the reasons under ruled out",
                    r.prefer.join(", "),
                    e.base.name
                ),
            });
        }
    }
    let listed: Vec<&Eval> = others[..shown].iter().map(|&i| &evals[i]).collect();
    if chosen.is_none() && system.is_none() {
        let competing = rejected
            .iter()
            .filter(|r| r.kinds.contains(&RejectKind::UncountedProton))
            .count();
        // Among the bases strong enough to matter (not rejected only as too
        // weak, without a comparable pKa or for the other enolate side), do
        // most fail on a competitor?
        let strong = rejected
            .iter()
            .filter(|r| {
                r.kinds.iter().any(|k| {
                    !matches!(
                        k,
                        RejectKind::TooWeak | RejectKind::NoComparablePka | RejectKind::Regio
                    )
                })
            })
            .count();
        let message = if competing > 0 && competing * 2 >= strong.max(1) {
            "no catalogue base meets the criteria for this target: another site of about the same acidity competes for the base, so selective deprotonation is not expected; protect or differentiate that site, or plan for a mixture".to_string()
        } else {
            "no catalogue base meets the criteria for this target; see the rejections".to_string()
        };
        warnings.push(Warning {
            kind: WarningKind::NoBase,
            message,
        });
    }
    // Every conversion reported is the whole equilibrium at the advised
    // equivalents, nothing set aside (as `acidsite equilibrium` solves it).
    let no_exclusion: Rc<[usize]> = Rc::from([]);
    let exact_of = |e: &Eval| -> Option<f64> {
        let l = e.lean?;
        solve_lean(
            &ctx,
            l.base_pka,
            l.scale,
            e.equivalents,
            l.a0,
            &no_exclusion,
        )
        .map(|x| x.1)
    };
    let alternatives: Vec<Alternative> = listed
        .iter()
        .map(|e| Alternative {
            base: e.base.name.as_str(),
            equivalents: e.equivalents,
            conversion: exact_of(e).unwrap_or(e.conversion),
            scale: e.scale.unwrap_or(Scale::Dmso),
            solvent: e.solvent.to_string(),
            temperature: temperature(e.base),
            note: e.notes.join("; "),
        })
        .collect();

    // Counted protons and equivalents of the chosen base.
    // A system's base may have no usable evaluation (no comparable pKa):
    // the system's equivalents then follow from the plan alone.
    let numbers_from = chosen.filter(|e| e.equivalents > 0.0 || system.is_none());
    let (counted, equivalents, equivalents_note, counted_note) = match numbers_from {
        Some(e) => {
            let n: usize = e.counted.iter().map(|c| c.protons).sum();
            let note = match (opts.equivalents, opts.purpose) {
                (Some(x), _) => format!("{x} equiv as requested"),
                (None, Purpose::Stoichiometric | Purpose::InSitu) => {
                    let mut t = format!("{} for the target", ctx.plan.per_target);
                    if ctx.plan.extra > 0.0 {
                        t.push_str(&format!(
                            " + {} consumed by the {} ({})",
                            ctx.plan.extra,
                            reaction.name(),
                            if reaction == Reaction::Acylation {
                                "the product is more acidic than the substrate and takes base"
                            } else {
                                "a second deprotonation for the second step"
                            }
                        ));
                    }
                    t.push_str(&format!(" + {n} counted proton(s) + {PRACTICAL_EXCESS} practical excess (titre of the base solution, adventitious moisture)"));
                    t
                }
                (None, Purpose::Catalytic) => format!(
                    "{} equiv catalytic + {n} counted proton(s)",
                    ctx.plan.per_target
                ),
            };
            let cn = if n > 0 {
                Some(format!(
                    "{n} proton(s) are removed before the target and consume base: {}. Proton transfer from O–H, N–H and S–H is fast; with lithium and sodium bases in THF, alcohols and carbamate N–H are deprotonated before a ketone's α-C–H even where their DMSO pKa is somewhat higher, so they are counted (common practice).",
                    e.counted
                        .iter()
                        .map(|c| format!("{} {} at atoms {:?}", c.element, c.class, c.atoms))
                        .collect::<Vec<_>>()
                        .join(", ")
                ))
            } else {
                None
            };
            if let (Some(x), Purpose::Stoichiometric) = (opts.equivalents, opts.purpose) {
                if x < 1.0 + n as f64 {
                    warnings.push(Warning {
                        kind: WarningKind::RequestedEquivalents,
                        message: format!(
                            "{x} equiv does not cover the target plus the {n} counted proton(s): at least {} equiv is needed",
                            1 + n
                        ),
                    });
                }
            }
            // A requested base that could not be judged (no comparable
            // pKa) was never given equivalents: the plan's own.
            let eqv = if e.equivalents > 0.0 {
                e.equivalents
            } else {
                opts.equivalents
                    .unwrap_or(ctx.plan.per_target + ctx.plan.extra + PRACTICAL_EXCESS)
            };
            (e.counted.to_vec(), eqv, note, cn)
        }
        None => match system {
            Some(_) => {
                let e = ctx.plan.per_target + ctx.plan.extra + PRACTICAL_EXCESS;
                (
                    Vec::new(),
                    e,
                    format!(
                        "{} for the target + {PRACTICAL_EXCESS} practical excess",
                        ctx.plan.per_target + ctx.plan.extra
                    ),
                    None,
                )
            }
            None => (Vec::new(), 0.0, "no base chosen".to_string(), None),
        },
    };
    if let Some(n) = &counted_note {
        warnings.push(Warning {
            kind: WarningKind::CountedProtons,
            message: n.clone(),
        });
    }
    molecule_warnings(&ctx, chosen, &mut warnings);
    // Side reactions from the data, for this reaction, mode and base.
    if let Some(t) = smarts_target {
        let family = chosen.map(|e| e.base.family.name());
        for sr in &data.side_reactions {
            if sr.applies(reaction, mode, family) && sr.found_in(t) {
                warnings.push(Warning {
                    kind: WarningKind::SideReaction,
                    message: format!("{} [{}]", sr.message, sr.id),
                });
            }
        }
    }
    if f.sites.get(target).map(|x| x.labelled).unwrap_or(false) {
        warnings.push(Warning {
            kind: WarningKind::LabelExchange,
            message: "the target carries deuterium or tritium: deprotonation and any protic work-up exchange the label; quench with D2O (or the labelled acid) and keep protic solvents out if the label is to stay".into(),
        });
    }

    let two_sides = ctx
        .target_unit
        .iter()
        .any(|&i| sites.sites.get(i).and_then(|s| s.regio).is_some());
    let regio_rows = [Control::Kinetic, Control::Thermodynamic].map(|c| {
        smarts_target
            .filter(|_| two_sides)
            .and_then(|t| data.find(t, &tsite.atoms, reaction, Some(c)))
            .filter(|r| r.control == Some(c))
    });
    let regio = regio_advice(&ctx, regio_rows);
    // Cautions: chosen, alternatives, regio reagents, then a general one.
    let mut cautions: Vec<Caution> = Vec::new();
    let mut push = |c: Option<Caution>| {
        if let Some(c) = c {
            if !cautions.iter().any(|x| x.reagent == c.reagent) {
                cautions.push(c);
            }
        }
    };
    if let Some(sy) = system {
        push(caution_for_reagent(&sy.name, &sy.hazards, &[]));
    }
    if let Some(e) = chosen {
        push(caution_for(e.base, Some(&e.solvent)));
    }
    // Full cautions for the reagents of the kinetic and thermodynamic
    // conditions, one line for each other acceptable base.
    if regio.is_some() {
        for row in regio_rows.iter().flatten() {
            for name in row.prefer.iter().take(2) {
                match (cat.get(name), data.system(name)) {
                    (Some(b), _) => push(caution_for(b, None)),
                    (None, Some(sy)) => push(caution_for_reagent(&sy.name, &sy.hazards, &[])),
                    _ => {}
                }
            }
        }
    }
    for e in &listed {
        push(short_caution_for(e.base));
    }
    push(Some(general_caution()));

    // The reported conversion: the whole equilibrium at the advised
    // equivalents, nothing set aside (as `acidsite equilibrium` solves it),
    // through the allocation-free lean solver; the per-site breakdown only
    // when asked for.
    let exact_conversion: Option<f64> = chosen.and_then(exact_of);
    let exact = chosen
        .filter(|_| opts.full_equilibrium)
        .and_then(|e| full_equilibrium(&ctx, e));
    let t = Target {
        index: target,
        site: tsite.clone(),
        chosen_by,
    };
    let mut mode_note = String::new();
    if let Some(r) = row {
        mode_note.push_str(&r.note);
        mode_note.push_str(" [");
        mode_note.push_str(&r.id);
        mode_note.push_str(", ");
        mode_note.push_str(&r.source);
        mode_note.push(']');
    } else {
        // No practice row: the mode's own rule says why.
        mode_note.push_str(mode.name());
        mode_note.push_str(": ");
        mode_note.push_str(&mode_row.note);
    }
    if let Some(sy) = system {
        mode_note.push_str("; ");
        mode_note.push_str(&sy.name);
        mode_note.push_str(": ");
        mode_note.push_str(&sy.procedure);
        mode_note.push_str(" [");
        mode_note.push_str(&sy.source);
        mode_note.push(']');
        if let Some(b) = &sy.base {
            mode_note.push_str(&format!(
                "; the conversion shown is the equilibrium with {b} alone"
            ));
        }
    }
    let (solvent, temperature_out) = match system {
        Some(sy) => (
            Some(sy.solvent.clone()),
            Some(Temperature {
                low_c: sy.temp_min_c,
                high_c: sy.temp_max_c,
            }),
        ),
        None => (
            chosen.map(|e| e.solvent.to_string()),
            chosen.map(|e| temperature(e.base)),
        ),
    };
    Ok(Advice {
        target: t,
        purpose: opts.purpose,
        reaction,
        control,
        mode,
        mode_note,
        practice_row: row.map(|r| r.id.clone()),
        not_judged,
        base: system
            .map(|sy| sy.name.clone())
            .or(chosen.map(|e| e.base.name.clone())),
        equivalents,
        equivalents_note,
        conversion: exact_conversion.or(chosen
            .filter(|e| system.is_none() && e.lean.is_some())
            .map(|e| e.conversion)),
        equilibrium: exact,
        solvent,
        temperature: temperature_out,
        scale: chosen.and_then(|e| e.scale),
        scale_note: chosen.map(|e| e.scale_note.clone()).unwrap_or_default(),
        concentration: c,
        counted,
        counted_note,
        alternatives,
        alternatives_omitted,
        rejected,
        warnings,
        cautions,
        regio,
        catalogue_version: cat.version.clone(),
    })
}
