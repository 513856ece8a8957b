//! Never panic on any input; equilibrium set-up from a molecule (issue 5).

use acidsite::advice::{
    advise, advise_in, advise_with_features, detect_features, detect_features_in, equilibrium_for,
    patterns_all_parse, AdviceOptions, EquilibriumError, EquilibriumOptions, Purpose, Scale,
};
use acidsite::mol::Molecule;
use acidsite::sites::{find_sites, find_sites_in, Regio, Site, SiteReport};
use acidsite::smarts::Target;
use proptest::prelude::*;

/// One pattern-matching view shared by the sites and the advice gives the
/// same results as each building its own (issue 6), including a salt that
/// the sites read as its ammonium form. A consistency check; no reference
/// values.
#[test]
fn advise_in_given_a_shared_target_equals_advise() {
    for smi in [
        "CC(=O)CC(=O)OCC",
        "CC1CCCCC1=O",
        "OCCC(=O)c1ccccc1",
        "CCN(CC)CC.OC(=O)CC(=O)OCC",
        "O=C(O)c1ccccc1N",
        "CC(C)(C)OC(=O)NCC(=O)OC",
    ] {
        let mol = Molecule::from_smiles(smi).unwrap();
        let target = Target::new(&mol);
        let opts = acidsite::sites::Options::default();
        let sites = find_sites_in(&mol, &target, &opts);
        assert_eq!(sites, find_sites(&mol), "{smi}");
        assert_eq!(
            detect_features_in(&mol, &target, &sites),
            detect_features(&mol, &sites),
            "{smi}"
        );
        let aopts = AdviceOptions::default();
        assert_eq!(
            advise_in(&mol, &target, &sites, &aopts),
            advise(&mol, &sites, &aopts),
            "{smi}"
        );
    }
}

#[test]
fn patterns_all_parse_given_the_embedded_smarts_succeeds() {
    patterns_all_parse().unwrap();
}

#[test]
fn equilibrium_for_given_acetone_and_naoet_uses_ethanol_as_solvent() {
    // Common practice: acetone + NaOEt in EtOH leaves ~1/1000 or less as enolate.
    // Conditions: 0.5 M acetone, 1.0 equiv NaOEt, EtOH 17.1 M, water scale.
    let mol = Molecule::from_smiles("CC(C)=O").unwrap();
    let sites = find_sites(&mol);
    let e = equilibrium_for(
        &mol,
        &sites,
        &EquilibriumOptions {
            base: "NaOEt".into(),
            equivalents: 1.0,
            concentration: 0.5,
            solvent: None,
            scale: None,
        },
    )
    .unwrap();
    assert_eq!(e.scale, Scale::Water);
    assert_eq!(e.acid_solvent.as_ref().map(|a| a.1), Some(17.1));
    let f = e.site_fraction(0);
    assert!(f < 1e-3 && f > 0.0, "{f}");
    assert!(e.notes.iter().any(|n| n.contains("17.1")));
    assert!(e.mass_balance_residual <= 1e-9);
}

#[test]
fn equilibrium_for_given_lda_and_ketone_is_complete() {
    // Common practice: LDA converts a ketone essentially completely.
    let mol = Molecule::from_smiles("O=C1CCCCC1").unwrap();
    let sites = find_sites(&mol);
    let e = equilibrium_for(
        &mol,
        &sites,
        &EquilibriumOptions {
            equivalents: 1.05,
            ..EquilibriumOptions::new("LDA")
        },
    )
    .unwrap();
    assert!(e.anions[1] > 0.999, "{:?}", e.anions);
}

#[test]
fn equilibrium_for_given_unknown_base_is_an_error() {
    let mol = Molecule::from_smiles("CC(C)=O").unwrap();
    let sites = find_sites(&mol);
    let e = equilibrium_for(&mol, &sites, &EquilibriumOptions::new("nonesuch")).unwrap_err();
    assert!(matches!(e, EquilibriumError::UnknownBase(_)));
}

const SMILES: [&str; 8] = [
    "CC(C)=O",
    "CCOC(=O)CC(=O)OCC",
    "OC(=O)Cc1ccccc1",
    "CC(=O)CCCO",
    "c1ccccc1",
    "[Na+].[O-]C(=O)C",
    "ClCC(=O)Cl",
    "C",
];

fn site_strategy() -> impl Strategy<Value = Site> {
    (
        prop::collection::vec(0usize..40, 0..3),
        prop::sample::select(vec!["C", "O", "N", "S", "X"]),
        prop::option::of(-30.0f64..80.0),
        prop::option::of(prop_oneof![
            -30.0f64..80.0,
            Just(f64::NAN),
            Just(f64::INFINITY)
        ]),
        prop_oneof![0.0f64..5.0, Just(f64::NAN)],
        prop::option::of(prop::sample::select(vec![
            Regio::Kinetic,
            Regio::Thermodynamic,
        ])),
        prop::sample::select(vec!["ketone", "ester", "alcohol", "aldehyde", "nitro", ""]),
    )
        .prop_map(|(atoms, el, d, w, u, regio, class)| Site {
            atoms,
            element: acidsite::mol::Element::from_symbol(el).unwrap_or(acidsite::mol::Element::C),
            hydrogens: 1,
            deuterium: 0,
            tritium: 0,
            class: class.to_string(),
            pka_dmso: d,
            pka_water: w,
            uncertainty: u,
            rules: Vec::new(),
            regio,
            background: false,
        })
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 128, ..ProptestConfig::default() })]
    #[test]
    fn advise_given_arbitrary_sites_and_options_never_panics(
        which in 0usize..SMILES.len(),
        sites in prop::collection::vec(site_strategy(), 0..5),
        top_c in prop::option::of(0usize..8),
        top_o in prop::option::of(0usize..8),
        site in prop::option::of(0usize..40),
        eq in prop::option::of(prop_oneof![-1.0f64..10.0, Just(f64::NAN), Just(0.0)]),
        conc in prop_oneof![0.0001f64..5.0, Just(0.0), Just(-1.0), Just(f64::INFINITY)],
        base in prop::option::of(prop::sample::select(vec!["LDA", "NaOEt", "n-BuLi", "K2CO3", "xyz"])),
        solvent in prop::option::of(prop::sample::select(vec!["EtOH", "THF", "DMF", "water", ""])),
        catalytic in any::<bool>(),
        word in any::<bool>(),
    ) {
        let mol = Molecule::from_smiles(SMILES[which]).unwrap();
        let report = SiteReport { sites, top_carbon: top_c, top_overall: top_o };
        let opts = AdviceOptions {
            base: base.map(str::to_string),
            site,
            equivalents: eq,
            concentration: conc,
            solvent: solvent.map(str::to_string),
            scale: None,
            purpose: if catalytic { Purpose::Catalytic } else { Purpose::Stoichiometric },
            reaction: None,
            control: None,
            alternatives: None,
            full_equilibrium: true,
            word_rejections: word,
        };
        let f = detect_features(&mol, &report);
        let _ = advise_with_features(&f, &report, &opts);
        let _ = advise(&mol, &report, &opts);
        let real = find_sites(&mol);
        if let Ok(a) = advise(&mol, &real, &opts) {
            if let Some(c) = a.conversion {
                prop_assert!((0.0..=1.0).contains(&c));
            }
        }
    }
}

/// Throughput of the recommender (benchmark, not a timed test):
/// `cargo test --release --test advice -- advice_robustness:: --ignored --nocapture`.
#[test]
#[ignore]
fn advise_throughput_benchmark() {
    let list = [
        "CC1CCCCC1=O",
        "CCOC(=O)CC(=O)OCC",
        "CC(=O)CCCO",
        "N#CCc1ccccc1",
        "CC(=O)N(C)C",
        "CCOC(=O)CC(C)=O",
        "CC(=O)CCNC(=O)OC(C)(C)C",
        "COC(=O)C(C)c1ccccc1",
    ];
    let prepared: Vec<_> = list
        .iter()
        .map(|s| {
            let m = Molecule::from_smiles(s).unwrap();
            let r = find_sites(&m);
            (m, r)
        })
        .collect();
    let n = 2000;
    let start = std::time::Instant::now();
    for i in 0..n {
        let (m, r) = &prepared[i % prepared.len()];
        let a = advise(m, r, &AdviceOptions::default()).unwrap();
        assert!(a.base.is_some());
    }
    let dt = start.elapsed().as_secs_f64();
    println!(
        "advise: {n} calls in {dt:.3} s = {:.0} per second",
        n as f64 / dt
    );
    let start = std::time::Instant::now();
    for i in 0..n {
        let (m, _) = &prepared[i % prepared.len()];
        let _ = find_sites(m);
    }
    let ds = start.elapsed().as_secs_f64();
    println!(
        "find_sites (for comparison): {:.0} per second",
        n as f64 / ds
    );
}

/// Split of the recommender's time (benchmark).
#[test]
#[ignore]
fn advise_features_share_benchmark() {
    let m = Molecule::from_smiles("CC(=O)CCNC(=O)OC(C)(C)C").unwrap();
    let r = find_sites(&m);
    let n = 2000;
    let t0 = std::time::Instant::now();
    for _ in 0..n {
        let _ = detect_features(&m, &r);
    }
    let t1 = t0.elapsed().as_secs_f64();
    let f = detect_features(&m, &r);
    let t0 = std::time::Instant::now();
    for _ in 0..n {
        let _ = advise_with_features(&f, &r, &AdviceOptions::default());
    }
    let t2 = t0.elapsed().as_secs_f64();
    println!(
        "features {:.1} us, recommend {:.1} us",
        1e6 * t1 / n as f64,
        1e6 * t2 / n as f64
    );
}

#[test]
fn equilibrium_for_given_hydroxy_ketone_and_lda_notes_fast_oh_transfer() {
    // Common practice: lithium bases take the O–H first although the DMSO
    // pKa of the alcohol is higher than the ketone's.
    let mol = Molecule::from_smiles("CC(=O)CCCO").unwrap();
    let sites = find_sites(&mol);
    let e = equilibrium_for(
        &mol,
        &sites,
        &EquilibriumOptions {
            equivalents: 2.1,
            ..EquilibriumOptions::new("LDA")
        },
    )
    .unwrap();
    assert!(e.notes.iter().any(|n| n.contains("first")), "{:?}", e.notes);
    // With 2.1 equiv both the alcohol and the ketone are deprotonated.
    assert!(e.anions[2] > 0.99, "{:?}", e.anions);
}
