//! Side reactions: the base-family checks that rule a base out, and the warnings about the molecule and the chosen conditions.

use super::evaluate::worded;
use super::*;

pub(super) fn side_reaction_checks(
    f: &MoleculeFeatures,
    base: &Base,
    word: bool,
    reasons: &mut Vec<(RejectKind, String)>,
) {
    // At most eight groups: a fixed list, no allocation.
    let mut groups = GroupList::default();
    let fam = base.family;
    let attacks_all = matches!(fam, BaseFamily::Alkyllithium | BaseFamily::MetalAmide);
    match base.nucleophilic {
        Nucleophilicity::Yes => {
            let carbonyl_ok = !matches!(fam, BaseFamily::Pyridine);
            if f.ketone && carbonyl_ok {
                groups.push("ketone");
            }
            if f.aldehyde && carbonyl_ok {
                groups.push("aldehyde");
            }
            if f.ester && carbonyl_ok {
                groups.push("ester");
            }
            if f.nitrile
                && (attacks_all
                    || !matches!(fam, BaseFamily::SecondaryAmine | BaseFamily::Pyridine))
            {
                groups.push("nitrile");
            }
            if f.amide && attacks_all {
                groups.push("amide");
            }
            if f.carboxylic_acid && fam == BaseFamily::Alkyllithium {
                groups.push("carboxylate (ketone formation)");
            }
            if f.acyl_halide {
                groups.push("acyl halide");
            }
            if f.anhydride {
                groups.push("anhydride");
            }
            if !groups.is_empty() {
                let how = match fam {
                    BaseFamily::Alkyllithium => "adds to",
                    BaseFamily::MetalAmide => "attacks",
                    BaseFamily::SecondaryAmine => {
                        "condenses with or acylates on (enamine, iminium or amide formation)"
                    }
                    BaseFamily::Pyridine => "is acylated by",
                    _ => "attacks",
                };
                let r = worded(word, || {
                    let mut r = String::with_capacity(96);
                    r.push_str("nucleophilic base: ");
                    r.push_str(how);
                    r.push_str(" the ");
                    groups.push_joined(&mut r);
                    r.push_str(" (addition or substitution)");
                    r
                });
                reasons.push((RejectKind::Nucleophile, r));
            }
        }
        Nucleophilicity::Weak => {
            if f.acyl_halide {
                groups.push("acyl halide");
            }
            if f.anhydride {
                groups.push("anhydride");
            }
            if !groups.is_empty() {
                let r = worded(word, || {
                    let mut r = String::with_capacity(64);
                    r.push_str("reacts with the ");
                    groups.push_joined(&mut r);
                    r.push_str(" (acyl substitution)");
                    r
                });
                reasons.push((RejectKind::Nucleophile, r));
            }
        }
        Nucleophilicity::No => {}
    }
    if fam == BaseFamily::Alkoxide && f.ester {
        if let Some(mine) = alkoxy_of(base) {
            let other: Vec<&str> = f
                .ester_alkoxy
                .iter()
                .map(String::as_str)
                .filter(|a| *a != mine)
                .collect();
            if !other.is_empty() {
                reasons.push((
                    RejectKind::Transesterification,
                    worded(word, || format!(
                        "transesterification: the {mine} alkoxide exchanges the {} ester group(s); use the alkoxide that matches the ester",
                        other.join(", ")
                    )),
                ));
            }
        }
    }
    if fam == BaseFamily::Hydroxide && (f.ester || f.anhydride || f.acyl_halide) {
        reasons.push((
            RejectKind::Hydrolysis,
            worded(word, || {
                "hydroxide hydrolyses the ester (saponification) or acyl group".into()
            }),
        ));
    }
}

pub(super) fn molecule_warnings(ctx: &Ctx, chosen: Option<&Eval>, w: &mut Vec<Warning>) {
    let f = ctx.f;
    let t = &ctx.sites.sites[ctx.target];
    let sf = f.sites.get(ctx.target).cloned().unwrap_or_default();
    let mut add = |kind, message: String| w.push(Warning { kind, message });
    if f.aldehyde {
        add(
            WarningKind::SelfAldol,
            "the molecule is an aldehyde: its enolate adds to unreacted aldehyde (self-aldol) faster than most electrophiles; use an enolate equivalent (enamine, imine anion, silyl enol ether) or add the aldehyde last and cold".into(),
        );
    }
    for &i in &ctx.target_unit {
        if let (Some(lg), Some(site)) = (
            f.sites.get(i).and_then(|x| x.beta_leaving_group.as_ref()),
            ctx.sites.sites.get(i),
        ) {
            add(
                WarningKind::BetaElimination,
                format!(
                    "a leaving group ({lg}) sits on the carbon next to the acidic carbon at atoms {:?}: the anion there can expel it (E1cB elimination); keep cold, avoid equilibrating conditions and trap fast",
                    site.atoms
                ),
            );
        }
    }
    if sf.stereocentre {
        add(
            WarningKind::Epimerisation,
            format!("the target carbon (atoms {:?}) is a stereocentre: deprotonation planarises it and it will epimerise or racemise", t.atoms),
        );
    }
    if f.alkyl_halide {
        let mut m = "the molecule contains an alkyl halide or sulfonate: the anion can alkylate itself (intra- or intermolecularly) and strong bases can eliminate HX".to_string();
        if f.alpha_halo_carbonyl {
            m.push_str("; the halide is next to a carbonyl group, so bases can also start a Favorskii rearrangement or Darzens-type self-condensation");
        }
        add(WarningKind::AlkylHalide, m);
    }
    if sf.dicarbonyl {
        add(
            WarningKind::OVersusCAlkylation,
            "1,3-dicarbonyl anions react at O as well as C: hard electrophiles (sulfonates, sulfates, silyl and acyl chlorides), polar aprotic solvents and K+/Cs+ favour O; alkyl iodides and bromides with Na+/Li+ in THF or alcohol favour C (common practice)".into(),
        );
    }
    if let Some(e) = chosen {
        let dicarbonyl = sf.dicarbonyl;
        if t.is_carbon()
            && ctx.target_carbonyl
            && !dicarbonyl
            && ctx.opts.purpose == Purpose::Stoichiometric
            && !matches!(
                e.base.family,
                BaseFamily::LithiumAmide | BaseFamily::Silylamide
            )
        {
            add(
                WarningKind::SelfCondensation,
                format!("{} forms the enolate slowly or reversibly: unreacted carbonyl compound and enolate coexist and self-condensation (aldol or Claisen) competes", e.base.name),
            );
        }
        if e.conversion < MIN_CONVERSION && ctx.opts.purpose == Purpose::Stoichiometric {
            let msg = if e.marginal {
                format!(
                    "{:.1}% of the target is deprotonated at the central pKa estimates and 99% is reached only within their uncertainty: check the conversion (for example by a deuterium quench of an aliquot) before adding the electrophile",
                    100.0 * e.conversion
                )
            } else {
                format!(
                    "only {:.1}% of the target is deprotonated at equilibrium in {}; the reaction relies on the electrophile consuming the anion as it forms",
                    100.0 * e.conversion,
                    e.solvent
                )
            };
            add(WarningKind::IncompleteEquilibrium, msg);
        }
        if let (Some(sc), Some(t_pka)) = (e.scale, pka_on(t, e.scale.unwrap_or(Scale::Dmso))) {
            let bp = e.lean.as_ref().map(|q| q.base_pka).unwrap_or(f64::NAN);
            let margin = bp - t_pka;
            if margin.is_finite()
                && margin < 2.0 + 2.0 * t.uncertainty
                && ctx.opts.purpose == Purpose::Stoichiometric
            {
                add(
                    WarningKind::Uncertainty,
                    format!(
                        "the target pKa estimate carries ±{:.1} units and the base is only {:.1} units stronger on the {} scale: the conversion could be lower than computed",
                        t.uncertainty,
                        margin,
                        sc.name()
                    ),
                );
            }
        }
    }
}
