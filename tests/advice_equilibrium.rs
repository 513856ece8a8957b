//! Deprotonation equilibrium solver (issue 5).

use acidsite::advice::{solve, AcidUnit, EquilibriumInput, Microsite};
use proptest::prelude::*;

fn unit(site: usize, pka: f64) -> AcidUnit {
    AcidUnit {
        alternatives: vec![Microsite {
            site,
            atoms: vec![site],
            pka,
        }],
    }
}

fn input(units: Vec<AcidUnit>, base_pka: f64, eq: f64, c: f64, a0: f64) -> EquilibriumInput {
    EquilibriumInput {
        units,
        base_pka,
        equivalents: eq,
        concentration: c,
        acid_solvent_molar: a0,
    }
}

/// Closed form for one site: K = D (A0 + D) / ((C - D)(B0 - D)), stable root.
fn closed_form(k: f64, c: f64, b0: f64, a0: f64) -> f64 {
    let b = k * (c + b0) + a0;
    let disc = b * b - 4.0 * (k - 1.0) * k * c * b0;
    2.0 * k * c * b0 / (b + disc.max(0.0).sqrt())
}

#[test]
fn solve_given_single_site_agrees_with_closed_form_from_minus_25_to_plus_30() {
    for step in 0..=110 {
        let dpka = -25.0 + 0.5 * step as f64;
        for &(eq, c, a0) in &[
            (1.0, 0.5, 0.0),
            (1.1, 0.1, 0.0),
            (0.5, 1.0, 0.0),
            (1.0, 0.5, 17.1),
            (3.0, 0.01, 2.0),
        ] {
            let e = solve(&input(vec![unit(0, 20.0)], 20.0 + dpka, eq, c, a0)).unwrap();
            let k = 10f64.powf(dpka);
            let d = closed_form(k, c, eq * c, a0) / c;
            let got = e.sites[0].deprotonated;
            assert!(
                (got - d).abs() <= 1e-9 + 1e-7 * d,
                "dpKa {dpka} eq {eq} c {c} a0 {a0}: solver {got} closed form {d}"
            );
            assert!(
                e.mass_balance_residual <= 1e-9,
                "residual {}",
                e.mass_balance_residual
            );
        }
    }
}

#[test]
fn solve_given_three_units_difference_gives_about_1000_to_1() {
    // Common practice: a pKa difference of 3 units is an equilibrium constant
    // of about 1000:1. Recover K from the computed composition: with equimolar
    // acid and base, K = ([A-][BH]) / ([HA][B-]) = f^2 / (1 - f)^2.
    let c = 0.5;
    let e = solve(&input(vec![unit(0, 20.0)], 23.0, 1.0, c, 0.0)).unwrap();
    let f = e.sites[0].deprotonated;
    let k = (f * f) / ((1.0 - f) * (1.0 - f));
    assert!((k - 1000.0).abs() / 1000.0 < 1e-6, "K = {k}");
    // sqrt(1000) / (1 + sqrt(1000)) = 0.969 of the acid is deprotonated.
    assert!(f > 0.96 && f < 0.975, "f = {f}");
}

#[test]
fn solve_given_acetone_and_sodium_ethoxide_in_ethanol_leaves_little_enolate() {
    // Common practice: acetone with NaOEt in EtOH gives about 1/1000 or less enolate.
    // Conditions used: water scale, acetone pKa 19.3 (from memory), EtOH 15.9
    // (from memory), 0.5 M acetone, 1.0 equiv NaOEt, EtOH counted at 17.1 M.
    let e = solve(&input(vec![unit(0, 19.3)], 15.9, 1.0, 0.5, 17.1)).unwrap();
    let f = e.sites[0].deprotonated;
    assert!(f < 1e-3, "enolate fraction {f}");
    // Expected about 10^-3.4 * 0.5 / 17.1 = 1.2e-5.
    assert!((f - 1.16e-5).abs() < 0.1e-5, "enolate fraction {f}");
}

#[test]
fn solve_given_lda_converts_ketone_ester_and_amide_completely() {
    // LDA (diisopropylamine 36, THF, common practice) against DMSO pKa values:
    // acetone 26.5 (Bordwell 1988), ethyl acetate ~29.5 and N,N-dimethylacetamide
    // ~35 (DMSO, from memory). Ketones and esters: essentially complete.
    for pka in [26.5, 29.5] {
        let e = solve(&input(vec![unit(0, pka)], 36.0, 1.05, 0.5, 0.0)).unwrap();
        assert!(
            e.sites[0].deprotonated > 0.999,
            "pKa {pka}: {}",
            e.sites[0].deprotonated
        );
    }
    // Tertiary amide: N,N-dimethylacetamide 34.5 (DMSO, from memory, as in
    // corpus/sites). Against diisopropylamine's THF value the central estimate
    // is incomplete; one mixed-scale uncertainty (2 units) in LDA's favour
    // gives > 99 %, which is how the recommender accepts LDA here (marginal,
    // with a warning). Common practice: LDA enolises tertiary amides in THF.
    let central = solve(&input(vec![unit(0, 34.5)], 36.0, 1.1, 0.5, 0.0)).unwrap();
    let f = central.sites[0].deprotonated;
    assert!(f > 0.8 && f < 0.9, "{f}");
    let favoured = solve(&input(vec![unit(0, 34.5)], 38.0, 1.1, 0.5, 0.0)).unwrap();
    assert!(favoured.sites[0].deprotonated > 0.99);
}

#[test]
fn solve_given_alkoxide_and_dicarbonyls_is_complete() {
    // Common practice: an alkoxide suffices for 1,3-dicarbonyls and malonates.
    // DMSO: diethyl malonate 16.4, acetylacetone 13.3 (Bordwell 1988) vs EtOH 29.8.
    for pka in [16.4, 13.3] {
        let e = solve(&input(vec![unit(0, pka)], 29.8, 1.05, 0.5, 0.0)).unwrap();
        assert!(e.sites[0].deprotonated > 0.999);
    }
    // In ethanol itself (water scale, EtOH 17.1 M): ethyl acetoacetate 10.7 and
    // acetylacetone 9.0 (water, from memory) are still > 99 % deprotonated.
    for pka in [10.7, 9.0] {
        let e = solve(&input(vec![unit(0, pka)], 15.9, 1.05, 0.5, 17.1)).unwrap();
        assert!(
            e.sites[0].deprotonated > 0.99,
            "{pka}: {}",
            e.sites[0].deprotonated
        );
    }
}

#[test]
fn solve_given_acid_and_ketone_sites_forms_dianion_with_two_equivalents() {
    // Carboxylic acid O–H (DMSO ~12) and its α-C–H (~28): 1 equiv LDA gives the
    // carboxylate, 2.1 equiv the dianion (common practice).
    let units = vec![unit(0, 12.3), unit(1, 28.0)];
    let one = solve(&input(units.clone(), 36.0, 1.0, 0.5, 0.0)).unwrap();
    assert!(one.anions[1] > 0.99, "{:?}", one.anions);
    let two = solve(&input(units, 36.0, 2.1, 0.5, 0.0)).unwrap();
    assert!(two.anions[2] > 0.99, "{:?}", two.anions);
}

#[test]
fn solve_given_alternative_alpha_sites_removes_one_proton_only() {
    // Both α-carbons of a ketone belong to one unit: excess base still gives a
    // mono-anion, shared between the sides in the ratio of their K.
    let u = AcidUnit {
        alternatives: vec![
            Microsite {
                site: 0,
                atoms: vec![1],
                pka: 26.0,
            },
            Microsite {
                site: 1,
                atoms: vec![5],
                pka: 27.0,
            },
        ],
    };
    let e = solve(&input(vec![u], 36.0, 2.0, 0.5, 0.0)).unwrap();
    assert!(e.anions[1] > 0.999 && e.anions.len() == 2);
    let ratio = e.sites[0].deprotonated / e.sites[1].deprotonated;
    assert!((ratio - 10.0).abs() < 1e-6, "{ratio}");
}

#[test]
fn solve_given_bad_numbers_returns_errors() {
    assert!(solve(&input(vec![unit(0, 20.0)], 20.0, -1.0, 0.5, 0.0)).is_err());
    assert!(solve(&input(vec![unit(0, 20.0)], 20.0, 1.0, 0.0, 0.0)).is_err());
    assert!(solve(&input(vec![unit(0, f64::NAN)], 20.0, 1.0, 0.5, 0.0)).is_err());
    assert!(solve(&input(vec![unit(0, 20.0)], f64::INFINITY, 1.0, 0.5, 0.0)).is_err());
}

#[test]
fn solve_given_no_base_or_no_sites_is_trivial() {
    let e = solve(&input(vec![unit(0, 20.0)], 30.0, 0.0, 0.5, 0.0)).unwrap();
    assert_eq!(e.sites[0].deprotonated, 0.0);
    let e = solve(&input(vec![], 30.0, 1.0, 0.5, 0.0)).unwrap();
    assert!((e.free_base_fraction - 1.0).abs() < 1e-12);
}

/// Cases from the MOSES benchmark where the first solver needed 20 to 400
/// steps (issue 6): a strong base past its first unit (the free base runs to
/// zero near the root), two equal units, a very weak base. Each must meet the
/// mass balance and take few steps; the values are model checks, no data.
#[test]
fn solve_given_hard_multi_unit_cases_converges_in_few_steps_issue_6() {
    let cases: &[(&[f64], f64, f64)] = &[
        // (site pKa values, base pKa, equivalents); 0.5 M, aprotic.
        (&[20.0, 31.0], 40.0, 1.1),
        (&[34.35, 34.59], 40.0, 1.1),
        (&[10.0, 10.0], 12.7, 1.1),
        (&[10.0, 10.1, 26.0], 12.8, 1.1),
        (&[40.1, 41.1], 10.0, 1.1),
        (&[5.0, 16.0, 28.0, 28.0], 40.0, 2.1),
    ];
    for &(pkas, base, eq) in cases {
        let units = pkas.iter().enumerate().map(|(i, &p)| unit(i, p)).collect();
        let e = solve(&input(units, base, eq, 0.5, 0.0)).unwrap();
        assert!(e.iterations <= 12, "{pkas:?}: {} steps", e.iterations);
        assert!(
            e.mass_balance_residual <= 1e-9,
            "{pkas:?}: {}",
            e.mass_balance_residual
        );
        // The reported ratio is the free base over the conjugate acid.
        let r = 10f64.powf(e.log_ratio);
        let rel = (r * e.conjugate_acid_molar - e.free_base_molar).abs() / e.free_base_molar;
        assert!(rel < 1e-6, "{pkas:?}: r x acid vs free base off by {rel}");
    }
}

/// A unit with no microsite left can lose no proton: all base stays free
/// and the mass balance holds (the solver's bracket runs to its upper end).
/// A model check, no data.
#[test]
fn solve_given_only_empty_units_leaves_the_base_free() {
    let empty = AcidUnit {
        alternatives: Vec::new(),
    };
    let e = solve(&input(vec![empty.clone(), empty], 40.0, 1.1, 0.5, 0.0)).unwrap();
    assert!(e.units.iter().all(|&f| f == 0.0));
    assert!((e.free_base_fraction - 1.0).abs() < 1e-12);
    assert!(e.mass_balance_residual <= 1e-9);
}

fn units_strategy() -> impl Strategy<Value = Vec<AcidUnit>> {
    prop::collection::vec(prop::collection::vec(0.0f64..50.0, 1..3), 1..6).prop_map(|v| {
        v.into_iter()
            .enumerate()
            .map(|(i, pk)| AcidUnit {
                alternatives: pk
                    .into_iter()
                    .enumerate()
                    .map(|(j, p)| Microsite {
                        site: 10 * i + j,
                        atoms: vec![i],
                        pka: p,
                    })
                    .collect(),
            })
            .collect()
    })
}

proptest! {
    #[test]
    fn solve_given_random_inputs_keeps_fractions_and_mass_balance(
        units in units_strategy(),
        base in 0.0f64..55.0,
        eq in 0.0f64..6.0,
        c in 0.001f64..2.0,
        a0 in prop_oneof![Just(0.0), 0.0f64..30.0],
    ) {
        let e = solve(&input(units, base, eq, c, a0)).unwrap();
        for s in &e.sites {
            prop_assert!((0.0..=1.0).contains(&s.deprotonated));
        }
        for u in &e.units {
            prop_assert!((0.0..=1.0).contains(u));
        }
        let total: f64 = e.anions.iter().sum();
        prop_assert!((total - 1.0).abs() < 1e-9);
        prop_assert!(e.mass_balance_residual <= 1e-9, "residual {}", e.mass_balance_residual);
        // Independent check of the mass balance from the reported figures.
        let removed: f64 = e.units.iter().sum::<f64>() * c;
        let b0 = eq * c;
        prop_assert!((e.free_base_molar + removed - b0).abs() <= 1e-9 * b0.max(c));
        prop_assert!((0.0..=1.0).contains(&e.free_base_fraction));
        // Safeguarded Newton from the greedy start: never a long crawl.
        prop_assert!(e.iterations <= 60, "{} steps", e.iterations);
    }

    #[test]
    fn solve_given_more_equivalents_never_lowers_conversion(
        units in units_strategy(),
        base in 0.0f64..55.0,
        eq in 0.0f64..4.0,
        extra in 0.0f64..3.0,
        c in 0.001f64..2.0,
        a0 in prop_oneof![Just(0.0), 0.0f64..30.0],
    ) {
        let lo = solve(&input(units.clone(), base, eq, c, a0)).unwrap();
        let hi = solve(&input(units, base, eq + extra, c, a0)).unwrap();
        for (a, b) in lo.units.iter().zip(&hi.units) {
            prop_assert!(*b >= *a - 1e-12, "{a} -> {b}");
        }
    }
}
