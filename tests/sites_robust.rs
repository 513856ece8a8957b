//! find_sites never panics and keeps its invariants on arbitrary parsable
//! input (issue 4).

use acidsite::mol::Molecule;
use acidsite::sites::find_sites;
use proptest::prelude::*;

fn check(smiles: &str) {
    let Ok(mol) = Molecule::from_smiles(smiles) else {
        return;
    };
    let r = find_sites(&mol);
    let n = mol.atom_count();
    for s in &r.sites {
        assert!(!s.atoms.is_empty());
        assert!(s.atoms.iter().all(|&a| a < n));
        assert!(s.uncertainty > 0.0 && s.uncertainty.is_finite());
        assert!(s.pka_dmso.is_none_or(f64::is_finite));
        assert!(s.pka_water.is_none_or(f64::is_finite));
        assert!(!s.rules.is_empty());
    }
    // Background (unactivated alkane) sites are never the top site
    // (issue 11); they come after every other site.
    assert_eq!(
        r.top_overall.is_some(),
        r.sites.iter().any(|s| !s.background)
    );
    if let Some(c) = r.top_carbon {
        assert!(r.sites[c].is_carbon() && !r.sites[c].background);
    }
    if let Some(first) = r.sites.iter().position(|s| s.background) {
        assert!(r.sites[first..].iter().all(|s| s.background));
    }
    // Every atom appears in at most one site.
    let mut all: Vec<usize> = r.sites.iter().flat_map(|s| s.atoms.clone()).collect();
    let len = all.len();
    all.sort_unstable();
    all.dedup();
    assert_eq!(all.len(), len);
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(2000))]
    #[test]
    fn find_sites_given_random_smiles_never_panics(s in "[CNOScnos()=#123\\[\\]H+\\-.@Cl]{1,40}") {
        check(&s);
    }

    #[test]
    fn find_sites_given_mutated_drug_smiles_never_panics(cut in 0usize..60, ins in "[()=#1cnO\\[\\]+]{0,3}") {
        let base = "CC(=O)Nc1ccc(O)cc1C(=O)OCC(C#N)S(=O)(=O)c1ccc([N+](=O)[O-])cc1";
        let cut = cut.min(base.len());
        let s = format!("{}{}{}", &base[..cut], ins, &base[cut..]);
        check(&s);
    }
}

#[test]
fn find_sites_given_hypervalent_and_charged_forms_is_stable() {
    for s in [
        "CN(=O)=O",
        "C[S+](C)[O-]",
        "C[N+]#[C-]",
        "[CH3-]",
        "[CH2]C(C)=O",
        "C1=CC=CC1.C1=CC=CC1",
        "[Na+].[Na+].[O-]C(=O)CC([O-])=O",
        "c1ccc2c(c1)Cc1ccccc1-2",
    ] {
        check(s);
    }
}
