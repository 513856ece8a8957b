//! Planning cases a process chemist would question (issue 5 follow-up):
//! levelled hydroxide and alkoxide bases, LDA's DMSO-comparable strength,
//! the ranking of suitable bases, and the weak-base-with-electrophile note.
//!
//! Basis of each check: "common practice" (routine in synthesis
//! laboratories) or "from memory".

use acidsite::advice::{
    advise, commonness_penalty, equilibrium_for, Advice, AdviceOptions, EquilibriumOptions,
    RejectKind,
};
use acidsite::mol::Molecule;
use acidsite::sites::find_sites;

fn plan(smiles: &str) -> Advice<'static> {
    let mol = Molecule::from_smiles(smiles).expect("test SMILES parses");
    let sites = find_sites(&mol);
    advise(&mol, &sites, &AdviceOptions::default()).expect("advice")
}

fn lda_conversion(smiles: &str) -> f64 {
    let mol = Molecule::from_smiles(smiles).expect("test SMILES parses");
    let sites = find_sites(&mol);
    let opts = EquilibriumOptions {
        equivalents: 1.1,
        ..EquilibriumOptions::new("LDA")
    };
    let e = equilibrium_for(&mol, &sites, &opts).expect("equilibrium");
    e.units.iter().cloned().fold(0.0, f64::max)
}

#[test]
fn advise_given_acetone_rejects_hydroxides_judged_on_the_water_scale() {
    // Common practice: hydroxide in water gives only traces of a ketone
    // enolate (water pKa about 15.7 against about 19 for acetone); it is
    // not a base for a preformed enolate.
    let a = plan("CC(C)=O");
    for b in ["NaOH", "KOH", "LiOH", "NaOEt", "NaOMe"] {
        assert!(!a.is_acceptable(b), "{b} accepted for acetone");
        let r = a.rejected.iter().find(|r| r.base == b).expect("rejected");
        assert!(
            r.kinds.contains(&RejectKind::TooWeak)
                || r.kinds.contains(&RejectKind::NoComparablePka),
            "{b}: {}",
            r.reason
        );
    }
}

#[test]
fn advise_given_2_methylcyclohexanone_does_not_list_lithium_hydroxide() {
    // Common practice: LiOH in water/THF hydrolyses esters; it does not
    // preform ketone enolates.
    let a = plan("CC1CCCCC1=O");
    assert!(!a.is_acceptable("LiOH"));
    assert!(!a.is_acceptable("NaOH"));
}

#[test]
fn equilibrium_for_given_lda_converts_ketone_ester_and_tertiary_amide() {
    // Common practice: LDA (conjugate acid about 40 on a DMSO-comparable
    // scale) converts ketones, esters and tertiary amides essentially
    // completely at 1.1 equiv.
    for s in ["CC(C)=O", "CCOC(C)=O", "CC(=O)N(C)C", "O=C1CCCCC1"] {
        let c = lda_conversion(s);
        assert!(c > 0.999, "{s}: {c}");
    }
}

#[test]
fn advise_given_dimethylacetamide_recommends_lda_without_a_marginal_note() {
    // Common practice: tertiary amide enolates are made with LDA in THF.
    let a = plan("CC(=O)N(C)C");
    assert_eq!(a.base.as_deref(), Some("LDA"));
    assert!(a.conversion.unwrap() > 0.999);
}

const COMMON: [&str; 9] = [
    "NaOEt", "NaOMe", "KOtBu", "K2CO3", "NaH", "DBU", "Et3N", "NaOH", "KOH",
];

#[test]
fn advise_given_malononitrile_prefers_a_common_mild_base() {
    // Common practice: malononitrile is alkylated with an alkoxide,
    // NaH, DBU or a carbonate, not with a phosphazene superbase.
    let a = plan("N#CCC#N");
    let b = a.base.clone().unwrap();
    assert!(COMMON.contains(&b.as_str()), "recommended {b}");
    let cat = acidsite::advice::catalogue().unwrap();
    assert_eq!(commonness_penalty(cat.get(&b).unwrap()), 0.0);
}

#[test]
fn advise_given_diethyl_malonate_recommends_sodium_ethoxide() {
    // Common practice: malonic ester synthesis, NaOEt in EtOH.
    assert_eq!(plan("CCOC(=O)CC(=O)OCC").base.as_deref(), Some("NaOEt"));
}

#[test]
fn advise_given_acetylacetone_prefers_a_common_base() {
    // Common practice: acetylacetone is deprotonated by alkoxides,
    // hydroxide or carbonate.
    let a = plan("CC(=O)CC(C)=O");
    let b = a.base.clone().unwrap();
    assert!(COMMON.contains(&b.as_str()), "recommended {b}");
}

#[test]
fn advise_given_simple_ketone_and_ester_recommends_lda() {
    // Common practice: LDA in THF at -78 C for ketone and ester enolates.
    assert_eq!(plan("O=C1CCCCC1").base.as_deref(), Some("LDA"));
    assert_eq!(plan("CCOC(C)=O").base.as_deref(), Some("LDA"));
}

#[test]
fn advise_given_ranked_alternatives_puts_phosphazenes_after_common_bases() {
    // Common practice: phosphazenes are costly specialist bases.
    for s in ["N#CCC#N", "CCOC(=O)CC(=O)OCC", "O=C1CCCCC1", "N#CCc1ccccc1"] {
        let a = plan(s);
        let pos = |n: &str| a.alternatives.iter().position(|x| x.base == n);
        if let (Some(p), Some(h)) = (pos("P4-tBu"), pos("NaH")) {
            assert!(h < p, "{s}: NaH after P4-tBu");
        }
        assert_ne!(a.base.as_deref(), Some("P4-tBu"), "{s}");
        assert_ne!(a.base.as_deref(), Some("BEMP"), "{s}");
    }
}

#[test]
fn advise_given_ethyl_acetoacetate_accepts_k2co3_with_the_electrophile_present_issue10() {
    // Common practice: K2CO3 in acetone or DMF alkylates β-keto esters
    // because the alkylating agent drains the equilibrium (in-situ mode);
    // only a preformed anion needs 99 % at equilibrium.
    let a = plan("CCOC(=O)CC(C)=O");
    assert_eq!(a.mode, acidsite::advice::practice::Mode::InSitu);
    assert!(a.is_acceptable("K2CO3"), "{:?}", a.rejected);
    assert!(!a
        .rejected
        .iter()
        .any(|r| r.reason.contains("used in practice")));
}
